package search

import (
	"cmp"
	"math"
	"math/rand/v2"
	"slices"
	"testing"

	"cardinal/optics"
)

// The candidate of a part turned around, derived from the part's own matrix
// as [D B; C A], has the cardinal points of the reversed part computed
// surface by surface by the optics package.
func TestReversedCandidate(t *testing.T) {
	glass, _ := optics.GlassCode("517642")
	flint, _ := optics.GlassCode("620364")
	doublet := optics.Part{Supplier: "TEST", Name: "ACH", Diameter: 25.4,
		Surfaces:  []optics.Surface{optics.Sphere(61.5), optics.Sphere(-44.2), optics.Sphere(-129.6)},
		Thickness: []float64{6, 2.5},
		Media:     []optics.Medium{glass, flint}}
	parts := []optics.Part{lens("PCX", 25.8, math.Inf(1), 5.3, 1.5168, 25.4), doublet,
		lens("MEN", 30, 80, 4, 1.7, 20)}
	for _, part := range parts {
		t.Run(part.Name, func(t *testing.T) {
			p := prepare(items(part), focusReq(100))
			want := part.Reversed().System(nil, nil).Cardinal(optics.LineD)
			found := false
			for _, c := range p.cands {
				if !c.rev {
					continue
				}
				found = true
				checkNear(t, "EFL", c.efl(), want.EFL, 1e-9, 1e-12)
				checkNear(t, "P", c.P, want.P, 1e-9, 1e-12)
				checkNear(t, "P'", c.Pp, want.PPrime, 1e-9, 1e-12)
				checkNear(t, "F", c.ffd(), want.F, 1e-9, 1e-12)
				checkNear(t, "F'", c.bfd(), want.FPrime, 1e-9, 1e-12)
				rs := part.Reversed().Surfaces
				s := &search{itemData: p.itemData}
				if first, last := s.firstSurface(&c), s.lastSurface(&c); first != rs[0] || last != rs[len(rs)-1] {
					t.Errorf("outer surfaces %v %v, want %v %v", first, last, rs[0], rs[len(rs)-1])
				}
			}
			if !found {
				t.Fatal("no reversed candidate")
			}
		})
	}
}

// The radix sort of byTier orders by tier, then power, then index, as the
// comparison sort does: random powers of both signs with repeats, and the
// infinities.
func TestRadixSortMatchesComparison(t *testing.T) {
	r := rand.New(rand.NewPCG(1, 2))
	for _, n := range []int{0, 1, 2, 9, 1000, 20000} {
		phis := make([]float64, n)
		keys := make([]sortKey, n)
		for i := range keys {
			phi := (r.Float64() - 0.5) * math.Pow(10, float64(r.IntN(6)-4))
			switch r.IntN(50) {
			case 0:
				phi = math.Inf(1)
			case 1:
				phi = math.Inf(-1)
			case 2, 3, 4:
				if i > 0 {
					phi = phis[r.IntN(i)] // a repeat
				}
			}
			if phi == 0 {
				phi = 1e-3
			}
			phis[i] = phi
			keys[i] = sortKey{u: orderedBits(phi), i: int32(i), tier: int8(r.IntN(8))}
			if back := fromOrderedBits(keys[i].u); back != phi {
				t.Fatalf("fromOrderedBits(orderedBits(%g)) = %g", phi, back)
			}
		}
		want := slices.Clone(keys)
		slices.SortFunc(want, func(a, b sortKey) int {
			if c := cmp.Compare(a.tier, b.tier); c != 0 {
				return c
			}
			if c := cmp.Compare(phis[a.i], phis[b.i]); c != 0 {
				return c
			}
			return cmp.Compare(a.i, b.i)
		})
		got := radixSort(keys, make([]sortKey, n))
		if !slices.Equal(got, want) {
			t.Errorf("%d keys: the radix sort's order differs from the comparison sort's", n)
		}
	}
}

// forestSize counts the nodes buildForest makes, so that their slice is
// allocated once.
func TestForestSize(t *testing.T) {
	r := rand.New(rand.NewPCG(3, 4))
	for _, n := range []int{0, 1, 8, 9, 17, 1000, 4097} {
		cs := make([]cand, n)
		for i := range cs {
			cs[i] = cand{phi: r.Float64() - 0.4, tier: int8(r.IntN(3))}
		}
		slices.SortFunc(cs, func(a, b cand) int {
			if c := cmp.Compare(a.tier, b.tier); c != 0 {
				return c
			}
			return cmp.Compare(a.phi, b.phi)
		})
		s := &search{c: cs, tree: &forest{}}
		s.buildForest()
		if got, want := forestSize(cs), len(s.tree.nodes); got != want {
			t.Errorf("%d candidates: forestSize %d, buildForest made %d nodes", n, got, want)
		}
	}
}
