package importers

import (
	"bytes"
	"encoding/csv"
	"testing"

	"cardinal/catalog/record"
)

// The cases follow OWASP, "CSV Injection": cells beginning with = + - @,
// tab or carriage return are prefixed with a single quote; numbers stay
// numbers.
func TestSafeCell(t *testing.T) {
	tests := []struct{ name, in, want string }{
		{"formula", "=1+2", "'=1+2"},
		{"hyperlink formula", `=HYPERLINK("http://x.invalid","y")`, `'=HYPERLINK("http://x.invalid","y")`},
		{"plus", "+1+2", "'+1+2"},
		{"plus number is not left as a formula", "+5", "'+5"},
		{"minus formula", "-2+3", "'-2+3"},
		{"at", "@SUM(A1)", "'@SUM(A1)"},
		{"tab", "\t=1", "'\t=1"},
		{"carriage return", "\r=1", "'\r=1"},
		{"leading spaces before a formula", "  =1", "'  =1"},
		{"negative number stays a number", "-12.50", "-12.50"},
		{"negative exponent number", "-1.5e-3", "-1.5e-3"},
		{"positive number", "27.50", "27.50"},
		{"integer", "3", "3"},
		{"leading-dot number", "-.5", "-.5"},
		{"text with a minus inside", "PCX-50", "PCX-50"},
		{"text beginning with a minus and digits", "-5 mm meniscus", "'-5 mm meniscus"},
		{"plain text", "Plano-convex lens", "Plano-convex lens"},
		{"empty", "", ""},
		{"not a number: infinity", "-Inf", "'-Inf"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			if got := SafeCell(tc.in); got != tc.want {
				t.Errorf("SafeCell(%q) = %q, want %q", tc.in, got, tc.want)
			}
		})
	}
}

// What SafeCSV writes reads back through encoding/csv as the neutralised
// cells, quoting intact.
func TestSafeCSVRoundTrip(t *testing.T) {
	rows := [][]string{{"part", "price", "note"}, {"=cmd|' /C calc'!A0", "-3.5", "say \"hi\", then go"}}
	var b bytes.Buffer
	w := NewSafeCSV(&b)
	for _, r := range rows {
		if err := w.Write(r); err != nil {
			t.Fatal(err)
		}
	}
	if err := w.Flush(); err != nil {
		t.Fatal(err)
	}
	got, err := csv.NewReader(&b).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	want := [][]string{{"part", "price", "note"}, {"'=cmd|' /C calc'!A0", "-3.5", "say \"hi\", then go"}}
	for i := range want {
		for j := range want[i] {
			if got[i][j] != want[i][j] {
				t.Errorf("cell %d,%d = %q, want %q", i, j, got[i][j], want[i][j])
			}
		}
	}
}

// The drawer and glass files the program writes are safe to open in a
// spreadsheet and still import back unchanged: a cell that would start a
// formula gets a quote (OWASP, "CSV Injection") and the reader takes it
// away.
func TestNeutralisedFilesReadBack(t *testing.T) {
	items := []record.DrawerItem{{Supplier: "=1+1", Part: "-2+3", Quantity: 2, Location: "@SUM(A1)"},
		{Supplier: "LAB", Part: "PCX-50", Quantity: 1, Location: "B2"}}
	var b bytes.Buffer
	if err := WriteDrawer(&b, items); err != nil {
		t.Fatal(err)
	}
	for _, bad := range []string{"\n=1+1", ",-2+3", ",@SUM"} {
		if bytes.Contains(b.Bytes(), []byte(bad)) {
			t.Errorf("a formula cell written raw (%q):\n%s", bad, b.String())
		}
	}
	back, err := ReadDrawer(&b, "drawer.csv")
	if err != nil {
		t.Fatal(err)
	}
	for i := range items {
		if back[i].Supplier != items[i].Supplier || back[i].Part != items[i].Part || back[i].Location != items[i].Location || back[i].Quantity != items[i].Quantity {
			t.Errorf("item %d read back as %+v, want %+v", i, back[i], items[i])
		}
	}
	glasses := []Glass{{Name: "=CROWN", Formula: "abbe", Coefficients: []float64{1.517, 64.2}, Source: "-2+3 from memory"}}
	b.Reset()
	if err := WriteGlasses(&b, glasses); err != nil {
		t.Fatal(err)
	}
	gb, err := ReadGlasses(&b, "glasses.csv")
	if err != nil {
		t.Fatal(err)
	}
	if gb[0].Name != "=CROWN" || gb[0].Source != "-2+3 from memory" {
		t.Errorf("glass read back as %+v", gb[0])
	}
}
