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
	// 4th ed., on plane-parallel plates, from memory for the chapter; Siegman 1986, ch. 20: the
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

func TestGaussianFocusSelf(t *testing.T) {
	// S. A. Self, "Focusing of spherical Gaussian beams", Appl. Opt. 22,
	// 658-661 (1983), eqs. (9) and (11): a waist w0 (Rayleigh range zR) at
	// a distance s before a thin lens f is imaged to a waist at s'' with
	// 1/(s + zR^2/(s - f)) + 1/s'' = 1/f, of radius m w0 with
	// m = 1 / sqrt((1 - s/f)^2 + (zR/f)^2). The cases include an input
	// Rayleigh range comparable to f, where the waist lies well before the
	// paraxial focus (s = 0: s'' = f / (1 + (f/zR)^2)).
	for _, tc := range []struct {
		name         string
		w0, s, f, wl float64
	}{
		{"zR comparable to f, waist at the lens", 0.5, 0, 500, 1064},
		{"waist 300 mm before", 0.3, 300, 200, 632.8},
		{"waist inside f", 0.1, 40, 100, 1064},
		{"diverging lens", 0.4, 150, -80, 532},
	} {
		t.Run(tc.name, func(t *testing.T) {
			g := NewGaussianBeam(tc.wl, tc.w0, tc.s, 1)
			zr := g.RayleighRange()
			out := g.Through(Refraction(1/tc.f), 1)
			sPP := 1 / (1/tc.f - 1/(tc.s+zr*zr/(tc.s-tc.f)))
			m := 1 / math.Sqrt(sq(1-tc.s/tc.f)+sq(zr/tc.f))
			checkNear(t, "waist position s''", -out.WaistDistance(), sPP, 1e-9, 1e-9)
			checkNear(t, "waist radius", out.WaistRadius(), m*tc.w0, 0, 1e-9)
		})
	}
	// The case the issue names: the waist of a 0.5 mm beam at 1064 nm
	// through f = 500 mm lies at 342.7 mm, far before the paraxial focus
	// (Self 1983, eq. (9) with s = 0, evaluated by hand).
	out := NewGaussianBeam(1064, 0.5, 0, 1).Through(Refraction(1.0/500), 1)
	checkNear(t, "waist before the paraxial focus", -out.WaistDistance(), 342.7, 0.1, 0)
}

func TestEmbeddedGaussian(t *testing.T) {
	// A collimated beam of quality M^2 and waist W0 focused by f has a
	// waist M^2 lambda f / (pi W0) in the far-field limit and diverges at
	// M^2 lambda / (pi W0) (Siegman, Proc. SPIE 1224, 2 (1990); ISO
	// 11146-1; from memory).
	for _, m2 := range []float64{1, 1.3, 4} {
		g := NewEmbeddedBeam(1064, 2, 0, 1, m2)
		checkNear(t, "waist", g.WaistRadius(), 2, 0, 1e-12)
		checkNear(t, "divergence", g.Divergence(), m2*1064e-6/(math.Pi*2), 0, 1e-12)
		out := g.Through(Refraction(1.0/50), 1)
		checkNear(t, "focused waist", out.WaistRadius(), m2*1064e-6*50/(math.Pi*2), 0, 1e-3)
		if out.Quality() != m2 {
			t.Errorf("M^2 after a lens %g, want %g", out.Quality(), m2)
		}
	}
}
