package main

import (
	"encoding/csv"
	"encoding/json"
	"fmt"
	"io"
	"strings"

	"github.com/olekukonko/tablewriter"
	"github.com/olekukonko/tablewriter/tw"
)

// formats every result-printing command accepts.
var formats = []string{"table", "json", "csv", "md"}

func checkFormat(f string) error {
	for _, ok := range formats {
		if f == ok {
			return nil
		}
	}
	return usageErrorf("unknown --format %q: use one of %s", f, strings.Join(formats, ", "))
}

// grid is tabular output: the table, csv and md formats.
type grid struct {
	Header []string
	Rows   [][]string
}

// render writes data in the chosen format: the grid for table, csv and md,
// the value v (snake_case keys with units in the names) for json.
func render(w io.Writer, format string, g grid, v any) error {
	switch format {
	case "json":
		enc := json.NewEncoder(w)
		enc.SetIndent("", "  ")
		return enc.Encode(v)
	case "csv":
		cw := csv.NewWriter(w)
		if err := cw.Write(g.Header); err != nil {
			return err
		}
		if err := cw.WriteAll(g.Rows); err != nil {
			return err
		}
		return cw.Error()
	case "md":
		fmt.Fprintf(w, "| %s |\n", strings.Join(mdEscape(g.Header), " | "))
		fmt.Fprintf(w, "|%s\n", strings.Repeat(" --- |", len(g.Header)))
		for _, r := range g.Rows {
			fmt.Fprintf(w, "| %s |\n", strings.Join(mdEscape(r), " | "))
		}
		return nil
	default:
		t := tablewriter.NewTable(w, tablewriter.WithHeaderAutoFormat(tw.Off), tablewriter.WithRowAutoWrap(tw.WrapNone))
		t.Header(g.Header)
		if err := t.Bulk(g.Rows); err != nil {
			return err
		}
		return t.Render()
	}
}

func mdEscape(cells []string) []string {
	out := make([]string, len(cells))
	for i, c := range cells {
		out[i] = strings.ReplaceAll(strings.ReplaceAll(c, "|", `\|`), "\n", " ")
	}
	return out
}

// mm formats a length for people: fixed decimals, no "-0.000".
func mm(v float64) string { return fixed(v, 3) }

func fixed(v float64, decimals int) string {
	s := fmt.Sprintf("%.*f", decimals, v)
	if strings.Trim(s, "-0.") == "" {
		s = strings.TrimPrefix(s, "-")
	}
	return s
}
