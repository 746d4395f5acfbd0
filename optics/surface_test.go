package optics

import (
	"math"
	"strings"
	"testing"
)

func TestSag(t *testing.T) {
	// Sphere: z = R - sqrt(R^2 - h^2) (geometry). Paraboloid (k = -1):
	// z = h^2/(2R). Polynomial term added as written in ISO 10110-12.
	checkNear(t, "sphere", must(Sphere(50).Sag(12.5)), 50-math.Sqrt(2500-156.25), 1e-12, 0)
	checkNear(t, "concave", must(Sphere(-50).Sag(12.5)), -(50 - math.Sqrt(2500-156.25)), 1e-12, 0)
	checkNear(t, "plane", must(Surface{}.Sag(7)), 0, 0, 0)
	par := Surface{Radius: 40, Conic: -1}
	checkNear(t, "paraboloid", must(par.Sag(10)), 100.0/80, 1e-12, 0)
	asph := Surface{Radius: 40, Conic: -1, Asph: [7]float64{1e-5, -2e-8}}
	checkNear(t, "asphere", must(asph.Sag(10)), 100.0/80+1e-5*1e4-2e-8*1e6, 1e-12, 0)
	if _, ok := Sphere(5).Sag(6); ok {
		t.Error("a sphere of radius 5 has no point at h = 6")
	}
	// Slope against a central difference.
	for _, h := range []float64{0.5, 3, 9} {
		fd := (must(asph.Sag(h+1e-6)) - must(asph.Sag(h-1e-6))) / 2e-6
		checkNear(t, "slope", asph.SagSlope(h), fd, 1e-7, 1e-7)
	}
}

func must(z float64, ok bool) float64 {
	if !ok {
		panic("no sag")
	}
	return z
}

func TestEdgeThickness(t *testing.T) {
	// Biconvex R = 50 mm both sides, t = 5 mm, D = 25 mm: ET = t - 2 sag
	// (geometry).
	et, err := singlet(50, -50, 5, 1.5, 25).EdgeThickness()
	if err != nil {
		t.Fatal(err)
	}
	checkNear(t, "ET", et, 5-2*(50-math.Sqrt(2500-156.25)), 1e-12, 0)
	// Plano-concave: thicker at the edge.
	et, _ = singlet(math.Inf(1), 30, 2, 1.5, 25).EdgeThickness()
	checkNear(t, "ET concave", et, 2+30-math.Sqrt(900-156.25), 1e-12, 0)
}

func TestValidate(t *testing.T) {
	cases := []struct {
		name string
		part Part
		want []string
	}{
		{"radius too small", singlet(4, -50, 5, 1.5, 12.7), []string{"r1: radius 4 mm is smaller than the 6.35 mm semi-diameter"}},
		{"thickness", singlet(50, -50, 0, 1.5, 12.7), []string{"t1: thickness must be positive"}},
		{"negative edge", singlet(20, -20, 1, 1.5, 25), []string{"t1: the element between surfaces 1 and 2 has a negative edge thickness"}},
		{"diameter", singlet(50, -50, 3, 1.5, -1), []string{"diameter: must be a positive"}},
		{"ok", singlet(50, -50, 5, 1.5, 25), nil},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			err := c.part.Validate()
			if c.want == nil {
				if err != nil {
					t.Fatalf("unexpected %v", err)
				}
				return
			}
			if err == nil {
				t.Fatal("expected an error")
			}
			for _, w := range c.want {
				if !strings.Contains(err.Error(), w) {
					t.Errorf("error %q lacks %q", err, w)
				}
			}
		})
	}
}

func TestSymmetric(t *testing.T) {
	if !singlet(50, -50, 5, 1.5, 25).Symmetric() {
		t.Error("equiconvex lens is symmetric")
	}
	if singlet(50, math.Inf(1), 5, 1.5, 25).Symmetric() {
		t.Error("plano-convex lens is not symmetric")
	}
}

func TestWindowIsSymmetric(t *testing.T) {
	w := singlet(math.Inf(1), math.Inf(1), 3, 1.5, 25)
	if !w.Symmetric() {
		t.Error("a flat window is symmetric")
	}
	if !w.Reversed().Surfaces[0].IsPlane() {
		t.Error("a reversed plane is a plane")
	}
}
