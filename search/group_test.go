package search

import (
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"sort"
	"strings"
	"testing"

	"cardinal/catalog/synth"
)

// findGrouped runs the search as the command line does: one row per set
// of parts (twins as one), the other layouts under it.
func findGrouped(t *testing.T, its []Item, req Requirement) Outcome {
	t.Helper()
	listAllArrangements(t)
	req.Arrangements = false
	out, err := Find(its, req)
	if err != nil {
		t.Fatal(err)
	}
	return out
}

// listAllArrangements keeps every arrangement under its row for the rest
// of the test, so that the grouped rows can be compared with every layout.
func listAllArrangements(t *testing.T) {
	old := arrangementsListed
	arrangementsListed = math.MaxInt
	t.Cleanup(func() { arrangementsListed = old })
}

// partSets lists each result's set of parts (IDs sorted), sorted.
func partSets(rs []Result) []string {
	var out []string
	for _, r := range rs {
		ids := make([]string, len(r.Parts))
		for i, u := range r.Parts {
			ids[i] = u.ID()
		}
		sort.Strings(ids)
		out = append(out, strings.Join(ids, "+"))
	}
	sort.Strings(out)
	return out
}

// flatten is every row followed by its arrangements.
func flatten(rs []Result) []Result {
	var out []Result
	for _, r := range rs {
		out = append(out, r)
		out = append(out, r.Arrangements...)
	}
	return out
}

// checkGrouping compares the grouped outcome with every layout listed on
// its own (Requirement.Arrangements): the same layouts, by part set, so
// grouping hides no solution; and --top N keeps the first N rows.
func checkGrouping(t *testing.T, its []Item, req Requirement) int {
	t.Helper()
	req.Top = 0
	all := mustFind(t, its, req) // Arrangements: every layout its own row
	grouped := findGrouped(t, its, req)
	if got, want := partSets(flatten(grouped.Results)), partSets(all.Results); !slices.Equal(got, want) {
		t.Fatalf("grouped part sets %v\nwant %v", got, want)
	}
	if req.TracesRays() {
		return len(grouped.Results) // --top N traces fewer layouts, so its order may differ
	}
	for _, n := range []int{1, 3} {
		req.Top = n
		top := findGrouped(t, its, req)
		want := grouped.Results[:min(n, len(grouped.Results))]
		if len(top.Results) != len(want) {
			t.Errorf("--top %d: %d rows, want %d", n, len(top.Results), len(want))
		}
		// Each row is one of the first n rows of all (its best layout
		// may be a twin's when they tie).
		inFirst := partSets(flatten(want))
		for _, r := range flatten(top.Results) {
			if ps := partSets([]Result{r})[0]; !slices.Contains(inFirst, ps) {
				t.Errorf("--top %d holds %s, not among the first %d rows of all: %v", n, ps, n, inFirst)
			}
		}
	}
	return len(grouped.Results)
}

// Grouping never hides a distinct solution, on the demo catalog.
func TestGroupingHidesNothingDemo(t *testing.T) {
	its := demoItems(t)
	for _, req := range []Requirement{focusReq(100), expandReq(4), imageReq(200, -1)} {
		if req.Kind == Expand {
			req.LengthMax = 150
		}
		t.Run(string(req.Kind), func(t *testing.T) {
			if n := checkGrouping(t, its, req); n < 2 {
				t.Errorf("%d rows: the comparison proves little", n)
			}
		})
	}
}

// ... and on random catalogs.
func TestGroupingHidesNothingRandom(t *testing.T) {
	cases := 40
	if testing.Short() {
		cases = 10
	}
	rng := rand.New(rand.NewPCG(3, 4))
	rows := 0
	for k := 0; k < cases; k++ {
		its := Items(synth.Catalog(uint64(100+k), 20+rng.IntN(60)), nil)
		req := randomRequirement(rng)
		if req.Validate() != nil {
			continue
		}
		t.Run(fmt.Sprintf("case %d %s", k, req.Kind), func(t *testing.T) { rows += checkGrouping(t, its, req) })
	}
	if rows == 0 {
		t.Error("no random case has a result: the comparison proves little")
	}
}

// Parts optically the same are one row, the twin named as an alternative
// with its price; a part 1 % off in EFL is a row of its own.
func TestTwinsAreOneRow(t *testing.T) {
	a := scaled("A-100", 100, 10, "XTS", 0)
	twin := a
	twin.Entry.Part.Supplier, twin.Entry.Part.Name, twin.Entry.Price = "TARNWICK", "KC-100", 15.9
	near := scaled("NEAR-101", 101, 9, "XTS", 0)
	req := focusReq(101)
	req.EFLTol, req.Elements = Tolerance{Value: 3, Percent: true}, 1
	out := findGrouped(t, []Item{a, twin, near}, req)
	if len(out.Results) != 2 {
		t.Fatalf("%d rows, want 2 (A and its twin as one, NEAR on its own): %s", len(out.Results), brief(out.Results))
	}
	found := false
	for _, r := range out.Results {
		for _, alt := range r.Alternatives {
			found = true
			if alt.For != "TEST:A-100" || alt.Part != "TARNWICK:KC-100" || alt.Price == nil || alt.Text() != "also TARNWICK:KC-100, 15.90 XTS" {
				t.Errorf("alternative %+v (%s)", alt, alt.Text())
			}
		}
		if r.Parts[0].Part == "NEAR-101" && len(r.Alternatives) > 0 {
			t.Errorf("NEAR-101 has alternatives %v", r.Alternatives)
		}
	}
	if !found {
		t.Errorf("no row names the twin: %+v", out.Results)
	}
}

// A row keeps its best few arrangements in full and counts them all: the
// same rows, the same first arrangements and the same count as when every
// one is listed, and the note says how many are kept.
func TestArrangementsListedAreTheBestFew(t *testing.T) {
	its := demoItems(t)
	req := focusReq(100)
	req.Top = 0
	all := findGrouped(t, its, req) // every arrangement listed
	old := arrangementsListed
	arrangementsListed = 2
	t.Cleanup(func() { arrangementsListed = old })
	req.Arrangements = false
	few, err := Find(its, req)
	if err != nil {
		t.Fatal(err)
	}
	if len(few.Results) != len(all.Results) {
		t.Fatalf("%d rows, want %d", len(few.Results), len(all.Results))
	}
	capped := 0
	for k, r := range few.Results {
		a := all.Results[k]
		if r.OtherArrangements != len(a.Arrangements) || r.OtherArrangements != a.OtherArrangements {
			t.Errorf("row %d: counts %d other arrangements, want %d", k+1, r.OtherArrangements, len(a.Arrangements))
		}
		want := a.Arrangements[:min(2, len(a.Arrangements))]
		if got := partSets(r.Arrangements); !slices.Equal(got, partSets(want)) || len(r.Arrangements) != len(want) {
			t.Errorf("row %d: arrangements %v, want the first %d of %v", k+1, got, len(want), partSets(a.Arrangements))
		}
		for i := range r.Arrangements {
			if r.Arrangements[i].Score != want[i].Score || *r.Arrangements[i].EFL != *want[i].EFL {
				t.Errorf("row %d arrangement %d differs from the one listed with all", k+1, i+1)
			}
		}
		if len(a.Arrangements) > 2 {
			capped++
		}
	}
	if capped == 0 {
		t.Fatal("no row has more than 2 other arrangements: the test proves little")
	}
	if !slices.ContainsFunc(few.Notes, func(n string) bool { return strings.Contains(n, "keep the best 2 of them") }) {
		t.Errorf("no note says how many arrangements are kept: %q", few.Notes)
	}
}
