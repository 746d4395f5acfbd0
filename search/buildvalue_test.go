package search

import (
	"math"
	"math/rand/v2"
	"slices"
	"testing"

	"cardinal/optics"
)

func TestBuildValueIsBuildBitForBit(t *testing.T) {
	// The study compensates its builds on plain numbers (buildValue); its
	// figures stay those of the model carried with derivatives (build) only
	// if every build gives the very same numbers: compared with ==, for
	// every kind, compensator and distribution, with radius tolerances too.
	withRadius := optics.Tolerances{EFLPct: 2, Thickness: 0.2, Index: 0.002, RadiusPct: 0.5}
	for _, c := range setups(t) {
		for _, dist := range []Distribution{Uniform, Normal} {
			for _, radius := range []bool{false, true} {
				name := c.name + " " + string(dist)
				if radius {
					name += " radius"
				}
				t.Run(name, func(t *testing.T) {
					su := c.su
					if radius {
						su.Tols = []optics.Tolerances{withRadius, withRadius}
					}
					m, err := newModel(c.req, su)
					if err != nil {
						t.Fatal(err)
					}
					r1, r2 := rand.New(rand.NewPCG(7, 9)), rand.New(rand.NewPCG(7, 9))
					d, v := make(draw, len(m.params)), make([]float64, len(m.params))
					for i := 0; i < 3000; i++ {
						want, wantOK := buildDual(m, r1, dist, d)
						got, gotOK := m.buildValue(r2, dist, v)
						if gotOK != wantOK || got.ok != want.ok || got.adjust.V != want.adjust.V || got.figure.V != want.figure.V || got.at != want.at {
							t.Fatalf("build %d: value path %+v (%v), dual path %+v (%v)", i, got, gotOK, want, wantOK)
						}
					}
				})
			}
		}
	}
}

func TestPercentilesFromHeapsAreBySort(t *testing.T) {
	// Finding the order statistics in a heap must give what sorting gives (the
	// definition of an order statistic), exactly, with ties and with the
	// percentiles asked in any order.
	sorted := func(v []float64, p float64) float64 { // definition 7 of Hyndman and Fan (1996), on a sorted copy
		s := slices.Sorted(slices.Values(v))
		h := (float64(len(s)) - 1) * p / 100
		i := int(h)
		if i+1 >= len(s) {
			return s[len(s)-1]
		}
		return s[i] + (h-float64(i))*(s[i+1]-s[i])
	}
	rng := rand.New(rand.NewPCG(1, 2))
	for _, n := range []int{1, 2, 3, 5, 40, 1000, 1001} {
		for rep := 0; rep < 30; rep++ {
			v := make([]float64, n)
			for i := range v {
				v[i] = rng.NormFloat64()
				if rep%3 == 0 {
					v[i] = float64(rng.IntN(4)) // many ties
				}
			}
			orig := slices.Clone(v)
			for _, ps := range [][2]float64{{2.5, 97.5}, {50, 50}, {97.5, 2.5}, {0, 100}} {
				lo, hi := percentiles(v, ps[0], ps[1])
				if lo != sorted(v, ps[0]) || hi != sorted(v, ps[1]) {
					t.Fatalf("n %d, percentiles %v: got %v %v, want %v %v", n, ps, lo, hi, sorted(v, ps[0]), sorted(v, ps[1]))
				}
			}
			if !slices.Equal(v, orig) {
				t.Fatal("percentiles changed its input")
			}
		}
	}
}

// buildDual draws one build's departures into d and compensates it with
// the model carried with derivatives (eval): the reference buildValue
// must equal.
func buildDual(m *model, rng *rand.Rand, dist Distribution, d draw) (t trial, ok bool) {
	for j, p := range m.params {
		d[j] = optics.Const(p.Tol * unitDraw(rng, dist))
	}
	t = m.eval(d)
	return t, t.ok && !math.IsNaN(t.figure.V) && !math.IsInf(t.figure.V, 0) && !math.IsNaN(t.adjust.V)
}
