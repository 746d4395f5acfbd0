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
			if code != tc.code || !strings.Contains(unwrapped(errb.String()), tc.stderr) {
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
