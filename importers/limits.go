package importers

import (
	"fmt"
	"math"
	"unicode"
)

// A Limit is the valid range of one kind of number in the input files: a
// value given must lie in [Min, Max] in size (the sign is checked apart).
// The limits are far wider than any stock part and keep every figure the
// program works out from a part finite: a diameter of 1e300 mm or a
// thickness of 1e-300 mm would turn into Inf or NaN downstream. `cardinal
// help csv` prints them.
type Limit struct {
	What     string // the columns it applies to, as the help says
	Min, Max float64
	Unit     string
}

// The limits of the prescription, glass and drawer CSV files.
var (
	lengthLimit     = Limit{"diameter, clear_aperture, t1 ... t5, edge_thickness", 0.001, 10000, "mm"}
	radiusLimit     = Limit{"r1 ... r6 (in size; inf or plano for a flat)", 0.001, 1e9, "mm"}
	focalLimit      = Limit{"efl (in size), bfd (in size, 0 allowed)", 0.001, 1e6, "mm"}
	conicLimit      = Limit{"conic1 ... conic6 (in size, 0 allowed)", 0, 1e6, ""}
	asphLimit       = Limit{"asph1 ... asph6 terms (in size, 0 allowed)", 0, 1e6, ""}
	wavelengthLimit = Limit{"stated_wavelength, min_nm, max_nm", 150, 20000, "nm"}
	priceLimit      = Limit{"price (0 allowed)", 0, 1e9, ""}
	quantityLimit   = Limit{"quantity (a whole number)", 0, 1e6, ""}
)

// Limits lists the valid range of every number of the input files, for
// the help.
func Limits() []Limit {
	return []Limit{lengthLimit, radiusLimit, focalLimit, conicLimit, asphLimit, wavelengthLimit, priceLimit, quantityLimit}
}

// String writes the range as "0.001 to 10000 mm".
func (l Limit) String() string {
	s := formatFloat(l.Min) + " to " + formatFloat(l.Max)
	if l.Unit != "" {
		s += " " + l.Unit
	}
	return s
}

// holds tells whether v lies in the limit; zero lies in it when allowZero.
func (l Limit) holds(v float64, allowZero bool) bool {
	a := math.Abs(v)
	return a == 0 && allowZero || a >= l.Min && a <= l.Max
}

// within checks a number read from col against the limit and reports it
// with what is expected; it returns v, or 0 when refused.
func (r *row) within(col string, v float64, l Limit, allowZero bool) float64 {
	if l.holds(v, allowZero) {
		return v
	}
	r.fail(col, "%s %s is outside %s; check the value and its unit", formatFloat(v), l.Unit, l)
	return 0
}

// freeText are the columns whose cells may hold tabs and line breaks (a
// quoted cell over several lines); every other cell (names, suppliers,
// glasses, currencies, addresses) is one line of text.
var freeText = map[string]bool{"notes": true, "description": true, "location": true}

// checkControl refuses control characters (NUL, escape, bell, ... : the
// Unicode category Cc) in the row's cells, naming the column and the
// place in the cell: they are invisible, break tables and terminals, and
// no part name, supplier, description, glass or location needs them.
func (r *row) checkControl() {
	for _, c := range r.t.columnOrder() {
		i := r.t.columns[c]
		if i >= len(r.rec.cells) {
			continue
		}
		if at, ch, bad := controlChar(r.rec.cells[i], freeText[c]); bad {
			r.fail(c, "holds the control character %s at character %d of the cell; this cell takes plain text: remove it (a text editor that shows invisible characters helps)", ch, at)
		}
	}
}

// controlChar finds the first control character of s (tab and line breaks
// allowed when lines is true): its 1-based place among the characters and
// its name.
func controlChar(s string, lines bool) (int, string, bool) {
	n := 0
	for _, c := range s {
		n++
		if !unicode.IsControl(c) || lines && (c == '\t' || c == '\n' || c == '\r') {
			continue
		}
		return n, ControlName(c), true
	}
	return 0, "", false
}

// ControlName names a control character as U+0000 (NUL).
func ControlName(c rune) string {
	names := map[rune]string{0: "NUL", 7: "BEL", 8: "BS", 9: "TAB", 10: "LF", 13: "CR", 27: "ESC", 127: "DEL"}
	if n, ok := names[c]; ok {
		return fmt.Sprintf("U+%04X (%s)", c, n)
	}
	return fmt.Sprintf("U+%04X", c)
}

// HasControl tells whether s holds a control character (Cc), and where:
// the command line checks its own words with it.
func HasControl(s string) (at int, name string, ok bool) {
	return controlChar(s, false)
}
