package main

import (
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"reflect"
	"sort"
	"strings"
	"testing"

	"github.com/spf13/cobra"

	"cardinal/catalog"
)

// parseWith runs a command built with a capturing run function on args
// and returns the run's error (nil when the flags parsed and validated).
func parseWith(cmd *cobra.Command, args ...string) error {
	cmd.PersistentPreRunE = checkNumbers // as the root runs it before every command
	cmd.SetArgs(args)
	cmd.SilenceErrors, cmd.SilenceUsage = true, true
	cmd.SetOut(new(strings.Builder))
	cmd.SetErr(new(strings.Builder))
	return cmd.Execute()
}

func TestCatalogListFlags(t *testing.T) {
	inf := math.Inf(1)
	for _, tc := range []struct {
		name string
		args []string
		want catalog.Filter
		err  string
	}{
		{"none", nil, catalog.Filter{}, ""},
		{"efl range", []string{"--efl", "45:55"}, catalog.Filter{EFL: catalog.Range{Min: 45, Max: 55}}, ""},
		{"efl from", []string{"--efl", "100:"}, catalog.Filter{EFL: catalog.Range{Min: 100, Max: inf}}, ""},
		{"efl negative", []string{"--efl", ":0"}, catalog.Filter{EFL: catalog.Range{Min: -inf, Max: 0}}, ""},
		{"diameter max", []string{"--diameter-max", "25.4"}, catalog.Filter{Diameter: catalog.Range{Min: 0, Max: 25.4}}, ""},
		{"diameter min", []string{"--diameter-min", "30"}, catalog.Filter{Diameter: catalog.Range{Min: 30, Max: inf}}, ""},
		{"suppliers and kinds", []string{"--supplier", "DEMO,FICTA", "--kind", "positive", "--kind", "singlet", "--in-drawer"},
			catalog.Filter{Suppliers: []string{"DEMO", "FICTA"}, Kinds: []string{"positive", "singlet"}, InDrawer: true}, ""},
		{"efl not a range", []string{"--efl", "50"}, catalog.Filter{}, "MIN:MAX"},
		{"efl backwards", []string{"--efl", "60:40"}, catalog.Filter{}, "above MAX"},
		{"efl not a number", []string{"--efl", "a:b"}, catalog.Filter{}, "not a finite number"},
		{"diameters backwards", []string{"--diameter-min", "30", "--diameter-max", "20"}, catalog.Filter{}, "min <= max"},
		{"unknown kind", []string{"--kind", "round"}, catalog.Filter{}, "--kind"},
		{"unknown format", []string{"--format", "xml"}, catalog.Filter{}, "--format"},
		{"argument", []string{"extra"}, catalog.Filter{}, "unknown command"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			e, _, _ := storeEnv(t, nil)
			var got *catalogListOptions
			err := parseWith(newCatalogListCmd(e, func(o *catalogListOptions) error { got = o; return nil }), tc.args...)
			if tc.err != "" {
				if err == nil || !strings.Contains(err.Error(), tc.err) {
					t.Errorf("error %v, want %q", err, tc.err)
				}
				return
			}
			if err != nil {
				t.Fatal(err)
			}
			if !reflect.DeepEqual(got.filter, tc.want) {
				t.Errorf("filter %+v, want %+v", got.filter, tc.want)
			}
		})
	}
}

func TestCatalogImportAndRemoveFlags(t *testing.T) {
	e, _, _ := storeEnv(t, nil)
	var imp *catalogImportOptions
	if err := parseWith(newCatalogImportCmd(e, func(o *catalogImportOptions) error { imp = o; return nil }), "a.csv", "--dry-run"); err != nil || imp.File != "a.csv" || !imp.DryRun {
		t.Errorf("import a.csv --dry-run: %+v, %v", imp, err)
	}
	for _, args := range [][]string{nil, {"a.csv", "b.csv"}} {
		if err := parseWith(newCatalogImportCmd(e, func(*catalogImportOptions) error { return nil }), args...); err == nil {
			t.Errorf("import %v: no error", args)
		}
	}
	var rm *catalogRemoveOptions
	if err := parseWith(newCatalogRemoveCmd(e, func(o *catalogRemoveOptions) error { rm = o; return nil }), "DEMO:PCX-50"); err != nil || rm.Part != "DEMO:PCX-50" {
		t.Errorf("remove DEMO:PCX-50: %+v, %v", rm, err)
	}
	var ex *catalogExportOptions
	if err := parseWith(newCatalogExportCmd(e, func(o *catalogExportOptions) error { ex = o; return nil }), "--supplier", "DEMO"); err != nil || !reflect.DeepEqual(ex.Suppliers, []string{"DEMO"}) {
		t.Errorf("export --supplier DEMO: %+v, %v", ex, err)
	}
}

// writeFile writes a file in a fresh directory and returns its path.
func writeFile(t *testing.T, name, text string) string {
	t.Helper()
	p := filepath.Join(t.TempDir(), name)
	if err := os.WriteFile(p, []byte(text), 0o644); err != nil {
		t.Fatal(err)
	}
	return p
}

func TestRunCatalogCommands(t *testing.T) {
	db := filepath.Join(t.TempDir(), "c.db")
	e, out, errb := storeEnv(t, map[string]string{"CARDINAL_DB": db})
	good := "supplier,part,diameter,r1,r2,t1,glass1,efl\nLAB,L-1,25.4,51.68,inf,3.6,517642,90\nLAB,L-2,12.7,20.5,-20.5,4,517642,\n"
	badMid := "supplier,part,diameter,r1,r2,t1,glass1\nLAB,L-3,25.4,40,inf,3,517642\nLAB,L-4,25.4,5,inf,3,517642\nLAB,L-5,25.4,60,inf,3,517642\n"
	tests := []struct {
		name    string
		args    []string
		code    int
		stdout  string // a fragment, "" for none to check
		stderr  string
		changes bool // whether the export may differ after
	}{
		{"list of a named catalog not there yet", []string{"catalog", "list"}, exitNotFound, "", "does not exist; create it with 'cardinal catalog import FILE'", false},
		{"dry run creates nothing", []string{"catalog", "import", demoLensesCSV, "--dry-run"}, 0, "into " + db + " (a new catalog; a dry run creates none)", "", false},
		{"import", []string{"catalog", "import", demoLensesCSV}, 0, "13 added, 0 updated, 0 unchanged", "", true},
		{"import again", []string{"catalog", "import", demoLensesCSV}, 0, "0 added, 0 updated, 13 unchanged", "", false},
		{"import with a warning", []string{"catalog", "import", writeFile(t, "w.csv", good)}, 0, "2 added", "efl: stated 90 mm", true},
		{"a bad row mid-file", []string{"catalog", "import", writeFile(t, "b.csv", badMid)}, exitUsage, "", "b.csv:3: r1:", false},
		{"missing file", []string{"catalog", "import", "/no/such.csv"}, exitNotFound, "", "no such file", false},
		{"not a CSV", []string{"catalog", "import", writeFile(t, "x.csv", "\x00\x01\x02 binary \xff\xfe")}, exitUsage, "", "UTF-8", false},
		{"not a prescription CSV", []string{"catalog", "import", writeFile(t, "y.csv", "name,age\nann,3\n")}, exitUsage, "", "supplier", false},
		{"list filtered", []string{"catalog", "list", "--efl", "45:55", "--format", "csv"}, 0, "DEMO,PCX-50,", "", false},
		{"list nothing", []string{"catalog", "list", "--efl", "5000:6000"}, 0, "", "no part matches", false},
		{"list shows warnings", []string{"catalog", "list", "--supplier", "LAB"}, 0, "LAB:L-1", "LAB:L-1: efl:", false},
		{"remove unknown", []string{"catalog", "remove", "DEMO:PCX-5O"}, exitNotFound, "", "did you mean DEMO:PCX-50", false},
		{"export unknown supplier", []string{"catalog", "export", "--supplier", "NOBODY"}, exitNotFound, "", "NOBODY", false},
		{"remove", []string{"catalog", "remove", "LAB:L-2"}, 0, "removed LAB:L-2", "", true},
	}
	export := func() string {
		t.Helper()
		if _, err := os.Stat(db); err != nil {
			return "no file"
		}
		if code := runCLI(e, "catalog", "export"); code != 0 {
			t.Fatalf("export: exit %d, %s", code, errb)
		}
		return out.String()
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			before := export()
			code := runCLI(e, tc.args...)
			if code != tc.code || !strings.Contains(out.String(), tc.stdout) || !strings.Contains(unwrap(errb.String()), tc.stderr) {
				t.Errorf("exit %d, stdout %q, stderr %q; want exit %d, %q and %q", code, out, errb, tc.code, tc.stdout, tc.stderr)
			}
			if after := export(); !tc.changes && after != before {
				t.Errorf("the catalog changed")
			}
		})
	}
}

func TestCatalogListJSONKeys(t *testing.T) {
	e, out, _ := storeEnv(t, nil)
	if code := runCLI(e, "catalog", "list", "--format", "json", "--efl", "45:55"); code != 0 {
		t.Fatal(code)
	}
	var rows []map[string]any
	if err := json.Unmarshal(out.Bytes(), &rows); err != nil || len(rows) == 0 {
		t.Fatalf("%v: %s", err, out)
	}
	var keys []string
	for k := range rows[0] {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	// Keys shared with inspect (issue 2) keep its names; every key is
	// snake_case with its unit (DESIGN.md, Outputs).
	for _, k := range []string{"supplier", "part", "wavelength_nm", "length_mm", "efl_mm", "bfd_mm", "ffd_mm", "principal_mm", "principal_prime_mm", "warnings"} {
		if _, ok := rows[0][k]; !ok {
			t.Errorf("key %s missing from %v", k, keys)
		}
	}
	for _, k := range keys {
		if k != strings.ToLower(k) || strings.Contains(k, " ") {
			t.Errorf("key %q is not snake_case", k)
		}
	}
	// Every row lies in the asked range, and the reversed BFD of a lens in
	// air is minus its forward FFD (the thick-lens formulas are symmetric
	// under R1, R2 -> -R2, -R1; Hecht, Optics, 5th ed., sec. 6.2.1).
	for _, r := range rows {
		efl := r["efl_mm"].(float64)
		if efl < 45 || efl > 55 {
			t.Errorf("%s: EFL %g outside 45:55", r["part"], efl)
		}
		if d := r["reversed_bfd_mm"].(float64) + r["ffd_mm"].(float64); math.Abs(d) > 1e-9 {
			t.Errorf("%s: reversed BFD + FFD = %g, want 0", r["part"], d)
		}
	}
}
