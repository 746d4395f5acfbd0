package export

import (
	"fmt"
	"io"
	"strconv"
	"strings"

	"cardinal/search/present"
)

// RequestHeader names the columns of a request's rows.
var RequestHeader = []string{"supplier", "part", "description", "needed", "in_drawer", "location", "to_order", "unit_price", "line_total", "currency", "url"}

// RequestLabels are RequestHeader in words, for pages people read.
var RequestLabels = []string{"supplier", "part", "description", "needed", "in drawer", "location", "to order", "unit price", "line total", "currency", "where to buy"}

// Rows lays the request out as a table: each supplier's lines, then its
// subtotal (one row per currency), then the grand totals, one row per
// currency. Quantities are whole numbers, money has two decimals, an
// unknown price is empty.
func (r Request) Rows() [][]string {
	var rows [][]string
	for _, g := range r.Suppliers {
		for _, l := range g.Lines {
			rows = append(rows, []string{l.Supplier, l.Part, l.Description, strconv.Itoa(l.Needed),
				strconv.Itoa(l.InDrawer), l.Location, strconv.Itoa(l.ToOrder), money(l.UnitPrice), money(l.LineTotal), l.Currency, l.URL})
		}
		for _, m := range g.Subtotals {
			rows = append(rows, []string{g.Supplier, "subtotal", "", "", "", "", "", "", money(&m.Amount), m.Currency, ""})
		}
	}
	for _, m := range r.Totals {
		rows = append(rows, []string{"total", "", "", "", "", "", "", "", money(&m.Amount), m.Currency, ""})
	}
	return rows
}

// Notes are what the request says beside its table, as name and text: the
// search, the requirement, each solution with its spacings and its build
// sheet step by step, the number of systems, parts without a price, and
// the cautions.
func (r Request) Notes() [][2]string {
	n := [][2]string{{"search", strconv.FormatInt(r.Search, 10)}, {"requirement", r.RequirementText}}
	for _, s := range r.Solutions {
		n = append(n, [2]string{fmt.Sprintf("solution %d", s.Rank), s.Parts + "; " + s.Spacings})
		if s.Build != nil {
			for _, l := range s.Build.Lines(SidesOf(r.Requirement.Kind)) {
				n = append(n, [2]string{fmt.Sprintf("build %d", s.Rank), l})
			}
		}
	}
	n = append(n, [2]string{"systems", fmt.Sprintf("%d (quantities are for %d of each solution)", r.Systems, r.Systems)})
	if len(r.Unpriced) > 0 {
		n = append(n, [2]string{"unpriced", "no price stated for " + strings.Join(r.Unpriced, ", ") + "; the totals leave them out"})
	}
	if len(r.Totals) > 1 {
		n = append(n, [2]string{"currencies", "the totals are in more than one currency and are listed apart, never summed"})
	}
	for _, c := range r.Cautions {
		n = append(n, [2]string{"caution", c})
	}
	return n
}

// WriteCSV writes the request as CSV a spreadsheet can open safely (see
// present.SafeCell): the header, the rows, an empty row, then the notes as
// name,text rows; every row has the header's number of cells, so that a
// strict CSV reader takes it.
func (r Request) WriteCSV(w io.Writer) error {
	c := present.NewSafeCSV(w)
	rows := append([][]string{RequestHeader}, r.Rows()...)
	rows = append(rows, nil)
	for _, n := range r.Notes() {
		rows = append(rows, n[:])
	}
	for _, row := range rows {
		full := make([]string, len(RequestHeader))
		copy(full, row)
		if err := c.Write(full); err != nil {
			return err
		}
	}
	return c.Flush()
}

// money prints an amount with two decimals, "" when unknown.
func money(v *float64) string {
	if v == nil {
		return ""
	}
	return strconv.FormatFloat(*v, 'f', 2, 64)
}
