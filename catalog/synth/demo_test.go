package synth

import (
	"bytes"
	"flag"
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"

	"cardinal/catalog/record"
	"cardinal/importers"
	"cardinal/optics"
)

var update = flag.Bool("update", false, "rewrite catalog/demo/catalog.csv, drawer.csv and glasses.csv from the generator")

var demoDir = filepath.Join("..", "demo")

const catalogHeader = `# cardinal demo catalog: an INVENTED scenario, written by catalog/synth
# (regenerate with: go test ./catalog/synth -run TestDemoFiles -update).
# The suppliers DEMO and TARNWICK, their part numbers, prices (currency XTS,
# the ISO 4217 code reserved for testing) and web addresses are made up. The
# prescriptions are designed from a focal length on the ISO 3 R10/R20
# series, a stock diameter and a glass (six-digit codes, fused-silica, caf2,
# sapphire) and belong to no real catalog. efl is the nominal focal length;
# bfd (at 587.6 nm) and edge_thickness are computed from the prescription,
# so the file imports without warnings. The DEMO parts of lenses.csv are
# included as they are.
`

const glassesHeader = `# cardinal demo user glasses, written by catalog/synth: an example for
# cardinal glass import. mgf2-o is a published formula (source column);
# melt-7a is an invented melt of crown glass given by its nd and Vd.
`

const drawerHeader = `# cardinal demo drawer: an INVENTED lab drawer of parts from catalog.csv,
# written by catalog/synth. Location: drawer letter and slot number.
`

// demoFiles renders the demo catalog and drawer as the files should read.
func demoFiles(t *testing.T) (catalog, drawer, glasses []byte) {
	t.Helper()
	entries := Demo(keptDemoParts(t))
	var c, d bytes.Buffer
	c.WriteString(catalogHeader)
	if err := importers.WritePrescriptions(&c, entries); err != nil {
		t.Fatal(err)
	}
	d.WriteString(drawerHeader)
	if err := importers.WriteDrawer(&d, DemoDrawer(entries)); err != nil {
		t.Fatal(err)
	}
	var g bytes.Buffer
	g.WriteString(glassesHeader)
	if err := importers.WriteGlasses(&g, DemoGlasses()); err != nil {
		t.Fatal(err)
	}
	return c.Bytes(), d.Bytes(), g.Bytes()
}

// keptDemoParts reads the DEMO parts of the small demo file lenses.csv.
func keptDemoParts(t *testing.T) []record.Entry {
	t.Helper()
	entries := readCatalog(t, "lenses.csv")
	var keep []record.Entry
	for _, e := range entries {
		if e.Part.Supplier == demoSupplier.name {
			e.Line, e.Warnings = 0, nil
			keep = append(keep, e)
		}
	}
	return keep
}

func readCatalog(t *testing.T, name string) []record.Entry {
	t.Helper()
	f, err := os.Open(filepath.Join(demoDir, name))
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	file, err := importers.ReadPrescriptionFile(f, name, optics.BuiltinGlasses())
	if err != nil {
		t.Fatalf("reading %s: %v", name, err)
	}
	if len(file.Warnings) > 0 {
		t.Errorf("%s: file warnings %v", name, file.Warnings)
	}
	return file.Rows
}

// TestDemoFiles checks that the committed demo files are what the
// generator makes; -update rewrites them.
func TestDemoFiles(t *testing.T) {
	catalog, drawer, glasses := demoFiles(t)
	for _, f := range []struct {
		name string
		want []byte
	}{{"catalog.csv", catalog}, {"drawer.csv", drawer}, {"glasses.csv", glasses}} {
		path := filepath.Join(demoDir, f.name)
		if *update {
			if err := os.WriteFile(path, f.want, 0o644); err != nil {
				t.Fatal(err)
			}
			continue
		}
		got, err := os.ReadFile(path)
		if err != nil {
			t.Fatalf("%v (run go test ./catalog/synth -run TestDemoFiles -update)", err)
		}
		if !bytes.Equal(got, f.want) {
			t.Errorf("%s differs from the generator's output; review the change and run go test ./catalog/synth -run TestDemoFiles -update", path)
		}
	}
}

// TestDemoCatalog reads the committed catalog back with the neutral CSV
// reader and holds it to the demo scenario of the catalog issue.
func TestDemoCatalog(t *testing.T) {
	entries := readCatalog(t, "catalog.csv")
	if n := len(entries); n < 300 || n > 500 {
		t.Errorf("%d parts, want 300 to 500", n)
	}
	suppliers := map[string]int{}
	kinds := map[string]int{}
	minD, maxD, minF, maxF := 1e9, 0.0, 1e9, 0.0
	for _, e := range entries {
		if len(e.Warnings) > 0 {
			t.Errorf("%s: %s", e.Part.ID(), strings.Join(e.Warnings, "; "))
		}
		checkEntry(t, e)
		suppliers[e.Part.Supplier]++
		k := kindOf(e.Part)
		if k != "achromat" && !strings.HasPrefix(k, "plano") && e.Part.Surfaces[0].Curvature()*e.StatedEFL < 0 {
			k = "negative " + k
		}
		kinds[k]++
		minD, maxD = min(minD, e.Part.Diameter), max(maxD, e.Part.Diameter)
		minF, maxF = min(minF, e.StatedEFL), max(maxF, e.StatedEFL)
	}
	if len(suppliers) != 2 || suppliers["DEMO"] == 0 || suppliers["TARNWICK"] == 0 {
		t.Errorf("suppliers %v, want DEMO and TARNWICK", suppliers)
	}
	for _, k := range []string{"plano-convex", "biconvex", "meniscus", "negative meniscus", "plano-concave", "biconcave", "achromat"} {
		if kinds[k] == 0 {
			t.Errorf("no %s part (%v)", k, kinds)
		}
	}
	if minD > 6 || maxD < 50.8 || minF > -500 || maxF < 1000 {
		t.Errorf("diameters %g-%g mm, EFL %g to %g mm: want 6-50.8 mm and about -1000 to 1000 mm", minD, maxD, minF, maxF)
	}
}

// TestDemoKeepsExamplePart checks that DEMO:PCX-50, the example part of the
// documentation, has the same prescription in catalog.csv as in lenses.csv.
func TestDemoKeepsExamplePart(t *testing.T) {
	find := func(entries []record.Entry) record.Entry {
		for _, e := range entries {
			if e.Part.ID() == "DEMO:PCX-50" {
				e.Line = 0
				return e
			}
		}
		t.Fatal("no DEMO:PCX-50")
		return record.Entry{}
	}
	a, b := find(readCatalog(t, "lenses.csv")), find(readCatalog(t, "catalog.csv"))
	if !reflect.DeepEqual(a, b) {
		t.Errorf("DEMO:PCX-50 differs:\nlenses.csv  %+v\ncatalog.csv %+v", a, b)
	}
}

func TestDemoDrawer(t *testing.T) {
	f, err := os.Open(filepath.Join(demoDir, "drawer.csv"))
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	items, err := importers.ReadDrawer(f, "drawer.csv")
	if err != nil {
		t.Fatal(err)
	}
	if n := len(items); n < 25 || n > 40 {
		t.Errorf("%d drawer items, want 25 to 40", n)
	}
	ids := map[string]bool{}
	for _, e := range readCatalog(t, "catalog.csv") {
		ids[e.Part.ID()] = true
	}
	for _, it := range items {
		if !ids[it.ID()] || it.Quantity < 1 || it.Location == "" {
			t.Errorf("line %d: %s quantity %d at %q: want a catalog part, at least one, a location", it.Line, it.ID(), it.Quantity, it.Location)
		}
	}
}

// TestDemoGlasses reads the committed glasses back: the published formula
// against handbook indices; the invented melt, which no handbook holds,
// against what any crown glass obeys.
func TestDemoGlasses(t *testing.T) {
	f, err := os.Open(filepath.Join(demoDir, "glasses.csv"))
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	file, err := importers.ReadGlassFile(f, "glasses.csv")
	if err != nil || len(file.Warnings) > 0 {
		t.Fatalf("reading glasses.csv: %v %v", err, file.Warnings)
	}
	seen := map[string]bool{}
	for _, g := range file.Rows {
		seen[g.Name] = true
		m := g.Medium()
		nd := m.Index(optics.LineD)
		vd := (nd - 1) / (m.Index(optics.LineF) - m.Index(optics.LineC)) // Abbe number, ISO 7944 (common practice)
		switch g.Name {
		case "mgf2-o":
			// Magnesium fluoride, ordinary ray: no = 1.378 at the d line and
			// Vd about 106 (the usual handbook values for MgF2, from memory).
			checkNear(t, g.Name+" nd", nd, 1.378, 5e-4, 0)
			checkNear(t, g.Name+" Vd", vd, 106, 0, 0.02)
		case "melt-7a":
			// An invented melt given by nd and Vd: the abbe formula must
			// honour the definition of both (the row's own figures are the
			// input here, not a check value), and the glass must lie on the
			// crown side of the glass map, nd below 1.6 with Vd above 55
			// (common practice).
			if g.Formula != "abbe" || len(g.Coefficients) != 2 {
				t.Fatalf("melt-7a: formula %s %v, want abbe nd Vd", g.Formula, g.Coefficients)
			}
			checkNear(t, g.Name+" nd by its definition", nd, g.Coefficients[0], 1e-9, 0)
			checkNear(t, g.Name+" Vd by its definition", vd, g.Coefficients[1], 0, 1e-6)
			if !(nd > 1.45 && nd < 1.6 && vd > 55) {
				t.Errorf("melt-7a: nd %.4f, Vd %.1f is not a crown glass", nd, vd)
			}
		default:
			t.Errorf("unexpected glass %s", g.Name)
		}
	}
	if !seen["mgf2-o"] || !seen["melt-7a"] {
		t.Errorf("glasses %v, want mgf2-o and melt-7a", seen)
	}
}
