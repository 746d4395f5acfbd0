package importers

import (
	"bytes"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"strings"
	"unicode/utf8"
)

// A Source is a foreign table to read through a Mapping: a spreadsheet
// (.xlsx) or a CSV file with any header.
type Source struct {
	Name string // the file name as the user gave it, for messages
	Data []byte // the whole file
}

// IsSpreadsheet tells whether the data is a zip archive, as an .xlsx
// workbook is, rather than text.
func (s Source) IsSpreadsheet() bool { return bytes.HasPrefix(s.Data, []byte("PK\x03\x04")) }

// A rowSource yields the rows of one sheet or CSV file.
type rowSource interface {
	next() (srcRow, bool)
	err() error
	// merged lists the merged ranges; complete once next returned false.
	merged() []cellRange
	// rest reads to the end, so that merged is complete.
	rest()
	close() error
}

// open starts reading the sheet the mapping names; it returns the sheet's
// name ("" for CSV).
func (s Source) open(m *Mapping) (rowSource, string, error) {
	if !s.IsSpreadsheet() {
		if m.Sheet != "" {
			return nil, "", fmt.Errorf("the mapping names sheet %q, but %s is a CSV file, which has none; remove the sheet line", m.Sheet, s.Name)
		}
		return newCSVRows(s.Data, m), "", nil
	}
	b, err := openXLSX(bytes.NewReader(s.Data), int64(len(s.Data)))
	if err != nil {
		return nil, "", err
	}
	rows, sheet, err := b.rows(m.Sheet)
	if err != nil {
		return nil, sheet, err
	}
	return &xlsxSource{rows}, sheet, nil
}

type xlsxSource struct{ x *xlsxRows }

func (s *xlsxSource) next() (srcRow, bool) { return s.x.next() }
func (s *xlsxSource) err() error           { return s.x.err }
func (s *xlsxSource) rest()                { s.x.finish() }
func (s *xlsxSource) close() error         { return s.x.close() }
func (s *xlsxSource) merged() []cellRange {
	var out []cellRange
	for _, ref := range s.x.merges {
		if r, ok := parseRange(ref); ok {
			out = append(out, r)
		}
	}
	return out
}

// csvRows reads a CSV file of any header: RFC 4180 quoting, the mapping's
// delimiter, no comment lines (a foreign file may start a cell with #).
type csvRows struct {
	r *csv.Reader
	e error
}

func newCSVRows(data []byte, m *Mapping) *csvRows {
	data = bytes.TrimPrefix(data, []byte("\uFEFF"))
	r := csv.NewReader(bytes.NewReader(data))
	r.FieldsPerRecord = -1
	r.LazyQuotes = false
	if m.Delimiter != 0 {
		r.Comma = m.Delimiter
	}
	return &csvRows{r: r}
}

func (c *csvRows) next() (srcRow, bool) {
	if c.e != nil {
		return srcRow{}, false
	}
	cells, err := c.r.Read()
	if errors.Is(err, io.EOF) {
		return srcRow{}, false
	}
	if err != nil {
		var pe *csv.ParseError
		if errors.As(err, &pe) {
			c.e = fmt.Errorf("line %d: CSV syntax: %v; quote a cell that holds the delimiter or a quote mark", pe.Line, pe.Err)
		} else {
			c.e = err
		}
		return srcRow{}, false
	}
	line, _ := c.r.FieldPos(0)
	row := srcRow{n: line, cells: make([]srcCell, len(cells))}
	for i, s := range cells {
		if !utf8.ValidString(s) {
			c.e = fmt.Errorf("line %d is not valid UTF-8; save the file as UTF-8 (CSV UTF-8 in most spreadsheet programs)", line)
			return srcRow{}, false
		}
		if strings.TrimSpace(s) != "" {
			row.cells[i] = srcCell{text: s, kind: cellText}
		}
	}
	return row, true
}

func (c *csvRows) err() error          { return c.e }
func (c *csvRows) merged() []cellRange { return nil }
func (c *csvRows) rest()               {}
func (c *csvRows) close() error        { return nil }
