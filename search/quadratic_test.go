package search

import (
	"math"
	"testing"
)

func TestQuadRoots(t *testing.T) {
	tests := []struct {
		name       string
		a, b, c    float64
		want       []float64
		degenerate bool
	}{
		// (x-1)(x-2) = x^2 - 3x + 2.
		{"two roots", 1, -3, 2, []float64{1, 2}, false},
		// (x-3)^2.
		{"double root", 1, -6, 9, []float64{3}, false},
		{"no real root", 1, 0, 1, nil, false},
		// Linear: 2x + 4 = 0.
		{"linear", 0, 2, 4, []float64{-2}, false},
		// a = 1e-20: roots near -c/b = -1 and near -b/a = -1e20 (Numerical
		// Recipes, sec. 5.6: the naive formula loses the small root).
		{"nearly linear", 1e-20, 1, 1, []float64{-1e20, -1}, false},
		{"all zero", 0, 0, 0, nil, true},
		{"x squared", 1, 0, 0, []float64{0}, false},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			roots, n, deg := quadRoots(tt.a, tt.b, tt.c, 1, 1, 1)
			got := roots[:n]
			if deg != tt.degenerate || len(got) != len(tt.want) {
				t.Fatalf("roots %v degenerate %v, want %v %v", got, deg, tt.want, tt.degenerate)
			}
			for i := range got {
				if math.Abs(got[i]-tt.want[i]) > 1e-12*math.Max(1, math.Abs(tt.want[i])) {
					t.Errorf("root %d = %.17g, want %.17g", i, got[i], tt.want[i])
				}
			}
		})
	}
}
