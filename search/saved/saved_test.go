package saved

import (
	"bytes"
	"context"
	"encoding/json"
	"errors"
	"math"
	"reflect"
	"strings"
	"testing"
	"time"

	"cardinal/catalog"
	"cardinal/catalog/record"
	"cardinal/optics"
	"cardinal/search"
)

var ctx = context.Background()

// lens is a singlet of a six-digit glass code in air; prescriptions are
// invented test data.
func lens(t *testing.T, name string, r1, r2, thick float64) record.Entry {
	t.Helper()
	m, err := optics.BuiltinGlasses().Lookup("517642")
	if err != nil {
		t.Fatal(err)
	}
	return record.Entry{Part: optics.Part{Supplier: "TEST", Name: name, Diameter: 25.4,
		Surfaces: []optics.Surface{{Radius: r1}, {Radius: r2}}, Thickness: []float64{thick},
		Media: []optics.Medium{m}}, Price: 20, Currency: "XTS"}
}

func testEntries(t *testing.T) []record.Entry {
	inf := math.Inf(1)
	return []record.Entry{
		lens(t, "PCX-50", 25.84, inf, 5.3),
		lens(t, "PCX-100", 51.68, inf, 3.6),
		lens(t, "PCX-200", 103.4, inf, 3),
		lens(t, "PCV-50", -25.84, inf, 3),
	}
}

// book opens a fresh in-memory catalog of the test parts, one of them in
// the drawer, and runs one search on it.
func book(t *testing.T) (*Book, *catalog.Store, Search) {
	t.Helper()
	st, err := catalog.Open(catalog.Memory)
	if err != nil {
		t.Fatal(err)
	}
	t.Cleanup(func() { st.Close() })
	es := testEntries(t)
	if _, err := st.Import(ctx, es, false); err != nil {
		t.Fatal(err)
	}
	if _, err := st.ImportDrawer(ctx, []record.DrawerItem{{Supplier: "TEST", Part: "PCX-100", Quantity: 2, Location: "A1"}}, false); err != nil {
		t.Fatal(err)
	}
	req := search.Defaults()
	req.Kind, req.EFL, req.Beam, req.Top = search.Focus, 50, 4, 5
	if err := req.Validate(); err != nil {
		t.Fatal(err)
	}
	drawer, err := st.Drawer(ctx)
	if err != nil {
		t.Fatal(err)
	}
	out, err := search.Find(search.Items(es, drawer), req)
	if err != nil {
		t.Fatal(err)
	}
	if len(out.Results) < 2 {
		t.Fatalf("the test search found %d results, want at least 2", len(out.Results))
	}
	s := Search{At: time.Date(2025, 1, 2, 3, 4, 5, 6, time.UTC), Requirement: out.Requirement,
		Results: out.Results, Why: out.Why, Misses: out.Misses, Notes: []string{"a solver note"}}
	return New(st), st, s
}

// A search reads back as it was saved, down to the JSON of its results
// (so that its output can be printed again byte for byte).
func TestSaveLoad(t *testing.T) {
	b, _, s := book(t)
	id, err := b.Save(ctx, s)
	if err != nil {
		t.Fatal(err)
	}
	for _, ref := range []Ref{{ID: id}, {}} {
		got, err := b.Load(ctx, ref)
		if err != nil {
			t.Fatal(err)
		}
		want := s
		want.ID = id
		if !got.At.Equal(want.At) {
			t.Errorf("time %v, want %v", got.At, want.At)
		}
		got.At = want.At
		gj, _ := json.Marshal(got)
		wj, _ := json.Marshal(want)
		if !bytes.Equal(gj, wj) {
			t.Errorf("%s read back as\n%s\nwant\n%s", ref, gj, wj)
		}
		if !reflect.DeepEqual(got.Results[0].Quality, s.Results[0].Quality) {
			t.Errorf("quality figures %v, want %v", got.Results[0].Quality, s.Results[0].Quality)
		}
	}
	var nf *NotFoundError
	if _, err := b.Load(ctx, Ref{ID: id + 1}); !errors.As(err, &nf) || !strings.Contains(err.Error(), "no saved search 2") {
		t.Errorf("missing search: %v", err)
	}
}

// A search that met nothing keeps why and its nearest misses.
func TestSaveNothingMet(t *testing.T) {
	b, _, s := book(t)
	s.Results, s.Why, s.Misses = nil, []string{"no layout reached the target"}, s.Results[:1]
	id, err := b.Save(ctx, s)
	if err != nil {
		t.Fatal(err)
	}
	got, err := b.Load(ctx, Ref{ID: id})
	if err != nil {
		t.Fatal(err)
	}
	if got.Results == nil || len(got.Results) != 0 || !reflect.DeepEqual(got.Why, s.Why) || len(got.Misses) != 1 || got.Misses[0].Rank != s.Misses[0].Rank {
		t.Errorf("read back %+v", got)
	}
	list, _ := b.List(ctx)
	if len(list) != 1 || list[0].Count != 0 {
		t.Errorf("list %+v", list)
	}
	if _, err := got.Pick([]int{1}); err == nil || !strings.Contains(err.Error(), "met nothing") {
		t.Errorf("picking from a search that met nothing: %v", err)
	}
}

func TestListAnnotateRemove(t *testing.T) {
	b, _, s := book(t)
	for range 3 {
		if _, err := b.Save(ctx, s); err != nil {
			t.Fatal(err)
		}
	}
	if id, err := b.Annotate(ctx, Ref{ID: 2}, "for the camera relay"); err != nil || id != 2 {
		t.Fatalf("annotate: %d %v", id, err)
	}
	if id, err := b.Remove(ctx, Ref{}); err != nil || id != 3 {
		t.Fatalf("remove last: %d %v", id, err)
	}
	var nf *NotFoundError
	if _, err := b.Remove(ctx, Ref{ID: 3}); !errors.As(err, &nf) {
		t.Errorf("removing twice: %v", err)
	}
	if _, err := b.Annotate(ctx, Ref{ID: 3}, "x"); !errors.As(err, &nf) {
		t.Errorf("noting a removed search: %v", err)
	}
	list, err := b.List(ctx)
	if err != nil {
		t.Fatal(err)
	}
	if len(list) != 2 || list[1].ID != 2 || list[1].Note != "for the camera relay" || list[0].Note != "" ||
		list[0].Count != len(s.Results) || list[0].Requirement.EFL != 50 || list[0].Requirement.Kind != search.Focus {
		t.Errorf("list %+v", list)
	}
}

func TestPick(t *testing.T) {
	b, st, s := book(t)
	id, _ := b.Save(ctx, s)
	got, _ := b.Load(ctx, Ref{ID: id})
	rs, err := got.Pick([]int{2, 1})
	if err != nil || len(rs) != 2 || rs[0].Rank != 2 || rs[1].Rank != 1 {
		t.Fatalf("pick 2,1: %+v %v", rs, err)
	}
	var pe *PickError
	if _, err := got.Pick([]int{1, 99}); !errors.As(err, &pe) || pe.Rank != 99 || pe.Have != len(s.Results) || pe.ID != id {
		t.Errorf("pick 99: %v", err)
	}
	p, err := b.Pick(ctx, got, []int{1, 2})
	if err != nil {
		t.Fatal(err)
	}
	for _, r := range p.Results {
		for _, u := range r.Parts {
			if _, ok := p.Entries[u.ID()]; !ok {
				t.Errorf("part %s of a picked result not read", u.ID())
			}
		}
	}
	if d := p.Drawer["TEST:PCX-100"]; d.Quantity != 2 || d.Location != "A1" {
		t.Errorf("drawer row %+v", d)
	}
	for id, st := range p.Stock() {
		if st.Entry.Part.ID() != id || st.InDrawer != p.Drawer[id].Quantity {
			t.Errorf("stock of %s: %+v", id, st)
		}
	}
	// A picked part removed from the catalog is named.
	gone := p.Results[0].Parts[0].ID()
	if _, err := st.Remove(ctx, gone); err != nil {
		t.Fatal(err)
	}
	var mp *MissingPartError
	if _, err := b.Pick(ctx, got, []int{1}); !errors.As(err, &mp) || mp.Part != gone {
		t.Errorf("pick with a part gone: %v", err)
	}
}

// Rebuilt systems reproduce the saved first-order figures; a part changed
// since the search is reported.
func TestRebuild(t *testing.T) {
	b, st, s := book(t)
	id, _ := b.Save(ctx, s)
	got, _ := b.Load(ctx, Ref{ID: id})
	p, err := b.Pick(ctx, got, []int{1})
	if err != nil {
		t.Fatal(err)
	}
	sols, changes, err := p.Rebuild()
	if err != nil || len(sols) != 1 || len(changes) != 0 {
		t.Fatalf("rebuild: %d solutions, changes %v, %v", len(sols), changes, err)
	}
	// The rebuilt system's EFL is the one the search saved.
	efl := sols[0].System().Cardinal(search.Defaults().Wavelength).EFL
	if math.Abs(efl-*got.Results[0].EFL) > 1e-6 {
		t.Errorf("rebuilt EFL %.9g, saved %.9g", efl, *got.Results[0].EFL)
	}
	// Thicken one picked part: the catalog changed since the search.
	e := p.Entries[got.Results[0].Parts[0].ID()]
	e.Part.Thickness = []float64{e.Part.Thickness[0] + 1}
	if _, err := st.Import(ctx, []record.Entry{e}, false); err != nil {
		t.Fatal(err)
	}
	p, _ = b.Pick(ctx, got, []int{1})
	if _, changes, _ := p.Rebuild(); len(changes) == 0 {
		t.Error("a part changed since the search, and Rebuild says nothing")
	}
}

func TestParseRef(t *testing.T) {
	for _, tc := range []struct {
		in   string
		want Ref
		str  string
		bad  bool
	}{
		{"7", Ref{ID: 7}, "7", false},
		{" last ", Ref{}, "last", false},
		{"LAST", Ref{}, "last", false},
		{"demo:3", Ref{Demo: true, ID: 3}, "demo:3", false},
		{"Demo: last", Ref{Demo: true}, "demo:last", false},
		{"0", Ref{}, "", true},
		{"-2", Ref{}, "", true},
		{"demo:", Ref{}, "", true},
		{"yesterday", Ref{}, "", true},
		{"mine:3", Ref{}, "", true},
	} {
		got, err := ParseRef(tc.in)
		var re *RefError
		switch {
		case tc.bad && !errors.As(err, &re):
			t.Errorf("ParseRef(%q) = %+v, %v; want a *RefError", tc.in, got, err)
		case !tc.bad && (err != nil || got != tc.want || got.String() != tc.str):
			t.Errorf("ParseRef(%q) = %+v (%q), %v; want %+v (%q)", tc.in, got, got.String(), err, tc.want, tc.str)
		}
	}
}
