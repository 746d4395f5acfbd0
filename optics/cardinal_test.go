package optics

import (
	"math"
	"math/rand/v2"
	"testing"
)

// randomSinglet draws a singlet in air with |R| >= 12 mm, so that it is a
// physical lens at 10 mm diameter.
func randomSinglet(rng *rand.Rand) (r1, r2, t, n float64) {
	radius := func() float64 {
		r := 12 + 400*rng.Float64()
		if rng.IntN(2) == 0 {
			r = -r
		}
		return r
	}
	return radius(), radius(), 1 + 9*rng.Float64(), 1.4 + 0.5*rng.Float64()
}

func TestThickLensFormulas(t *testing.T) {
	// Thick-lens lensmaker's equation and principal-plane positions
	// (Hecht, Optics, 5th ed., sec. 6.2.1, eqs. 6.2-6.4):
	//   1/f = (n-1) [1/R1 - 1/R2 + (n-1) d / (n R1 R2)]
	//   h1 = -f (n-1) d / (n R2),  h2 = -f (n-1) d / (n R1)
	// h1 from the first vertex, h2 from the second, positive to the right.
	rng := rand.New(rand.NewPCG(1, 2))
	for i := 0; i < 2000; i++ {
		r1, r2, d, n := randomSinglet(rng)
		c := singlet(r1, r2, d, n, 10).System(nil, nil).Cardinal(LineD)
		inv := (n - 1) * (1/r1 - 1/r2 + (n-1)*d/(n*r1*r2))
		if math.Abs(inv) < 1e-6 {
			continue
		}
		f := 1 / inv
		h1 := -f * (n - 1) * d / (n * r2)
		h2 := -f * (n - 1) * d / (n * r1)
		checkNear(t, "EFL", c.EFL, f, 0, 1e-9)
		checkNear(t, "P", c.P, h1, 1e-12, 1e-9)
		checkNear(t, "P'", c.PPrime, h2, 1e-12, 1e-9)
		checkNear(t, "BFD", c.BFD(), f+h2, 1e-9, 1e-9)
		checkNear(t, "FFD", c.FFD(), -f+h1, 1e-9, 1e-9)
		checkNear(t, "det", c.Matrix.Det(), 1, 1e-12, 0)
	}
}

func TestGullstrand(t *testing.T) {
	// Gullstrand's equation for two systems in air separated by e between
	// the first's back principal plane and the second's front one:
	// phi = phi1 + phi2 - e phi1 phi2 (Hecht, Optics, 5th ed., sec. 6.2.1;
	// Smith, Modern Optical Engineering, 4th ed., sec. 4.1).
	rng := rand.New(rand.NewPCG(3, 4))
	for i := 0; i < 1000; i++ {
		a := singlet(singletArgs(randomSinglet(rng)))
		b := singlet(singletArgs(randomSinglet(rng)))
		gap := 50 * rng.Float64()
		ca := a.System(nil, nil).Cardinal(LineD)
		cb := b.System(nil, nil).Cardinal(LineD)
		e := -ca.PPrime + gap + cb.P
		want := ca.Power + cb.Power - e*ca.Power*cb.Power
		got := Assemble(nil, nil, []Part{a, b}, []float64{gap}).Cardinal(LineD).Power
		checkNear(t, "power", got, want, 1e-15, 1e-9)
	}
}

func singletArgs(r1, r2, t, n float64) (float64, float64, float64, float64, float64) {
	return r1, r2, t, n, 10
}

func TestNewton(t *testing.T) {
	// Newton's equation x x' = f f' (Hecht, Optics, 5th ed., ch. 5, with
	// f = P to F and f' = P' to F' for unequal media) for random conjugates
	// found by the matrix method, including an object in water.
	water, _ := BuiltinGlasses().Lookup("water")
	rng := rand.New(rand.NewPCG(5, 6))
	for i := 0; i < 1000; i++ {
		p := singlet(singletArgs(randomSinglet(rng)))
		var in Medium
		if i%2 == 1 {
			in = water
		}
		c := p.System(in, nil).Cardinal(LineD)
		z := c.F + 500*(rng.Float64()-0.5)
		zi, mag, st := c.Image(z)
		if st != Solved {
			continue
		}
		x, xi := z-c.F, zi-c.FPrime
		checkNear(t, "x x'", x*xi, c.FFront*c.FBack, 1e-9, 1e-9)
		checkNear(t, "NewtonImage", c.NewtonImage(x), xi, 1e-9, 1e-9)
		checkNear(t, "m = -f/x", mag, -c.FFront/x, 1e-12, 1e-9)
		// The magnification solve returns the same planes.
		zo2, zi2, _ := c.ForMagnification(mag)
		checkNear(t, "object", zo2, z, 1e-9, 1e-9)
		checkNear(t, "image", zi2, zi, 1e-9, 1e-9)
	}
}

func TestPlanoConvexPrincipalPoint(t *testing.T) {
	// A plano-convex lens has one principal point on its curved vertex
	// (common practice; Hecht, Optics, 5th ed., sec. 6.2.1: h1 = -f(n-1)d/(n R2),
	// zero when R2 is infinite).
	pcx := singlet(51.5, math.Inf(1), 4, 1.5168, 25)
	c := pcx.System(nil, nil).Cardinal(LineD)
	checkNear(t, "P at curved vertex", c.P, 0, 1e-12, 0)
	cr := pcx.Reversed().System(nil, nil).Cardinal(LineD)
	checkNear(t, "reversed: P' at curved vertex", cr.PPrime, 0, 1e-12, 0)
}

func TestSymmetricBiconvex(t *testing.T) {
	// Principal points of a symmetric biconvex lens lie symmetrically, about a
	// third of the thickness in from each vertex for n near 1.5 (common
	// practice: h = f (n-1) d/(n R) -> d/(2n) for a thin-ish lens).
	for _, d := range []float64{3, 6, 9} {
		c := singlet(100, -100, d, 1.5, 25).System(nil, nil).Cardinal(LineD)
		checkNear(t, "symmetry", c.P, -c.PPrime, 1e-12, 1e-12)
		checkNear(t, "third", c.P, d/3, 0, 0.02)
	}
}

func TestNodalPoints(t *testing.T) {
	water, _ := BuiltinGlasses().Lookup("water")
	p := singlet(40, -60, 5, 1.6, 20)
	// Same medium both sides: nodal points on the principal points
	// (common practice).
	c := p.System(nil, nil).Cardinal(LineD)
	checkNear(t, "N = P", c.N, c.P, 1e-12, 0)
	checkNear(t, "N' = P'", c.NPrime, c.PPrime, 1e-12, 0)
	// Water in front: both shift by (n' - n)/phi (Smith, ch. 2; common practice).
	cw := p.System(water, nil).Cardinal(LineD)
	shift := (cw.NImage - cw.NObject) / cw.Power
	checkNear(t, "PN", cw.N-cw.P, shift, 1e-12, 1e-12)
	checkNear(t, "P'N'", cw.NPrime-cw.PPrime, shift, 1e-12, 1e-12)
	// A ray aimed at N leaves from N' at the same angle (angular
	// magnification +1); one aimed at the anti-nodal point leaves at the
	// opposite angle.
	for _, tc := range []struct {
		from, to, gamma float64
	}{{cw.N, cw.NPrime, 1}, {cw.AN, cw.ANPrime, -1}} {
		u := 0.01
		y0 := -tc.from * u // height at the first vertex of a ray through the point
		y1, nu1 := cw.Matrix.Apply(y0, cw.NObject*u)
		u1 := nu1 / cw.NImage
		checkNear(t, "angular magnification", u1/u, tc.gamma, 1e-12, 1e-9)
		checkNear(t, "exit point", -y1/u1, tc.to, 1e-9, 1e-9)
	}
}

func TestPrincipalAndAntiPrincipalImaging(t *testing.T) {
	// Principal planes image onto each other with magnification +1,
	// anti-principal planes with -1 (their definitions).
	water, _ := BuiltinGlasses().Lookup("water")
	for _, p := range []Part{singlet(40, -60, 5, 1.6, 20), singlet(-30, -80, 4, 1.7, 20)} {
		c := p.System(water, nil).Cardinal(LineD)
		zi, m, _ := c.Image(c.P)
		checkNear(t, "P -> P'", zi, c.PPrime, 1e-9, 1e-9)
		checkNear(t, "m(P)", m, 1, 1e-12, 1e-9)
		zi, m, _ = c.Image(c.AP)
		checkNear(t, "AP -> AP'", zi, c.APPrime, 1e-9, 1e-9)
		checkNear(t, "m(AP)", m, -1, 1e-12, 1e-9)
	}
}

func TestReversal(t *testing.T) {
	// Turning a part around swaps its front and back points (invariant).
	rng := rand.New(rand.NewPCG(7, 8))
	for i := 0; i < 200; i++ {
		p := singlet(singletArgs(randomSinglet(rng)))
		c := p.System(nil, nil).Cardinal(LineD)
		r := p.Reversed().System(nil, nil).Cardinal(LineD)
		checkNear(t, "EFL", r.EFL, c.EFL, 1e-12, 1e-12)
		checkNear(t, "F", r.F, -c.FPrime, 1e-9, 1e-12)
		checkNear(t, "P", r.P, -c.PPrime, 1e-9, 1e-12)
		checkNear(t, "AN'", r.ANPrime, -c.AN, 1e-9, 1e-12)
	}
}

func TestThinLensLimit(t *testing.T) {
	// As the thickness goes to zero, EFL tends to the thin-lens lensmaker's
	// value and the principal points to the vertices (Hecht, Optics, 5th
	// ed., sec. 5.2.3).
	n, r1, r2 := 1.5, 60.0, -90.0
	f0 := 1 / ((n - 1) * (1/r1 - 1/r2))
	c := singlet(r1, r2, 1e-7, n, 10).System(nil, nil).Cardinal(LineD)
	checkNear(t, "EFL", c.EFL, f0, 0, 1e-8)
	checkNear(t, "P", c.P, 0, 1e-6, 0)
}

func TestAfocalPair(t *testing.T) {
	// Two positive lenses spaced so that F1' meets F2: a Keplerian
	// telescope, afocal, with lateral magnification -f2/f1 (common practice).
	a := singlet(51.5, -51.5, 4, 1.5, 20)
	b := singlet(103, -103, 4, 1.5, 30)
	ca := a.System(nil, nil).Cardinal(LineD)
	cb := b.System(nil, nil).Cardinal(LineD)
	gap := ca.BFD() - cb.FFD()
	c := Assemble(nil, nil, []Part{a, b}, []float64{gap}).Cardinal(LineD)
	if !c.Afocal {
		t.Fatalf("expected afocal, power %g", c.Power)
	}
	checkNear(t, "lateral", c.LateralMagnification, -cb.EFL/ca.EFL, 1e-9, 1e-9)
	checkNear(t, "angular", c.AngularMagnification, -ca.EFL/cb.EFL, 1e-9, 1e-9)
	for _, v := range []float64{c.EFL, c.F, c.P, c.AN} {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			t.Errorf("afocal system has non-finite field %g", v)
		}
	}
	// A finite object still has an image through an afocal system, at
	// constant magnification.
	_, m, st := c.Image(-200)
	if st != Solved {
		t.Fatalf("status %v", st)
	}
	checkNear(t, "afocal imaging", m, -cb.EFL/ca.EFL, 1e-9, 1e-9)
}
