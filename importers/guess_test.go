package importers

import (
	"bytes"
	"strings"
	"testing"
)

// TestGuessMapping: a sheet with a title above its header, the trade's
// column names with units in brackets, a negative radius, flats written
// PLANO and 0, and a glass name the catalog does not know.
func TestGuessMapping(t *testing.T) {
	rows := [][]any{
		{"Lens stock (invented)"},
		{},
		{"Item No.", "Maker", "Dia. (mm)", "Radius 1 (mm)", "Radius 2 (mm)", "CT (mm)", "Material", "EFL (mm)", "Coating"},
		{"A-1", "LAB", 25.4, 51.68, "PLANO", 3.6, "517642", 99.96, "none"},
		{"A-2", "LAB", 25.4, 76.78, -76.78, 4.5, "Umber Flint", 52.26, "none"},
		{"A-3", "LAB", 12.7, 12.92, 0, 4, "517642", 24.99, "none"},
	}
	data := buildXLSX(t, "Stock", rows, nil)
	var b bytes.Buffer
	if err := GuessMapping(&b, Source{Name: "stock.xlsx", Data: data}, "", nil); err != nil {
		t.Fatal(err)
	}
	text := b.String()
	for _, want := range []string{
		"sheet: Stock\n", "header row: 3\n", "lengths: mm\n", "radii: signed\n", "flat: inf, infinity, plano, flat, 0\n",
		"part <- Item No.\n", "supplier <- Maker\n", "diameter <- Dia. (mm)\n", "r1 <- Radius 1 (mm)\n", "r2 <- Radius 2 (mm)\n",
		"t1 <- CT (mm)\n", "glass1 <- Material\n", "efl <- EFL (mm)\n", "# not used: Coating\n", "# glass Umber Flint -> ??????\n",
	} {
		if !strings.Contains(text, want) {
			t.Errorf("guess lacks %q:\n%s", want, text)
		}
	}
	// Completed by the user, the guess reads the sheet.
	done := strings.Replace(text, "# glass Umber Flint -> ??????", "glass Umber Flint -> 755276", 1)
	got, err := ReadMapped(Source{Name: "stock.xlsx", Data: data}, readMap(t, done), MapOptions{})
	if err != nil {
		t.Fatalf("%v\n%s", err, done)
	}
	if len(got.Rows) != 3 || got.Rows[1].Part.Media[0].Name() != "755276" {
		t.Errorf("read %d parts: %+v", len(got.Rows), got.Rows)
	}
}

func TestGuessHeaderWords(t *testing.T) {
	for header, field := range map[string]string{
		"R1": "r1", "Radius 2": "r2", "R2 (in)": "r2", "Front radius": "r1", "Back Radius [mm]": "r2",
		"Center Thickness": "t1", "CT2": "t2", "Centre thickness (inch)": "t1", "Dia.": "diameter", "Ø (mm)": "diameter", "⌀": "diameter",
		"Material": "glass1", "Glass 2": "glass2", "EFL (mm)": "efl", "Focal Length": "efl", "BFL": "bfd",
		"Part #": "part", "P/N": "part", "Edge thickness": "edge_thickness", "Shape": "shape", "Conic 1": "conic1",
		"Colour": "",
	} {
		if got := readHeaderCell(header).field(); got != field {
			t.Errorf("%q: field %q, want %q", header, got, field)
		}
	}
	if u := readHeaderCell("R1 (in)").unit; u != "inch" {
		t.Errorf("R1 (in): unit %q, want inch", u)
	}
}

func TestGuessNoHeader(t *testing.T) {
	data := buildXLSX(t, "S", [][]any{{"x", "y"}, {1, 2}}, nil)
	err := GuessMapping(&bytes.Buffer{}, Source{Name: "s.xlsx", Data: data}, "", nil)
	if err == nil || !strings.Contains(err.Error(), "write the mapping by hand") {
		t.Errorf("error %v", err)
	}
}
