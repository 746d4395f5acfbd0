package importers

import (
	"fmt"
	"io"
	"strconv"
	"strings"

	"cardinal/catalog/record"
)

var drawerSchema = schema{
	known: func(name string) bool {
		switch name {
		case "supplier", "part", "quantity", "location":
			return true
		}
		return false
	},
	required: []string{"supplier", "part", "quantity"},
}

// ReadDrawer reads a drawer CSV (columns supplier, part, quantity, location;
// the rules of the prescription CSV for comments, quoting and header). A
// quantity is a whole number >= 0. The error, when not nil, is a FileErrors
// and the items are then nil.
func ReadDrawer(r io.Reader, file string) ([]record.DrawerItem, error) {
	f, err := ReadDrawerFile(r, file)
	return f.Rows, err
}

// ReadDrawerFile is ReadDrawer with the file's own warnings.
func ReadDrawerFile(r io.Reader, file string) (File[record.DrawerItem], error) {
	t := readTable(r, file, drawerSchema)
	errs := t.errs
	var out []record.DrawerItem
	seen := map[string]int{}
	for _, rec := range t.rows {
		if !t.headerOK {
			break
		}
		row := t.row(rec)
		d := parseDrawerRow(row)
		if first, dup := seen[d.ID()]; dup && d.Supplier != "" && d.Part != "" {
			row.fail("part", "%s is already on line %d; list each part once", d.ID(), first)
		} else {
			seen[d.ID()] = rec.line
		}
		errs = append(errs, row.errs...)
		out = append(out, d)
	}
	if len(errs) > 0 {
		sortErrors(errs)
		return File[record.DrawerItem]{Warnings: t.warnings}, errs
	}
	return File[record.DrawerItem]{Rows: out, Warnings: t.warnings}, nil
}

func parseDrawerRow(r *row) record.DrawerItem {
	d := record.DrawerItem{Line: r.rec.line, Supplier: r.required("supplier"), Part: r.required("part"), Location: r.text("location")}
	if strings.HasPrefix(d.Supplier, "#") || strings.ContainsRune(d.Supplier, ':') {
		r.fail("supplier", "%q may not start with # or hold a colon", d.Supplier)
	}
	if s := r.required("quantity"); s != "" {
		q, err := strconv.Atoi(s)
		if err != nil || q < 0 || float64(q) > quantityLimit.Max {
			r.fail("quantity", "%q is not a whole number from 0 to %d", s, int(quantityLimit.Max))
		}
		d.Quantity = q
	}
	return d
}

// WriteDrawer writes items as a drawer CSV that ReadDrawer reads back field
// for field (the source line aside).
func WriteDrawer(w io.Writer, items []record.DrawerItem) error {
	cw := NewSafeCSV(w) // cells a spreadsheet would run as formulas get a quote; the readers take it away
	cw.Write([]string{"supplier", "part", "quantity", "location"})
	for _, d := range items {
		if strings.HasPrefix(d.Supplier, "#") {
			return fmt.Errorf("writing drawer item %s: a supplier starting with # would read back as a comment line", d.ID())
		}
		cw.Write([]string{d.Supplier, d.Part, strconv.Itoa(d.Quantity), d.Location})
	}
	return cw.Flush()
}
