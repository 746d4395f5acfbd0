package search

import (
	"context"
	"fmt"
	"math/rand/v2"
	"reflect"
	"testing"

	"cardinal/catalog"
	"cardinal/catalog/synth"
)

// samePruned runs the pruned and the exhaustive search and fails unless
// they return the same results and the same near misses, number for number.
func samePruned(t *testing.T, its []Item, req Requirement) Outcome {
	t.Helper()
	got, err := Find(its, req)
	if err != nil {
		t.Fatalf("%+v: %v", req, err)
	}
	want, err := FindExhaustive(its, req)
	if err != nil {
		t.Fatal(err)
	}
	if !reflect.DeepEqual(got.Results, want.Results) {
		t.Fatalf("%+v\npruned %d results, exhaustive %d; first difference at %d\npruned %s\nexhaustive %s",
			req, len(got.Results), len(want.Results), firstDiff(got.Results, want.Results),
			brief(got.Results), brief(want.Results))
	}
	if !reflect.DeepEqual(got.Misses, want.Misses) {
		t.Fatalf("%+v\nnear misses differ:\npruned %s\nexhaustive %s", req, brief(got.Misses), brief(want.Misses))
	}
	if got.Evaluated > want.Evaluated {
		t.Errorf("pruned search solved %d pairs, more than the exhaustive %d", got.Evaluated, want.Evaluated)
	}
	return got
}

func firstDiff(a, b []Result) int {
	for i := range a {
		if i >= len(b) || !reflect.DeepEqual(a[i], b[i]) {
			return i
		}
	}
	return len(a)
}

func brief(rs []Result) string {
	s := ""
	for i, r := range rs {
		if i == 6 {
			return s + " ..."
		}
		s += fmt.Sprintf("\n  %v score %.6f", r.Parts, r.Score)
	}
	return s
}

func demoItems(t testing.TB) []Item {
	t.Helper()
	st, err := catalog.OpenDemo()
	if err != nil {
		t.Fatal(err)
	}
	defer st.Close()
	ctx := context.Background()
	entries, err := st.Entries(ctx, catalog.Filter{})
	if err != nil {
		t.Fatal(err)
	}
	drawer, err := st.Drawer(ctx)
	if err != nil {
		t.Fatal(err)
	}
	return Items(entries, drawer)
}

// The pruned search returns exactly what the exhaustive one does on the
// demo catalog, for the requirements of the issue and their variants.
func TestPrunedEqualsExhaustiveDemo(t *testing.T) {
	its := demoItems(t)
	for name, r := range demoRequirements() {
		t.Run(name, func(t *testing.T) {
			out := samePruned(t, its, r)
			t.Logf("%d results, %d pairs solved of %d", len(out.Results), out.Evaluated, out.Candidates*out.Candidates)
		})
	}
}

// demoRequirements are the requirements of the README's examples and
// their variants.
func demoRequirements() map[string]Requirement {
	focus := focusReq(75)
	focus.Beam, focus.BFDMin, focus.Wavelength, focus.Top = 6, 40, 1064, 10
	img := imageReq(300, -0.36)
	img.MagTol = Tolerance{Value: 2, Percent: true}
	img.ObjectHeight, img.NA, img.WDMin, img.BFDMin, img.Top = 5, 0.02, 60, 15, 10
	exp := expandReq(5)
	exp.ExpandTol = Tolerance{Value: 2, Percent: true}
	exp.Beam, exp.Form, exp.LengthMax, exp.Top = 2, Galilean, 150, 10
	reqs := map[string]Requirement{"focus": focus, "image": img, "expand": exp}
	for name, r := range map[string]Requirement{"focus": focus, "image": img, "expand": exp} {
		all := r
		all.Top, all.LengthMax = 0, 25
		reqs[name+" all under 25 mm"] = all
		cheap := r
		cheap.Prefer = PreferCheap
		reqs[name+" cheap"] = cheap
		drawer := r
		drawer.DrawerOnly, drawer.Prefer = true, PreferDraw
		reqs[name+" drawer"] = drawer
		dline := r
		dline.Wavelength = 0
		reqs[name+" d line"] = dline
	}
	return reqs
}

// randomRequirement draws a requirement of any kind with random limits.
func randomRequirement(rng *rand.Rand) Requirement {
	r := Defaults()
	pct := func(lo, hi float64) Tolerance { return Tolerance{Value: lo + rng.Float64()*(hi-lo), Percent: true} }
	switch rng.IntN(3) {
	case 0:
		r.Kind, r.EFL, r.EFLTol = Focus, 20+rng.Float64()*400, pct(0.2, 5)
		if rng.IntN(2) == 0 {
			r.BFDMin = rng.Float64() * 100
		}
		if rng.IntN(3) == 0 {
			r.Beam = 1 + rng.Float64()*15
		}
	case 1:
		r.Kind, r.Track, r.MagTol = Image, 80+rng.Float64()*900, pct(0.2, 5)
		r.Mag = -(0.05 + rng.Float64()*4)
		if rng.IntN(4) == 0 {
			r.Mag = -r.Mag
		}
		if rng.IntN(2) == 0 {
			r.WDMin, r.BFDMin = rng.Float64()*r.Track/5, rng.Float64()*r.Track/5
		}
		if rng.IntN(3) == 0 {
			r.NA, r.ObjectHeight = rng.Float64()*0.1, rng.Float64()*10
		}
	default:
		r.Kind, r.Expansion, r.ExpandTol = Expand, 0.2+rng.Float64()*12, pct(0.5, 6)
		r.Form = []Form{AnyForm, Keplerian, Galilean}[rng.IntN(3)]
		if rng.IntN(3) == 0 {
			r.Beam = 1 + rng.Float64()*8
		}
	}
	r.GapMin = rng.Float64() * 2
	if rng.IntN(2) == 0 {
		r.LengthMax = 20 + rng.Float64()*600
	}
	if rng.IntN(4) == 0 {
		r.DiameterMax = 10 + rng.Float64()*40
	}
	r.Top = []int{0, 1, 3, 10, 10}[rng.IntN(5)]
	r.Prefer = []Prefer{Balanced, PreferDraw, PreferShort, PreferCheap}[rng.IntN(4)]
	r.DrawerOnly = rng.IntN(8) == 0
	r.Wavelength = []float64{587.5618, 632.8, 1064, 486.1}[rng.IntN(4)]
	if rng.IntN(6) == 0 && r.Kind != Expand && !(r.Kind == Image && r.Mag > 0) {
		r.Elements = 1
	}
	return r
}

// The pruned search returns exactly what the exhaustive one does on
// hundreds of random synthetic catalogs with random requirements.
func TestPrunedEqualsExhaustiveRandom(t *testing.T) {
	cases := 300
	if testing.Short() {
		cases = 60
	}
	rng := rand.New(rand.NewPCG(1, 2))
	nonEmpty := 0
	for k := 0; k < cases; k++ {
		entries := synth.Catalog(uint64(k), 20+rng.IntN(80))
		its := Items(entries, nil)
		for i := range its {
			its[i].Drawer = []int{0, 0, 0, 1, 2}[rng.IntN(5)]
		}
		req := randomRequirement(rng)
		if req.Validate() != nil {
			continue
		}
		t.Run(fmt.Sprintf("case %d %s", k, req.Kind), func(t *testing.T) {
			if len(samePruned(t, its, req).Results) > 0 {
				nonEmpty++
			}
		})
	}
	t.Logf("%d of %d cases have results", nonEmpty, cases)
	if nonEmpty < cases/4 {
		t.Errorf("only %d of %d random cases have results: the comparison proves little", nonEmpty, cases)
	}
}
