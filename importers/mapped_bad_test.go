package importers

import (
	"archive/zip"
	"bytes"
	"io"
	"strings"
	"testing"
	"time"

	"github.com/xuri/excelize/v2"
)

// smallSheet is a sheet of three invented parts, header in row 1.
func smallSheet() [][]any {
	return [][]any{
		{"Part", "Dia", "R1", "R2", "CT", "Glass", "EFL"},
		{"A-1", 25.4, 51.68, "plano", 3.6, "517642", 99.96},
		{"A-2", 25.4, 76.78, -76.78, 4.5, "517642", 75},
		{"A-3", 12.7, 12.92, "plano", 4, "517642", 24.99},
	}
}

const smallMapping = `sheet: Parts
supplier = LAB
part <- Part
diameter <- Dia
r1 <- R1
r2 <- R2
t1 <- CT
glass1 <- Glass
efl <- EFL
`

// rewritePart returns a copy of a zip archive with one part's text changed.
func rewritePart(t *testing.T, data []byte, name string, edit func(string) string) []byte {
	t.Helper()
	zr, err := zip.NewReader(bytes.NewReader(data), int64(len(data)))
	if err != nil {
		t.Fatal(err)
	}
	var out bytes.Buffer
	zw := zip.NewWriter(&out)
	for _, f := range zr.File {
		rc, _ := f.Open()
		b, _ := io.ReadAll(rc)
		rc.Close()
		if f.Name == name {
			b = []byte(edit(string(b)))
		}
		w, _ := zw.Create(f.Name)
		w.Write(b)
	}
	zw.Close()
	return out.Bytes()
}

// TestReadMappedBadInput: each kind of bad input is refused (or warned
// about) with a message naming the sheet, the row, the source column and,
// in a spreadsheet, the cell; nothing is half read.
func TestReadMappedBadInput(t *testing.T) {
	edit := func(fn func(f *excelize.File)) []byte { return buildXLSX(t, "Parts", smallSheet(), fn) }
	set := func(cell string, v any) []byte {
		return edit(func(f *excelize.File) { f.SetCellValue("Parts", cell, v) })
	}
	tests := []struct {
		name    string
		data    []byte
		mapping string
		want    []string // each must appear in the error
		rows    int      // entries when no error is expected
		warn    string   // a warning that must appear
	}{
		{name: "good", data: edit(nil), rows: 3},
		{name: "missing sheet", data: edit(nil), mapping: strings.Replace(smallMapping, "sheet: Parts", "sheet: Achromats", 1),
			want: []string{`there is no sheet "Achromats"`, `"Parts"`}},
		{name: "header not there", data: buildXLSX(t, "Parts", append([][]any{{"Stock list"}, {}}, smallSheet()...), nil),
			want: []string{`row 1, column "Part"`, "no such column in header row 1", `"Stock list"`, "header row: N"}},
		{name: "header row past the end", data: edit(nil), mapping: smallMapping + "header row: 40\n",
			want: []string{"there is no header row 40"}},
		{name: "merged cell in the data", data: edit(func(f *excelize.File) { f.MergeCell("Parts", "C3", "C4") }),
			want: []string{`row 3, column "R1" (cell C3:C4, r1)`, "merged"}},
		{name: "merged title above the header", data: buildXLSX(t, "Parts", append([][]any{{"Stock list"}}, smallSheet()...),
			func(f *excelize.File) { f.MergeCell("Parts", "A1", "G1") }), mapping: smallMapping + "header row: 2\n", rows: 3},
		{name: "formula with no saved result", data: rewritePart(t, edit(func(f *excelize.File) { f.SetCellFormula("Parts", "E3", "E2*1.25") }),
			"xl/worksheets/sheet1.xml", func(s string) string {
				return strings.Replace(s, `<c r="E3" t="str"><f>E2*1.25</f><v>4.5</v></c>`, `<c r="E3"><f>E2*1.25</f></c>`, 1)
			}),
			want: []string{`row 3, column "CT" (cell E3, t1)`, "formula with no saved result"}},
		// excelize keeps the cell's old value as the formula's saved result.
		{name: "formula with its saved result", data: edit(func(f *excelize.File) { f.SetCellFormula("Parts", "E3", "E2*1.25") }), rows: 3},
		{name: "error value", data: rewritePart(t, edit(nil), "xl/worksheets/sheet1.xml", func(s string) string {
			i := strings.Index(s, `<c r="E4"`)
			j := i + strings.Index(s[i:], "</c>")
			return s[:i] + `<c r="E4" t="e"><f>1/0</f><v>#DIV/0!</v></c>` + s[j+4:]
		}), want: []string{`row 4, column "CT" (cell E4, t1)`, "#DIV/0!"}},
		{name: "date where a number belongs", data: set("B3", time.Date(2026, 1, 25, 0, 0, 0, 0, time.UTC)),
			want: []string{`row 3, column "Dia" (cell B3, diameter)`, "formatted as a date"}},
		{name: "text where a number belongs", data: set("B4", "12.7 mm"),
			want: []string{`row 4, column "Dia" (cell B4, diameter)`, `"12.7 mm" is not a finite number`}},
		{name: "empty row in the middle", data: buildXLSX(t, "Parts", append(smallSheet()[:2], append([][]any{{}}, smallSheet()[2:]...)...), nil),
			rows: 3, warn: "row 3 is empty and skipped"},
		{name: "empty row in the middle, stop there", data: buildXLSX(t, "Parts", append(smallSheet()[:2], append([][]any{{}}, smallSheet()[2:]...)...), nil),
			mapping: smallMapping + "blank row: stop\n", rows: 1},
		{name: "unknown glass names, one error", data: edit(func(f *excelize.File) {
			f.SetCellValue("Parts", "F2", "Vellum Crown")
			f.SetCellValue("Parts", "F4", "Vellum Crown")
			f.SetCellValue("Parts", "F3", "Umber Flint")
		}), want: []string{`unknown glass names: "Umber Flint" (row 3); "Vellum Crown" (rows 2, 4)`, "cardinal glass alias NAME CODE", "glass NAME -> CODE"}},
		{name: "glass line to an unknown glass", data: edit(nil), mapping: smallMapping + "glass Vellum Crown -> 51764\n",
			want: []string{"test.colmap", "glass Vellum Crown -> 51764"}},
		{name: "negative magnitude", data: edit(nil), mapping: smallMapping + "radii: magnitudes\nshape = biconvex\n",
			want: []string{`row 3, column "R2" (cell D3, r2)`, "radii: magnitudes, but the cell holds the negative radius -76.78"}},
		{name: "bad shape", data: edit(nil), mapping: strings.Replace(smallMapping, "r2 <- R2", "r2 <- R2\nshape <- EFL", 1) + "radii: magnitudes\n",
			want: []string{`row 2, column "EFL" (cell G2, shape)`, "is not a shape cardinal knows"}},
		{name: "bad constant", data: edit(nil), mapping: smallMapping + "price = cheap\n",
			want: []string{`row 2 (price)`, `"cheap" is not a finite number`, "line 10 of test.colmap"}},
		{name: "part given twice", data: set("A4", "A-1"),
			want: []string{`row 4, column "Part" (cell A4, part)`, "LAB:A-1 is already in row 2"}},
		{name: "not a workbook", data: []byte("PK\x03\x04 broken"), want: []string{"not an .xlsx workbook"}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			mp := tc.mapping
			if mp == "" {
				mp = smallMapping
			}
			got, err := ReadMapped(Source{Name: "parts.xlsx", Data: tc.data}, readMap(t, mp), MapOptions{})
			if len(tc.want) == 0 {
				if err != nil {
					t.Fatalf("unexpected error: %v", err)
				}
				if len(got.Rows) != tc.rows {
					t.Errorf("%d entries, want %d", len(got.Rows), tc.rows)
				}
				if !strings.Contains(got.Warnings.Error(), tc.warn) {
					t.Errorf("warnings %q, want %q", got.Warnings.Error(), tc.warn)
				}
				return
			}
			if err == nil {
				t.Fatal("no error")
			}
			if _, ok := err.(SheetErrors); !ok {
				t.Errorf("error of type %T, want SheetErrors", err)
			}
			for _, w := range tc.want {
				if !strings.Contains(err.Error(), w) {
					t.Errorf("error does not hold %q:\n%v", w, err)
				}
			}
			if strings.Contains(tc.name, "sheet") || strings.Contains(tc.name, "header") || strings.Contains(tc.name, "workbook") {
				return
			}
			if !strings.Contains(err.Error(), `parts.xlsx, sheet "Parts"`) && !strings.Contains(err.Error(), "test.colmap") {
				t.Errorf("error does not name the file and sheet:\n%v", err)
			}
		})
	}
}

// TestReadMappedCSV: a foreign CSV with semicolons, decimal commas, a
// comment-like first cell, 0 and blank for flats, and centimetres.
func TestReadMappedCSV(t *testing.T) {
	csv := "Item;Ø (cm);Front R;Back R;CT;Material\n#12;2,54;5,168;0;0,36;517642\nB-7;1,27;1,292;;0,4;517642\n"
	m := readMap(t, `delimiter: semicolon
decimal: comma
lengths: cm
flat: inf, 0, blank
supplier = LAB
part <- Item
diameter <- Ø (cm)
r1 <- Front R
r2 <- Back R
t1 <- CT
glass1 <- Material
`)
	got, err := ReadMapped(Source{Name: "stock.csv", Data: []byte(csv)}, m, MapOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if len(got.Rows) != 2 {
		t.Fatalf("%d entries, want 2", len(got.Rows))
	}
	p := got.Rows[0].Part
	// 1 cm = 10 mm (SI); a radius of 0 and a blank one are flats here.
	if p.Name != "#12" || !near(p.Diameter, 25.4) || !near(p.Surfaces[0].Radius, 51.68) || !near(p.Thickness[0], 3.6) ||
		p.Surfaces[1].Radius < 1e300 || got.Rows[1].Part.Surfaces[1].Radius < 1e300 {
		t.Errorf("first part %+v", p)
	}
	if got.Rows[0].Line != 2 || got.Rows[1].Line != 3 {
		t.Errorf("rows %d, %d; want lines 2 and 3", got.Rows[0].Line, got.Rows[1].Line)
	}
}

func near(a, b float64) bool { return a-b < 1e-12*b && b-a < 1e-12*b }

func TestReadMapping(t *testing.T) {
	tests := []struct {
		name, text string
		want       string // part of the error; "" for none
	}{
		{"minimal", "r1 <- R1\n", ""},
		{"every setting", "sheet: Two\nheader row: 2\nfirst data row: 4\nblank row: stop\nlengths: inch\nradii: signed\nflat: plano, 0\ndelimiter: tab\ndecimal: comma\nr1 <- R1\n", ""},
		{"column name with colon and equals", "r1 <- R1: front = a\n", ""},
		{"constant url", "url = https://lab.example.com/x\nr1 <- R1\n", ""},
		{"unknown field", "radius <- R1\n", `"radius" is not a field`},
		{"field twice", "r1 <- R1\nr1 = 5\n", "r1 is already given on line 1"},
		{"unknown setting", "colour: red\nr1 <- R1\n", `"colour" is not a setting`},
		{"bad unit", "lengths: furlong\nr1 <- R1\n", `lengths: "furlong"`},
		{"bad row", "header row: first\nr1 <- R1\n", "not a row number"},
		{"data before header", "header row: 3\nfirst data row: 2\nr1 <- R1\n", "must come after header row 3"},
		{"magnitudes without shape", "radii: magnitudes\nr1 <- R1\n", "needs the part's shape"},
		{"no column", "lengths: mm\n", "maps no column"},
		{"not a line", "r1 R1\n", "is not a mapping line"},
		{"glass twice", "r1 <- R1\nglass A -> 517642\nglass a -> 620364\n", `glass "a" is already named on line 2`},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			m, err := ReadMapping(strings.NewReader(tc.text), "x.colmap")
			if tc.want == "" {
				if err != nil || m == nil {
					t.Fatalf("error %v", err)
				}
				return
			}
			if err == nil || !strings.Contains(err.Error(), tc.want) {
				t.Errorf("error %v, want %q", err, tc.want)
			}
		})
	}
	m, _ := ReadMapping(strings.NewReader("sheet: Two\nheader row: 2\nfirst data row: 4\nblank row: stop\nlengths: inch\nflat: plano, 0\ndelimiter: tab\ndecimal: comma\nr1 <- R1: front = a\n"), "x")
	if m.Sheet != "Two" || m.headerRow() != 2 || m.firstDataRow() != 4 || !m.StopAtBlank || m.Unit != Inch ||
		!m.flatWhen("0") || !m.flatWhen("-Plano") || m.flatWhen("inf") || m.Delimiter != '\t' || !m.DecimalComma || m.source("r1") != "R1: front = a" {
		t.Errorf("mapping read as %+v", m)
	}
}
