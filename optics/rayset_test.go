package optics

import (
	"fmt"
	"math"
	"testing"
)

func TestHexapolarMoments(t *testing.T) {
	// Mean of rho^(2k) over the unit disc is 1/(k+1), of x^2 is 1/4 and of
	// x^2 y^2 is 1/24 (elementary integrals over the disc); the
	// Gauss-Legendre rings integrate these exactly.
	pts := Hexapolar(12)
	if len(pts) != 468 {
		t.Fatalf("12 rings give %d points, want 468", len(pts))
	}
	moment := func(f func(x, y float64) float64) float64 {
		s := 0.0
		for _, p := range pts {
			s += p.Weight * f(p.X, p.Y)
		}
		return s
	}
	checkNear(t, "sum of weights", moment(func(x, y float64) float64 { return 1 }), 1, 1e-14, 0)
	for k := 1; k <= 10; k++ {
		got := moment(func(x, y float64) float64 { return math.Pow(x*x+y*y, float64(k)) })
		checkNear(t, fmt.Sprintf("mean rho^%d", 2*k), got, 1/float64(k+1), 1e-13, 0)
	}
	checkNear(t, "mean x^2", moment(func(x, y float64) float64 { return x * x }), 0.25, 1e-14, 0)
	checkNear(t, "mean x^2 y^2", moment(func(x, y float64) float64 { return x * x * y * y }), 1.0/24, 1e-14, 0)
	checkNear(t, "mean y", moment(func(x, y float64) float64 { return y }), 0, 1e-15, 0)
}

func TestGridsAndFans(t *testing.T) {
	for _, tc := range []struct {
		name  string
		pts   []PupilPoint
		count float64 // about pi n^2 / 4 for the square grid: the disc's share
		rho2  float64 // mean rho^2; 1/2 over the disc
		tol   float64
	}{
		{"square 30", SquareGrid(30), math.Pi * 900 / 4, 0.5, 0.01},
		{"fan 11", MeridionalFan(11), 11, 0.4, 1e-12}, // mean of y^2 over 11 even steps on [-1, 1]
		{"hexapolar 1", Hexapolar(1), 6, 0.5, 1e-15},
	} {
		t.Run(tc.name, func(t *testing.T) {
			checkNear(t, "points", float64(len(tc.pts)), tc.count, 0, 0.02)
			var sw, s2 float64
			for _, p := range tc.pts {
				if p.X*p.X+p.Y*p.Y > 1+1e-15 {
					t.Fatalf("point %v outside the pupil", p)
				}
				sw, s2 = sw+p.Weight, s2+p.Weight*(p.X*p.X+p.Y*p.Y)
			}
			checkNear(t, "weights", sw, 1, 1e-12, 0)
			checkNear(t, "mean rho^2", s2, tc.rho2, tc.tol, 0)
		})
	}
}
