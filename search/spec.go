package search

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"reflect"
	"sort"
	"strings"
	"unicode"
	"unicode/utf8"
)

// A SpecError is a problem in a requirement file: the file, the line and
// column (1-based, columns in characters) where it was found, the JSON key
// it concerns (when there is one) and what was expected there.
type SpecError struct {
	File      string
	Line, Col int
	Key       string
	Problem   string
}

func (e *SpecError) Error() string {
	var b strings.Builder
	fmt.Fprintf(&b, "%s:%d:%d: ", e.File, e.Line, e.Col)
	if e.Key != "" {
		fmt.Fprintf(&b, "%q: ", e.Key)
	}
	b.WriteString(e.Problem)
	return b.String()
}

// ReadSpec reads a requirement file: a JSON object with the keys of
// Requirement (the "requirement" object a search prints, so a saved
// search can be run again), over the command-line defaults. Unknown keys,
// values of the wrong type, a kind, form or preference not known and text
// after the object are each a *SpecError with the line and column. The
// requirement is not validated here: flags may still change it.
func ReadSpec(r io.Reader, name string) (Requirement, error) {
	b, err := io.ReadAll(io.LimitReader(r, maxSpecBytes+1))
	if err != nil {
		return Requirement{}, &SpecError{File: name, Line: 1, Col: 1, Problem: "cannot be read: " + err.Error()}
	}
	if len(b) > maxSpecBytes {
		return Requirement{}, &SpecError{File: name, Line: 1, Col: 1, Problem: fmt.Sprintf("is larger than %d bytes; a requirement file is a small JSON object", maxSpecBytes)}
	}
	p := specParser{b: b, name: name}
	members, err := p.object(b, 0)
	if err != nil {
		return Requirement{}, err
	}
	for _, m := range members {
		if m.key == "requirement" {
			if members, err = p.object(m.raw, m.valOff); err != nil {
				return Requirement{}, err
			}
			break
		}
	}
	req := Defaults()
	keys := map[string]bool{}
	fields := specFields()
	for _, m := range members {
		if now, ok := formerKeys[m.key]; ok {
			m.key = now // the name of an earlier version
		}
		f, ok := fields[m.key]
		if !ok {
			return Requirement{}, p.errAt(m.keyOff, m.key, "is not a requirement key; expected one of "+knownKeys(fields))
		}
		if keys[m.key] {
			return Requirement{}, p.errAt(m.keyOff, m.key, "is given twice; give it once")
		}
		keys[m.key] = true
		dst := reflect.ValueOf(&req).Elem().FieldByIndex(f.index)
		if err := json.Unmarshal(m.raw, dst.Addr().Interface()); err != nil {
			return Requirement{}, p.errAt(m.valOff, m.key, "expected "+f.want)
		}
		if msg := checkEnum(m.key, dst); msg != "" {
			return Requirement{}, p.errAt(m.valOff, m.key, msg)
		}
		if m.key == "wavelength_nm" && req.Wavelength == 0 {
			return Requirement{}, p.errAt(m.valOff, m.key, "expected a wavelength of "+rangeOf("wavelength_nm").String()+"; leave the key out for the d line")
		}
	}
	return req, nil
}

// maxSpecBytes bounds what a requirement file may hold (a requirement is
// well under a kilobyte; a saved search with its results can be larger).
const maxSpecBytes = 64 << 20

type member struct {
	key            string
	keyOff, valOff int
	raw            json.RawMessage
}

type specParser struct {
	b    []byte
	name string
}

// object reads the members of the JSON object in b, which starts at
// offset base of the file; nothing but white space may follow it.
func (p *specParser) object(b []byte, base int) ([]member, error) {
	dec := json.NewDecoder(bytes.NewReader(b))
	dec.UseNumber()
	tok, err := dec.Token()
	if err != nil {
		return nil, p.syntax(err, base, dec)
	}
	if d, ok := tok.(json.Delim); !ok || d != '{' {
		return nil, p.errAt(base+skipSpace(b, 0), "", "expected a JSON object: {\"kind\": \"focus\", \"efl_mm\": 50, ...}")
	}
	var ms []member
	for dec.More() {
		keyStart := base + skipSpace(b, int(dec.InputOffset()))
		if keyStart < base+len(b) && b[keyStart-base] == ',' {
			keyStart = base + skipSpace(b, keyStart-base+1)
		}
		tok, err := dec.Token()
		if err != nil {
			return nil, p.syntax(err, base, dec)
		}
		key, _ := tok.(string)
		var raw json.RawMessage
		valStart := int(dec.InputOffset())
		if err := dec.Decode(&raw); err != nil {
			return nil, p.syntax(err, base, dec)
		}
		valStart = skipSpace(b, valStart)
		if valStart < len(b) && b[valStart] == ':' {
			valStart = skipSpace(b, valStart+1)
		}
		ms = append(ms, member{key: key, keyOff: keyStart, valOff: base + valStart, raw: raw})
	}
	if _, err := dec.Token(); err != nil {
		return nil, p.syntax(err, base, dec)
	}
	end := int(dec.InputOffset())
	if rest := skipSpace(b, end); rest < len(b) {
		return nil, p.errAt(base+rest, "", "unexpected text after the JSON object; a requirement file holds one object")
	}
	return ms, nil
}

func skipSpace(b []byte, i int) int {
	for i < len(b) && (b[i] == ' ' || b[i] == '\t' || b[i] == '\n' || b[i] == '\r') {
		i++
	}
	return i
}

// syntax turns a decoder error into a SpecError at its position.
func (p *specParser) syntax(err error, base int, dec *json.Decoder) error {
	if errors.Is(err, io.EOF) || errors.Is(err, io.ErrUnexpectedEOF) {
		return p.errAt(len(p.b), "", "the file ends inside the JSON object: a closing } or \" is missing")
	}
	var se *json.SyntaxError
	var v any
	// The decoder's offsets count from the value it was reading: scan the
	// whole file again for the position in it.
	if whole := json.Unmarshal(p.b, &v); errors.As(whole, &se) {
		off := max(int(se.Offset)-1, 0)
		return p.errAt(off, "", "not valid JSON here: check the quotes, commas and brackets (text needs double quotes)")
	}
	return p.errAt(base+int(dec.InputOffset()), "", "not valid JSON here")
}

// errAt is a SpecError at byte offset off of the file.
func (p *specParser) errAt(off int, key, problem string) error {
	off = min(max(off, 0), len(p.b))
	before := p.b[:off]
	line := 1 + bytes.Count(before, []byte{'\n'})
	col := 1 + utf8.RuneCount(before[bytes.LastIndexByte(before, '\n')+1:])
	return &SpecError{File: p.name, Line: line, Col: col, Key: key, Problem: problem}
}

// A specField is a key of a requirement file: the field it sets and what
// its value must be.
type specField struct {
	index []int
	want  string
}

// specFields maps each JSON key of Requirement to its field.
func specFields() map[string]specField {
	t := reflect.TypeFor[Requirement]()
	fs := map[string]specField{}
	for i := range t.NumField() {
		f := t.Field(i)
		key, _, _ := strings.Cut(f.Tag.Get("json"), ",")
		if key == "" || key == "-" {
			continue
		}
		fs[key] = specField{index: f.Index, want: wantOf(key, f.Type)}
	}
	return fs
}

// wantOf says what value a key takes, in the words of the file.
func wantOf(key string, t reflect.Type) string {
	switch key {
	case "kind":
		return `"focus", "image", "expand" or "match"`
	case "form":
		return `"keplerian" or "galilean"`
	case "prefer":
		return `"drawer", "short", "cheap", "sharp" or "robust"`
	}
	switch {
	case t == reflect.TypeFor[Tolerance]():
		return `a string such as "1%" or "0.5mm", or a number (an absolute amount)`
	case t.Kind() == reflect.Float64:
		unit := ""
		for _, r := range Ranges() {
			if r.Key == key {
				unit = " (" + r.String() + ")"
			}
		}
		return "a number" + unit
	case t.Kind() == reflect.Int:
		return "a whole number"
	case t.Kind() == reflect.Bool:
		return "true or false"
	case t.Kind() == reflect.String:
		return "a string"
	case t.Kind() == reflect.Slice:
		return "an array of numbers such as [486.1, 587.6, 656.3]"
	}
	return "a value"
}

// checkEnum checks the words a key may hold.
func checkEnum(key string, v reflect.Value) string {
	ok := map[string][]string{
		"kind":   {string(Focus), string(Image), string(Expand), string(Match)},
		"form":   {string(AnyForm), string(Keplerian), string(Galilean)},
		"prefer": {string(Balanced), string(PreferDraw), string(PreferShort), string(PreferCheap), string(PreferSharp), string(PreferRobust)},
	}[key]
	if ok == nil {
		if v.Kind() == reflect.String {
			return controlText(v.String())
		}
		return ""
	}
	s := v.String()
	for _, w := range ok {
		if s == w {
			return ""
		}
	}
	return fmt.Sprintf("%q is not known; expected %s", s, wantOf(key, v.Type()))
}

func knownKeys(fs map[string]specField) string {
	ks := make([]string, 0, len(fs))
	for k := range fs {
		ks = append(ks, k)
	}
	sort.Strings(ks)
	return strings.Join(ks, ", ")
}

// controlText refuses a text value holding a control character (NUL,
// escape, ...), which no supplier name needs.
func controlText(s string) string {
	for i, c := range []rune(s) {
		if unicode.IsControl(c) {
			return fmt.Sprintf("holds the control character U+%04X at character %d; write plain text", c, i+1)
		}
	}
	return ""
}
