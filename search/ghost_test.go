package search

import (
	"math"
	"testing"

	"cardinal/optics"
)

// resultSystem is a result's layout built from the items by the optics
// package alone.
func resultSystem(its []Item, r Result) optics.System {
	var parts []optics.Part
	for _, u := range r.Parts {
		for _, it := range its {
			if it.Entry.Part.Supplier == u.Supplier && it.Entry.Part.Name == u.Part {
				p := it.Entry.Part
				if u.Reversed {
					p = p.Reversed()
				}
				parts = append(parts, p)
			}
		}
	}
	var gaps []float64
	if r.Gap != nil {
		gaps = []float64{*r.Gap}
	}
	return optics.Assemble(nil, nil, parts, gaps)
}

// ResultGhosts lists the ghosts a result's worst ghost was chosen from:
// its first is that ghost, for singles and pairs, focus and mode
// matching, coated parts or not; a coated part's ghosts say so.
func TestResultGhostsAsJudged(t *testing.T) {
	a, b := equiconvex("A", 60, 4, 25), equiconvex("B", 120, 4, 25)
	coated := equiconvex("C", 80, 4, 25)
	coated.Coating = optics.Coating{Stated: true, ResidualPct: 0.3}
	its := items(a, b, coated)
	focus := focusReq(40)
	focus.Wavelength, focus.Beam, focus.Power, focus.EFLTol = 1064, 4, 1, Tolerance{Value: 20, Percent: true}
	match := matchReq(0.2, 0.15, 0)
	for name, req := range map[string]Requirement{"focus": focus, "match": match} {
		out := mustFind(t, its, req)
		if len(out.Results) == 0 {
			t.Fatalf("%s: no results", name)
		}
		withCoated := 0
		for _, r := range out.Results {
			for _, u := range r.Parts {
				if u.Part == "C" {
					withCoated++
				}
			}
			gs, _ := ResultGhosts(resultSystem(its, r), req, r)
			w := r.Gaussian.Ghost
			if len(gs) == 0 || w == nil {
				t.Fatalf("%s %v: %d ghosts, worst %v", name, r.Parts, len(gs), w)
			}
			if gs[0].Z != w.Z || gs[0].Concentration != w.Concentration || len(gs[0].Surfaces) != len(w.Surfaces) {
				t.Errorf("%s %v: first ghost %+v, the result's worst %+v", name, r.Parts, gs[0], *w)
			}
			for _, g := range gs {
				usesCoated := false
				for _, u := range r.Parts {
					usesCoated = usesCoated || u.Part == "C"
				}
				if !usesCoated && g.ReflectanceFrom != "indices" {
					t.Errorf("%s %v: ghost %v from %q without a coated part", name, r.Parts, g.Surfaces, g.ReflectanceFrom)
				}
				if len(r.Parts) == 1 && usesCoated && (g.ReflectanceFrom != "coating" || math.Abs(g.Reflectance-math.Pow(0.003, float64(len(g.Surfaces)))) > 1e-15) {
					t.Errorf("%s %v: ghost %v reflectance %g from %q, want 0.3 %% per reflection from the coating", name, r.Parts, g.Surfaces, g.Reflectance, g.ReflectanceFrom)
				}
			}
		}
		if withCoated == 0 {
			t.Errorf("%s: no result uses the coated part", name)
		}
	}
}
