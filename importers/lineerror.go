package importers

import (
	"fmt"
	"strings"
)

// A LineError is one thing wrong with one line of an input file: the file
// name as the user gave it, the 1-based line (0 for the file as a whole), the
// column name the problem lies in ("" for the whole row) and the reason.
type LineError struct {
	File   string
	Line   int
	Column string
	Reason string
}

// Error prints the problem as "lenses.csv:14: r2: reason".
func (e LineError) Error() string {
	var b strings.Builder
	b.WriteString(e.File)
	if e.Line > 0 {
		fmt.Fprintf(&b, ":%d", e.Line)
	}
	b.WriteString(": ")
	if e.Column != "" {
		b.WriteString(e.Column + ": ")
	}
	b.WriteString(e.Reason)
	return b.String()
}

// FileErrors is every problem found in one file, in the order of the file.
// The readers return it as their error when anything is wrong; a nil
// FileErrors is never returned as an error.
type FileErrors []LineError

// Error prints one problem per line.
func (fe FileErrors) Error() string {
	s := make([]string, len(fe))
	for i, e := range fe {
		s[i] = e.Error()
	}
	return strings.Join(s, "\n")
}

// A File is what a reader found in one input file: its rows, and the
// warnings that concern the file as a whole (such as an unknown column).
// Warnings about one row live with that row.
type File[T any] struct {
	Rows     []T
	Warnings []LineError
}
