package present

import (
	"bytes"
	"encoding/json"
	"fmt"
	"html"
	"io"
	"strconv"
	"strings"

	"cardinal/importers"
)

// WriteCSV writes the table as CSV for a spreadsheet or a script: the keys
// as the header, one raw value per cell (numbers in full precision, true or
// false, empty where a value does not apply), every cell through the
// injection-safe writer.
func WriteCSV(w io.Writer, t Table) error {
	c := importers.NewSafeCSV(w)
	if err := c.Write(t.Keys()); err != nil {
		return err
	}
	rec := make([]string, len(t.Columns))
	for _, row := range t.Rows {
		for i, cell := range row {
			rec[i] = RawText(cell.Raw)
		}
		if err := c.Write(rec); err != nil {
			return err
		}
	}
	return c.Flush()
}

// RawText is a raw value as one plain CSV cell.
func RawText(v any) string {
	switch x := v.(type) {
	case nil:
		return ""
	case float64:
		return strconv.FormatFloat(x, 'g', -1, 64)
	case int:
		return strconv.Itoa(x)
	case bool:
		return strconv.FormatBool(x)
	case string:
		return x
	}
	panic(fmt.Sprintf("present: raw value of type %T", v))
}

// WriteMarkdown writes the table as a markdown table of the cells' text,
// the headings with their units.
func WriteMarkdown(w io.Writer, t Table) error {
	h := make([]string, len(t.Columns))
	for i, c := range t.Columns {
		h[i] = c.Heading()
	}
	var b strings.Builder
	fmt.Fprintf(&b, "| %s |\n", strings.Join(mdEscape(h), " | "))
	fmt.Fprintf(&b, "|%s\n", strings.Repeat(" --- |", len(h)))
	for _, row := range t.Rows {
		fmt.Fprintf(&b, "| %s |\n", strings.Join(mdEscape(texts(row)), " | "))
	}
	_, err := io.WriteString(w, b.String())
	return err
}

func texts(row []Cell) []string {
	s := make([]string, len(row))
	for i, c := range row {
		s[i] = c.Text
	}
	return s
}

func mdEscape(cells []string) []string {
	out := make([]string, len(cells))
	for i, c := range cells {
		out[i] = strings.ReplaceAll(strings.ReplaceAll(c, "|", `\|`), "\n", " ")
	}
	return out
}

// WriteJSON writes the table as a JSON array of objects, one per row, the
// keys in column order, null where a value does not apply.
func WriteJSON(w io.Writer, t Table) error {
	var b bytes.Buffer
	b.WriteString("[")
	for r, row := range t.Rows {
		if r > 0 {
			b.WriteString(",")
		}
		b.WriteString("\n  {")
		for i, cell := range row {
			if i > 0 {
				b.WriteString(", ")
			}
			k, _ := json.Marshal(t.Columns[i].Key)
			v, err := json.Marshal(cell.Raw)
			if err != nil {
				return fmt.Errorf("column %s: %w", t.Columns[i].Key, err)
			}
			fmt.Fprintf(&b, "%s: %s", k, v)
		}
		b.WriteString("}")
	}
	if len(t.Rows) > 0 {
		b.WriteString("\n")
	}
	b.WriteString("]\n")
	_, err := w.Write(b.Bytes())
	return err
}

// HTML is the table as an HTML table of the cells' text (escaped) or their
// HTML; numeric columns carry the class "num" so a page can align them,
// and rowClass (nil for none) names a class for a row, "" for none.
func HTML(t Table, class string, rowClass func(row int) string) string {
	var b strings.Builder
	fmt.Fprintf(&b, "<table class=\"%s\">\n<thead><tr>", html.EscapeString(class))
	num := numeric(t)
	for _, c := range t.Columns {
		fmt.Fprintf(&b, "<th>%s</th>", html.EscapeString(c.Heading()))
	}
	b.WriteString("</tr></thead>\n<tbody>\n")
	for r, row := range t.Rows {
		if rc := ""; rowClass != nil {
			rc = rowClass(r)
			if rc != "" {
				fmt.Fprintf(&b, "<tr class=\"%s\">", html.EscapeString(rc))
			} else {
				b.WriteString("<tr>")
			}
		} else {
			b.WriteString("<tr>")
		}
		for i, c := range row {
			cell := c.HTML
			if cell == "" {
				cell = html.EscapeString(c.Text)
			}
			if num[i] {
				fmt.Fprintf(&b, "<td class=\"num\">%s</td>", cell)
			} else {
				fmt.Fprintf(&b, "<td>%s</td>", cell)
			}
		}
		b.WriteString("</tr>\n")
	}
	b.WriteString("</tbody>\n</table>\n")
	return b.String()
}

// numeric tells, per column, whether every value that applies is a number.
func numeric(t Table) []bool {
	num := make([]bool, len(t.Columns))
	for i := range t.Columns {
		num[i] = true
		for _, row := range t.Rows {
			switch row[i].Raw.(type) {
			case nil, float64, int:
			default:
				num[i] = false
			}
		}
	}
	return num
}
