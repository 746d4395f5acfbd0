package importers

import (
	"bufio"
	"fmt"
	"io"
	"slices"
	"strconv"
	"strings"
)

// A Mapping says how a foreign table (a supplier's spreadsheet or CSV, a
// lab's inventory sheet) becomes rows of the neutral prescription CSV. It is
// read from a column-mapping file, cardinal's own small text format:
//
//	# comment lines and blank lines are ignored
//	sheet: Stock lenses          settings: NAME: VALUE
//	header row: 3
//	lengths: inch
//	radii: magnitudes
//	flat: inf, plano, 0, blank
//	part <- Item No.             a field fed by a source column (its header text)
//	r1 <- Radius 1 (in)
//	supplier = TARNWICK          a field with one value for the whole file
//	glass Crown A -> 517642      a glass name used in the sheet, and what it is
//
// The zero Mapping reads the first sheet, header in row 1, lengths in mm,
// radii signed as cardinal signs them.
type Mapping struct {
	File string // the mapping file's name, for messages

	Sheet        string // "" is the first sheet
	HeaderRow    int    // 1-based; 0 means 1
	FirstDataRow int    // 0 means the row after the header
	StopAtBlank  bool   // stop at the first empty data row instead of skipping it
	Unit         LengthUnit
	Magnitudes   bool     // radii are magnitudes; the shape field gives the signs
	Flat         []string // lower-case spellings of a flat surface; "0" and "blank" included when set
	Delimiter    rune     // CSV only; 0 means a comma
	DecimalComma bool     // numbers are written 12,5 (CSV only)

	Columns   []ColumnMap
	Constants []Constant
	Glasses   []GlassName

	setFlat bool
}

// A ColumnMap feeds a field from a source column.
type ColumnMap struct {
	Field, Source string
	Line          int // in the mapping file
}

// A Constant gives a field one value for the whole file.
type Constant struct {
	Field, Value string
	Line         int
}

// A GlassName says what a glass name used in the source is: a six-digit
// glass code, a built-in glass or one of the user's glasses.
type GlassName struct {
	Name, Target string
	Line         int
}

// A LengthUnit is the unit of every length in a source table.
type LengthUnit int

// Units of length. The inch is exactly 25.4 mm (the international yard and
// pound agreement of 1959).
const (
	Millimetre LengthUnit = iota
	Centimetre
	Inch
)

// MillimetresPerInch is the international inch, exactly 25.4 mm (the
// international yard and pound agreement of 1959).
const MillimetresPerInch = 25.4

// Millimetres is the length of one unit in mm.
func (u LengthUnit) Millimetres() float64 {
	switch u {
	case Centimetre:
		return 10
	case Inch:
		return MillimetresPerInch
	}
	return 1
}

func (u LengthUnit) String() string {
	switch u {
	case Centimetre:
		return "cm"
	case Inch:
		return "inch"
	}
	return "mm"
}

// DefaultFlat returns how a flat surface is written when a mapping does not say.
func DefaultFlat() []string { return []string{"inf", "infinity", "plano", "flat"} }

// MappingFields are the fields a mapping may feed: the columns of the
// neutral prescription CSV, and shape.
func MappingFields() []string { return slices.Clone(mappingFields) }

var mappingFields = listMappingFields()

func listMappingFields() []string {
	f := []string{"supplier", "part", "description", "diameter", "clear_aperture"}
	for i := 1; i <= MaxSurfaces; i++ {
		f = append(f, col("r", i))
	}
	for i := 1; i < MaxSurfaces; i++ {
		f = append(f, col("t", i))
	}
	for i := 1; i < MaxSurfaces; i++ {
		f = append(f, col("glass", i))
	}
	for i := 1; i <= MaxSurfaces; i++ {
		f = append(f, col("conic", i), col("asph", i))
	}
	return append(f, "efl", "bfd", "edge_thickness", "stated_wavelength", "price", "currency", "url", "notes", CoatingColumn, "shape")
}

// ReadMapping reads a column-mapping file. The error, when not nil, is a
// FileErrors naming every bad line.
func ReadMapping(r io.Reader, file string) (*Mapping, error) {
	m := &Mapping{File: file}
	var errs FileErrors
	fail := func(line int, format string, a ...any) {
		errs = append(errs, LineError{File: file, Line: line, Reason: fmt.Sprintf(format, a...)})
	}
	fields := map[string]int{}
	sc := bufio.NewScanner(r)
	for n := 1; sc.Scan(); n++ {
		line := strings.TrimSpace(strings.TrimPrefix(sc.Text(), "\uFEFF"))
		if line == "" || strings.HasPrefix(line, "#") {
			continue
		}
		if reason := m.readLine(line, n, fields); reason != "" {
			fail(n, "%s", reason)
		}
	}
	if err := sc.Err(); err != nil {
		fail(0, "reading stopped: %v", err)
	}
	if !m.setFlat {
		m.Flat = DefaultFlat()
	}
	if m.FirstDataRow != 0 && m.FirstDataRow <= m.headerRow() {
		fail(0, "first data row %d must come after header row %d", m.FirstDataRow, m.headerRow())
	}
	if m.Magnitudes && fields["shape"] == 0 {
		fail(0, "radii: magnitudes needs the part's shape to sign them: map a column with 'shape <- COLUMN' or set 'shape = biconvex' (see 'cardinal catalog mapping --help')")
	}
	if len(m.Columns) == 0 {
		fail(0, "maps no column; write lines like 'r1 <- Radius 1' (cardinal catalog mapping FILE writes a first guess)")
	}
	if len(errs) > 0 {
		return nil, errs
	}
	return m, nil
}

// readLine reads one line into m; it returns the reason when the line is
// wrong.
func (m *Mapping) readLine(line string, n int, fields map[string]int) string {
	if field, src, ok := strings.Cut(line, "<-"); ok {
		return m.addField(strings.TrimSpace(field), n, fields, func(f string) string {
			src = strings.TrimSpace(src)
			if src == "" {
				return "names no source column after <-"
			}
			m.Columns = append(m.Columns, ColumnMap{Field: f, Source: src, Line: n})
			return ""
		})
	}
	if rest, ok := strings.CutPrefix(line, "glass "); ok {
		if name, target, ok := strings.Cut(rest, "->"); ok {
			name, target = strings.TrimSpace(name), strings.TrimSpace(target)
			if name == "" || target == "" {
				return "write a glass name as 'glass NAME -> CODE' (CODE: a six-digit glass code or a glass you imported)"
			}
			for _, g := range m.Glasses {
				if strings.EqualFold(g.Name, name) {
					return fmt.Sprintf("glass %q is already named on line %d", name, g.Line)
				}
			}
			m.Glasses = append(m.Glasses, GlassName{Name: name, Target: target, Line: n})
			return ""
		}
	}
	eq, colon := strings.Index(line, "="), strings.Index(line, ":")
	if eq >= 0 && (colon < 0 || eq < colon) {
		field, value := strings.TrimSpace(line[:eq]), strings.TrimSpace(line[eq+1:])
		return m.addField(field, n, fields, func(f string) string {
			if value == "" {
				return fmt.Sprintf("%s = needs a value", f)
			}
			m.Constants = append(m.Constants, Constant{Field: f, Value: value, Line: n})
			return ""
		})
	}
	if colon >= 0 {
		return m.setting(strings.ToLower(strings.Join(strings.Fields(line[:colon]), " ")), strings.TrimSpace(line[colon+1:]))
	}
	return fmt.Sprintf("%q is not a mapping line: write 'SETTING: VALUE', 'FIELD <- SOURCE COLUMN', 'FIELD = VALUE' or 'glass NAME -> CODE'", line)
}

func (m *Mapping) addField(field string, n int, fields map[string]int, add func(string) string) string {
	f := strings.ToLower(field)
	if !slices.Contains(mappingFields, f) {
		return fmt.Sprintf("%q is not a field; the fields are %s", field, strings.Join(MappingFields(), ", "))
	}
	if first := fields[f]; first != 0 {
		return fmt.Sprintf("%s is already given on line %d", f, first)
	}
	fields[f] = n
	return add(f)
}

// setting reads one 'NAME: VALUE' line.
func (m *Mapping) setting(name, value string) string {
	low := strings.ToLower(value)
	switch name {
	case "sheet":
		m.Sheet = value
	case "header row", "first data row":
		v, err := strconv.Atoi(value)
		if err != nil || v < 1 {
			return fmt.Sprintf("%s: %q is not a row number (1 is the first row)", name, value)
		}
		if name == "header row" {
			m.HeaderRow = v
		} else {
			m.FirstDataRow = v
		}
	case "blank row":
		return choose(&m.StopAtBlank, name, value, "skip or stop", map[string]bool{"skip": false, "stop": true})
	case "lengths":
		return choose(&m.Unit, name, value, "mm, cm or inch",
			map[string]LengthUnit{"mm": Millimetre, "cm": Centimetre, "inch": Inch, "in": Inch, "inches": Inch})
	case "radii":
		return choose(&m.Magnitudes, name, value, "signed (as cardinal signs them) or magnitudes (the shape gives the signs)",
			map[string]bool{"signed": false, "magnitudes": true})
	case "flat":
		m.setFlat = true
		m.Flat = nil
		for _, s := range strings.Split(low, ",") {
			if s = strings.TrimSpace(s); s != "" {
				m.Flat = append(m.Flat, s)
			}
		}
	case "delimiter":
		return choose(&m.Delimiter, name, value, "comma, semicolon or tab",
			map[string]rune{",": ',', "comma": ',', ";": ';', "semicolon": ';', "tab": '\t', `\t`: '\t'})
	case "decimal":
		return choose(&m.DecimalComma, name, value, "point or comma",
			map[string]bool{"point": false, ".": false, "comma": true, ",": true})
	default:
		return fmt.Sprintf("%q is not a setting; the settings are sheet, header row, first data row, blank row, lengths, radii, flat, delimiter, decimal", name)
	}
	return ""
}

// choose sets *dst to the value the word value names (case ignored), or
// says what to write instead: the one shape of every setting that takes one
// word of a few.
func choose[T any](dst *T, name, value, write string, words map[string]T) string {
	v, ok := words[strings.ToLower(value)]
	if !ok {
		return fmt.Sprintf("%s: %q; write %s", name, value, write)
	}
	*dst = v
	return ""
}

func (m *Mapping) headerRow() int { return max(m.HeaderRow, 1) }

func (m *Mapping) firstDataRow() int {
	if m.FirstDataRow > 0 {
		return m.FirstDataRow
	}
	return m.headerRow() + 1
}

// flatWhen tells whether the mapping counts s as a flat surface.
func (m *Mapping) flatWhen(s string) bool {
	s = strings.ToLower(strings.TrimSpace(s))
	if s == "" {
		return slices.Contains(m.Flat, "blank")
	}
	return slices.Contains(m.Flat, strings.TrimLeft(s, "+-"))
}

// source is the source column of a field, "" when the field is not fed by
// a column.
func (m *Mapping) source(field string) string {
	for _, c := range m.Columns {
		if c.Field == field {
			return c.Source
		}
	}
	return ""
}

func (m *Mapping) constant(field string) (Constant, bool) {
	for _, c := range m.Constants {
		if c.Field == field {
			return c, true
		}
	}
	return Constant{}, false
}
