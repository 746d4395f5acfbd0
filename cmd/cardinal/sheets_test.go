package main

import (
	"bytes"
	"encoding/json"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"

	"cardinal/importers"
	"cardinal/optics"
)

func TestSheetFlags(t *testing.T) {
	e, _, _ := storeEnv(t, nil)
	for _, tc := range []struct {
		name string
		args []string
		ok   bool
	}{
		{"map", []string{"a.xlsx", "--map", "a.colmap"}, true},
		{"map, sheet, show, format", []string{"a.xlsx", "--map", "a.colmap", "--sheet", "S", "--show", "3", "--format", "json", "--dry-run"}, true},
		{"sheet without map", []string{"a.csv", "--sheet", "S"}, false},
		{"show without map", []string{"a.csv", "--show", "3"}, false},
		{"negative show", []string{"a.xlsx", "--map", "m", "--show", "-1"}, false},
		{"bad format", []string{"a.xlsx", "--map", "m", "--format", "xml"}, false},
	} {
		t.Run(tc.name, func(t *testing.T) {
			var got *catalogImportOptions
			err := parseWith(newCatalogImportCmd(e, func(o *catalogImportOptions) error { got = o; return nil }), tc.args...)
			if (err == nil) != tc.ok {
				t.Fatalf("err %v, want ok %v", err, tc.ok)
			}
			if tc.ok && (got == nil || got.Map == "" || got.File != tc.args[0]) {
				t.Errorf("options %+v", got)
			}
		})
	}
	for _, tc := range []struct {
		name string
		args []string
		ok   bool
	}{
		{"set", []string{"Crown A", "517642"}, true},
		{"remove", []string{"--remove", "Crown A"}, true},
		{"one arg", []string{"Crown A"}, false},
		{"remove with target", []string{"--remove", "Crown A", "517642"}, false},
	} {
		t.Run("alias "+tc.name, func(t *testing.T) {
			err := parseWith(newGlassAliasCmd(e, func(*glassAliasOptions) error { return nil }), tc.args...)
			if (err == nil) != tc.ok {
				t.Errorf("err %v, want ok %v", err, tc.ok)
			}
		})
	}
	var mo *catalogMappingOptions
	if err := parseWith(newCatalogMappingCmd(e, func(o *catalogMappingOptions) error { mo = o; return nil }), "a.xlsx", "--sheet", "Two"); err != nil || mo.File != "a.xlsx" || mo.Sheet != "Two" {
		t.Errorf("mapping a.xlsx --sheet Two: %+v, %v", mo, err)
	}
}

// Invented glass names (no real manufacturer's names) for the demo glasses.
var sheetGlassNames = map[string]string{"517642": "Vellum Crown", "620364": "Ardent Flint",
	"fused-silica": "Silica Clear", "caf2": "Fluor Crystal", "583594": "Moulding Glass 58"}

// demoLensSheet writes catalog/demo/lenses.csv as a supplier might: inches,
// radii as magnitudes with a shape, glasses by invented names, conic and
// asphere terms in inch units.
func demoLensSheet(t *testing.T) []byte {
	t.Helper()
	data, err := os.ReadFile("../../catalog/demo/lenses.csv")
	if err != nil {
		t.Fatal(err)
	}
	es, err := importers.ReadPrescriptions(bytes.NewReader(data), "lenses.csv", optics.BuiltinGlasses())
	if err != nil {
		t.Fatal(err)
	}
	f := excelize.NewFile()
	defer f.Close()
	f.SetSheetName("Sheet1", "Lenses")
	head := []any{"Vendor", "Part #", "Description", "Notes", "Dia. (in)", "CA (in)", "Radius 1", "Radius 2", "Radius 3", "CT1", "CT2",
		"Glass 1", "Glass 2", "Lens type", "Conic 1", "Asph 1", "EFL", "BFL", "ET", "Price", "URL"}
	f.SetSheetRow("Lenses", "A1", &head)
	in := func(v float64) any {
		if v == 0 {
			return nil
		}
		return v / 25.4
	}
	for i, e := range es {
		p := e.Part
		row := []any{p.Supplier, p.Name, p.Description, e.Notes, in(p.Diameter), in(p.ClearAperture)}
		signs := ""
		for j := range 3 {
			switch {
			case j >= len(p.Surfaces):
				row = append(row, nil)
			case math.IsInf(p.Surfaces[j].Radius, 0):
				row, signs = append(row, "Flat"), signs+"+"
			default:
				row = append(row, math.Abs(p.Surfaces[j].Radius)/25.4)
				signs += map[bool]string{true: "+", false: "-"}[p.Surfaces[j].Radius > 0]
			}
		}
		for j := range 2 {
			if j < len(p.Thickness) {
				row = append(row, p.Thickness[j]/25.4)
			} else {
				row = append(row, nil)
			}
		}
		for j := range 2 {
			if j < len(p.Media) {
				row = append(row, sheetGlassNames[p.Media[j].Name()])
			} else {
				row = append(row, nil)
			}
		}
		var conic, asph any
		if s := p.Surfaces[0]; s.Conic != 0 || s.Asph != [7]float64{} {
			conic = s.Conic
			// a_n in inch^(1-n): a_n(mm) * 25.4^(n-1) (the sag term a_n h^n is a length).
			asph = fmt.Sprintf("a4=%.17g a6=%.17g", s.Asph[0]*math.Pow(25.4, 3), s.Asph[1]*math.Pow(25.4, 5))
		}
		row = append(row, signs, conic, asph, in(e.StatedEFL), in(e.StatedBFD), in(e.StatedEdge), e.Price, e.URL)
		f.SetSheetRow("Lenses", fmt.Sprintf("A%d", i+2), &row)
	}
	b, err := f.WriteToBuffer()
	if err != nil {
		t.Fatal(err)
	}
	return b.Bytes()
}

const lensMapping = `lengths: inch
radii: magnitudes
supplier <- Vendor
part <- Part #
description <- Description
notes <- Notes
diameter <- Dia. (in)
clear_aperture <- CA (in)
r1 <- Radius 1
r2 <- Radius 2
r3 <- Radius 3
t1 <- CT1
t2 <- CT2
glass1 <- Glass 1
glass2 <- Glass 2
shape <- Lens type
conic1 <- Conic 1
asph1 <- Asph 1
efl <- EFL
bfd <- BFL
edge_thickness <- ET
price <- Price
url <- URL
currency = XTS
glass Moulding Glass 58 -> 583594
`

// listJSON runs catalog list --format json on a catalog.
func listJSON(t *testing.T, db string) []map[string]any {
	t.Helper()
	e, out, errb := storeEnv(t, nil)
	if code := execute([]string{"--db", db, "catalog", "list", "--format", "json"}, e); code != 0 {
		t.Fatalf("list: %s", errb)
	}
	var parts []map[string]any
	if err := json.Unmarshal(out.Bytes(), &parts); err != nil {
		t.Fatal(err)
	}
	return parts
}

// TestMappedImportRoundTrip: the demo lenses written as a supplier sheet in
// inches, with magnitudes and glass names resolved by the user's aliases,
// import to the catalog the neutral CSV gives: the same parts with the same
// computed cardinal points to 1e-9 mm.
func TestMappedImportRoundTrip(t *testing.T) {
	dir := t.TempDir()
	sheetDB, csvDB := filepath.Join(dir, "sheet.db"), filepath.Join(dir, "csv.db")
	xlsx := filepath.Join(dir, "lenses.xlsx")
	colmap := filepath.Join(dir, "lenses.colmap")
	os.WriteFile(xlsx, demoLensSheet(t), 0o644)
	os.WriteFile(colmap, []byte(lensMapping), 0o644)
	run := func(args ...string) string {
		t.Helper()
		e, out, errb := storeEnv(t, nil)
		if code := execute(args, e); code != 0 {
			t.Fatalf("%v: exit %d: %s", args, code, errb)
		}
		return out.String() + errb.String()
	}
	for code, name := range sheetGlassNames {
		if code != "583594" {
			run("--db", sheetDB, "glass", "alias", name, code)
		}
	}
	run("--db", sheetDB, "catalog", "import", xlsx, "--map", colmap)
	run("--db", csvDB, "catalog", "import", "../../catalog/demo/lenses.csv")
	got, want := listJSON(t, sheetDB), listJSON(t, csvDB)
	if len(got) != len(want) || len(want) != 13 {
		t.Fatalf("%d parts from the sheet, %d from the CSV, want 13", len(got), len(want))
	}
	for i := range want {
		for k, w := range want[i] {
			g := got[i][k]
			wf, isNum := w.(float64)
			gf, _ := g.(float64)
			switch {
			case isNum && math.Abs(gf-wf) > 1e-9:
				t.Errorf("%v %s: %v, want %v (1e-9)", want[i]["part"], k, g, w)
			case !isNum && fmt.Sprint(g) != fmt.Sprint(w):
				t.Errorf("%v %s: %v, want %v", want[i]["part"], k, g, w)
			}
		}
	}
}

// TestPreviewFlagsWrongSigns: a mapping that calls a magnitude sheet
// signed turns every biconvex part into a meniscus; the preview's stated
// EFL check flags each of them, and nothing is stored.
func TestPreviewFlagsWrongSigns(t *testing.T) {
	dir := t.TempDir()
	db := filepath.Join(dir, "c.db")
	xlsx := filepath.Join(dir, "lenses.xlsx")
	colmap := filepath.Join(dir, "wrong.colmap")
	os.WriteFile(xlsx, demoLensSheet(t), 0o644)
	wrong := strings.Replace(lensMapping, "radii: magnitudes", "radii: signed", 1)
	wrong = strings.Replace(wrong, "glass Moulding", "glass Vellum Crown -> 517642\nglass Ardent Flint -> 620364\nglass Silica Clear -> fused-silica\nglass Fluor Crystal -> caf2\nglass Moulding", 1)
	os.WriteFile(colmap, []byte(wrong), 0o644)
	e, out, errb := storeEnv(t, nil)
	// Signed, the biconcave parts' magnitudes make biconvex lenses with a
	// negative edge: those rows fail, and the preview shows the rest.
	if code := execute([]string{"--db", db, "catalog", "import", xlsx, "--map", colmap, "--dry-run", "--format", "json"}, e); code != exitUsage {
		t.Fatalf("exit %d, want %d: %s", code, exitUsage, errb)
	}
	if !strings.Contains(errb.String(), "negative edge thickness") {
		t.Errorf("stderr does not name the failing rows:\n%s", errb)
	}
	var pv previewJSON
	if err := json.Unmarshal(out.Bytes(), &pv); err != nil {
		t.Fatalf("%v\n%s", err, out)
	}
	flagged := map[string]bool{}
	for _, p := range pv.Disagree {
		flagged[p.Part] = true
	}
	// The biconvex parts of catalog/demo/lenses.csv.
	for _, part := range []string{"DCX-75", "BCX-30"} {
		if !flagged[part] {
			t.Errorf("biconvex %s not flagged; flagged %v", part, flagged)
		}
	}
	// Parts with no negative radius are read the same either way.
	for _, part := range []string{"PCX-25", "PCX-50", "MEN-100", "FS-PCX-100", "ASP-20"} {
		if flagged[part] {
			t.Errorf("%s flagged, but its radii are all positive", part)
		}
	}
	if pv.Parts < 10 || len(pv.First) != 10 {
		t.Errorf("preview of %d parts, first %d rows; want at least 10 and 10", pv.Parts, len(pv.First))
	}
	if _, err := os.Stat(db); err == nil {
		t.Errorf("a dry run created the catalog")
	}
}

func TestRunSheetCommands(t *testing.T) {
	dir := t.TempDir()
	db := filepath.Join(dir, "c.db")
	xlsx := filepath.Join(dir, "lenses.xlsx")
	os.WriteFile(xlsx, demoLensSheet(t), 0o644)
	tests := []struct {
		name     string
		args     []string
		terminal bool
		code     int
		out, err string // parts of stdout and stderr
	}{
		{name: "guess a mapping", args: []string{"catalog", "mapping", xlsx}, out: "r1 <- Radius 1\n"},
		{name: "guess from a missing sheet", args: []string{"catalog", "mapping", xlsx, "--sheet", "Nope"}, code: exitUsage, err: `there is no sheet`},
		{name: "alias to a code", args: []string{"glass", "alias", "Vellum Crown", "517642"}, out: `added the glass alias "Vellum Crown" -> 517642 (nd 1.51700)`},
		{name: "alias again", args: []string{"glass", "alias", "vellum crown", "517642"}, out: "replaced"},
		{name: "the neutral CSV uses aliases too", args: []string{"catalog", "import", "NEUTRAL"}, out: "1 added"},
		{name: "alias over a glass", args: []string{"glass", "alias", "caf2", "517642"}, code: exitUsage, err: "is already a glass"},
		{name: "alias to nothing", args: []string{"glass", "alias", "Odd", "12345"}, code: exitUsage, err: "the target must be a six-digit glass code"},
		{name: "list aliases", args: []string{"glass", "aliases", "--format", "csv"}, out: "name,glass,nd\nvellum crown,517642,1.517\n"}, // the latest spelling,
		{name: "remove an alias", args: []string{"glass", "alias", "--remove", "VELLUM CROWN"}, out: "removed"},
		{name: "remove it again", args: []string{"glass", "alias", "--remove", "Vellum Crown"}, code: exitNotFound, err: "no glass alias"},
		{name: "unknown glasses, progress on a terminal", args: []string{"catalog", "import", xlsx, "--map", "MAP"}, terminal: true, code: exitUsage,
			err: "reading " + xlsx + ": 13 rows\n"},
		{name: "map without the file", args: []string{"catalog", "import", xlsx, "--map", filepath.Join(dir, "none.colmap")}, code: exitNotFound, err: "no such file"},
	}
	colmap := filepath.Join(dir, "lenses.colmap")
	os.WriteFile(colmap, []byte(lensMapping), 0o644)
	neutral := filepath.Join(dir, "lab.csv")
	os.WriteFile(neutral, []byte("supplier,part,diameter,r1,r2,t1,glass1\nLAB,L-1,25.4,51.68,inf,3.6,vellum CROWN\n"), 0o644)
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			e, out, errb := storeEnv(t, nil)
			e.ErrTerminal = tc.terminal
			args := append([]string{"--db", db}, tc.args...)
			for i, a := range args {
				switch a {
				case "MAP":
					args[i] = colmap
				case "NEUTRAL":
					args[i] = neutral
				}
			}
			if code := execute(args, e); code != tc.code {
				t.Fatalf("exit %d, want %d; stderr:\n%s", code, tc.code, errb)
			}
			if !strings.Contains(out.String(), tc.out) || !strings.Contains(errb.String(), tc.err) {
				t.Errorf("stdout:\n%s\nstderr:\n%s\nwant %q and %q", out, errb, tc.out, tc.err)
			}
			if !tc.terminal && strings.Contains(errb.String(), "\r") {
				t.Errorf("progress on a stderr that is not a terminal")
			}
		})
	}
}
