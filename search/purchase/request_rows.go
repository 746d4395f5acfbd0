package purchase

import (
	"fmt"
	"io"
	"strconv"
	"strings"

	"cardinal/importers"
	"cardinal/search/present"
	"cardinal/search/solution"
)

// RequestHeader is the keys of a request's columns: the CSV header.
func RequestHeader() []string { return Request{}.Table().Keys() }

// RequestLabels are the columns' headings, for pages people read.
func RequestLabels() []string {
	t := Request{}.Table()
	h := make([]string, len(t.Columns))
	for i, c := range t.Columns {
		h[i] = c.Heading()
	}
	return h
}

// Table lays the request out once for every format: each supplier's
// lines, then its subtotal (one row per currency), then the grand totals,
// one row per currency. Quantities are whole numbers, money has two
// decimals, an unknown price is missing; on a narrow terminal the
// description and the address move under the table, labelled by part.
func (r Request) Table() present.Table {
	t := present.Table{Label: 1, Columns: []present.Column{
		{Key: "supplier", Label: "supplier"}, {Key: "part", Label: "part"},
		{Key: "description", Label: "description", Note: true},
		{Key: "needed", Label: "needed"}, {Key: "in_drawer", Label: "in drawer"}, {Key: "location", Label: "location"},
		{Key: "to_order", Label: "to order"}, {Key: "unit_price", Label: "unit price"}, {Key: "line_total", Label: "line total"},
		{Key: "currency", Label: "currency"}, {Key: "url", Label: "where to buy", Note: true},
	}}
	none := present.Cell{Text: present.Missing}
	for _, g := range r.Suppliers {
		for _, l := range g.Lines {
			t.Add(present.Text(l.Supplier), present.Text(l.Part), present.Text(l.Description), present.Int(l.Needed),
				present.Int(l.InDrawer), present.Text(l.Location), present.Int(l.ToOrder), moneyCell(l.UnitPrice),
				moneyCell(l.LineTotal), present.Text(l.Currency), present.Text(l.URL))
		}
		for _, m := range g.Subtotals {
			t.Add(present.Text(g.Supplier), present.Text("subtotal"), none, none, none, none, none, none,
				present.Num(m.Amount, 2), present.Text(m.Currency), none)
		}
	}
	for _, m := range r.Totals {
		t.Add(present.Text("total"), none, none, none, none, none, none, none, present.Num(m.Amount, 2), present.Text(m.Currency), none)
	}
	return t
}

func moneyCell(v *float64) present.Cell {
	if v == nil {
		return present.Cell{Text: present.Missing}
	}
	return present.Num(*v, 2)
}

// Rows are the request's table as text, empty where a value is missing.
func (r Request) Rows() [][]string {
	t := r.Table()
	rows := make([][]string, len(t.Rows))
	for i, row := range t.Rows {
		rows[i] = make([]string, len(row))
		for j, c := range row {
			if c.Raw != nil {
				rows[i][j] = c.Text
			}
		}
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
			for _, l := range s.Build.Lines(solution.SidesOf(r.Requirement.Kind)) {
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
// importers.SafeCell): the header, the rows, an empty row, then the notes as
// name,text rows; every row has the header's number of cells, so that a
// strict CSV reader takes it.
func (r Request) WriteCSV(w io.Writer) error {
	c := importers.NewSafeCSV(w)
	rows := append([][]string{RequestHeader()}, r.Rows()...)
	rows = append(rows, nil)
	for _, n := range r.Notes() {
		rows = append(rows, n[:])
	}
	for _, row := range rows {
		full := make([]string, len(RequestHeader()))
		copy(full, row)
		if err := c.Write(full); err != nil {
			return err
		}
	}
	return c.Flush()
}
