package search

import (
	"context"
	"fmt"
	"math/rand/v2"
	"reflect"
	"testing"

	"cardinal/catalog"
	"cardinal/catalog/record"
	"cardinal/catalog/synth"
)

// sameIndexed runs the pruned search on the catalog's search index and the
// exhaustive search on the full prescriptions read from the same catalog,
// and fails unless results, near misses and notes agree number for number.
func sameIndexed(t *testing.T, st *catalog.Store, req Requirement) Outcome {
	t.Helper()
	ctx := context.Background()
	ix, err := st.SearchIndex(ctx, catalog.IndexOptions{InDrawer: req.DrawerOnly})
	if err != nil {
		t.Fatal(err)
	}
	got, err := FindIndexed(ctx, ix, req)
	ix.Close()
	if err != nil {
		t.Fatalf("%+v: %v", req, err)
	}
	entries, err := st.Entries(ctx, catalog.Filter{InDrawer: req.DrawerOnly})
	if err != nil {
		t.Fatal(err)
	}
	drawer, err := st.Drawer(ctx)
	if err != nil {
		t.Fatal(err)
	}
	want, err := FindExhaustive(Items(entries, drawer), req)
	if err != nil {
		t.Fatal(err)
	}
	if !reflect.DeepEqual(got.Results, want.Results) {
		t.Fatalf("%+v\nindexed %d results, exhaustive %d; first difference at %d\nindexed %s\nexhaustive %s",
			req, len(got.Results), len(want.Results), firstDiff(got.Results, want.Results),
			brief(got.Results), brief(want.Results))
	}
	if !reflect.DeepEqual(got.Misses, want.Misses) {
		t.Fatalf("%+v\nnear misses differ:\nindexed %s\nexhaustive %s", req, brief(got.Misses), brief(want.Misses))
	}
	if !reflect.DeepEqual(got.Notes, want.Notes) || got.Candidates != want.Candidates {
		t.Fatalf("%+v\nnotes or candidates differ:\nindexed %d %q\nexhaustive %d %q", req, got.Candidates, got.Notes, want.Candidates, want.Notes)
	}
	return got
}

// The pruned search on the demo catalog's index returns what solving every
// ordered pair from the full prescriptions returns.
func TestIndexedEqualsExhaustiveDemo(t *testing.T) {
	st, err := catalog.OpenDemo()
	if err != nil {
		t.Fatal(err)
	}
	defer st.Close()
	for name, r := range demoRequirements() {
		t.Run(name, func(t *testing.T) {
			if testing.Short() && r.Top == 0 {
				t.Skip("every result traced with real rays: slow")
			}
			out := sameIndexed(t, st, r)
			t.Logf("%d results, %d pairs solved", len(out.Results), out.Evaluated)
		})
	}
}

// The same on random synthetic catalogs with random drawers and
// requirements, each stored in a catalog and read back through its index.
func TestIndexedEqualsExhaustiveRandom(t *testing.T) {
	cases := 120
	if testing.Short() {
		cases = 30
	}
	rng := rand.New(rand.NewPCG(3, 4))
	ctx := context.Background()
	nonEmpty := 0
	for k := 0; k < cases; k++ {
		entries := synth.Catalog(uint64(1000+k), 20+rng.IntN(80))
		st, err := catalog.Open(catalog.Memory)
		if err != nil {
			t.Fatal(err)
		}
		if _, err := st.Import(ctx, entries, false); err != nil {
			t.Fatal(err)
		}
		var drawer []record.DrawerItem
		for _, e := range entries {
			if q := []int{0, 0, 0, 1, 2}[rng.IntN(5)]; q > 0 {
				drawer = append(drawer, record.DrawerItem{Supplier: e.Part.Supplier, Part: e.Part.Name, Quantity: q})
			}
		}
		if _, err := st.ImportDrawer(ctx, drawer, false); err != nil {
			t.Fatal(err)
		}
		req := randomRequirement(rng)
		if req.Validate() == nil {
			t.Run(fmt.Sprintf("case %d %s", k, req.Kind), func(t *testing.T) {
				if len(sameIndexed(t, st, req).Results) > 0 {
					nonEmpty++
				}
			})
		}
		st.Close()
	}
	t.Logf("%d of %d cases have results", nonEmpty, cases)
	if nonEmpty < cases/4 {
		t.Errorf("only %d of %d random cases have results: the comparison proves little", nonEmpty, cases)
	}
}
