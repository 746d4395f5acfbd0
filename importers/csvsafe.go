package importers

import (
	"encoding/csv"
	"io"
	"regexp"
	"strings"
)

// plainNumber matches a decimal number as this package writes it: an
// optional minus sign, digits with an optional fraction, an optional
// exponent. A spreadsheet reads such a cell as a number, never a formula.
var plainNumber = regexp.MustCompile(`^-?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$`)

// formulaStart holds the characters that make a spreadsheet treat a cell
// as a formula or a command: = + - @, tab and carriage return (OWASP, "CSV
// Injection", the community page on formula injection).
const formulaStart = "=+-@\t\r"

// SafeCell neutralises a text cell for a spreadsheet: a cell whose first
// character (after any spaces) starts a formula gets a single quote in
// front, the defence OWASP describes for CSV injection, so that the cell is
// shown as text and never evaluated. A cell that is a plain number, a
// negative one included, is returned as it is so that it stays a number.
func SafeCell(s string) string {
	if plainNumber.MatchString(s) {
		return s
	}
	t := strings.TrimLeft(s, " ")
	if t != "" && strings.ContainsRune(formulaStart, rune(t[0])) {
		return "'" + s
	}
	return s
}

// A SafeCSV writes RFC 4180 CSV (encoding/csv) with every cell passed
// through SafeCell.
type SafeCSV struct {
	w *csv.Writer
}

// NewSafeCSV returns a writer over w.
func NewSafeCSV(w io.Writer) *SafeCSV { return &SafeCSV{w: csv.NewWriter(w)} }

// Write writes one record.
func (c *SafeCSV) Write(record []string) error {
	safe := make([]string, len(record))
	for i, s := range record {
		safe[i] = SafeCell(s)
	}
	return c.w.Write(safe)
}

// Flush writes any buffered data and returns the first error met.
func (c *SafeCSV) Flush() error {
	c.w.Flush()
	return c.w.Error()
}

// Unneutralise reads back a cell SafeCell wrote: a single quote before a
// character that starts a formula is taken away, so that the drawer and
// glass files the program writes for spreadsheets import back unchanged.
// A text that really begins with a quote and such a character loses the
// quote; no stored name or note does in practice.
func Unneutralise(s string) string {
	if len(s) > 1 && s[0] == '\'' {
		if t := strings.TrimLeft(s[1:], " "); t != "" && strings.ContainsRune(formulaStart, rune(t[0])) {
			return s[1:]
		}
	}
	return s
}
