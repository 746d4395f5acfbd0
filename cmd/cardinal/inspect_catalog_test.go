package main

import (
	"encoding/json"
	"math"
	"path/filepath"
	"strings"
	"testing"
)

func TestInspectCatalogPart(t *testing.T) {
	db := filepath.Join(t.TempDir(), "c.db")
	e, out, errb := storeEnv(t, map[string]string{"CARDINAL_DB": db})
	// A plano-convex lens, R 51.68 mm, t 3.6 mm, nd 1.517: f = R/(n - 1)
	// = 99.961 mm; turned around (flat side first) its front focal point
	// lies f - t/n = 97.588 mm before the flat vertex (Hecht, Optics, 5th
	// ed., eqs. 6.2-6.4). The stated EFL of 90 mm is more than 1 % off.
	part := writeFile(t, "p.csv", "supplier,part,diameter,r1,r2,t1,glass1,efl\nLAB,PCX-100,25.4,51.68,inf,3.6,517642,90\n")
	if code := runCLI(e, "catalog", "import", part); code != 0 {
		t.Fatalf("import: %s", errb)
	}
	n := 1.517
	f := 51.68 / (n - 1)
	for _, tc := range []struct {
		name   string
		args   []string
		code   int
		stderr string
		check  func(t *testing.T, r map[string]any)
	}{
		{"reversed", []string{"inspect", "LAB:PCX-100", "--reverse", "--format", "json"}, 0, "LAB:PCX-100: efl: stated 90 mm", func(t *testing.T, r map[string]any) {
			if got := r["efl_mm"].(float64); math.Abs(got-f) > 1e-9 {
				t.Errorf("EFL %.12g, want %.12g", got, f)
			}
			if got, want := r["ffd_mm"].(float64), -(f - 3.6/n); math.Abs(got-want) > 1e-9 {
				t.Errorf("FFD %.12g, want %.12g", got, want)
			}
			if w := r["warnings"].([]any); len(w) == 0 {
				t.Error("the stored warning is missing from the JSON")
			}
		}},
		{"part alone", []string{"inspect", "PCX-100", "--format", "json"}, 0, "", nil},
		{"unknown", []string{"inspect", "LAB:PCX-10O"}, exitNotFound, "did you mean LAB:PCX-100", nil},
		{"with --file", []string{"inspect", "LAB:PCX-100", "--file", part}, exitUsage, "not both", nil},
	} {
		t.Run(tc.name, func(t *testing.T) {
			code := runCLI(e, tc.args...)
			if code != tc.code || !strings.Contains(unwrap(errb.String()), tc.stderr) {
				t.Fatalf("exit %d, stderr %q; want %d, %q", code, errb, tc.code, tc.stderr)
			}
			if tc.check == nil {
				return
			}
			var rows []map[string]any
			if err := json.Unmarshal(out.Bytes(), &rows); err != nil || len(rows) != 1 {
				t.Fatalf("%v: %s", err, out)
			}
			tc.check(t, rows[0])
		})
	}
}

// A part named from the catalog and the same part named with --file and
// --part go through one resolver: the same part found, or the same
// suggestions, for every kind of name.
func TestInspectNamesResolveAlike(t *testing.T) {
	db := filepath.Join(t.TempDir(), "c.db")
	e, out, errb := storeEnv(t, map[string]string{"CARDINAL_DB": db})
	file := writeFile(t, "p.csv", "supplier,part,diameter,r1,r2,t1,glass1\n"+
		"LAB,PCX-500,25.4,258.4,inf,3.6,517642\n"+
		"LAB,PCX-50,25.4,25.84,inf,5.3,517642\n"+
		"BENCH,PCX-50,25.4,25.84,inf,5.3,517642\n"+
		"BENCH,BCX-25,12.7,25.5,-25.5,3.0,517642\n")
	if code := runCLI(e, "catalog", "import", file); code != 0 {
		t.Fatalf("import: %s", errb)
	}
	// The words each source adds to a not-found message, taken away to
	// compare what is left: the same names suggested in the same order.
	plain := func(s string) string {
		s = unwrap(s)
		s = strings.ReplaceAll(s, " in "+file, " in the catalog")
		s = strings.ReplaceAll(s, "; none of its 4 parts is close; run without --part to list them", "")
		return strings.ReplaceAll(s, "; 'cardinal catalog list' lists every part", "")
	}
	for _, tc := range []struct {
		name, part string
		code       int
		found      string // SUPPLIER:PART found, "" if none
		stderr     string // in the not-found message
	}{
		{"exact", "LAB:PCX-500", 0, "LAB:PCX-500", ""},
		{"lower case", "lab:pcx-500", 0, "LAB:PCX-500", ""},
		{"part alone, lower case", "pcx-500", 0, "LAB:PCX-500", ""},
		{"part alone", "BCX-25", 0, "BENCH:BCX-25", ""},
		{"two suppliers", "pcx-50", exitNotFound, "", "from 2 suppliers; name one: BENCH:PCX-50, LAB:PCX-50"},
		{"typo", "LAB:PCX-5OO", exitNotFound, "", "did you mean LAB:PCX-50, LAB:PCX-500"},
		{"wrong supplier", "BENCH:PCX-500", exitNotFound, "", "did you mean BENCH:PCX-50, LAB:PCX-500"},
		{"nothing close", "ZZZZZZZZZZZZ", exitNotFound, "", `no part "ZZZZZZZZZZZZ" in the catalog`},
	} {
		t.Run(tc.name, func(t *testing.T) {
			var outs, errs [2]string
			for i, args := range [][]string{
				{"inspect", tc.part, "--format", "json"},
				{"inspect", "--file", file, "--part", tc.part, "--format", "json"},
			} {
				if code := runCLI(e, args...); code != tc.code {
					t.Fatalf("%v: exit %d, want %d: %s", args, code, tc.code, errb)
				}
				outs[i], errs[i] = out.String(), plain(errb.String())
			}
			if outs[0] != outs[1] || errs[0] != errs[1] {
				t.Fatalf("catalog and file differ:\n%s%s\nagainst\n%s%s", outs[0], errs[0], outs[1], errs[1])
			}
			if !strings.Contains(errs[0], tc.stderr) {
				t.Errorf("stderr %q, want %q in it", errs[0], tc.stderr)
			}
			if tc.found == "" {
				return
			}
			var rows []map[string]any
			if err := json.Unmarshal(out.Bytes(), &rows); err != nil || len(rows) != 1 || rows[0]["supplier"].(string)+":"+rows[0]["part"].(string) != tc.found {
				t.Errorf("found %s (%v), want %s", out, err, tc.found)
			}
		})
	}
}

// inspect shows the tolerances the build study gives a catalog part: its
// own where its row states them, the catalog's defaults (set with
// 'catalog tolerances', not the program's) for the rest, and says which.
func TestInspectCatalogTolerances(t *testing.T) {
	db := filepath.Join(t.TempDir(), "c.db")
	e, out, errb := storeEnv(t, map[string]string{"CARDINAL_DB": db})
	part := writeFile(t, "p.csv", "supplier,part,diameter,r1,r2,t1,glass1,efl_tolerance\n"+
		"LAB,OWN,25.4,51.68,inf,3.6,517642,0.5\nLAB,NONE,25.4,51.68,inf,3.6,517642,\n")
	if code := runCLI(e, "catalog", "import", part); code != 0 {
		t.Fatalf("import: %s", errb)
	}
	if code := runCLI(e, "catalog", "tolerances", "--efl-tol", "2%", "--thickness-tol", "0.25"); code != 0 {
		t.Fatalf("catalog tolerances: %s", errb)
	}
	out.Reset()
	if code := runCLI(e, "inspect", "LAB:OWN", "LAB:NONE", "--format", "json"); code != 0 {
		t.Fatalf("inspect: %s", errb)
	}
	var rows []struct {
		Part string `json:"part"`
		Tol  struct {
			EFL       float64 `json:"efl_pct"`
			Thickness float64 `json:"thickness_mm"`
			Index     float64 `json:"index"`
		} `json:"tolerances"`
		Stated bool              `json:"tolerances_stated"`
		From   map[string]string `json:"tolerances_from"`
	}
	if err := json.Unmarshal(out.Bytes(), &rows); err != nil || len(rows) != 2 {
		t.Fatalf("%v: %s", err, out)
	}
	own, none := rows[0], rows[1]
	if own.Tol.EFL != 0.5 || own.From["efl_pct"] != "stated" || !own.Stated {
		t.Errorf("OWN: EFL tolerance %g %% from %q, stated %v; want its own 0.5 %%", own.Tol.EFL, own.From["efl_pct"], own.Stated)
	}
	for _, r := range rows {
		if r.Tol.Thickness != 0.25 || r.From["thickness_mm"] != "catalog default" || r.Tol.Index != 0.001 || r.From["index"] != "catalog default" {
			t.Errorf("%s: thickness %g mm from %q, index %g from %q; want the catalog's 0.25 mm and 0.001", r.Part, r.Tol.Thickness,
				r.From["thickness_mm"], r.Tol.Index, r.From["index"])
		}
	}
	if none.Tol.EFL != 2 || none.From["efl_pct"] != "catalog default" || none.Stated {
		t.Errorf("NONE: EFL tolerance %g %% from %q, stated %v; want the catalog's 2 %%", none.Tol.EFL, none.From["efl_pct"], none.Stated)
	}
	out.Reset()
	if code := runCLI(e, "inspect", "LAB:OWN"); code != 0 {
		t.Fatalf("inspect: %s", errb)
	}
	for _, want := range []string{"+-0.50  % (stated)", "+-0.250  mm (catalog default)"} {
		if !strings.Contains(strings.Join(strings.Fields(out.String()), " "), strings.Join(strings.Fields(want), " ")) {
			t.Errorf("the table lacks %q:\n%s", want, out)
		}
	}
}
