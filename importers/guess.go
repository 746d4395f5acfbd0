package importers

import (
	"fmt"
	"io"
	"slices"
	"strconv"
	"strings"

	"cardinal/optics"
)

// Guessing a first mapping from a table's headers, for the user to check.

// guessRows is how many rows are searched for the header, and how many
// data rows after it are looked at for signs, flats and glass names.
const guessRows = 30

const guessData = 200

// headerWords are the words of the trade a header may use for a field
// (common practice), lower-case, units and punctuation removed.
var headerWords = map[string][]string{
	"supplier":          {"supplier", "vendor", "manufacturer", "maker", "brand", "source"},
	"part":              {"part", "part no", "part number", "item", "item no", "item number", "catalog no", "catalogue no", "catalog number", "stock no", "stock number", "sku", "pn", "p n", "product code", "order code", "code", "id"},
	"description":       {"description", "desc", "product", "name", "title"},
	"diameter":          {"diameter", "dia", "diam", "d", "od", "outer diameter", "outside diameter", "lens diameter", "size"},
	"clear_aperture":    {"clear aperture", "ca", "aperture"},
	"efl":               {"efl", "f", "focal length", "effective focal length", "fl", "focal"},
	"bfd":               {"bfl", "bfd", "back focal length", "back focal distance", "bf"},
	"edge_thickness":    {"et", "te", "edge thickness", "edge"},
	"price":             {"price", "unit price", "cost", "list price"},
	"currency":          {"currency", "curr"},
	"url":               {"url", "link", "web", "website", "web page", "web link"},
	"notes":             {"notes", "note", "comments", "comment", "remarks"},
	"shape":             {"shape", "type", "lens type", "lens shape", "form"},
	"stated_wavelength": {"wavelength", "design wavelength", "lambda"},
	CoatingColumn:       {"residual reflectance", "reflectance", "reflectance per surface", "coating reflectance", "ravg", "r avg"},
}

// indexedWords are the words of fields numbered by surface or element.
var indexedWords = map[string][]string{
	"r":     {"r", "radius", "roc", "radius of curvature", "curvature radius", "rc"},
	"t":     {"ct", "tc", "t", "thickness", "center thickness", "centre thickness"},
	"glass": {"material", "glass", "substrate", "glass type", "glass code", "mat"},
	"conic": {"conic", "k", "conic constant"},
	"asph":  {"asph", "asphere", "aspheric", "aspheric terms", "asphere terms"},
}

// A header is one header cell as the guess reads it.
type headerCell struct {
	text  string // as written
	words string // lower-case, no unit, punctuation as spaces
	unit  string // mm, cm, inch or "" from (mm), [in], ...
}

func readHeaderCell(s string) headerCell {
	h := headerCell{text: strings.TrimSpace(s)}
	low := strings.ToLower(h.text)
	for _, br := range [][2]string{{"(", ")"}, {"[", "]"}} {
		if i := strings.Index(low, br[0]); i >= 0 {
			if j := strings.Index(low[i:], br[1]); j > 0 {
				h.unit = unitWord(strings.TrimSpace(low[i+1 : i+j]))
				low = low[:i] + " " + low[i+j+1:]
			}
		}
	}
	low = strings.ReplaceAll(low, "#", " no ")
	for _, d := range []string{"ø", "⌀", "∅"} { // the diameter sign (common practice)
		low = strings.ReplaceAll(low, d, " diameter ")
	}
	low = strings.ReplaceAll(low, "\"", " inch ")
	f := strings.FieldsFunc(low, func(r rune) bool {
		return !(r >= 'a' && r <= 'z' || r >= '0' && r <= '9')
	})
	if n := len(f); n > 1 && (f[n-1] == "mm" || f[n-1] == "in" || f[n-1] == "inch" || f[n-1] == "cm") {
		if h.unit == "" {
			h.unit = unitWord(f[n-1])
		}
		f = f[:n-1]
	}
	h.words = strings.Join(f, " ")
	return h
}

func unitWord(s string) string {
	switch s {
	case "mm", "millimetre", "millimeter", "millimetres", "millimeters":
		return "mm"
	case "cm":
		return "cm"
	case "in", "inch", "inches", "\"", "in.":
		return "inch"
	}
	return ""
}

// field returns the catalog field a header names, "" when none.
func (h headerCell) field() string {
	for f, words := range headerWords {
		if slices.Contains(words, h.words) {
			return f
		}
	}
	base, n := splitIndex(h.words)
	switch base {
	case "front radius", "first radius":
		return "r1"
	case "back radius", "rear radius", "second radius":
		return "r2"
	}
	for prefix, words := range indexedWords {
		if slices.Contains(words, base) {
			if n == 0 {
				n = 1
			}
			limit := MaxSurfaces
			if prefix == "t" || prefix == "glass" {
				limit--
			}
			if n <= limit {
				return col(prefix, n)
			}
		}
	}
	return ""
}

// splitIndex splits "radius 2" or "r2" into "radius"/"r" and 2.
func splitIndex(s string) (string, int) {
	i := len(s)
	for i > 0 && s[i-1] >= '0' && s[i-1] <= '9' {
		i--
	}
	if i == len(s) || i == 0 {
		return s, 0
	}
	n, _ := strconv.Atoi(s[i:])
	return strings.TrimSpace(s[:i]), n
}

// GuessMapping reads the first rows of a table (sheet "" is the first
// sheet) and writes a first mapping, with comments saying what to check.
// glasses are the names the catalog knows (nil: built-in glasses only).
func GuessMapping(w io.Writer, src Source, sheet string, glasses optics.GlassTable) error {
	if glasses == nil {
		glasses = optics.BuiltinGlasses()
	}
	rows, sheetName, err := src.open(&Mapping{Sheet: sheet})
	if err != nil {
		return SheetErrors{{File: src.Name, Sheet: sheet, Reason: err.Error()}}
	}
	defer rows.close()
	var head []srcRow
	for len(head) < guessRows {
		r, ok := rows.next()
		if !ok {
			break
		}
		head = append(head, r)
	}
	if err := rows.err(); err != nil {
		return SheetErrors{{File: src.Name, Sheet: sheetName, Reason: err.Error()}}
	}
	hi, fields := bestHeader(head)
	if hi < 0 {
		return SheetErrors{{File: src.Name, Sheet: sheetName, Reason: fmt.Sprintf("none of the first %d rows names columns cardinal recognises (such as Radius 1, CT, Diameter, Material); write the mapping by hand ('cardinal catalog mapping --help' shows the format)", guessRows)}}
	}
	g := &guess{src: src, sheet: sheetName, sheetAsked: sheet, header: head[hi], fields: fields, glasses: glasses}
	data := head[hi+1:]
	for len(data) < guessData {
		r, ok := rows.next()
		if !ok {
			break
		}
		data = append(data, r)
	}
	g.data = data
	return g.write(w)
}

// bestHeader picks the row whose cells name the most fields (at least two)
// and returns it with the field of each column.
func bestHeader(rows []srcRow) (int, map[int]string) {
	best, bestN := -1, 1
	var bestFields map[int]string
	for i, r := range rows {
		fields, taken := map[int]string{}, map[string]bool{}
		for c, cell := range r.cells {
			if cell.kind != cellText {
				continue
			}
			if f := readHeaderCell(cell.text).field(); f != "" && !taken[f] {
				fields[c], taken[f] = f, true
			}
		}
		if len(fields) > bestN {
			best, bestN, bestFields = i, len(fields), fields
		}
	}
	return best, bestFields
}

// A guess is the material for a guessed mapping.
type guess struct {
	src               Source
	sheet, sheetAsked string
	header            srcRow
	fields            map[int]string // column -> field
	data              []srcRow
	glasses           optics.GlassTable
}

func (g *guess) write(w io.Writer) error {
	var b strings.Builder
	where := g.src.Name
	if g.sheet != "" {
		where += fmt.Sprintf(" (sheet %q)", g.sheet)
	}
	fmt.Fprintf(&b, "# cardinal column mapping, guessed from the headers of %s.\n", where)
	b.WriteString("# CHECK EVERY LINE: a wrong sign or unit here poisons every later search.\n")
	fmt.Fprintf(&b, "# Preview before importing: cardinal catalog import %s --map THIS-FILE --dry-run\n", g.src.Name)
	b.WriteString("# Lines: 'SETTING: VALUE', 'FIELD <- SOURCE COLUMN', 'FIELD = VALUE', 'glass NAME -> CODE';\n# a # starts a comment only at the start of a line.\n\n")
	if g.sheet != "" {
		fmt.Fprintf(&b, "sheet: %s\n", g.sheet)
	}
	fmt.Fprintf(&b, "header row: %d\n", g.header.n)
	g.writeUnit(&b)
	g.writeRadii(&b)
	g.writeFlat(&b)
	b.WriteString("\n")
	cols := make([]int, 0, len(g.fields))
	for c := range g.fields {
		cols = append(cols, c)
	}
	slices.Sort(cols)
	have := map[string]bool{}
	for _, c := range cols {
		f := g.fields[c]
		have[f] = true
		fmt.Fprintf(&b, "%s <- %s\n", f, strings.TrimSpace(g.header.cells[c].text))
	}
	for _, f := range []string{"supplier", "part", "diameter", "r1", "r2", "t1", "glass1"} {
		if !have[f] {
			fmt.Fprintf(&b, "# CHECK: %s is required, but no column looks like it: map a column (%s <- COLUMN)\n# or give one value (%s = VALUE), and remove the # below\n# %s = ?\n", f, f, f, f)
		}
	}
	var unused []string
	for c, cell := range g.header.cells {
		if _, ok := g.fields[c]; !ok && strings.TrimSpace(cell.text) != "" {
			unused = append(unused, strings.TrimSpace(cell.text))
		}
	}
	if len(unused) > 0 {
		fmt.Fprintf(&b, "# not used: %s\n", strings.Join(unused, ", "))
	}
	g.writeGlasses(&b)
	_, err := io.WriteString(w, b.String())
	return err
}

// column returns the cells of a field's column in the data rows looked at.
func (g *guess) column(field string) []srcCell {
	for c, f := range g.fields {
		if f == field {
			out := make([]srcCell, len(g.data))
			for i, r := range g.data {
				out[i] = r.cell(c)
			}
			return out
		}
	}
	return nil
}

func (g *guess) writeUnit(b *strings.Builder) {
	count := map[string][]string{}
	for c, f := range g.fields {
		if isLengthField(f) || isIndexed(f, "r") {
			h := readHeaderCell(g.header.cells[c].text)
			if h.unit != "" {
				count[h.unit] = append(count[h.unit], h.text)
			}
		}
	}
	switch len(count) {
	case 0:
		b.WriteString("# CHECK: no header names a unit; is the sheet in mm? (or write cm or inch)\nlengths: mm\n")
	case 1:
		for u, hs := range count {
			fmt.Fprintf(b, "# from the units in the headers %s\nlengths: %s\n", strings.Join(hs, ", "), u)
		}
	default:
		b.WriteString("# CHECK: the headers name different units; one unit holds for the whole file,\n# so convert the odd columns in the sheet first\nlengths: mm\n")
	}
}

func (g *guess) writeRadii(b *strings.Builder) {
	for i := 1; i <= MaxSurfaces; i++ {
		for j, c := range g.column(col("r", i)) {
			if x, err := strconv.ParseFloat(strings.TrimSpace(c.text), 64); err == nil && x < 0 {
				fmt.Fprintf(b, "# row %d gives a negative radius, so the sheet signs them\nradii: signed\n", g.data[j].n)
				return
			}
		}
	}
	if g.column("shape") != nil {
		b.WriteString("# CHECK: no radius is negative in the rows looked at, and a shape column gives the signs\nradii: magnitudes\n")
		return
	}
	b.WriteString("# CHECK: no radius is negative in the rows looked at; if the sheet gives magnitudes,\n# map a shape column (shape <- COLUMN) and write radii: magnitudes\nradii: signed\n")
}

func (g *guess) writeFlat(b *strings.Builder) {
	flat := DefaultFlat()
	zero, blank := false, false
	for i := 1; i <= MaxSurfaces; i++ {
		cells := g.column(col("r", i))
		for _, c := range cells {
			s := strings.ToLower(strings.TrimSpace(c.text))
			if _, err := strconv.ParseFloat(s, 64); err == nil {
				zero = zero || s == "0" || strings.Trim(s, "0.+-") == ""
				continue
			}
			if s != "" && !slices.Contains(flat, strings.TrimLeft(s, "+-")) {
				flat = append(flat, strings.TrimLeft(s, "+-"))
			}
		}
		if i == 2 && cells != nil {
			for _, c := range cells {
				blank = blank || strings.TrimSpace(c.text) == ""
			}
		}
	}
	if zero {
		flat = append(flat, "0")
		b.WriteString("# a radius of 0 appears in the rows looked at: taken as flat\n")
	}
	if blank {
		flat = append(flat, "blank")
		b.WriteString("# CHECK: some r2 cells are empty: taken as flat\n")
	}
	fmt.Fprintf(b, "flat: %s\n", strings.Join(flat, ", "))
}

// writeGlasses lists the glass names in the rows looked at that the catalog
// does not know, as lines to complete.
func (g *guess) writeGlasses(b *strings.Builder) {
	seen := map[string]bool{}
	var unknown []string
	for i := 1; i < MaxSurfaces; i++ {
		for _, c := range g.column(col("glass", i)) {
			name := strings.TrimSpace(c.text)
			if name == "" || seen[strings.ToLower(name)] {
				continue
			}
			seen[strings.ToLower(name)] = true
			if _, err := g.glasses.Lookup(name); err != nil {
				unknown = append(unknown, name)
			}
		}
	}
	if len(unknown) == 0 {
		return
	}
	b.WriteString("\n# Glass names the catalog does not know: write each one's six-digit code (517642: nd 1.517,\n")
	b.WriteString("# Vd 64.2) or a glass you imported, and remove the #; or add them for every import\n")
	b.WriteString("# with 'cardinal glass alias NAME CODE'.\n")
	for _, n := range unknown {
		fmt.Fprintf(b, "# glass %s -> ??????\n", n)
	}
}
