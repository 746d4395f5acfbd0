package search

import (
	"fmt"
	"strconv"
	"strings"
)

// A Problem is one thing wrong with a requirement. Text names the fields
// it is about by their JSON keys in braces ("{efl_mm}"), so that the
// command line can say --efl where a flag gave the value and "efl_mm"
// where a spec file did.
type Problem struct {
	Keys []string // the JSON keys the problem is about, the main one first
	Text string
}

// A RequirementError lists every problem of a requirement. The command
// line maps its keys to flag or spec-file names (RenderWith); Error names
// them by JSON key.
type RequirementError struct {
	Problems []Problem
}

// Error names the fields by their JSON keys, quoted.
func (e *RequirementError) Error() string {
	return e.RenderWith(strconv.Quote)
}

// RenderWith writes the problems, each key written as name(key).
func (e *RequirementError) RenderWith(name func(key string) string) string {
	s := make([]string, len(e.Problems))
	for i, p := range e.Problems {
		s[i] = p.render(name)
	}
	return "requirement: " + strings.Join(s, "; ")
}

func (p Problem) render(name func(string) string) string {
	var b strings.Builder
	t := p.Text
	for {
		i := strings.IndexByte(t, '{')
		j := strings.IndexByte(t, '}')
		if i < 0 || j < i {
			b.WriteString(t)
			return b.String()
		}
		b.WriteString(t[:i])
		b.WriteString(name(t[i+1 : j]))
		t = t[j+1:]
	}
}

// problems collects the problems of one validation.
type problems []Problem

// add records a problem; text names keys as {key} and the first key named
// is the main one.
func (ps *problems) add(format string, a ...any) {
	text := fmt.Sprintf(format, a...)
	var keys []string
	for t := text; ; {
		i := strings.IndexByte(t, '{')
		j := strings.IndexByte(t, '}')
		if i < 0 || j < i {
			break
		}
		keys = append(keys, t[i+1:j])
		t = t[j+1:]
	}
	*ps = append(*ps, Problem{Keys: keys, Text: text})
}

func (ps problems) err() error {
	if len(ps) == 0 {
		return nil
	}
	return &RequirementError{Problems: ps}
}

// A Range is the valid range of one number of a requirement: a value of
// zero means "not given" for every field but the magnification's sign and
// gap_min_mm; a given value lies in [Min, Max] (its magnitude, for the
// signed magnification). The ranges keep every figure the search computes
// finite: they are far wider than any bench, and reject only what no
// stock lens can serve.
type Range struct {
	Key      string
	Min, Max float64
	Unit     string
}

// SanityLength is the longest envelope, and track, a result may have
// when no --envelope-max is given, mm: 10 m, past any optical bench
// (common practice). A longer layout fails the envelope check.
const SanityLength = 10000

// MaxShown is the ceiling on the results a search keeps and shows, also
// for --top 0 ("all that meet"): a list longer than this is not one a
// person reads, and keeping it bounded keeps a search's memory bounded.
const MaxShown = 10000

// Ranges lists the valid range of every number of a requirement, in the
// order of the JSON keys; README and the help of find print it.
func Ranges() []Range {
	const far = 100000 // mm: 100 m
	return []Range{
		{"efl_mm", 0.1, far, "mm"},
		{"track_mm", 0.1, far, "mm"},
		{"magnification", 1e-4, 1e4, ""},
		{"object_height_mm", 0, far, "mm"},
		{"na", 0, 0.999, ""},
		{"working_distance_min_mm", 0, far, "mm"},
		{"expansion", 1e-3, 1e3, ""},
		{"beam_mm", 0, far, "mm"},
		{"back_clearance_min_mm", 0, far, "mm"},
		{"envelope_max_mm", 0, far, "mm"},
		{"diameter_max_mm", 0, far, "mm"},
		{"gap_min_mm", 0, 1000, "mm"},
		{"wavelength_nm", 150, 20000, "nm"},
		{"field_angle_deg", 0, 89.9, "degrees"},
		{"power_w", 0, 1e6, "W"},
		{"band_nm", 150, 20000, "nm"},
		{"top", 0, MaxShown, ""},
		{"efl_tol", 0, far, "mm or %"},
		{"mag_tol", 0, 1e4, "or %"},
		{"expand_tol", 0, 1e3, "or %"},
		{"waist_in_mm", 0, 1000, "mm"},
		{"waist_in_at_mm", 0, far, "mm (either sign)"},
		{"m2", 1, 1000, ""},
		{"waist_out_at_mm", 0, far, "mm"},
		{"laser_exit_mm", 0, far, "mm"},
		{"waist_out_mm", 0, 1000, "mm"},
		{"coupling_min", 0, 1, ""},
	}
}

func rangeOf(key string) Range {
	for _, r := range Ranges() {
		if r.Key == key {
			return r
		}
	}
	panic("search: no range for " + key)
}

// String writes the range as "0.1 to 100000 mm".
func (r Range) String() string {
	s := strconv.FormatFloat(r.Min, 'g', -1, 64) + " to " + strconv.FormatFloat(r.Max, 'g', -1, 64)
	if r.Unit != "" {
		s += " " + r.Unit
	}
	return s
}
