package finite

import (
	"bytes"
	"encoding/xml"
	"errors"
	"fmt"
	"io"
	"regexp"
	"strconv"
)

// nonNumber is NaN or an infinity as Go's fmt and strconv write a float
// ("NaN", "+Inf", "-Inf"), standing alone.
var nonNumber = regexp.MustCompile(`(^|[^A-Za-z0-9_])(NaN|[+-]Inf)([^A-Za-z0-9_]|$)`)

// Attributes returns an *Error for the first attribute of an XML document
// (an SVG drawing) whose value holds NaN or an infinity, naming the element
// by its name and class and the attribute. Text nodes are not read: they
// carry the user's part names, which may spell anything.
func Attributes(what string, doc []byte) error {
	dec := xml.NewDecoder(bytes.NewReader(doc))
	for {
		tok, err := dec.Token()
		if errors.Is(err, io.EOF) {
			return nil
		}
		if err != nil {
			return fmt.Errorf("%s is not well-formed XML: %w", what, err)
		}
		el, ok := tok.(xml.StartElement)
		if !ok {
			continue
		}
		for _, a := range el.Attr {
			m := nonNumber.FindStringSubmatch(a.Value)
			if m == nil {
				continue
			}
			return &Error{What: what, Path: fmt.Sprintf("<%s%s> attribute %s", el.Name.Local, classOf(el), a.Name.Local), Value: parse(m[2])}
		}
	}
}

func classOf(el xml.StartElement) string {
	for _, a := range el.Attr {
		if a.Name.Local == "class" {
			return fmt.Sprintf(" class=%q", a.Value)
		}
	}
	return ""
}

func parse(s string) float64 {
	f, _ := strconv.ParseFloat(s, 64) // reads "NaN", "+Inf" and "-Inf" as such
	return f
}
