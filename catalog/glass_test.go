package catalog

import (
	"errors"
	"math"
	"reflect"
	"strings"
	"testing"

	"cardinal/catalog/record"
	"cardinal/importers"
	"cardinal/optics"
)

func TestImportGlasses(t *testing.T) {
	s := newStore(t)
	// Sellmeier coefficients of fused silica (Malitson, J. Opt. Soc. Am. 55,
	// 1205 (1965)) under a user's name; nd 1.4585 (same paper).
	silica := importers.Glass{Name: "my-silica", Formula: "sellmeier",
		Coefficients: []float64{0.6961663, 0.0684043 * 0.0684043, 0.4079426, 0.1162414 * 0.1162414, 0.8974794, 9.896161 * 9.896161},
		MinNm:        210, MaxNm: 3710, Source: "Malitson 1965", Line: 2}
	abbe := importers.Glass{Name: "Lab-Flint", Formula: "abbe", Coefficients: []float64{1.62, 36.4}, Line: 3}
	rep, err := s.ImportGlasses(ctx, []importers.Glass{silica, abbe}, false)
	if err != nil {
		t.Fatal(err)
	}
	if !reflect.DeepEqual(rep.Added, []string{"my-silica", "Lab-Flint"}) {
		t.Errorf("added %v", rep.Added)
	}
	table, _ := s.Glasses(ctx)
	m, err := table.Lookup("MY-SILICA")
	if err != nil || !near(m.Index(optics.LineD), 1.4585, 1e-4, 0) {
		t.Errorf("my-silica: %v, nd %.5f, want 1.4585", err, m.Index(optics.LineD))
	}
	if _, err := table.Lookup("517642"); err != nil {
		t.Errorf("glass codes still resolve: %v", err)
	}
	got, _ := s.UserGlasses(ctx)
	silica.Line, abbe.Line = 0, 0
	if !reflect.DeepEqual(got, []importers.Glass{abbe, silica}) {
		t.Errorf("UserGlasses:\n got %+v\nwant %+v", got, []importers.Glass{abbe, silica})
	}
	// Again: unchanged, nothing recomputed.
	before := checksum(t, s)
	rep, _ = s.ImportGlasses(ctx, []importers.Glass{silica, abbe}, false)
	if len(rep.Unchanged) != 2 || checksum(t, s) != before {
		t.Errorf("re-import: %+v", rep)
	}
}

func TestImportGlassesAllOrNothing(t *testing.T) {
	s := newStore(t)
	if _, err := s.ImportGlasses(ctx, []importers.Glass{constantGlass("test-crown", 1.52)}, false); err != nil {
		t.Fatal(err)
	}
	table, _ := s.Glasses(ctx)
	m, _ := table.Lookup("test-crown")
	mustImport(t, s, []record.Entry{singletOf("TEST", "L1", 30, -30, 4, 20, m)})
	before := checksum(t, s)
	for _, tc := range []struct {
		name  string
		bad   importers.Glass
		field string
	}{
		{"air", constantGlass("air", 1), "name"},
		{"a glass code", constantGlass("517642", 1.5), "name"},
		{"too few coefficients", importers.Glass{Name: "x", Formula: "sellmeier", Coefficients: []float64{1}}, "coefficients"},
		{"index below one", constantGlass("x", 0.5), "coefficients"},
		{"given twice", constantGlass("TEST-crown", 1.6), "name"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			tc.bad.Line = 9
			list := []importers.Glass{constantGlass("test-crown", 1.6), tc.bad}
			for _, dry := range []bool{false, true} {
				_, err := s.ImportGlasses(ctx, list, dry)
				var ie *ImportError
				if !errors.As(err, &ie) || ie.Rows[0].Line != 9 || ie.Rows[0].Field != tc.field {
					t.Errorf("error %v, want an *ImportError on line 9, %s", err, tc.field)
				}
				if checksum(t, s) != before {
					t.Error("a failed glass import changed the tables")
				}
			}
		})
	}
	// A good dry run reports the recompute and keeps nothing.
	rep, err := s.ImportGlasses(ctx, []importers.Glass{constantGlass("test-crown", 1.6)}, true)
	if err != nil || !reflect.DeepEqual(rep.Recomputed, []string{"TEST:L1"}) || checksum(t, s) != before {
		t.Errorf("dry run: %+v, %v", rep, err)
	}
}

func TestGlassChangeRecomputesWarnings(t *testing.T) {
	s := newStore(t)
	s.ImportGlasses(ctx, []importers.Glass{constantGlass("test-crown", 1.5)}, false)
	table, _ := s.Glasses(ctx)
	m, _ := table.Lookup("test-crown")
	// Plano-convex R 50, n 1.5: f = R/(n-1) = 100 mm (Hecht, Optics, 5th
	// ed., eq. 6.2 with 1/R2 = 0), as stated.
	e := singletOf("TEST", "PCX", 50, math.Inf(1), 4, 20, m)
	e.StatedEFL = 100
	e.Warnings = []string{"note from the supplier file"}
	rep := mustImport(t, s, []record.Entry{e})
	if len(rep.Warnings) != 1 {
		t.Fatalf("warnings %v, want only the file's own", rep.Warnings)
	}
	// At n 1.6, f = 50/0.6 = 83.3 mm: 17 % off what the supplier states.
	s.ImportGlasses(ctx, []importers.Glass{constantGlass("test-crown", 1.6)}, false)
	rows, _ := s.Computed(ctx, Filter{})
	w := rows[0].Warnings
	if len(w) != 2 || w[0] != "note from the supplier file" || !strings.HasPrefix(w[1], "efl:") {
		t.Errorf("warnings after the glass change %q, want the note and an efl warning", w)
	}
	if !near(rows[0].Forward.EFL, 50/0.6, 0, 1e-12) {
		t.Errorf("EFL %.9g, want %.9g", rows[0].Forward.EFL, 50/0.6)
	}
}
