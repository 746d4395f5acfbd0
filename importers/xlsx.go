package importers

import (
	"archive/zip"
	"encoding/xml"
	"errors"
	"fmt"
	"io"
	"path"
	"strconv"
	"strings"
)

// The .xlsx reader. A workbook is a zip of XML parts (SpreadsheetML,
// ECMA-376 Part 1, the Office Open XML standard): xl/workbook.xml names the
// sheets, xl/_rels/workbook.xml.rels says which part holds each,
// xl/sharedStrings.xml holds the text cells, xl/styles.xml the number
// formats that tell a date from a number, and each sheet part holds its rows
// in <sheetData> and its merged ranges in <mergeCells> after them. The sheet
// is read as a stream of XML tokens, one row at a time, so memory grows with
// the shared strings and the row in hand, not with the sheet.

// A cellKind says what a spreadsheet cell holds.
type cellKind uint8

const (
	cellEmpty   cellKind = iota
	cellText             // text, or any cell of a CSV file
	cellNumber           // a number, its text written in full precision
	cellDate             // a number shown as a date or time
	cellBool             // TRUE or FALSE
	cellError            // an error value such as #DIV/0!
	cellNoValue          // a formula with no saved result
)

// A srcCell is one cell of a source row.
type srcCell struct {
	text string
	kind cellKind
	addr string // A1-style address in a spreadsheet; "" in a CSV file
}

// A srcRow is one row of a source table: its 1-based row (spreadsheet row
// or CSV line) and its cells by 0-based column.
type srcRow struct {
	n     int
	cells []srcCell
}

// cell is the cell of column i, empty when the row is shorter.
func (r srcRow) cell(i int) srcCell {
	if i < 0 || i >= len(r.cells) {
		return srcCell{}
	}
	return r.cells[i]
}

func (r srcRow) empty() bool {
	for _, c := range r.cells {
		if c.kind != cellEmpty && strings.TrimSpace(c.text) != "" || c.kind == cellNoValue || c.kind == cellError {
			return false
		}
	}
	return true
}

// An xlsxBook is an open workbook.
type xlsxBook struct {
	zr     *zip.Reader
	sheets []xlsxSheetRef
	shared []string
	dates  []bool // by cell style index: the style shows a date or time
}

type xlsxSheetRef struct{ name, part string }

// openXLSX reads the workbook's sheet list, shared strings and styles.
func openXLSX(r io.ReaderAt, size int64) (*xlsxBook, error) {
	zr, err := zip.NewReader(r, size)
	if err != nil {
		return nil, fmt.Errorf("not an .xlsx workbook (%v); save it from the spreadsheet program as .xlsx, or export the sheet as CSV", err)
	}
	b := &xlsxBook{zr: zr}
	if err := b.readSheets(); err != nil {
		return nil, err
	}
	if err := b.readSharedStrings(); err != nil {
		return nil, err
	}
	if err := b.readStyles(); err != nil {
		return nil, err
	}
	return b, nil
}

func (b *xlsxBook) open(name string) (io.ReadCloser, error) {
	for _, f := range b.zr.File {
		if strings.EqualFold(f.Name, name) {
			return f.Open()
		}
	}
	return nil, errMissingPart
}

var errMissingPart = errors.New("missing part")

// decodePart decodes a whole (small) XML part into v; a missing part is
// not an error when optional.
func (b *xlsxBook) decodePart(name string, v any, optional bool) error {
	rc, err := b.open(name)
	if errors.Is(err, errMissingPart) && optional {
		return nil
	}
	if err != nil {
		return fmt.Errorf("the workbook has no readable %s: %v", name, err)
	}
	defer rc.Close()
	if err := xml.NewDecoder(rc).Decode(v); err != nil {
		return fmt.Errorf("the workbook's %s cannot be read: %v", name, err)
	}
	return nil
}

func (b *xlsxBook) readSheets() error {
	var wb struct {
		Sheets []struct {
			Name string     `xml:"name,attr"`
			Attr []xml.Attr `xml:",any,attr"`
		} `xml:"sheets>sheet"`
	}
	if err := b.decodePart("xl/workbook.xml", &wb, false); err != nil {
		return err
	}
	var rels struct {
		Rel []struct {
			ID     string `xml:"Id,attr"`
			Target string `xml:"Target,attr"`
		} `xml:"Relationship"`
	}
	if err := b.decodePart("xl/_rels/workbook.xml.rels", &rels, false); err != nil {
		return err
	}
	target := map[string]string{}
	for _, r := range rels.Rel {
		t := r.Target
		if strings.HasPrefix(t, "/") {
			t = strings.TrimPrefix(t, "/")
		} else {
			t = path.Join("xl", t)
		}
		target[r.ID] = t
	}
	for _, s := range wb.Sheets {
		for _, a := range s.Attr {
			if a.Name.Local == "id" {
				b.sheets = append(b.sheets, xlsxSheetRef{name: s.Name, part: target[a.Value]})
			}
		}
	}
	if len(b.sheets) == 0 {
		return errors.New("the workbook names no sheet")
	}
	return nil
}

// readSharedStrings reads the text of every shared string; a rich-text
// string is the text of its runs, phonetic guides left out.
func (b *xlsxBook) readSharedStrings() error {
	rc, err := b.open("xl/sharedStrings.xml")
	if errors.Is(err, errMissingPart) {
		return nil
	}
	if err != nil {
		return err
	}
	defer rc.Close()
	d := xml.NewDecoder(rc)
	var cur strings.Builder
	depthPh := 0
	for {
		tok, err := d.Token()
		if errors.Is(err, io.EOF) {
			return nil
		}
		if err != nil {
			return fmt.Errorf("the workbook's shared strings cannot be read: %v", err)
		}
		switch t := tok.(type) {
		case xml.StartElement:
			switch t.Name.Local {
			case "si":
				cur.Reset()
			case "rPh":
				depthPh++
			case "t":
				if depthPh == 0 {
					var s string
					if err := d.DecodeElement(&s, &t); err != nil {
						return fmt.Errorf("the workbook's shared strings cannot be read: %v", err)
					}
					cur.WriteString(s)
				}
			}
		case xml.EndElement:
			switch t.Name.Local {
			case "si":
				b.shared = append(b.shared, cur.String())
			case "rPh":
				depthPh--
			}
		}
	}
}

// readStyles marks the cell styles whose number format shows a date or a
// time.
func (b *xlsxBook) readStyles() error {
	var st struct {
		NumFmts []struct {
			ID   int    `xml:"numFmtId,attr"`
			Code string `xml:"formatCode,attr"`
		} `xml:"numFmts>numFmt"`
		Xfs []struct {
			NumFmtID int `xml:"numFmtId,attr"`
		} `xml:"cellXfs>xf"`
	}
	if err := b.decodePart("xl/styles.xml", &st, true); err != nil {
		return err
	}
	custom := map[int]bool{}
	for _, f := range st.NumFmts {
		custom[f.ID] = isDateFormat(f.Code)
	}
	b.dates = make([]bool, len(st.Xfs))
	for i, x := range st.Xfs {
		if d, ok := custom[x.NumFmtID]; ok {
			b.dates[i] = d
		} else {
			b.dates[i] = builtinDateFormat(x.NumFmtID)
		}
	}
	return nil
}

// builtinDateFormat tells whether a built-in number format shows a date or
// time: ids 14-22 and 45-47 (ECMA-376 Part 1, 18.8.30 numFmt; the clause
// number from memory), and 27-36 and 50-58, the dates of East Asian locales
// (common practice).
func builtinDateFormat(id int) bool {
	return id >= 14 && id <= 22 || id >= 45 && id <= 47 || id >= 27 && id <= 36 || id >= 50 && id <= 58
}

// isDateFormat tells whether a format code shows a date or time: it has a
// y, m, d, h or s outside quoted text, escapes and [colour] brackets
// (ECMA-376 Part 1, 18.8.31 numFmts, format code syntax; the clause number
// from memory).
func isDateFormat(code string) bool {
	inQuote, inBracket := false, false
	for i := 0; i < len(code); i++ {
		c := code[i]
		switch {
		case inQuote:
			inQuote = c != '"'
		case inBracket:
			if c == ']' {
				inBracket = false
			} else if strings.ContainsRune("hHmMsS", rune(c)) && i > 0 && code[i-1] == '[' {
				return true // [h], [m], [s]: elapsed time
			}
		case c == '"':
			inQuote = true
		case c == '[':
			inBracket = true
		case c == '\\' || c == '_' || c == '*':
			i++ // the next character is literal or a fill
		case strings.ContainsRune("yYmMdDhHsS", rune(c)):
			return true
		}
	}
	return false
}

// sheetNames lists the sheets in workbook order.
func (b *xlsxBook) sheetNames() []string {
	out := make([]string, len(b.sheets))
	for i, s := range b.sheets {
		out[i] = s.name
	}
	return out
}

// rows starts reading a sheet by name ("" is the first sheet); the name
// is matched without regard to case.
func (b *xlsxBook) rows(sheet string) (*xlsxRows, string, error) {
	ref := b.sheets[0]
	if sheet != "" {
		found := false
		for _, s := range b.sheets {
			if strings.EqualFold(s.name, sheet) {
				ref, found = s, true
				break
			}
		}
		if !found {
			return nil, "", &missingSheetError{sheet: sheet, have: b.sheetNames()}
		}
	}
	rc, err := b.open(ref.part)
	if err != nil {
		return nil, ref.name, fmt.Errorf("sheet %q: its part %s cannot be read: %v", ref.name, ref.part, err)
	}
	return &xlsxRows{book: b, rc: rc, dec: xml.NewDecoder(rc)}, ref.name, nil
}

// A missingSheetError names the sheet asked for and those there are.
type missingSheetError struct {
	sheet string
	have  []string
}

func (e *missingSheetError) Error() string {
	return fmt.Sprintf("there is no sheet %q; the workbook has %s; name one with 'sheet: NAME' in the mapping or --sheet", e.sheet, quoteList(e.have))
}

func quoteList(names []string) string {
	q := make([]string, len(names))
	for i, n := range names {
		q[i] = strconv.Quote(n)
	}
	return strings.Join(q, ", ")
}

// xlsxRows streams the rows of one sheet.
type xlsxRows struct {
	book   *xlsxBook
	rc     io.ReadCloser
	dec    *xml.Decoder
	merges []string // merged ranges, known once the rows are read
	row    int      // the last row number read
	err    error
}

// next returns the next row that has any cell element; false at the end
// of the sheet's data or on an error (see err).
func (x *xlsxRows) next() (srcRow, bool) {
	for x.err == nil {
		tok, err := x.dec.Token()
		if err != nil {
			if !errors.Is(err, io.EOF) {
				x.err = fmt.Errorf("the sheet's XML cannot be read after row %d: %v", x.row, err)
			}
			return srcRow{}, false
		}
		se, ok := tok.(xml.StartElement)
		if !ok {
			continue
		}
		switch se.Name.Local {
		case "row":
			r, err := x.readRow(se)
			if err != nil {
				x.err = err
				return srcRow{}, false
			}
			return r, true
		case "mergeCell":
			for _, a := range se.Attr {
				if a.Name.Local == "ref" {
					x.merges = append(x.merges, a.Value)
				}
			}
		}
	}
	return srcRow{}, false
}

// finish reads the rest of the sheet, to learn its merged ranges.
func (x *xlsxRows) finish() {
	for {
		if _, ok := x.next(); !ok {
			return
		}
	}
}

func (x *xlsxRows) close() error { return x.rc.Close() }

func (x *xlsxRows) readRow(se xml.StartElement) (srcRow, error) {
	r := srcRow{n: x.row + 1}
	for _, a := range se.Attr {
		if a.Name.Local == "r" {
			n, err := strconv.Atoi(a.Value)
			if err != nil || n < 1 {
				return r, fmt.Errorf("the sheet has a row numbered %q", a.Value)
			}
			r.n = n
		}
	}
	x.row = r.n
	col := 0
	for {
		tok, err := x.dec.Token()
		if err != nil {
			return r, fmt.Errorf("the sheet's XML cannot be read in row %d: %v", r.n, err)
		}
		switch t := tok.(type) {
		case xml.StartElement:
			if t.Name.Local != "c" {
				if err := x.dec.Skip(); err != nil {
					return r, err
				}
				continue
			}
			c, at, err := x.readCell(t, r.n, col)
			if err != nil {
				return r, err
			}
			col = at + 1
			for len(r.cells) < at {
				r.cells = append(r.cells, srcCell{})
			}
			r.cells = append(r.cells, c)
		case xml.EndElement:
			if t.Name.Local == "row" {
				return r, nil
			}
		}
	}
}

// readCell reads one <c> element: its address, type, style, formula and
// value. col is where the cell sits when it gives no address.
func (x *xlsxRows) readCell(se xml.StartElement, row, col int) (srcCell, int, error) {
	var typ, ref string
	style := -1
	for _, a := range se.Attr {
		switch a.Name.Local {
		case "r":
			ref = a.Value
		case "t":
			typ = a.Value
		case "s":
			style, _ = strconv.Atoi(a.Value)
		}
	}
	if ref != "" {
		c, r, ok := splitCellRef(ref)
		if !ok || r != row {
			return srcCell{}, 0, fmt.Errorf("row %d holds a cell with the address %q", row, ref)
		}
		col = c
	}
	var v, inline strings.Builder
	formula, hasV := false, false
	depth := 0
	for {
		tok, err := x.dec.Token()
		if err != nil {
			return srcCell{}, 0, fmt.Errorf("the sheet's XML cannot be read in row %d: %v", row, err)
		}
		switch t := tok.(type) {
		case xml.StartElement:
			depth++
			switch t.Name.Local {
			case "f":
				formula = true
			case "v":
				hasV = true
				var s string
				if err := x.dec.DecodeElement(&s, &t); err != nil {
					return srcCell{}, 0, err
				}
				depth--
				v.WriteString(s)
			case "t":
				var s string
				if err := x.dec.DecodeElement(&s, &t); err != nil {
					return srcCell{}, 0, err
				}
				depth--
				inline.WriteString(s)
			case "rPh":
				if err := x.dec.Skip(); err != nil {
					return srcCell{}, 0, err
				}
				depth--
			}
		case xml.EndElement:
			if depth == 0 {
				c := x.cellValue(typ, style, v.String(), inline.String(), formula, hasV)
				c.addr = cellName(col, row)
				return c, col, nil
			}
			depth--
		}
	}
}

// cellValue turns a cell's type (ECMA-376 Part 1, 18.18.11 ST_CellType, the
// clause number from memory),
// style and value into a srcCell.
func (x *xlsxRows) cellValue(typ string, style int, v, inline string, formula, hasV bool) srcCell {
	if formula && (!hasV || strings.TrimSpace(v) == "" && typ != "str" && typ != "inlineStr") {
		return srcCell{kind: cellNoValue}
	}
	switch typ {
	case "s":
		i, err := strconv.Atoi(strings.TrimSpace(v))
		if err != nil || i < 0 || i >= len(x.book.shared) {
			return srcCell{kind: cellError, text: "a shared string that is not in the workbook"}
		}
		return textCell(x.book.shared[i])
	case "inlineStr":
		return textCell(inline)
	case "str":
		return textCell(v)
	case "b":
		if strings.TrimSpace(v) == "1" {
			return srcCell{kind: cellBool, text: "TRUE"}
		}
		return srcCell{kind: cellBool, text: "FALSE"}
	case "e":
		return srcCell{kind: cellError, text: v}
	case "d":
		return srcCell{kind: cellDate, text: v}
	}
	if strings.TrimSpace(v) == "" {
		return srcCell{}
	}
	if style >= 0 && style < len(x.book.dates) && x.book.dates[style] {
		return srcCell{kind: cellDate, text: v}
	}
	return srcCell{kind: cellNumber, text: strings.TrimSpace(v)}
}

func textCell(s string) srcCell {
	if strings.TrimSpace(s) == "" {
		return srcCell{}
	}
	return srcCell{kind: cellText, text: s}
}

// splitCellRef reads "AB12" into the 0-based column 27 and row 12.
func splitCellRef(ref string) (col, row int, ok bool) {
	i := 0
	for i < len(ref) && (ref[i] >= 'A' && ref[i] <= 'Z' || ref[i] >= 'a' && ref[i] <= 'z') {
		col = col*26 + int(ref[i]|0x20-'a') + 1
		i++
	}
	if i == 0 || i > 3 {
		return 0, 0, false
	}
	row, err := strconv.Atoi(ref[i:])
	if err != nil || row < 1 {
		return 0, 0, false
	}
	return col - 1, row, true
}

// cellName writes the A1-style address of a 0-based column and a row.
func cellName(col, row int) string { return columnLetters(col) + strconv.Itoa(row) }

// columnLetters writes a 0-based column as A ... Z, AA ...
func columnLetters(col int) string {
	var b []byte
	for col++; col > 0; col = (col - 1) / 26 {
		b = append([]byte{byte('A' + (col-1)%26)}, b...)
	}
	return string(b)
}

// A cellRange is a merged range, 0-based columns and 1-based rows, both ends
// included.
type cellRange struct {
	ref                    string
	col0, row0, col1, row1 int
}

func parseRange(ref string) (cellRange, bool) {
	a, b, found := strings.Cut(ref, ":")
	if !found {
		b = a
	}
	c0, r0, ok0 := splitCellRef(a)
	c1, r1, ok1 := splitCellRef(b)
	return cellRange{ref: ref, col0: c0, row0: r0, col1: c1, row1: r1}, ok0 && ok1
}
