package optics

import (
	"fmt"
	"math"
	"testing"
)

func TestBestFocusAgainstScan(t *testing.T) {
	// The closed-form best plane against a direct scan of planes (the
	// smallest RMS of 4001 planes across +-2 mm), on and off axis.
	sys := pcx100().System(nil, nil)
	for _, field := range []float64{0, 2} {
		tr := traceAtParaxialFocus(t, sys, Object{Z: math.Inf(-1), Aperture: Aperture{Beam: 15}}, field)
		best := tr.BestFocus()
		scan, zs := math.Inf(1), 0.0
		for i := 0; i <= 4000; i++ {
			z := tr.ImageZ - 2 + float64(i)*0.001
			if r := tr.SpotAt(z).RMS; r < scan {
				scan, zs = r, z
			}
		}
		checkNear(t, fmt.Sprintf("field %g: best plane", field), best.Z, zs, 0.001, 0)
		if best.RMS > scan*(1+1e-9) {
			t.Errorf("field %g: closed form RMS %g above the scan's %g", field, best.RMS, scan)
		}
	}
}

func TestSpotSymmetryAndLoss(t *testing.T) {
	// On axis the centroid lies on the axis (rotational symmetry); a beam
	// wider than the clear aperture loses its outer rays, counted.
	sys := pcx100().System(nil, nil) // clear aperture 22.86 mm
	tr := traceAtParaxialFocus(t, sys, Object{Z: math.Inf(-1), Aperture: Aperture{Beam: 10}}, 0)
	s := tr.SpotAt(tr.ImageZ)
	checkNear(t, "centroid x", s.CentroidX, 0, 1e-12, 0)
	checkNear(t, "centroid y", s.CentroidY, 0, 1e-12, 0)
	if s.Lost != 0 || s.Passed != 468 {
		t.Errorf("passed %d, lost %d; want 468 and 0", s.Passed, s.Lost)
	}
	wide := traceAtParaxialFocus(t, sys, Object{Z: math.Inf(-1), Aperture: Aperture{Beam: 30}}, 0)
	lost := wide.Lost()
	if lost[Clipped] == 0 || wide.SpotAt(wide.ImageZ).Lost != lost[Clipped] {
		t.Errorf("a 30 mm beam on a 22.86 mm clear aperture lost %v", lost)
	}
}

func TestAiryRadius(t *testing.T) {
	// 1.22 lambda N for a slow lens in air at infinite conjugate, N = f/D
	// (Hecht, Optics, 5th ed., ch. 10, the Airy disc), from the real
	// marginal ray's NA.
	sys := pcx100().System(nil, nil)
	obj := Object{Z: math.Inf(-1), Aperture: Aperture{Beam: 4}}
	f, err := sys.MarginalFocus(obj, LineD)
	if err != nil {
		t.Fatal(err)
	}
	n := sys.Cardinal(LineD).EFL / 4
	checkNear(t, "Airy radius", AiryRadius(LineD, f.NA), 1.22*LineD*1e-6*n, 0, 1e-3)
}
