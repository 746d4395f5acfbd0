package optics

import (
	"fmt"
	"math"
	"math/rand/v2"
	"testing"
)

// thinLens is a lens of zero thickness, index n, power phi and shape
// factor B = (c1 + c2)/(c1 - c2), in air.
func thinLens(n, phi, b float64) System {
	k := phi / (n - 1)
	radius := func(c float64) float64 {
		if c == 0 {
			return math.Inf(1)
		}
		return 1 / c
	}
	return System{Surfaces: []Surface{Sphere(radius((b + 1) / 2 * k)), Sphere(radius((b - 1) / 2 * k))},
		Gaps: []float64{0}, Media: []Medium{Constant{"n", n}}}
}

// thinObject puts the object where a thin lens of power phi images it at
// magnification m (1/s' - 1/s = phi, m = s'/s; Hecht, Optics, 5th ed.,
// ch. 5), m = 0 meaning infinity, with the stop at the lens and a pupil of
// the given diameter.
func thinObject(phi, m, beam float64) Object {
	z := math.Inf(-1)
	if m != 0 {
		z = (1 - m) / (m * phi)
	}
	return Object{Z: z, Aperture: Aperture{Beam: beam}}
}

func TestThinLensSphericalShapeFactor(t *testing.T) {
	// The Seidel spherical aberration of a thin lens in air with the stop
	// at the lens, in terms of the shape factor B = (c1 + c2)/(c1 - c2) and
	// the conjugate factor C = (u + u')/(u - u') (Coddington's; Welford,
	// Aberrations of Optical Systems, 1986, the chapter on thin lenses,
	// from memory; also Kingslake, Lens Design Fundamentals):
	// S1 = y^4 phi^3/4 [ (n/(n-1))^2 + (n+2)/(n(n-1)^2) B^2
	//        + 4(n+1)/(n(n-1)) B C + (3n+2)/n C^2 ].
	rng := rand.New(rand.NewPCG(7, 8))
	for i := 0; i < 300; i++ {
		n, phi, b := 1.4+0.5*rng.Float64(), 0.005+0.02*rng.Float64(), -3+6*rng.Float64()
		m := []float64{0, -0.2, -0.5, -1, -3}[i%5]
		y := 1 + 4*rng.Float64()
		sd, err := thinLens(n, phi, b).Seidel(thinObject(phi, m, 2*y), 0, LineD, LineF, LineC)
		if err != nil {
			t.Fatal(err)
		}
		u1 := 0.0
		if m != 0 {
			u1 = -y * m * phi / (1 - m) // y / -s
		}
		u2 := u1 - y*phi
		c := (u1 + u2) / (u1 - u2)
		want := y * y * y * y * phi * phi * phi / 4 * (sq(n/(n-1)) + (n+2)/(n*sq(n-1))*b*b +
			4*(n+1)/(n*(n-1))*b*c + (3*n+2)/n*c*c)
		checkNear(t, fmt.Sprintf("S1 (n %.3f, B %.3f, m %g)", n, b, m), sd.S1, want, 1e-15, 1e-9)
	}
}

func TestBestFormShape(t *testing.T) {
	// The shape of least spherical aberration for a thin lens at infinite
	// conjugate, B = -2 (n^2 - 1) C / (n + 2) with C = -1, about +0.71 for
	// n = 1.5 (common textbook result; Welford 1986, thin lenses; Smith,
	// Modern Optical Engineering, 4th ed., ch. 6, from memory). Found here
	// by a golden-section search over the traced Seidel sum.
	for _, n := range []float64{1.5, 1.6, 1.8} {
		s1 := func(b float64) float64 {
			sd, _ := thinLens(n, 0.01, b).Seidel(thinObject(0.01, 0, 10), 0, LineD, LineF, LineC)
			return sd.S1
		}
		best := goldenMin(s1, -2, 3, 1e-9)
		checkNear(t, fmt.Sprintf("best B at n %g", n), best, 2*(n*n-1)/(n+2), 1e-6, 0)
		if n == 1.5 {
			checkNear(t, "best B at n 1.5", best, 0.714, 0.001, 0)
		}
	}
}

// goldenMin is a plain golden-section search for the minimum of a
// unimodal f on [a, b] (Press et al., Numerical Recipes, 3rd ed.,
// ch. 10).
func goldenMin(f func(float64) float64, a, b, tol float64) float64 {
	g := (math.Sqrt(5) - 1) / 2
	c, d := b-g*(b-a), a+g*(b-a)
	for b-a > tol {
		if f(c) < f(d) {
			b, d = d, c
			c = b - g*(b-a)
		} else {
			a, c = c, d
			d = a + g*(b-a)
		}
	}
	return (a + b) / 2
}

func TestPlanoConvexOrientationRatio(t *testing.T) {
	// A plano-convex lens focusing a collimated beam has far less
	// spherical aberration with its curved side toward the beam: for
	// n = 1.5 the third-order ratio is 36 / 9.33, about 4 (common
	// practice; Smith, Modern Optical Engineering, 4th ed., from memory; the values
	// follow from the shape-factor formula above with B = -1 and +1).
	curvedFirst, _ := thinLens(1.5, 0.01, 1).Seidel(thinObject(0.01, 0, 10), 0, LineD, LineF, LineC)
	flatFirst, _ := thinLens(1.5, 0.01, -1).Seidel(thinObject(0.01, 0, 10), 0, LineD, LineF, LineC)
	checkNear(t, "Seidel ratio", flatFirst.S1/curvedFirst.S1, 36/(9+28.0/3-40.0/3+13.0/3), 0, 1e-9)
	// The same with real rays through a thick stock-like lens, f = 100 mm,
	// 10 mm beam: the RMS spot at best focus.
	glass := Constant{"n", 1.5}
	pcx := singletOf(50, math.Inf(1), 4, glass)
	rms := func(p Part) float64 {
		tr := traceAtParaxialFocus(t, p.System(nil, nil), Object{Z: math.Inf(-1), Aperture: Aperture{Beam: 10}}, 0)
		return tr.BestFocus().RMS
	}
	// Third order gives 3.857; the part's thickness (4 mm at f = 100 mm)
	// and the higher orders at f/10 move the real-ray ratio by about 1 %
	// (3.898 measured), so 3 % is allowed and no more: a shape-factor
	// formula off by one term would miss it by far more.
	ratio := rms(pcx.Reversed()) / rms(pcx)
	checkNear(t, "real-ray RMS ratio flat-first / curved-first", ratio, 36/(9+28.0/3-40.0/3+13.0/3), 0, 0.03)
	t.Logf("real-ray ratio %.3f", ratio)
}

// traceAtParaxialFocus traces a 12-ring hexapolar bundle to the paraxial
// image plane.
func traceAtParaxialFocus(t *testing.T, sys System, obj Object, field float64) Traced {
	t.Helper()
	b, err := sys.Bundle(obj, field, LineD, Hexapolar(12))
	if err != nil {
		t.Fatal(err)
	}
	z, _, _ := sys.Cardinal(LineD).Image(obj.Z)
	return sys.Tracer(LineD).TraceBundle(b, z)
}

func TestThinLensFieldSums(t *testing.T) {
	// Thin lens in air with the stop at the lens (Welford 1986, thin
	// lenses, from memory): S3 = H^2 phi, S4 = H^2 phi / n, S5 = 0.
	rng := rand.New(rand.NewPCG(9, 10))
	for i := 0; i < 100; i++ {
		n, phi, b := 1.4+0.5*rng.Float64(), 0.01+0.02*rng.Float64(), -2+4*rng.Float64()
		m := []float64{0, -0.5, -2}[i%3]
		field := 2.0
		sd, err := thinLens(n, phi, b).Seidel(thinObject(phi, m, 6), field, LineD, LineF, LineC)
		if err != nil {
			t.Fatal(err)
		}
		h2 := sd.H * sd.H
		checkNear(t, "S3", sd.S3, h2*phi, 1e-15, 1e-9)
		checkNear(t, "S4", sd.S4, h2*phi/n, 1e-15, 1e-9)
		checkNear(t, "S5", sd.S5, 0, 1e-13, 0)
	}
}

func TestDistortionSumForm(t *testing.T) {
	// The division-free form of S5 used in addSurface against Welford's
	// surface form S5 = (Abar/A)(S3 + S4) (Welford 1986, ch. 7-8), for
	// random surfaces and rays with A away from zero.
	rng := rand.New(rand.NewPCG(11, 12))
	for i := 0; i < 500; i++ {
		cv, n1, n2 := (rng.Float64()-0.5)/10, 1+rng.Float64(), 1+rng.Float64()
		m := paraxialRay{rng.NormFloat64(), rng.NormFloat64() / 10}
		c := paraxialRay{rng.NormFloat64(), rng.NormFloat64() / 10}
		a, ab := n1*(m.u+m.y*cv), n1*(c.u+c.y*cv)
		if math.Abs(a) < 0.05 {
			continue
		}
		sd := Seidel{H: a*c.y - ab*m.y}
		sd.addSurface(Sphere(1/cv), n1, n2, 0, 0, m, c)
		checkNear(t, "S5", sd.S5, ab/a*(sd.S3+sd.S4), 1e-12, 1e-9)
	}
}

func TestConicSphericalSum(t *testing.T) {
	// The aspheric contribution cancels the sphere's S1 for the Cartesian
	// ellipsoid k = -1/n^2 at infinite conjugate, which real rays show
	// free of spherical aberration (TestCartesianEllipsoid; Hecht, Optics,
	// 5th ed., sec. 5.2.1).
	for _, n := range []float64{1.5, 1.7} {
		sys := surfaceSystem(Surface{Radius: 20, Conic: -1 / (n * n)}, 1, n)
		sd, err := sys.Seidel(Object{Z: math.Inf(-1), Aperture: Aperture{Beam: 10}}, 0, LineD, LineF, LineC)
		if err != nil {
			t.Fatal(err)
		}
		sphere, _ := surfaceSystem(Sphere(20), 1, n).Seidel(Object{Z: math.Inf(-1), Aperture: Aperture{Beam: 10}}, 0, LineD, LineF, LineC)
		checkNear(t, "S1 of the ellipsoid", sd.S1, 0, 1e-12*math.Abs(sphere.S1), 0)
		if sphere.S1 <= 0 {
			t.Errorf("the sphere's S1 %g should be positive (under-corrected)", sphere.S1)
		}
	}
}
