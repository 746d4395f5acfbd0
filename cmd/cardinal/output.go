package main

import (
	"encoding/json"
	"fmt"
	"io"
	"strconv"
	"strings"

	"github.com/mattn/go-runewidth"
	"github.com/spf13/pflag"
	"golang.org/x/sys/unix"

	"cardinal/search/present"
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

// outputFlags are the flags every result-printing command shares.
type outputFlags struct {
	Format  string
	Columns []string
	Wide    bool
}

// addOutputFlags binds --format and, for tables with optional columns,
// --columns and --wide.
func addOutputFlags(f *pflag.FlagSet, o *outputFlags, columns bool) {
	f.StringVar(&o.Format, "format", "table", "output format: table, json, csv or md")
	if columns {
		f.StringSliceVar(&o.Columns, "columns", nil, "columns to show, by key, in this order (see --format csv for the keys)")
		f.BoolVar(&o.Wide, "wide", false, "show every column, not only the default set")
	}
}

// width is the width tables are fitted to: the terminal's columns, else
// the COLUMNS variable, else present.DefaultWidth.
func (e *env) width() int {
	if e.TermWidth > 0 {
		return e.TermWidth
	}
	if n, err := strconv.Atoi(strings.TrimSpace(e.Getenv("COLUMNS"))); err == nil && n > 0 {
		return n
	}
	return present.DefaultWidth
}

// terminalWidth reads the width of the terminal on fd, 0 when it is not one.
func terminalWidth(fd uintptr) int {
	ws, err := unix.IoctlGetWinsize(int(fd), unix.TIOCGWINSZ)
	if err != nil {
		return 0
	}
	return int(ws.Col)
}

// render writes a table in the chosen format: JSON is the document v (the
// command's typed output, snake_case keys with units) unless v is nil or
// columns were chosen, then the table's rows as objects; a terminal table is
// fitted to the width, and how it was fitted is said on stderr.
func render(e *env, w io.Writer, o outputFlags, t present.Table, v any) error {
	// Data formats carry every column unless some were chosen; tables for
	// people the default set.
	data := o.Format == "csv" || o.Format == "json"
	t, err := t.Select(o.Columns, o.Wide || data, data)
	if err != nil {
		return usageErrorf("--columns: %v", err)
	}
	switch o.Format {
	case "json":
		if v == nil || len(o.Columns) > 0 {
			return present.WriteJSON(w, t)
		}
		enc := json.NewEncoder(w)
		enc.SetIndent("", "  ")
		return enc.Encode(v)
	case "csv":
		return present.WriteCSV(w, t)
	case "md":
		return present.WriteMarkdown(w, t)
	}
	fit, err := present.WriteTerminal(w, t, e.width())
	if n := fit.Note(); n != "" && err == nil {
		note(e, n)
	}
	return err
}

// note writes one line for people on stderr, wrapped to the width.
func note(e *env, s string) { notef(e, "%s\n", s) }

// notef writes a message for people on stderr, each line wrapped to the
// width with the continuation indented, so that a note never runs past the
// terminal's edge.
func notef(e *env, format string, a ...any) {
	s := fmt.Sprintf(format, a...)
	nl := strings.HasSuffix(s, "\n")
	lines := strings.Split(strings.TrimSuffix(s, "\n"), "\n")
	for i, l := range lines {
		if runewidth.StringWidth(l) > e.width() {
			indent := "  "
			lines[i] = strings.ReplaceAll(present.Wrap(l, e.width()-len(indent)), "\n", "\n"+indent)
		}
	}
	s = strings.Join(lines, "\n")
	if nl {
		s += "\n"
	}
	fmt.Fprint(e.Err, s)
}

// textTable is a table of text for people (the inspect blocks): every cell
// is its own raw value.
func textTable(header []string, rows [][]string) present.Table {
	t := present.Table{}
	for _, h := range header {
		t.Columns = append(t.Columns, present.Column{Key: h, Label: h})
	}
	for _, r := range rows {
		cells := make([]present.Cell, len(r))
		for i, c := range r {
			cells[i] = present.Text(c)
		}
		t.Add(cells...)
	}
	return t
}
