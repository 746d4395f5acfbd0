package importers

import (
	"bytes"
	"fmt"
	"math"
	"os"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"

	"cardinal/catalog/record"
	"cardinal/optics"
)

// The workbooks of these tests are written by the excelize library, so the
// reader is checked against files another program wrote.

// buildXLSX writes rows (from row 1) into sheet and lets edit change the
// workbook before it is saved.
func buildXLSX(t testing.TB, sheet string, rows [][]any, edit func(f *excelize.File)) []byte {
	t.Helper()
	f := excelize.NewFile()
	defer f.Close()
	if err := f.SetSheetName("Sheet1", sheet); err != nil {
		t.Fatal(err)
	}
	for i, r := range rows {
		r := r
		if err := f.SetSheetRow(sheet, fmt.Sprintf("A%d", i+1), &r); err != nil {
			t.Fatal(err)
		}
	}
	if edit != nil {
		edit(f)
	}
	b, err := f.WriteToBuffer()
	if err != nil {
		t.Fatal(err)
	}
	return b.Bytes()
}

func readMap(t *testing.T, text string) *Mapping {
	t.Helper()
	m, err := ReadMapping(strings.NewReader(text), "test.colmap")
	if err != nil {
		t.Fatalf("mapping: %v", err)
	}
	return m
}

// Invented glass names for the demo catalog's glasses (never a real
// manufacturer's catalogue name).
var inventedGlass = map[string]string{
	"517642": "Vellum Crown", "589613": "Saffron Crown", "620364": "Ardent Flint",
	"755276": "Umber Flint", "785258": "Cinder Flint", "847238": "Raven Flint",
	"fused-silica": "Silica Clear", "caf2": "Fluor Crystal", "sapphire": "sapphire",
}

// demoEntries reads the demo catalog's neutral CSV.
func demoEntries(t testing.TB) []record.Entry {
	t.Helper()
	data, err := os.ReadFile("../catalog/demo/catalog.csv")
	if err != nil {
		t.Fatal(err)
	}
	es, err := ReadPrescriptions(bytes.NewReader(data), "catalog.csv", optics.BuiltinGlasses())
	if err != nil {
		t.Fatal(err)
	}
	return es
}

// shapeOf writes the shape of a part for a sheet that gives magnitudes: a
// word for a singlet, a sign pattern otherwise.
func shapeOf(p optics.Part) string {
	sign := func(r float64) int {
		switch {
		case math.IsInf(r, 0):
			return 0
		case r > 0:
			return 1
		}
		return -1
	}
	if len(p.Surfaces) == 2 {
		s1, s2 := sign(p.Surfaces[0].Radius), sign(p.Surfaces[1].Radius)
		switch {
		case s1 > 0 && s2 < 0:
			return "Biconvex"
		case s1 == 0 && s2 < 0 || s1 > 0 && s2 == 0:
			return "Plano-Convex"
		case s1 < 0 && s2 > 0:
			return "biconcave"
		case s1 == 0 && s2 > 0 || s1 < 0 && s2 == 0:
			return "plano concave"
		case s1 > 0 && s2 > 0:
			return "Meniscus"
		}
	}
	var b strings.Builder
	for _, s := range p.Surfaces {
		if sign(s.Radius) < 0 {
			b.WriteByte('-')
		} else {
			b.WriteByte('+')
		}
	}
	return b.String()
}

// demoSheetRows writes the demo catalog as a supplier sheet might: a title
// row merged across the top, an empty row, the header in row 3, lengths in
// inches, radii as magnitudes with a shape column, flats as 0 or "Plano",
// glasses by invented names.
func demoSheetRows(entries []record.Entry) [][]any {
	rows := [][]any{{"Stock lenses (invented demo data)"}, {},
		{"Maker", "Item No.", "Description", "Dia. (in)", "CA (in)", "R1 (in)", "R2 (in)", "R3 (in)", "CT 1 (in)", "CT 2 (in)",
			"Material 1", "Material 2", "Shape", "EFL (in)", "BFL (in)", "ET (in)", "Price", "Link", "Remarks"}}
	in := func(v float64) any {
		if v == 0 {
			return nil
		}
		return v / MillimetresPerInch
	}
	for i, e := range entries {
		p := e.Part
		r := []any{p.Supplier, p.Name, p.Description, in(p.Diameter), in(p.ClearAperture)}
		for j := range 3 {
			switch {
			case j >= len(p.Surfaces):
				r = append(r, nil)
			case math.IsInf(p.Surfaces[j].Radius, 0) && i%2 == 0:
				r = append(r, 0)
			case math.IsInf(p.Surfaces[j].Radius, 0):
				r = append(r, "Plano")
			default:
				r = append(r, math.Abs(p.Surfaces[j].Radius)/MillimetresPerInch)
			}
		}
		for j := range 2 {
			if j < len(p.Thickness) {
				r = append(r, p.Thickness[j]/MillimetresPerInch)
			} else {
				r = append(r, nil)
			}
		}
		for j := range 2 {
			if j < len(p.Media) {
				r = append(r, inventedGlass[p.Media[j].Name()])
			} else {
				r = append(r, nil)
			}
		}
		r = append(r, shapeOf(p), in(e.StatedEFL), in(e.StatedBFD), in(e.StatedEdge), e.Price, e.URL, e.Notes)
		rows = append(rows, r)
	}
	return rows
}

const demoMapping = `# the demo sheet of the tests
sheet: Stock
header row: 3
lengths: inch
radii: magnitudes
flat: 0, plano
supplier <- Maker
part <- Item No.
description <- Description
diameter <- Dia. (in)
clear_aperture <- CA (in)
r1 <- R1 (in)
r2 <- R2 (in)
r3 <- R3 (in)
t1 <- CT 1 (in)
t2 <- CT 2 (in)
glass1 <- Material 1
glass2 <- Material 2
shape <- Shape
efl <- EFL (in)
bfd <- BFL (in)
edge_thickness <- ET (in)
price <- Price
currency = XTS
url <- Link
notes <- Remarks
glass Vellum Crown -> 517642
glass Saffron Crown -> 589613
glass Ardent Flint -> 620364
glass Silica Clear -> fused-silica
`

// aliasTable is the built-in glass table with the rest of the invented
// names as aliases, as the catalog gives it with the user's aliases.
func aliasTable() optics.GlassTable {
	t := optics.BuiltinGlasses()
	for code, name := range map[string]string{"755276": "Umber Flint", "785258": "Cinder Flint", "847238": "Raven Flint"} {
		m, err := optics.GlassCode(code)
		if err != nil {
			panic(err)
		}
		t[strings.ToLower(name)] = m
	}
	t["fluor crystal"] = t["caf2"]
	return t
}

// TestReadMappedRoundTrip: the demo catalog written as a supplier sheet
// (inches, magnitudes, glass names) reads back to the entries of its
// neutral CSV, with the same cardinal points to 1e-9 mm.
func TestReadMappedRoundTrip(t *testing.T) {
	want := demoEntries(t)
	data := buildXLSX(t, "Stock", demoSheetRows(want), func(f *excelize.File) {
		if err := f.MergeCell("Stock", "A1", "F1"); err != nil { // a title above the header is fine
			t.Fatal(err)
		}
	})
	got, err := ReadMapped(Source{Name: "stock.xlsx", Data: data}, readMap(t, demoMapping), MapOptions{Glasses: aliasTable()})
	if err != nil {
		t.Fatal(err)
	}
	if len(got.Rows) != len(want) {
		t.Fatalf("got %d entries, want %d", len(got.Rows), len(want))
	}
	if len(got.Warnings) != 0 {
		t.Errorf("warnings: %v", got.Warnings)
	}
	for i, w := range want {
		g := got.Rows[i]
		compareEntries(t, g, w)
		if g.Line != i+4 {
			t.Errorf("%s: line %d, want row %d", w.Part.ID(), g.Line, i+4)
		}
	}
}

// compareEntries checks that two entries describe the same part: text
// equal, lengths equal to a relative 1e-12 (an inch value times 25.4 may
// differ from the mm value in the last bit), cardinal points both ways to
// 1e-9 mm.
func compareEntries(t *testing.T, g, w record.Entry) {
	t.Helper()
	id := w.Part.ID()
	near := func(what string, a, b float64) {
		if a == b || math.Abs(a-b) <= 1e-12*math.Max(math.Abs(a), math.Abs(b)) {
			return
		}
		t.Errorf("%s: %s = %.17g, want %.17g", id, what, a, b)
	}
	if g.Part.ID() != id || g.Part.Description != w.Part.Description || g.URL != w.URL || g.Notes != w.Notes || g.Currency != w.Currency {
		t.Errorf("%s: text fields differ: got %+v", id, g)
	}
	if len(g.Part.Surfaces) != len(w.Part.Surfaces) {
		t.Fatalf("%s: %d surfaces, want %d", id, len(g.Part.Surfaces), len(w.Part.Surfaces))
	}
	for j := range w.Part.Surfaces {
		near(fmt.Sprintf("r%d", j+1), g.Part.Surfaces[j].Radius, w.Part.Surfaces[j].Radius)
	}
	for j := range w.Part.Thickness {
		near(fmt.Sprintf("t%d", j+1), g.Part.Thickness[j], w.Part.Thickness[j])
		if g.Part.Media[j].Name() != w.Part.Media[j].Name() {
			t.Errorf("%s: glass%d %s, want %s", id, j+1, g.Part.Media[j].Name(), w.Part.Media[j].Name())
		}
	}
	near("diameter", g.Part.Diameter, w.Part.Diameter)
	near("clear aperture", g.Part.ClearAperture, w.Part.ClearAperture)
	near("efl", g.StatedEFL, w.StatedEFL)
	near("bfd", g.StatedBFD, w.StatedBFD)
	near("edge", g.StatedEdge, w.StatedEdge)
	near("price", g.Price, w.Price)
	for _, rev := range []bool{false, true} {
		gp, wp := g.Part, w.Part
		if rev {
			gp, wp = gp.Reversed(), wp.Reversed()
		}
		gc, wc := gp.System(nil, nil).Cardinal(optics.LineD), wp.System(nil, nil).Cardinal(optics.LineD)
		for _, v := range []struct {
			name string
			a, b float64
		}{{"EFL", gc.EFL, wc.EFL}, {"F", gc.F, wc.F}, {"F'", gc.FPrime, wc.FPrime}, {"P", gc.P, wc.P}, {"P'", gc.PPrime, wc.PPrime}, {"N", gc.N, wc.N}, {"N'", gc.NPrime, wc.NPrime}} {
			if math.Abs(v.a-v.b) > 1e-9 {
				t.Errorf("%s (reversed %v): %s %.12g mm, want %.12g mm", id, rev, v.name, v.a, v.b)
			}
		}
	}
}

// TestInchIsExact: 1 inch = 25.4 mm exactly, the international inch of the
// international yard and pound agreement (1959).
func TestInchIsExact(t *testing.T) {
	m := readMap(t, "lengths: inch\nsupplier = X\npart <- p\ndiameter <- d\nr1 <- r1\nr2 <- r2\nt1 <- t\nglass1 = 517642\n")
	src := Source{Name: "in.csv", Data: []byte("p,d,r1,r2,t\nA,1,1,inf,0.25\n")}
	got, err := ReadMapped(src, m, MapOptions{})
	if err != nil {
		t.Fatal(err)
	}
	p := got.Rows[0].Part
	for _, c := range []struct {
		name      string
		got, want float64
	}{{"diameter", p.Diameter, 25.4}, {"r1", p.Surfaces[0].Radius, 25.4}, {"t1", p.Thickness[0], 6.35}} {
		if c.got != c.want { // exact: 1 in = 25.4 mm by definition (1959)
			t.Errorf("%s = %.17g mm, want exactly %g", c.name, c.got, c.want)
		}
	}
	if MillimetresPerInch != 25.4 {
		t.Errorf("MillimetresPerInch = %g", MillimetresPerInch)
	}
}
