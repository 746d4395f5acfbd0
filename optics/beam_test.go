package optics

import (
	"math"
	"testing"
)

func TestGaussianFreeSpace(t *testing.T) {
	// w(z) = w0 sqrt(1 + (z/zR)^2), zR = pi w0^2 / lambda, divergence
	// lambda/(pi w0) (Siegman, Lasers, 1986, ch. 17).
	g := NewGaussianBeam(632.8, 0.5, 0, 1)
	zr := math.Pi * 0.25 / 632.8e-6
	checkNear(t, "zR", g.RayleighRange(), zr, 0, 1e-12)
	for _, z := range []float64{-2000, 0, 500, 5000} {
		w := g.Propagate(z).Radius()
		checkNear(t, "w(z)", w, 0.5*math.Sqrt(1+z*z/(zr*zr)), 0, 1e-12)
	}
	checkNear(t, "divergence", g.Divergence(), 632.8e-6/(math.Pi*0.5), 0, 1e-12)
}

func TestGaussianThinLensFocus(t *testing.T) {
	// A waist at a thin lens of focal length f is refocused to a waist
	// f / (1 + (f/zR)^2) behind it, of radius
	// (f lambda/(pi w0)) / sqrt(1 + (f/zR)^2) (S. A. Self, "Focusing of
	// spherical Gaussian beams", Appl. Opt. 22, 658-661 (1983), with the
	// input waist at the lens; from memory).
	for _, tc := range []struct{ w0, f float64 }{{1, 100}, {0.2, 50}, {2, 500}} {
		g := NewGaussianBeam(1064, tc.w0, 0, 1)
		zr := g.RayleighRange()
		out := g.Through(Refraction(1/tc.f), 1)
		k := 1 + sq(tc.f/zr)
		checkNear(t, "waist distance", -out.WaistDistance(), tc.f/k, 0, 1e-9)
		checkNear(t, "waist radius", out.WaistRadius(), tc.f*1064e-6/(math.Pi*tc.w0)/math.Sqrt(k), 0, 1e-9)
	}
}

func TestGaussianThroughPlate(t *testing.T) {
	// A plane-parallel plate of thickness t and index n moves a focus
	// (ray or beam) away by t (1 - 1/n) (Smith, Modern Optical Engineering,
	// 4th ed., ch. 4 on plane-parallel plates; Siegman 1986, ch. 20: the
	// reduced distance t/n), and the waist size is unchanged.
	n, thick := 1.5, 10.0
	plate := System{Surfaces: []Surface{{}, {}}, Gaps: []float64{thick}, Media: []Medium{Constant{"n", n}}}
	g := NewGaussianBeam(632.8, 0.05, -40, 1) // waist 40 mm past the plate's front
	out := plate.Beam(g)
	checkNear(t, "waist from the back face", -out.WaistDistance(), 40-thick+thick*(1-1/n), 0, 1e-12)
	checkNear(t, "waist radius", out.WaistRadius(), 0.05, 0, 1e-12)
	if out.N != 1 {
		t.Errorf("output index %g", out.N)
	}
}
