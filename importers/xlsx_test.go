package importers

import "testing"

// Number format codes as spreadsheet programs write them (common practice):
// date and time codes use y, m, d, h, s outside quotes and brackets.
func TestIsDateFormat(t *testing.T) {
	for code, want := range map[string]bool{
		"General": false, "0.00": false, `0.000 "mm"`: false, `0.0" in"`: false, "[Red]0.00": false,
		`#,##0.00_);(#,##0.00)`: false, "0.00E+00": false, `\d0`: false,
		"yyyy-mm-dd": true, "d-mmm-yy": true, "[h]:mm:ss": true, "h:mm AM/PM": true, "mm:ss.0": true,
		`[$-409]mmmm d, yyyy`: true,
	} {
		if got := isDateFormat(code); got != want {
			t.Errorf("isDateFormat(%q) = %v, want %v", code, got, want)
		}
	}
	for id, want := range map[int]bool{0: false, 1: false, 2: false, 10: false, 11: false, 14: true, 22: true, 37: false, 45: true, 49: false} {
		if got := builtinDateFormat(id); got != want {
			t.Errorf("builtinDateFormat(%d) = %v, want %v", id, got, want)
		}
	}
}

// Cell addresses: columns A ... Z, AA ...; XFD is the 16,384th and last
// column of a sheet (common practice).
func TestCellNames(t *testing.T) {
	for _, c := range []struct {
		ref      string
		col, row int
	}{{"A1", 0, 1}, {"Z9", 25, 9}, {"AA10", 26, 10}, {"az3", 51, 3}, {"XFD1048576", 16383, 1048576}} {
		col, row, ok := splitCellRef(c.ref)
		if !ok || col != c.col || row != c.row {
			t.Errorf("splitCellRef(%q) = %d, %d, %v", c.ref, col, row, ok)
		}
		if got := cellName(c.col, c.row); got != map[string]string{"az3": "AZ3"}[c.ref] && got != c.ref {
			t.Errorf("cellName(%d, %d) = %q, want %q", c.col, c.row, got, c.ref)
		}
	}
	for _, bad := range []string{"", "1A", "A0", "ABCD1", "A-1"} {
		if _, _, ok := splitCellRef(bad); ok {
			t.Errorf("splitCellRef(%q) accepted", bad)
		}
	}
}
