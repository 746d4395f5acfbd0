package importers

import (
	"errors"
	"strings"
	"testing"

	"cardinal/catalog/record"
)

// The CSV rules shared by every format (RFC 4180 via encoding/csv; DESIGN.md
// neutral CSV), checked through the drawer format, the simplest.
func TestTableRules(t *testing.T) {
	tests := []struct {
		name     string
		in       string
		want     []record.DrawerItem
		errs     []string
		warnings []string
	}{
		{name: "comments, blank lines and free column order",
			in:   "# my drawer\n\nquantity,part,supplier\n# a comment row\n3,PCX-50,DEMO\n\n",
			want: []record.DrawerItem{{Supplier: "DEMO", Part: "PCX-50", Quantity: 3, Line: 5}}},
		{name: "byte-order mark and header case",
			in:   "\uFEFFSupplier, PART ,Quantity\nDEMO,PCX-50,1\n",
			want: []record.DrawerItem{{Supplier: "DEMO", Part: "PCX-50", Quantity: 1, Line: 2}}},
		{name: "quoted cells with commas, quotes and a line break",
			in: "supplier,part,quantity,location\nDEMO,PCX-50,2,\"drawer \"\"B\"\",\nback row\"\nDEMO,PCX-25,1,A1\n",
			want: []record.DrawerItem{{Supplier: "DEMO", Part: "PCX-50", Quantity: 2, Location: "drawer \"B\",\nback row", Line: 2},
				{Supplier: "DEMO", Part: "PCX-25", Quantity: 1, Location: "A1", Line: 4}}},
		{name: "unknown column warned and ignored",
			in:       "supplier,part,quantity,colour\nDEMO,PCX-50,1,blue\n",
			want:     []record.DrawerItem{{Supplier: "DEMO", Part: "PCX-50", Quantity: 1, Line: 2}},
			warnings: []string{"d.csv:1: colour: unknown column, ignored"}},
		{name: "row of empty cells skipped",
			in:   "supplier,part,quantity\n,,\nDEMO,PCX-50,1\n",
			want: []record.DrawerItem{{Supplier: "DEMO", Part: "PCX-50", Quantity: 1, Line: 3}}},
		{name: "empty file", in: "",
			errs: []string{"d.csv: no header line: the first line that is not a # comment must name the columns"}},
		{name: "only comments", in: "# nothing\n",
			errs: []string{"d.csv: no header line: the first line that is not a # comment must name the columns"}},
		{name: "missing and doubled columns", in: "supplier,Supplier,quantity\n",
			errs: []string{"d.csv:1: supplier: the column appears twice in the header", "d.csv:1: part: required column is missing from the header"}},
		{name: "invalid UTF-8 reported with its line",
			in:   "supplier,part,quantity\nDEMO,PCX-50,1\nDEMO,PCX-\xff,1\n",
			errs: []string{"d.csv:3: the line is not valid UTF-8; save the file as UTF-8"}},
		{name: "syntax error does not hide later rows",
			in: "supplier,part,quantity\nDEMO,PCX\"50,1\nDEMO,PCX-25,-1\n",
			errs: []string{`d.csv:2: CSV syntax: bare " in non-quoted-field (column 9 of the line); quote a cell that holds a comma or a quote mark, and double the quote marks inside it`,
				`d.csv:3: quantity: "-1" is not a whole number from 0 to 1000000`}},
		{name: "more cells than columns",
			in:   "supplier,part,quantity\nDEMO,PCX-50,1,extra\n",
			errs: []string{"d.csv:2: the row has 4 cells but the header names only 3 columns; quote cells that hold commas"}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			f, err := ReadDrawerFile(strings.NewReader(tc.in), "d.csv")
			checkErrors(t, err, tc.errs)
			if len(tc.errs) == 0 && !equalDrawer(f.Rows, tc.want) {
				t.Errorf("rows: got %+v, want %+v", f.Rows, tc.want)
			}
			var warnings []string
			for _, w := range f.Warnings {
				warnings = append(warnings, w.Error())
			}
			if strings.Join(warnings, "\n") != strings.Join(tc.warnings, "\n") {
				t.Errorf("warnings: got %q, want %q", warnings, tc.warnings)
			}
		})
	}
}

// checkErrors compares a reader's error with the expected messages, one per
// problem, in order.
func checkErrors(t *testing.T, err error, want []string) {
	t.Helper()
	if len(want) == 0 {
		if err != nil {
			t.Fatalf("unexpected error:\n%v", err)
		}
		return
	}
	var fe FileErrors
	if !errors.As(err, &fe) {
		t.Fatalf("got error %v (%T), want FileErrors", err, err)
	}
	if got := fe.Error(); got != strings.Join(want, "\n") {
		t.Errorf("errors:\ngot:\n%s\nwant:\n%s", got, strings.Join(want, "\n"))
	}
}

func equalDrawer(a, b []record.DrawerItem) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if a[i] != b[i] {
			return false
		}
	}
	return true
}
