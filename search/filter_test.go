package search

import (
	"math"
	"strings"
	"testing"

	"cardinal/catalog/record"
)

// The same part twice needs two pieces: with --drawer-only and one piece
// the pair fails the drawer check; with two it meets.
func TestDrawerOnlySamePartTwice(t *testing.T) {
	pcx := lens("PCX", 51.7, math.Inf(1), 4, 1.5168, 25.4)
	for _, tt := range []struct {
		pieces int
		meets  bool
	}{{1, false}, {2, true}} {
		its := []Item{{Entry: record.Entry{Part: pcx}, Drawer: tt.pieces}}
		req := focusReq(60)
		req.DrawerOnly = true
		out := mustFind(t, its, req)
		got := len(pairsOf(out.Results)) > 0
		if got != tt.meets {
			t.Errorf("%d pieces: pair results %v, want %v (why %v)", tt.pieces, got, tt.meets, out.Why)
		}
		if !tt.meets && !strings.Contains(strings.Join(out.Why, "\n"), "more pieces than the drawer holds") {
			t.Errorf("%d pieces: why %q does not name the drawer", tt.pieces, out.Why)
		}
		for _, r := range out.Results {
			if !r.InDrawer {
				t.Errorf("%d pieces: a drawer-only result not in the drawer: %v", tt.pieces, r.Parts)
			}
		}
	}
}

// Parts of other suppliers, larger than the diameter limit or not in the
// drawer take no part, and the notes count them.
func TestPartFilters(t *testing.T) {
	a := lens("A", 51.7, -51.7, 4, 1.5168, 25.4)
	b := lens("B", 51.7, -51.7, 4, 1.5168, 12.7)
	c := lens("C", 51.7, -51.7, 4, 1.5168, 12.7)
	c.Supplier = "OTHER"
	its := []Item{{Entry: record.Entry{Part: a}}, {Entry: record.Entry{Part: b}}, {Entry: record.Entry{Part: c}}}
	req := focusReq(50)
	req.EFLTol = Tolerance{Value: 5, Percent: true}
	req.Supplier, req.DiameterMax, req.Elements = "test", 20, 1
	out := mustFind(t, its, req)
	if len(out.Results) != 1 || out.Results[0].Parts[0].Part != "B" {
		t.Fatalf("results %s, want B alone", brief(out.Results))
	}
	notes := strings.Join(out.Notes, "\n")
	for _, want := range []string{"1 part set aside: other supplier", "1 part set aside: diameter over 20 mm"} {
		if !strings.Contains(notes, want) {
			t.Errorf("notes %q lack %q", notes, want)
		}
	}
}
