package present

import (
	"fmt"
	"math"
	"slices"
	"strconv"
	"strings"
)

// A Column describes one column once for every format.
type Column struct {
	// Key is the snake_case name with the unit in it: the CSV header and
	// the JSON key.
	Key string
	// Label is the short heading a terminal or a page shows; Unit follows
	// it ("EFL" "mm").
	Label, Unit string
	// Optional columns are left out of the default set; --columns or
	// --wide show them.
	Optional bool
	// TextOnly columns are for people (a price with its currencies, where
	// optional columns say the same for programs, one number each): CSV
	// and JSON leave them out unless --columns names them.
	TextOnly bool
	// Keep orders the columns a terminal too narrow for the table leaves
	// out: the lowest first, and of equals the rightmost.
	Keep int
	// Note marks a long text column (a reason, a description): on a
	// terminal too narrow for it, it moves to a line under the table.
	Note bool
}

// Heading is the label and unit as a table shows them.
func (c Column) Heading() string {
	if c.Unit == "" {
		return c.Label
	}
	return c.Label + " " + c.Unit
}

// A Cell is what a person reads and what a program reads. Raw is nil where
// the value does not apply, else a float64, an int, a bool or a string.
type Cell struct {
	Text string
	Raw  any
	// HTML, when set, is the cell for a page, already escaped (part names
	// that must not break); pages show Text otherwise.
	HTML string
}

// A Table is columns and rows of cells, one cell per column.
type Table struct {
	Columns []Column
	Rows    [][]Cell
	// Label is the column whose cell names a row in the notes a narrow
	// terminal moves under the table; the first column by default.
	Label int
}

// Add appends a row; it panics when the row does not have one cell per
// column, a mistake of the program.
func (t *Table) Add(row ...Cell) {
	if len(row) != len(t.Columns) {
		panic(fmt.Sprintf("present: row of %d cells for %d columns", len(row), len(t.Columns)))
	}
	t.Rows = append(t.Rows, row)
}

// Keys lists the column keys in order.
func (t Table) Keys() []string {
	k := make([]string, len(t.Columns))
	for i, c := range t.Columns {
		k[i] = c.Key
	}
	return k
}

// Select keeps the columns named by keys, in that order; with no keys it
// keeps the default set (every column not Optional), with wide every
// column, leaving out TextOnly columns forData (CSV, JSON). An unknown key is an error that lists the known ones.
func (t Table) Select(keys []string, wide, forData bool) (Table, error) {
	var idx []int
	switch {
	case len(keys) > 0:
		for _, k := range keys {
			i := slices.IndexFunc(t.Columns, func(c Column) bool { return c.Key == strings.TrimSpace(k) })
			if i < 0 {
				return Table{}, &UnknownColumnError{Key: k, Known: t.Keys()}
			}
			idx = append(idx, i)
		}
	default:
		for i, c := range t.Columns {
			if (wide || !c.Optional) && !(forData && c.TextOnly) {
				idx = append(idx, i)
			}
		}
	}
	return t.pick(idx), nil
}

func (t Table) pick(idx []int) Table {
	out := Table{Columns: make([]Column, len(idx)), Rows: make([][]Cell, len(t.Rows))}
	for j, i := range idx {
		out.Columns[j] = t.Columns[i]
		if i == t.Label {
			out.Label = j
		}
	}
	for r, row := range t.Rows {
		out.Rows[r] = make([]Cell, len(idx))
		for j, i := range idx {
			out.Rows[r][j] = row[i]
		}
	}
	return out
}

// UnknownColumnError is a --columns key the table does not have.
type UnknownColumnError struct {
	Key   string
	Known []string
}

func (e *UnknownColumnError) Error() string {
	return fmt.Sprintf("no column %q: choose from %s", e.Key, strings.Join(e.Known, ","))
}

// Missing is the text of a value that does not apply.
const Missing = "-"

// Num is a number shown with fixed decimals (never "-0.00"); a NaN or an
// infinity, which no output may hold, is shown as missing.
func Num(v float64, decimals int) Cell {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return Cell{Text: Missing}
	}
	return Cell{Text: Fixed(v, decimals), Raw: v}
}

// OptNum is Num of *v, or a missing cell for nil.
func OptNum(v *float64, decimals int) Cell {
	if v == nil {
		return Cell{Text: Missing}
	}
	return Num(*v, decimals)
}

// Int is a whole number.
func Int(i int) Cell { return Cell{Text: strconv.Itoa(i), Raw: i} }

// Text is a text cell; the empty text is missing.
func Text(s string) Cell {
	if s == "" {
		return Cell{Text: Missing}
	}
	return Cell{Text: s, Raw: s}
}

// Bool is yes or no.
func Bool(b bool) Cell {
	if b {
		return Cell{Text: "yes", Raw: true}
	}
	return Cell{Text: "no", Raw: false}
}

// Fixed formats v with the given decimals, without a minus sign on a value
// that rounds to zero: the one number format of tables and pages.
func Fixed(v float64, decimals int) string {
	s := strconv.FormatFloat(v, 'f', decimals, 64)
	if strings.Trim(s, "-0.") == "" {
		s = strings.TrimPrefix(s, "-")
	}
	return s
}
