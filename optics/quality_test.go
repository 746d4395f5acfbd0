package optics

import (
	"math"
	"strings"
	"testing"
)

func TestAssess(t *testing.T) {
	// Assess gathers what the lower-level functions measure: the same
	// spot, Airy radius and colour, and the losses as warnings.
	sys := pcx100().System(nil, nil)
	glass := mustGlass(t, "517642")
	sysGlass := singletOf(51.7, math.Inf(1), 4, glass).System(nil, nil)
	obj := Object{Z: math.Inf(-1), Aperture: Aperture{Beam: 8}}
	q, err := sys.Assess(Conditions{Object: obj, Field: 2})
	if err != nil {
		t.Fatal(err)
	}
	tr := traceAtParaxialFocus(t, sys, obj, 0)
	checkNear(t, "image plane", q.ImageZ, sys.Cardinal(LineD).BFD(), 1e-12, 0)
	checkNear(t, "axis RMS", q.Axis.RMS, tr.BestFocus().RMS, 1e-15, 1e-12)
	checkNear(t, "best focus shift", q.BestFocusShift, tr.BestFocus().Z-tr.ImageZ, 1e-12, 0)
	checkNear(t, "Airy radius", q.AiryRadius, AiryRadius(LineD, q.Focus.NA), 0, 1e-12)
	if !(q.Edge.RMS > q.Axis.RMS) || len(q.Warnings) != 0 || !q.DiffractionLimited {
		t.Errorf("edge %g vs axis %g, warnings %q, diffraction limited %v", q.Edge.RMS, q.Axis.RMS, q.Warnings, q.DiffractionLimited)
	}
	band := []float64{LineF, LineD, LineC}
	qg, err := sysGlass.Assess(Conditions{Object: obj, Band: band})
	if err != nil {
		t.Fatal(err)
	}
	checkNear(t, "focal shift", qg.Colour.FocalShift, qg.Colour.Focus[2]-qg.Colour.Focus[0], 1e-12, 0)
	checkNear(t, "Seidel colour vs paraxial", qg.Seidel.AxialColour(), qg.Colour.Focus[0]-qg.Colour.Focus[2], 0, 0.02)
}

func TestAssessReportsLosses(t *testing.T) {
	sys := pcx100().System(nil, nil)
	q, err := sys.Assess(Conditions{Object: Object{Z: math.Inf(-1), Aperture: Aperture{Beam: 24}}})
	if err != nil {
		t.Fatal(err)
	}
	if len(q.Warnings) != 1 || !strings.Contains(q.Warnings[0], "surface 1: outside the clear aperture") {
		t.Errorf("warnings %q", q.Warnings)
	}
	afocal := System{Surfaces: []Surface{Sphere(50), Sphere(50)}, Gaps: []float64{10}, Media: []Medium{Air}}
	if _, err := afocal.Assess(Conditions{Object: Object{Z: math.Inf(-1), Aperture: Aperture{Beam: 4}}}); err == nil {
		t.Error("an afocal system has no focus to judge")
	}
}
