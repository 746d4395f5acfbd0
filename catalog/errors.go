package catalog

import (
	"fmt"
	"strings"
)

// An OpenError says why a catalog file cannot be used; nothing was changed.
type OpenError struct {
	Path   string
	Reason string // reads after the path: "is a directory; ..."
	Err    error  // the underlying error, if any
	// Missing is true when the file does not exist (or holds no catalog
	// yet) and a command that only reads was pointed at it.
	Missing bool
	// ReadOnly is true when the file or its folder cannot be written.
	ReadOnly bool
}

func (e *OpenError) Error() string { return "catalog " + e.Path + " " + e.Reason }
func (e *OpenError) Unwrap() error { return e.Err }

// A NotFoundError names something the catalog (or a file) does not hold
// and the closest names it does hold.
type NotFoundError struct {
	What        string // "part", "search", "glass"
	Name        string
	Suggestions []string
	// In is where the name was looked for: "" for the catalog, else a
	// file name.
	In string
	// Ambiguous is true when Name (PART alone) names the parts of several
	// suppliers, which Suggestions lists.
	Ambiguous bool
	// Hint says what to do when there is no suggestion.
	Hint string
}

func (e *NotFoundError) Error() string {
	in := e.In
	if in == "" {
		in = "the catalog"
	}
	if e.Ambiguous {
		return fmt.Sprintf("%s %q is in %s from %d suppliers; name one: %s", e.What, e.Name, in, len(e.Suggestions), strings.Join(e.Suggestions, ", "))
	}
	msg := fmt.Sprintf("no %s %q in %s", e.What, e.Name, in)
	switch {
	case len(e.Suggestions) > 0:
		msg += "; did you mean " + strings.Join(e.Suggestions, ", ") + "?"
	case e.Hint != "":
		msg += "; " + e.Hint
	}
	return msg
}

// A RowError is one thing wrong with one row of an imported file.
type RowError struct {
	Line   int    // line of the source file; 0 if unknown
	ID     string // SUPPLIER:PART (or the glass name), if known
	Field  string // CSV column name, if known
	Reason string
}

func (e RowError) Error() string {
	var b strings.Builder
	if e.Line > 0 {
		fmt.Fprintf(&b, "line %d: ", e.Line)
	}
	if e.ID != "" {
		b.WriteString(e.ID + ": ")
	}
	if e.Field != "" {
		b.WriteString(e.Field + ": ")
	}
	b.WriteString(e.Reason)
	return b.String()
}

// An ImportError lists every row that stopped an import; the catalog was
// left as it was.
type ImportError struct {
	Rows []RowError
}

func (e *ImportError) Error() string {
	s := make([]string, len(e.Rows))
	for i, r := range e.Rows {
		s[i] = r.Error()
	}
	return fmt.Sprintf("%d problem(s), nothing imported:\n  %s", len(e.Rows), strings.Join(s, "\n  "))
}
