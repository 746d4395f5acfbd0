package optics

import (
	"fmt"
	"math"
	"testing"
)

func TestWavefrontPerfectFocus(t *testing.T) {
	// The Cartesian ellipsoid focuses a plane wave perfectly (Hecht,
	// Optics, 5th ed., sec. 5.2.1): every path to the focus is equal
	// (Fermat).
	n := 1.5
	sys := surfaceSystem(Surface{Radius: 20, Conic: -1 / (n * n)}, 1, n)
	b, err := sys.Bundle(Object{Z: math.Inf(-1), Aperture: Aperture{Beam: 16}}, 0, LineD, Hexapolar(8))
	if err != nil {
		t.Fatal(err)
	}
	focus := n * 20 / (n - 1)
	tr := sys.Tracer(LineD).TraceBundle(b, focus)
	w, err := tr.Wavefront(Vec3{Z: focus})
	if err != nil {
		t.Fatal(err)
	}
	checkNear(t, "RMS waves", w.RMS, 0, 1e-6, 0)
	if !w.DiffractionLimited() {
		t.Error("a perfect focus is diffraction limited")
	}
}

func TestWavefrontThirdOrderSpherical(t *testing.T) {
	// Primary spherical W = (S1/8) rho^4: against the paraxial focus its
	// RMS over the disc is (S1/8) sqrt(1/5 - 1/9) = (S1/8) 2/sqrt(45);
	// against the best reference sphere, defocus removed, (S1/8)/sqrt(180)
	// (V. N. Mahajan, Optical Imaging and Aberrations, Part I, 1998,
	// ch. 8 on Zernike polynomials, from memory; Born and Wolf, ch. 9).
	sys := pcx100().System(nil, nil)
	for _, tc := range []struct{ beam, tol float64 }{{8, 0.01}, {4, 0.003}} {
		obj := Object{Z: math.Inf(-1), Aperture: Aperture{Beam: tc.beam}}
		sd, _ := sys.Seidel(obj, 0, LineD, LineF, LineC)
		tr := traceAtParaxialFocus(t, sys, obj, 0)
		lambda := LineD * 1e-6
		centre := Vec3{Z: tr.Tracer.LastVertex() + tr.ImageZ}
		w, err := tr.Wavefront(centre)
		if err != nil {
			t.Fatal(err)
		}
		checkNear(t, fmt.Sprintf("beam %g: RMS at paraxial focus", tc.beam), w.RMS, sd.S1/8*2/math.Sqrt(45)/lambda, 0, tc.tol)
		best, err := tr.BestWavefront(centre)
		if err != nil {
			t.Fatal(err)
		}
		checkNear(t, fmt.Sprintf("beam %g: RMS at best reference", tc.beam), best.RMS, sd.S1/8/math.Sqrt(180)/lambda, 0, tc.tol)
	}
}

func TestBestWavefrontOffAxis(t *testing.T) {
	// Moving the reference centre never makes the RMS worse, and the
	// Marechal line separates a slow lens from a fast one (f/25 and f/4.4
	// plano-convex, f = 100 mm; common practice).
	sys := pcx100().System(nil, nil)
	for _, tc := range []struct {
		beam  float64
		field float64
		dl    bool
	}{{4, 0, true}, {4, 1, true}, {22.8, 0, false}} {
		tr := traceAtParaxialFocus(t, sys, Object{Z: math.Inf(-1), Aperture: Aperture{Beam: tc.beam}}, tc.field)
		chief := tr.Tracer.Trace(tr.Chief(), tr.ImageZ)
		w, _ := tr.Wavefront(chief.Image)
		best, err := tr.BestWavefront(chief.Image)
		if err != nil {
			t.Fatal(err)
		}
		if best.RMS > w.RMS*(1+1e-9) {
			t.Errorf("beam %g field %g: best reference RMS %g above %g", tc.beam, tc.field, best.RMS, w.RMS)
		}
		if best.DiffractionLimited() != tc.dl {
			t.Errorf("beam %g field %g: RMS %g waves, diffraction limited %v, want %v", tc.beam, tc.field, best.RMS, best.DiffractionLimited(), tc.dl)
		}
	}
}
