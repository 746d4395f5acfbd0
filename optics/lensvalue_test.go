package optics

import (
	"math"
	"math/rand/v2"
	"testing"
)

func TestMatrixValueIsMatrixBitForBit(t *testing.T) {
	// MatrixValue is a faster form of Matrix for builds that need no
	// derivative; a study's figures stay the same only if it returns the
	// very same numbers (an invariant of the two forms, compared with ==,
	// not a tolerance), for every kind of part and departure.
	doublet, airSpaced := multiPieceParts()
	rng := rand.New(rand.NewPCG(1, 2))
	for _, tc := range []struct {
		name   string
		p      Part
		radius bool
	}{
		{"plano-convex", singlet(51.7, math.Inf(1), 4, 1.517, 25), false},
		{"biconvex with radius errors", singlet(60, -80, 5, 1.6, 25), true},
		{"negative meniscus", singlet(-30, -90, 2, 1.7, 25), false},
		{"thick ball-like", singlet(5, -5, 9.5, 1.8, 10), true},
		{"doublet", doublet, true},
		{"air-spaced", airSpaced, false},
	} {
		t.Run(tc.name, func(t *testing.T) {
			l := NewLens(tc.p, LineD, Tolerances{})
			els := l.Elements()
			for trial := 0; trial < 2000; trial++ {
				var o Offsets
				var d Departure
				if trial%7 != 0 { // every seventh build has no focal-length error
					o.Focal = 0.02 * (2*rng.Float64() - 1)
				}
				d.Focal = Const(o.Focal)
				if tc.radius {
					o.Radius, d.Radius = make([]float64, len(l.Curv)), make([]Dual, len(l.Curv))
					for i := range o.Radius {
						o.Radius[i] = 0.01 * rng.NormFloat64()
						d.Radius[i] = Const(o.Radius[i])
					}
				}
				if trial%5 != 0 { // and every fifth no thickness or index error
					o.Thick, o.Index = make([]float64, els), make([]float64, els)
					d.Thick, d.Index = make([]Dual, els), make([]Dual, els)
					for i := 0; i < els; i++ {
						o.Thick[i], o.Index[i] = 0.1*(2*rng.Float64()-1), 0.001*(2*rng.Float64()-1)
						d.Thick[i], d.Index[i] = Const(o.Thick[i]), Const(o.Index[i])
					}
				}
				if got, want := l.curvatureFactorValue(o.Focal), l.curvatureFactor(d.Focal).V; got != want {
					t.Fatalf("build %d: curvature factor %v, want %v", trial, got, want)
				}
				want, wantLen := l.Matrix(d)
				got, gotLen := l.MatrixValue(o)
				if got != want.Value() || gotLen != wantLen.V {
					t.Fatalf("build %d, offsets %+v: MatrixValue %v length %v, Matrix %v length %v", trial, o, got, gotLen, want.Value(), wantLen.V)
				}
			}
		})
	}
}

func BenchmarkMatrixValue(b *testing.B) {
	l := NewLens(singlet(60, -80, 5, 1.6, 25), LineD, Tolerances{})
	o := Offsets{Focal: 0.01, Thick: []float64{0.05}, Index: []float64{-0.0005}}
	d := Departure{Focal: Const(0.01), Thick: []Dual{Const(0.05)}, Index: []Dual{Const(-0.0005)}}
	b.Run("value", func(b *testing.B) {
		for b.Loop() {
			l.MatrixValue(o)
		}
	})
	b.Run("dual", func(b *testing.B) {
		for b.Loop() {
			l.Matrix(d)
		}
	})
}
