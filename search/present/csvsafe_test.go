package present

import (
	"bytes"
	"encoding/csv"
	"testing"
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
