package main

import (
	"encoding/json"
	"math"
	"path/filepath"
	"strings"
	"testing"
)

func TestGlassFlags(t *testing.T) {
	e, _, _ := storeEnv(t, nil)
	var imp *importOptions
	if err := parseWith(newGlassImportCmd(e, func(o *importOptions) error { imp = o; return nil }), "g.csv", "--dry-run"); err != nil || imp.File != "g.csv" || !imp.DryRun {
		t.Errorf("import g.csv --dry-run: %+v, %v", imp, err)
	}
	for _, tc := range []struct {
		name string
		args []string
		user bool
		err  bool
	}{
		{"default", nil, false, false},
		{"user csv", []string{"--user", "--format", "csv"}, true, false},
		{"bad format", []string{"--format", "yaml"}, false, true},
	} {
		t.Run(tc.name, func(t *testing.T) {
			var got *glassListOptions
			err := parseWith(newGlassListCmd(e, func(o *glassListOptions) error { got = o; return nil }), tc.args...)
			if (err != nil) != tc.err || err == nil && got.User != tc.user {
				t.Errorf("%v: %+v, %v", tc.args, got, err)
			}
		})
	}
}

func TestRunGlassCommands(t *testing.T) {
	db := filepath.Join(t.TempDir(), "c.db")
	e, out, errb := storeEnv(t, map[string]string{"CARDINAL_DB": db})
	// A user glass of constant index 1.5, and a part made of it: a
	// plano-convex lens R 50 mm, f = R/(n - 1) = 100 mm (Hecht, Optics,
	// 5th ed., eq. 6.2 with 1/R2 = 0).
	glass15 := writeFile(t, "g.csv", "name,formula,coefficients\ntest-glass,constant,1.5\n")
	glass16 := writeFile(t, "g2.csv", "name,formula,coefficients\ntest-glass,constant,1.6\n")
	part := writeFile(t, "p.csv", "supplier,part,diameter,r1,r2,t1,glass1\nLAB,G-1,20,50,inf,4,test-glass\n")
	efl := func() float64 {
		t.Helper()
		if code := runCLI(e, "catalog", "list", "--format", "json"); code != 0 {
			t.Fatalf("list: %s", errb)
		}
		var rows []struct {
			EFL float64 `json:"efl_mm"`
		}
		json.Unmarshal(out.Bytes(), &rows)
		return rows[0].EFL
	}
	for _, tc := range []struct {
		name   string
		args   []string
		code   int
		stdout string
		stderr string
	}{
		{"part before its glass", []string{"catalog", "import", part}, exitUsage, "", `unknown glass "test-glass"`},
		{"glass import", []string{"glass", "import", glass15}, 0, "glasses: 1 added", ""},
		{"part", []string{"catalog", "import", part}, 0, "parts: 1 added", ""},
		{"bad glass file", []string{"glass", "import", writeFile(t, "bad.csv", "name,formula,coefficients\nair,constant,1\nx,sellmeier,1\n")}, exitUsage, "", "bad.csv:2: name:"},
		{"glass list", []string{"glass", "list"}, 0, "test-glass", ""},
		{"user glasses as CSV", []string{"glass", "list", "--user", "--format", "csv"}, 0, "name,formula,coefficients,min_nm,max_nm,source\ntest-glass,constant,1.5,,,\n", ""},
	} {
		t.Run(tc.name, func(t *testing.T) {
			code := runCLI(e, tc.args...)
			if code != tc.code || !strings.Contains(out.String(), tc.stdout) || !strings.Contains(unwrap(errb.String()), tc.stderr) {
				t.Errorf("exit %d, stdout %q, stderr %q; want %d, %q, %q", code, out, errb, tc.code, tc.stdout, tc.stderr)
			}
		})
	}
	if got := efl(); math.Abs(got-100) > 1e-9 {
		t.Errorf("EFL %.12g at n 1.5, want 100", got)
	}
	// The glass changes: the part is recomputed, f = 50/0.6 mm.
	if code := runCLI(e, "glass", "import", glass16); code != 0 || !strings.Contains(out.String(), "recomputed 1 part") {
		t.Errorf("glass update: exit %d, %q %q", code, out, errb)
	}
	if got := efl(); math.Abs(got-50/0.6) > 1e-9 {
		t.Errorf("EFL %.12g after the glass change, want %.12g", got, 50/0.6)
	}
}

func TestDescribeGlassAbbe(t *testing.T) {
	// Fused silica: nd 1.4585, Vd 67.8 (Malitson, J. Opt. Soc. Am. 55,
	// 1205 (1965); Vd from its nF and nC, common practice).
	for _, g := range builtinGlasses() {
		if g.Name == "fused-silica" {
			if math.Abs(g.Nd-1.4585) > 1e-4 || g.Vd == nil || math.Abs(*g.Vd-67.8) > 0.1 {
				t.Errorf("fused silica nd %.5f Vd %v", g.Nd, g.Vd)
			}
			return
		}
	}
	t.Error("no fused-silica among the built-in glasses")
}
