package catalog

import (
	"errors"
	"math"
	"reflect"
	"strings"
	"testing"

	"cardinal/catalog/record"
	"cardinal/optics"
)

func TestImportCounts(t *testing.T) {
	s := newStore(t)
	es := sampleEntries(t)
	rep := mustImport(t, s, es)
	if len(rep.Added) != len(es) || len(rep.Updated)+len(rep.Unchanged) != 0 {
		t.Errorf("first import: added %d, updated %d, unchanged %d; want %d, 0, 0", len(rep.Added), len(rep.Updated), len(rep.Unchanged), len(es))
	}
	before := checksum(t, s)
	rep = mustImport(t, s, es)
	if len(rep.Unchanged) != len(es) || len(rep.Added)+len(rep.Updated) != 0 {
		t.Errorf("second import: added %v, updated %v; want nothing", rep.Added, rep.Updated)
	}
	if checksum(t, s) != before {
		t.Error("re-importing the same entries changed the tables")
	}
}

func TestImportUpdateRecomputes(t *testing.T) {
	s := newStore(t)
	es := sampleEntries(t)
	mustImport(t, s, es)
	// PCX-50 gets a flatter first surface: a longer focal length.
	changed := es[0]
	changed.Part.Surfaces = []optics.Surface{{Radius: 30}, {Radius: math.Inf(1)}}
	changed.Part.Description = "re-measured"
	rep := mustImport(t, s, []record.Entry{changed})
	if !reflect.DeepEqual(rep.Updated, []string{"TEST:PCX-50"}) {
		t.Fatalf("updated %v, want [TEST:PCX-50]", rep.Updated)
	}
	rows, err := s.Computed(ctx, Filter{IDs: []string{"TEST:PCX-50"}})
	if err != nil || len(rows) != 1 {
		t.Fatal(rows, err)
	}
	// Plano-convex lens, curved side first: 1/f = (n - 1)/R1 exactly, the
	// thickness term vanishing with 1/R2 = 0 (Hecht, Optics, 5th ed., eq. 6.2).
	n := 1.517
	if want := 30 / (n - 1); !near(rows[0].Forward.EFL, want, 0, 1e-12) {
		t.Errorf("EFL after update %.9g, want %.9g", rows[0].Forward.EFL, want)
	}
	if rows[0].Description != "re-measured" {
		t.Errorf("description %q after update", rows[0].Description)
	}
	var surfaces int
	s.db.QueryRow("SELECT count(*) FROM surfaces").Scan(&surfaces)
	if want := 2*5 + 3; surfaces != want {
		t.Errorf("%d surface rows after update, want %d (no leftovers)", surfaces, want)
	}
}

func TestImportAllOrNothing(t *testing.T) {
	inf := math.Inf(1)
	bad := func(mod func(*record.Entry)) func(t *testing.T) record.Entry {
		return func(t *testing.T) record.Entry {
			e := lens(t, "TEST", "BAD-1", 20, inf, 3, 12.7, "517642")
			mod(&e)
			return e
		}
	}
	tests := []struct {
		name  string
		entry func(t *testing.T) record.Entry
		field string
	}{
		{"negative thickness", bad(func(e *record.Entry) { e.Part.Thickness[0] = -1 }), "t1"},
		{"radius smaller than the semi-diameter", bad(func(e *record.Entry) { e.Part.Surfaces[0].Radius = 5 }), "r1"},
		{"unknown glass", bad(func(e *record.Entry) {
			e.Part.Media[0] = optics.Constant{Label: "mystery-glass", N: 1.6}
		}), "glass1"},
		{"glass that differs from the table", bad(func(e *record.Entry) {
			e.Part.Media[0] = optics.Constant{Label: "fused-silica", N: 1.7}
		}), "glass1"},
		{"one surface", bad(func(e *record.Entry) {
			e.Part.Surfaces, e.Part.Thickness, e.Part.Media = e.Part.Surfaces[:1], nil, nil
		}), "r2"},
		{"not a number", bad(func(e *record.Entry) { e.StatedEFL = math.NaN() }), "efl"},
		{"given twice", func(t *testing.T) record.Entry { return sampleEntries(t)[1] }, "part"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			s := newStore(t)
			mustImport(t, s, sampleEntries(t)[:2])
			before := checksum(t, s)
			// A file of new parts and an update, with the bad row in the middle.
			es := sampleEntries(t)
			es[0].Notes = "changed"
			b := tc.entry(t)
			b.Line = 50
			es = append(es[:3], append([]record.Entry{b}, es[3:]...)...)
			for _, dry := range []bool{false, true} {
				_, err := s.Import(ctx, es, dry)
				var ie *ImportError
				if !errors.As(err, &ie) {
					t.Fatalf("dry run %v: error %v, want an *ImportError", dry, err)
				}
				found := false
				for _, r := range ie.Rows {
					found = found || r.Line == 50 && r.Field == tc.field
				}
				if !found {
					t.Errorf("dry run %v: %v does not name line 50, column %s", dry, err, tc.field)
				}
				if checksum(t, s) != before {
					t.Errorf("dry run %v: a failed import changed the tables", dry)
				}
			}
		})
	}
}

func TestImportListsEveryError(t *testing.T) {
	s := newStore(t)
	es := sampleEntries(t)
	es[1].Part.Thickness[0] = 0
	es[4].Part.Diameter = -3
	_, err := s.Import(ctx, es, false)
	var ie *ImportError
	if !errors.As(err, &ie) {
		t.Fatalf("error %v, want *ImportError", err)
	}
	var lines []int
	for _, r := range ie.Rows {
		if len(lines) == 0 || lines[len(lines)-1] != r.Line {
			lines = append(lines, r.Line)
		}
	}
	if !reflect.DeepEqual(lines, []int{3, 6}) {
		t.Errorf("errors on lines %v, want [3 6]: %v", lines, err)
	}
	if !strings.Contains(err.Error(), "nothing imported") {
		t.Errorf("message %q should say nothing was imported", err)
	}
}

func TestImportDryRun(t *testing.T) {
	s := newStore(t)
	before := checksum(t, s)
	rep, err := s.Import(ctx, sampleEntries(t), true)
	if err != nil {
		t.Fatal(err)
	}
	if len(rep.Added) != len(sampleEntries(t)) || !rep.DryRun {
		t.Errorf("dry run report %+v", rep)
	}
	if checksum(t, s) != before {
		t.Error("a dry run changed the tables")
	}
}

func TestImportWarnings(t *testing.T) {
	s := newStore(t)
	es := sampleEntries(t)[:1]
	// Plano-convex, R 25.84, nd 1.517: f = 25.84/0.517 = 49.98 mm (Hecht,
	// Optics, 5th ed., eq. 6.2). A stated 45 mm is 10 % off.
	es[0].StatedEFL = 45
	rep := mustImport(t, s, es)
	if len(rep.Warnings) != 1 || rep.Warnings[0].Line != 2 || !strings.HasPrefix(rep.Warnings[0].Reason, "efl:") {
		t.Fatalf("warnings %+v, want one efl warning on line 2", rep.Warnings)
	}
	rows, _ := s.Computed(ctx, Filter{})
	if len(rows[0].Warnings) != 1 {
		t.Errorf("stored warnings %q, want the efl warning", rows[0].Warnings)
	}
	got, _ := s.Entries(ctx, Filter{})
	if !reflect.DeepEqual(got[0].Warnings, rows[0].Warnings) {
		t.Errorf("Entries warnings %q, Computed warnings %q", got[0].Warnings, rows[0].Warnings)
	}
	// Corrected, the warning goes.
	es[0].StatedEFL = 49.98
	mustImport(t, s, es)
	rows, _ = s.Computed(ctx, Filter{})
	if len(rows[0].Warnings) != 0 {
		t.Errorf("warnings %q after the fix, want none", rows[0].Warnings)
	}
}
