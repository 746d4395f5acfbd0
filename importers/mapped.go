package importers

import (
	"fmt"
	"math"
	"slices"
	"sort"
	"strconv"
	"strings"

	"cardinal/catalog/record"
	"cardinal/optics"
)

// A SheetError is one thing wrong with a foreign table read through a
// mapping: the file, the sheet ("" for CSV), the row (0 for the file as a
// whole), the source column's header text and the cell, the catalog field
// it feeds, and the reason.
type SheetError struct {
	File, Sheet string
	Row         int
	Column      string // the source column's header; "" for the row or the file
	Cell        string // A1 address in a spreadsheet
	Field       string // the catalog field, such as r2
	Reason      string
}

// Error prints the problem as
// `lenses.xlsx, sheet "Stock", row 14, column "R2 (in)" (cell D14, r2): reason`.
func (e SheetError) Error() string {
	var b strings.Builder
	b.WriteString(e.File)
	if e.Sheet != "" {
		fmt.Fprintf(&b, ", sheet %q", e.Sheet)
	}
	if e.Row > 0 {
		fmt.Fprintf(&b, ", row %d", e.Row)
	}
	var where []string
	if e.Cell != "" {
		where = append(where, "cell "+e.Cell)
	}
	if e.Field != "" {
		where = append(where, e.Field)
	}
	if e.Column != "" {
		fmt.Fprintf(&b, ", column %q", e.Column)
	}
	if len(where) > 0 {
		fmt.Fprintf(&b, " (%s)", strings.Join(where, ", "))
	}
	b.WriteString(": " + e.Reason)
	return b.String()
}

// SheetErrors is every problem found in one foreign table.
type SheetErrors []SheetError

func (se SheetErrors) Error() string {
	s := make([]string, len(se))
	for i, e := range se {
		s[i] = e.Error()
	}
	return strings.Join(s, "\n")
}

// A MappedFile is what ReadMapped found: the entries (Entry.Line is the
// source row), the sheet read ("" for CSV), and warnings about the file.
// When ReadMapped returns an error, Rows holds the rows that did read, for
// a preview only: a wrong sign convention makes some parts invalid and
// others merely wrong, and the preview shows the second kind.
type MappedFile struct {
	Rows     []record.Entry
	Sheet    string
	Warnings SheetErrors
	// Sources maps a catalog field to the source column that fed it, or to
	// "constant" for a field given one value.
	Sources map[string]string
}

// MapOptions are the settings of ReadMapped. The zero value knows the
// built-in glasses and reports no progress.
type MapOptions struct {
	// Glasses resolves glass names after the mapping's own glass lines: the
	// catalog's glass table with the user's aliases (nil: built-in glasses,
	// six-digit codes and air).
	Glasses optics.GlassTable
	// Progress, when not nil, is called with the count of data rows read
	// every ProgressEvery rows and once at the end.
	Progress func(rows int)
}

// ProgressEvery is how many data rows pass between Progress calls.
const ProgressEvery = 5000

// ReadMapped reads a spreadsheet or foreign CSV through a mapping into
// entries, the same entries ReadPrescriptionFile gives for the neutral CSV
// of the converted rows: lengths in mm, radii signed, flats as +Inf, glass
// names resolved. Every problem is reported, each naming the file, sheet,
// row and source column; the error is then a SheetErrors (and the entries
// that read are for a preview only). Unknown glass names make one problem
// that lists each with its rows.
func ReadMapped(src Source, m *Mapping, opt MapOptions) (MappedFile, error) {
	if opt.Glasses == nil {
		opt.Glasses = optics.BuiltinGlasses()
	}
	rd := &mappedReader{src: src, m: m, opt: opt, unknown: map[string][]int{}, seen: map[string]int{}}
	return rd.read()
}

// mappedReader is the state of one ReadMapped.
type mappedReader struct {
	src       Source
	m         *Mapping
	opt       MapOptions
	sheet     string
	header    map[string]int // lower-case source header -> column
	headerRaw []string
	table     *table // the neutral table the converted rows go through
	colOf     map[string]int
	errs      SheetErrors
	warnings  SheetErrors
	unknown   map[string][]int // glass name as written -> rows
	seen      map[string]int   // SUPPLIER:PART -> first row
	entries   []record.Entry
}

func (rd *mappedReader) fail(row int, field, cell, format string, a ...any) {
	rd.errs = append(rd.errs, SheetError{File: rd.src.Name, Sheet: rd.sheet, Row: row, Field: field,
		Column: rd.m.source(field), Cell: cell, Reason: fmt.Sprintf(format, a...)})
}

func (rd *mappedReader) read() (MappedFile, error) {
	rd.checkGlassLines()
	rows, sheet, err := rd.src.open(rd.m)
	rd.sheet = sheet
	if err != nil {
		rd.fail(0, "", "", "%v", err)
		return rd.result()
	}
	defer rows.close()
	if !rd.readHeader(rows) {
		return rd.result()
	}
	rd.readData(rows)
	rows.rest()
	if err := rows.err(); err != nil {
		rd.fail(0, "", "", "%v", err)
	}
	rd.checkMerged(rows.merged())
	rd.reportUnknownGlasses()
	return rd.result()
}

func (rd *mappedReader) result() (MappedFile, error) {
	out := MappedFile{Sheet: rd.sheet, Warnings: rd.warnings, Sources: map[string]string{}}
	for _, c := range rd.m.Columns {
		out.Sources[c.Field] = c.Source
	}
	for _, c := range rd.m.Constants {
		out.Sources[c.Field] = "constant"
	}
	out.Rows = rd.entries
	if len(rd.errs) > 0 {
		sort.SliceStable(rd.errs, func(i, j int) bool { return rd.errs[i].Row < rd.errs[j].Row })
		return out, rd.errs
	}
	return out, nil
}

// checkGlassLines makes sure every glass line of the mapping names a glass
// the catalog knows.
func (rd *mappedReader) checkGlassLines() {
	for _, g := range rd.m.Glasses {
		if _, err := rd.opt.Glasses.Lookup(g.Target); err != nil {
			rd.errs = append(rd.errs, SheetError{File: rd.m.File, Row: g.Line,
				Reason: fmt.Sprintf("glass %s -> %s: %v; write a six-digit glass code (517642: nd 1.517, Vd 64.2) or import the glass first", g.Name, g.Target, err)})
		}
	}
}

// readHeader finds the header row and every mapped source column in it.
func (rd *mappedReader) readHeader(rows rowSource) bool {
	want := rd.m.headerRow()
	var hdr srcRow
	found := false
	for !found {
		r, ok := rows.next()
		if !ok {
			break
		}
		if r.n == want {
			hdr, found = r, true
		} else if r.n > want {
			break
		}
	}
	if !found {
		rd.fail(0, "", "", "there is no header row %d: the sheet's data ends before it or the row is empty; set 'header row: N' in the mapping", want)
		return false
	}
	rd.header = map[string]int{}
	for i, c := range hdr.cells {
		name := normalHeader(c.text)
		if name == "" {
			continue
		}
		if _, dup := rd.header[name]; dup {
			rd.header[name] = -1 // ambiguous
		} else {
			rd.header[name] = i
		}
		rd.headerRaw = append(rd.headerRaw, strings.TrimSpace(c.text))
	}
	before := len(rd.errs)
	rd.colOf = map[string]int{}
	for _, c := range rd.m.Columns {
		i, ok := rd.header[normalHeader(c.Source)]
		switch {
		case !ok:
			rd.errs = append(rd.errs, SheetError{File: rd.src.Name, Sheet: rd.sheet, Row: want, Column: c.Source, Field: c.Field,
				Reason: fmt.Sprintf("no such column in header row %d, which holds %s; fix the name on line %d of %s or set 'header row: N'",
					want, quoteList(rd.headerRaw), c.Line, rd.m.File)})
		case i < 0:
			rd.errs = append(rd.errs, SheetError{File: rd.src.Name, Sheet: rd.sheet, Row: want, Column: c.Source, Field: c.Field,
				Reason: "the header holds this name twice; rename one of the columns in the sheet"})
		default:
			rd.colOf[c.Field] = i
		}
	}
	rd.buildTable()
	return len(rd.errs) == before
}

// normalHeader compares header texts without regard to case or runs of
// spaces.
func normalHeader(s string) string { return strings.ToLower(strings.Join(strings.Fields(s), " ")) }

// buildTable makes the neutral table the converted rows are parsed in: one
// column per field the mapping feeds.
func (rd *mappedReader) buildTable() {
	t := &table{file: rd.src.Name, columns: map[string]int{}, headerOK: true}
	for i, f := range mappingFields {
		t.columns[f] = i
	}
	rd.table = t
}

// readData converts and parses every data row.
func (rd *mappedReader) readData(rows rowSource) {
	first, prev, count := rd.m.firstDataRow(), rd.m.headerRow(), 0
	var blank []int
	for {
		r, ok := rows.next()
		if !ok {
			break
		}
		if r.n < first {
			prev = r.n
			continue
		}
		gapFrom := max(prev+1, first)
		if r.empty() || r.n > gapFrom {
			for n := gapFrom; n < r.n; n++ {
				blank = append(blank, n)
			}
			if r.empty() {
				blank = append(blank, r.n)
			}
			if rd.m.StopAtBlank && len(blank) > 0 {
				break
			}
		}
		prev = r.n
		if r.empty() {
			continue
		}
		rd.readRow(r)
		if count++; rd.opt.Progress != nil && count%ProgressEvery == 0 {
			rd.opt.Progress(count)
		}
	}
	if rd.opt.Progress != nil {
		rd.opt.Progress(count)
	}
	if !rd.m.StopAtBlank && len(blank) > 0 && count > 0 {
		rd.warnings = append(rd.warnings, SheetError{File: rd.src.Name, Sheet: rd.sheet, Row: blank[0],
			Reason: fmt.Sprintf("%s empty and skipped; the rows after them were read too. If what follows an empty row is not parts (notes, a second table), write 'blank row: stop' in the mapping", rowList(blank))})
	}
}

// rowList writes rows as "row 7 is" or "rows 7-9, 12 are".
func rowList(rows []int) string {
	var parts []string
	for i := 0; i < len(rows); {
		j := i
		for j+1 < len(rows) && rows[j+1] == rows[j]+1 {
			j++
		}
		if j > i {
			parts = append(parts, fmt.Sprintf("%d-%d", rows[i], rows[j]))
		} else {
			parts = append(parts, strconv.Itoa(rows[i]))
		}
		i = j + 1
	}
	if len(rows) == 1 {
		return "row " + parts[0] + " is"
	}
	const most = 8
	if len(parts) > most {
		parts = append(parts[:most], fmt.Sprintf("and %d more", len(parts)-most))
	}
	return "rows " + strings.Join(parts, ", ") + " are"
}

// A mappedCell is one field's value taken from the source, before it is
// converted.
type mappedCell struct {
	srcCell
	field string
}

// readRow converts one source row into neutral cells and parses them as the
// neutral reader does.
func (rd *mappedReader) readRow(r srcRow) {
	cells := make([]string, len(rd.table.columns))
	rc := rowConverter{rd: rd, row: r.n, quiet: map[string]bool{}}
	values := map[string]mappedCell{}
	for _, c := range rd.m.Constants {
		values[c.Field] = mappedCell{srcCell: srcCell{text: c.Value, kind: cellText}, field: c.Field}
	}
	for f, i := range rd.colOf {
		values[f] = mappedCell{srcCell: r.cell(i), field: f}
	}
	rc.convert(values, cells)
	row := rd.table.row(rawRow{line: r.n, cells: cells})
	e := parseEntry(row, rd.opt.Glasses)
	if first, dup := rd.seen[e.Part.ID()]; dup && e.Part.Supplier != "" && e.Part.Name != "" {
		row.fail("part", "%s is already in row %d; supplier and part together must be unique", e.Part.ID(), first)
	} else {
		rd.seen[e.Part.ID()] = r.n
	}
	for _, le := range row.errs {
		if rc.quiet[le.Column] {
			continue
		}
		rd.fail(r.n, le.Column, rc.addr(le.Column), "%s", rd.explain(le))
	}
	if len(row.errs) > 0 {
		return
	}
	e.Warnings = ComputedWarnings(e)
	rd.entries = append(rd.entries, e)
}

// explain rewrites a neutral reader's message for a field the mapping
// feeds with a constant.
func (rd *mappedReader) explain(le LineError) string {
	if c, ok := rd.m.constant(le.Column); ok {
		return fmt.Sprintf("%s (the value %q comes from line %d of %s)", le.Reason, c.Value, c.Line, rd.m.File)
	}
	return le.Reason
}

// A rowConverter turns one row's mapped cells into neutral CSV text.
type rowConverter struct {
	rd     *mappedReader
	row    int
	values map[string]mappedCell
	quiet  map[string]bool // fields whose parse errors are already reported
}

func (rc *rowConverter) fail(field, format string, a ...any) {
	rc.quiet[field] = true
	rc.rd.fail(rc.row, field, rc.addr(field), format, a...)
}

// addr is the cell address of a field in this row.
func (rc *rowConverter) addr(field string) string {
	if v, ok := rc.values[field]; ok {
		return v.addr
	}
	return ""
}

func (rc *rowConverter) convert(values map[string]mappedCell, cells []string) {
	rc.values = values
	set := func(f, s string) { cells[rc.rd.table.columns[f]] = s }
	for _, f := range mappingFields {
		v, ok := values[f]
		if !ok || f == "shape" || isIndexed(f, "r") || !rc.readable(v) {
			continue // radii and shape below
		}
		switch {
		case isLengthField(f):
			set(f, rc.length(v))
		case strings.HasPrefix(f, "asph"):
			set(f, rc.asphere(v))
		case strings.HasPrefix(f, "glass"):
			set(f, rc.glass(v))
		case isIndexed(f, "conic") || f == "stated_wavelength" || f == "price" || f == CoatingColumn:
			set(f, rc.number(v))
		default:
			set(f, strings.TrimSpace(v.text))
		}
	}
	rc.radii(values, cells)
}

// readable refuses cells that hold no usable value: a formula never
// calculated, an error value, a date or a TRUE/FALSE where a number belongs.
func (rc *rowConverter) readable(v mappedCell) bool {
	switch v.kind {
	case cellNoValue:
		rc.fail(v.field, "the cell holds a formula with no saved result; open the file in a spreadsheet program and save it (which stores the results), or paste the values")
	case cellError:
		rc.fail(v.field, "the cell holds the error value %s; fix the formula or type the value", v.text)
	case cellDate:
		rc.fail(v.field, "the cell is formatted as a date or time (its value is %s); format it as a number and check the value", v.text)
	case cellBool:
		if v.field != "notes" && v.field != "description" {
			rc.fail(v.field, "the cell holds %s, not a value for %s", v.text, v.field)
		}
	default:
		return true
	}
	return false
}

func isIndexed(f, prefix string) bool {
	_, ok := indexed(f, prefix)
	return ok
}

// isLengthField tells the fields that hold a length other than a radius.
func isLengthField(f string) bool {
	switch f {
	case "diameter", "clear_aperture", "efl", "bfd", "edge_thickness":
		return true
	}
	return isIndexed(f, "t")
}

// number is a cell's number written as the neutral CSV writes it; text
// that is not a number passes unchanged, for the neutral parser to report.
func (rc *rowConverter) number(v mappedCell) string {
	s := strings.TrimSpace(v.text)
	if rc.rd.m.DecimalComma {
		s = strings.Replace(s, ",", ".", 1)
	}
	if x, err := strconv.ParseFloat(s, 64); err == nil {
		return formatFloat(x)
	}
	return s
}

// length converts a length to mm: inch to mm by 25.4 exactly (the
// international yard and pound agreement of 1959), cm by 10.
func (rc *rowConverter) length(v mappedCell) string {
	s := rc.number(v)
	x, err := strconv.ParseFloat(s, 64)
	if err != nil || s == "" {
		return s
	}
	return formatFloat(x * rc.rd.m.Unit.Millimetres())
}

// asphere converts even-asphere coefficients to mm: the sag term a_n h^n
// (ISO 10110-12 form) is a length, so with h and the sag in a unit of u mm,
// a_n in mm^(1-n) is a_n(unit) * u^(1-n).
func (rc *rowConverter) asphere(v mappedCell) string {
	s := equalsSpace.ReplaceAllString(strings.TrimSpace(v.text), "=")
	u := rc.rd.m.Unit.Millimetres()
	var out []string
	for _, term := range strings.FieldsFunc(s, func(r rune) bool { return r == ' ' || r == '\t' || r == ';' }) {
		key, val, ok := strings.Cut(term, "=")
		i, known := asphIndex[strings.ToLower(key)]
		x, err := strconv.ParseFloat(strings.Replace(val, ",", ".", btoi(rc.rd.m.DecimalComma)), 64)
		if !ok || !known || err != nil {
			return s // for the neutral parser to report
		}
		n := 4 + 2*i
		out = append(out, fmt.Sprintf("%s=%s", strings.ToLower(key), formatFloat(x*math.Pow(u, float64(1-n)))))
	}
	return strings.Join(out, " ")
}

func btoi(b bool) int {
	if b {
		return 1
	}
	return 0
}

// glass resolves a glass name through the mapping's glass lines; a name
// neither they nor the catalog know is collected for one error.
func (rc *rowConverter) glass(v mappedCell) string {
	name := strings.TrimSpace(v.text)
	if name == "" {
		return ""
	}
	for _, g := range rc.rd.m.Glasses {
		if strings.EqualFold(g.Name, name) {
			return g.Target
		}
	}
	if _, err := rc.rd.opt.Glasses.Lookup(name); err != nil {
		rc.rd.unknown[name] = append(rc.rd.unknown[name], rc.row)
		rc.quiet[v.field] = true
	}
	return name
}

// radii fills r1..rN: flats as inf, magnitudes signed by the shape, lengths
// in mm. N is the highest i with ri given, or with t(i-1) given when a blank
// radius is a flat.
func (rc *rowConverter) radii(values map[string]mappedCell, cells []string) {
	m := rc.rd.m
	n := 0
	for i := 1; i <= MaxSurfaces; i++ {
		if strings.TrimSpace(values[col("r", i)].text) != "" {
			n = i
		}
	}
	if m.flatWhen("") {
		for i := 1; i < MaxSurfaces; i++ {
			if strings.TrimSpace(values[col("t", i)].text) != "" {
				n = max(n, i+1)
			}
		}
	}
	var signs string
	if m.Magnitudes && n >= 2 {
		var ok bool
		shape := values["shape"]
		shape.field = "shape"
		if signs, ok = rc.shapeSigns(shape, n); !ok {
			for i := 1; i <= MaxSurfaces; i++ {
				rc.quiet[col("r", i)] = true
			}
			return
		}
	}
	for i := 1; i <= n; i++ {
		f := col("r", i)
		v := values[f]
		v.field = f
		if !rc.readable(v) {
			continue
		}
		cells[rc.rd.table.columns[f]] = rc.radius(v, signs, i)
	}
}

// radius converts one radius cell.
func (rc *rowConverter) radius(v mappedCell, signs string, i int) string {
	if rc.rd.m.flatWhen(v.text) {
		return "inf"
	}
	s := rc.length(v)
	x, err := strconv.ParseFloat(s, 64)
	if err != nil || signs == "" {
		return s
	}
	if x < 0 {
		rc.fail(v.field, "radii: magnitudes, but the cell holds the negative radius %s; if the sheet gives signed radii, write 'radii: signed' in the mapping", strings.TrimSpace(v.text))
		return s
	}
	if signs[i-1] == '-' {
		x = -x
	}
	return formatFloat(x)
}

// shapeSigns reads the shape of a part whose radii are magnitudes into the
// sign of each radius, "+" when the centre of curvature lies after the
// surface. A singlet's shape may be a word; any part may give a sign
// pattern such as +-- (one sign per radius, light order).
func (rc *rowConverter) shapeSigns(v mappedCell, n int) (string, bool) {
	if !rc.readable(v) {
		return "", false
	}
	text := strings.TrimSpace(v.text)
	if text == "" {
		rc.fail("shape", "is empty; with 'radii: magnitudes' each part needs a shape (%s, or a sign pattern such as +-- for each radius in light order)", strings.Join(ShapeWords(), ", "))
		return "", false
	}
	if p := strings.ReplaceAll(text, " ", ""); strings.Trim(p, "+-") == "" {
		if len(p) != n {
			rc.fail("shape", "the sign pattern %q has %d signs but the part has %d radii", p, len(p), n)
			return "", false
		}
		return p, true
	}
	key := strings.Join(strings.FieldsFunc(strings.ToLower(text), func(r rune) bool { return r == ' ' || r == '-' || r == '_' }), "")
	signs, ok := shapeSigns[key]
	if !ok {
		rc.fail("shape", "%q is not a shape cardinal knows; use %s, or a sign pattern such as +-- (one sign per radius, light order)", text, strings.Join(ShapeWords(), ", "))
		return "", false
	}
	if n != 2 {
		rc.fail("shape", "%q names a singlet, but the part has %d radii; give a sign pattern such as +-- instead", text, n)
		return "", false
	}
	return signs, true
}

// ShapeWords returns the singlet shapes a magnitude sheet may name (common
// practice). A meniscus is taken with its convex side first, as sheets
// draw it; a part turned the other way needs a sign pattern (--).
func ShapeWords() []string {
	return []string{"biconvex", "biconcave", "plano-convex", "plano-concave", "meniscus"}
}

// shapeSigns maps a shape word, lower-case without spaces or hyphens, to
// the signs of r1 and r2. A plano shape's sign on its flat side does not
// matter, so one pattern serves the flat on either side.
var shapeSigns = map[string]string{
	"biconvex": "+-", "doubleconvex": "+-", "equiconvex": "+-",
	"biconcave": "-+", "doubleconcave": "-+", "equiconcave": "-+",
	"planoconvex": "+-", "planconvex": "+-",
	"planoconcave": "-+", "planconcave": "-+",
	"meniscus": "++", "positivemeniscus": "++", "negativemeniscus": "++",
}

// reportUnknownGlasses makes one problem listing every glass name nothing
// resolves, with the rows that use it.
func (rd *mappedReader) reportUnknownGlasses() {
	if len(rd.unknown) == 0 {
		return
	}
	names := make([]string, 0, len(rd.unknown))
	for n := range rd.unknown {
		names = append(names, n)
	}
	slices.Sort(names)
	var list []string
	for _, n := range names {
		list = append(list, fmt.Sprintf("%q (%s)", n, strings.TrimSuffix(strings.TrimSuffix(rowList(slices.Compact(rd.unknown[n])), " is"), " are")))
	}
	rd.errs = append(rd.errs, SheetError{File: rd.src.Name, Sheet: rd.sheet, Column: glassColumns(rd.m),
		Reason: fmt.Sprintf("unknown glass names: %s. Say what each is, for every import with 'cardinal glass alias NAME CODE', or for this file with a line 'glass NAME -> CODE' in %s (CODE: a six-digit glass code such as 517642, or a glass you imported with 'cardinal glass import')",
			strings.Join(list, "; "), rd.m.File)})
}

func glassColumns(m *Mapping) string {
	var s []string
	for _, c := range m.Columns {
		if strings.HasPrefix(c.Field, "glass") {
			s = append(s, c.Source)
		}
	}
	return strings.Join(s, ", ")
}

// checkMerged refuses merged ranges that reach into the header or the data
// in a mapped column: only the first cell of a merged range holds its value.
func (rd *mappedReader) checkMerged(ranges []cellRange) {
	used := map[int]string{}
	for f, i := range rd.colOf {
		used[i] = f
	}
	for _, r := range ranges {
		if r.row1 < rd.m.headerRow() {
			continue
		}
		for c := r.col0; c <= r.col1; c++ {
			if f, ok := used[c]; ok {
				rd.errs = append(rd.errs, SheetError{File: rd.src.Name, Sheet: rd.sheet, Row: max(r.row0, rd.m.headerRow()),
					Column: rd.m.source(f), Field: f, Cell: r.ref,
					Reason: fmt.Sprintf("cells %s are merged, and only the first holds the value; unmerge them and fill every cell", r.ref)})
				break
			}
		}
	}
}
