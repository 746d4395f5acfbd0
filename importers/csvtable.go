package importers

import (
	"bufio"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"slices"
	"strconv"
	"strings"
	"unicode/utf8"
)

// A table is a neutral CSV file read into its header and rows: RFC 4180
// quoting (encoding/csv), lines starting with '#' as comments, the first
// other line as the header, header names case-insensitive and in any order,
// a leading byte-order mark tolerated.
type table struct {
	file    string
	columns map[string]int // lower-case header name -> index
	// headerOK is false when the header is missing or wrong; the rows are
	// then checked for syntax and encoding only.
	headerOK bool
	rows     []rawRow
	errs     FileErrors
	warnings []LineError
	order    []string // the column names in the order of their cells (columnOrder)
}

// columnOrder is the column names in the order of their cells, worked out
// once per header rather than once per row.
func (t *table) columnOrder() []string {
	if len(t.order) == len(t.columns) {
		return t.order
	}
	cols := make([]string, 0, len(t.columns))
	for c := range t.columns {
		cols = append(cols, c)
	}
	slices.SortFunc(cols, func(a, b string) int { return t.columns[a] - t.columns[b] })
	t.order = cols
	return cols
}

// A rawRow is one row of cells and the line it starts on.
type rawRow struct {
	line  int
	cells []string
}

// schema names the columns a format knows and those it requires.
type schema struct {
	known    func(name string) bool
	required []string
}

// readTable reads the whole file, collecting every problem of syntax,
// encoding and header; rows whose cells are all empty are skipped.
func readTable(r io.Reader, file string, s schema) *table {
	return streamTable(r, file, s, nil)
}

// streamRun is the number of rows streamTable hands on together.
const streamRun = 256

// streamTable is readTable handing the rows, when the header is right, to
// ready as they are read, in runs of consecutive rows (ready may work on
// them while the file is read on: they do not change, and the table's
// columns and columnOrder are set before the first run).
func streamTable(r io.Reader, file string, s schema, ready func(*table, []rawRow)) *table {
	t := &table{file: file}
	handed := 0
	hand := func(all bool) {
		if ready != nil && t.headerOK && (len(t.rows)-handed >= streamRun || all && len(t.rows) > handed) {
			ready(t, t.rows[handed:len(t.rows):len(t.rows)])
			handed = len(t.rows)
		}
	}
	defer hand(true)
	cr := csv.NewReader(skipBOM(r))
	cr.Comment = '#'
	cr.FieldsPerRecord = -1
	header := true
	for {
		cells, err := cr.Read()
		if errors.Is(err, io.EOF) {
			break
		}
		if err != nil {
			if !t.syntaxError(err) {
				break
			}
			continue
		}
		line, _ := cr.FieldPos(0)
		if !t.validUTF8(line, cells) {
			if header { // an unreadable header still ends the header search
				header = false
				t.columns = map[string]int{}
			}
			continue
		}
		if header {
			t.readHeader(line, cells, s)
			t.columnOrder() // before the rows share it
			header = false
			continue
		}
		t.addRow(line, cells)
		hand(false)
	}
	if header && len(t.errs) == 0 {
		t.errs = append(t.errs, LineError{File: file, Reason: "no header line: the first line that is not a # comment must name the columns"})
	}
	return t
}

// skipBOM drops a leading UTF-8 byte-order mark, which some spreadsheet
// programs write.
func skipBOM(r io.Reader) io.Reader {
	br := bufio.NewReader(r)
	if b, err := br.Peek(3); err == nil && string(b) == "\uFEFF" {
		br.Discard(3)
	}
	return br
}

// syntaxError records a CSV syntax error and tells whether reading can go on.
func (t *table) syntaxError(err error) bool {
	var pe *csv.ParseError
	if errors.As(err, &pe) {
		t.errs = append(t.errs, LineError{File: t.file, Line: pe.Line,
			Reason: fmt.Sprintf("CSV syntax: %v (column %d of the line); quote a cell that holds a comma or a quote mark, and double the quote marks inside it", pe.Err, pe.Column)})
		return true
	}
	t.errs = append(t.errs, LineError{File: t.file, Line: 0, Reason: fmt.Sprintf("reading stopped: %v", err)})
	return false
}

func (t *table) validUTF8(line int, cells []string) bool {
	for _, c := range cells {
		if !utf8.ValidString(c) {
			t.errs = append(t.errs, LineError{File: t.file, Line: line, Reason: "the line is not valid UTF-8; save the file as UTF-8"})
			return false
		}
	}
	return true
}

func (t *table) readHeader(line int, cells []string, s schema) {
	t.columns = map[string]int{}
	before := len(t.errs)
	defer func() { t.headerOK = len(t.errs) == before }()
	for i, c := range cells {
		name := strings.ToLower(strings.TrimSpace(c))
		switch {
		case name == "":
			t.warnings = append(t.warnings, LineError{File: t.file, Line: line, Reason: fmt.Sprintf("header cell %d is empty; that column is ignored", i+1)})
		case hasKey(t.columns, name):
			t.errs = append(t.errs, LineError{File: t.file, Line: line, Column: name, Reason: "the column appears twice in the header"})
		case !s.known(name):
			t.warnings = append(t.warnings, LineError{File: t.file, Line: line, Column: name, Reason: "unknown column, ignored"})
			t.columns[name] = i
		default:
			t.columns[name] = i
		}
	}
	for _, name := range s.required {
		if !hasKey(t.columns, name) {
			t.errs = append(t.errs, LineError{File: t.file, Line: line, Column: name, Reason: "required column is missing from the header"})
		}
	}
}

func hasKey(m map[string]int, k string) bool {
	_, ok := m[k]
	return ok
}

func (t *table) addRow(line int, cells []string) {
	empty := true
	for _, c := range cells {
		if strings.TrimSpace(c) != "" {
			empty = false
		}
	}
	if empty {
		return
	}
	width := 0
	for _, i := range t.columns {
		width = max(width, i+1)
	}
	for i := width; i < len(cells); i++ {
		if strings.TrimSpace(cells[i]) != "" {
			t.errs = append(t.errs, LineError{File: t.file, Line: line,
				Reason: fmt.Sprintf("the row has %d cells but the header names only %d columns; quote cells that hold commas", len(cells), width)})
			break
		}
	}
	t.rows = append(t.rows, rawRow{line: line, cells: cells})
}

// A row reads the cells of one record by column name and collects what is
// wrong with them.
type row struct {
	t    *table
	rec  rawRow
	errs FileErrors
}

// row starts reading a record; a cell with a control character is
// refused here, whatever the format (checkControl).
func (t *table) row(rec rawRow) *row {
	r := &row{t: t, rec: rec}
	r.checkControl()
	return r
}

// text is the trimmed cell of a column, "" when the column or cell is
// absent, with the quote the spreadsheet-safe writer puts before a formula
// character taken away (Unneutralise).
func (r *row) text(col string) string {
	i, ok := r.t.columns[col]
	if !ok || i >= len(r.rec.cells) {
		return ""
	}
	return Unneutralise(strings.TrimSpace(r.rec.cells[i]))
}

func (r *row) fail(col, format string, a ...any) {
	r.errs = append(r.errs, LineError{File: r.t.file, Line: r.rec.line, Column: col, Reason: fmt.Sprintf(format, a...)})
}

// required is the text of a cell that must not be empty.
func (r *row) required(col string) string {
	s := r.text(col)
	if s == "" {
		r.fail(col, "is empty but required")
	}
	return s
}

// number parses a finite number; an empty cell is 0 and ok is false.
func (r *row) number(col string) (v float64, ok bool) {
	s := r.text(col)
	if s == "" {
		return 0, false
	}
	v, err := strconv.ParseFloat(s, 64)
	if err != nil || v != v || v > maxFloat || v < -maxFloat {
		r.fail(col, "%q is not a finite number", s)
		return 0, false
	}
	return v, true
}

const maxFloat = 1.7976931348623157e308

// positive parses a number that must be > 0 when present.
func (r *row) positive(col, unit string) float64 {
	v, ok := r.number(col)
	if ok && v <= 0 {
		r.fail(col, "must be positive, not %s %s", formatFloat(v), unit)
		return 0
	}
	return v
}

// ranged parses a number that must be positive and within the limit when
// present; 0 when absent or refused.
func (r *row) ranged(col string, l Limit) float64 {
	v := r.positive(col, l.Unit)
	if v == 0 {
		return 0
	}
	return r.within(col, v, l, false)
}

// formatFloat writes the shortest decimal that reads back as the same float.
func formatFloat(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }

// optionalFloat writes zero as an empty cell (not stated).
func optionalFloat(v float64) string {
	if v == 0 {
		return ""
	}
	return formatFloat(v)
}
