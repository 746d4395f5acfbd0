package catalog

import (
	"errors"
	"math"
	"slices"
	"testing"

	"cardinal/catalog/record"
)

func TestEditDistance(t *testing.T) {
	// Levenshtein distances of textbook pairs (from memory: kitten/sitting
	// and flaw/lawn are the usual worked examples), and the edge cases
	// that follow from the definition.
	for _, tc := range []struct {
		a, b string
		want int
	}{
		{"kitten", "sitting", 3},
		{"flaw", "lawn", 2},
		{"", "abc", 3},
		{"abc", "", 3},
		{"same", "same", 0},
	} {
		t.Run(tc.a+"-"+tc.b, func(t *testing.T) {
			if got := editDistance(tc.a, tc.b); got != tc.want {
				t.Errorf("editDistance(%q, %q) = %d, want %d", tc.a, tc.b, got, tc.want)
			}
		})
	}
}

func TestSuggest(t *testing.T) {
	names := []string{"DEMO:PCX-50", "DEMO:PCX-100", "DEMO:PCV-50", "FICTA:PCX-200", "FICTA:ACH-100", "FICTA:ZZ-1"}
	for _, tc := range []struct {
		name, query string
		first       string // closest name, "" for no suggestion
		absent      string // a name too far to suggest
	}{
		{"typo", "DEMO:PCX-5O", "DEMO:PCX-50", "FICTA:ACH-100"},
		{"lower case", "demo:pcx-50", "DEMO:PCX-50", "FICTA:ZZ-1"},
		{"wrong supplier", "FICTA:PCX-50", "DEMO:PCX-50", "FICTA:ZZ-1"},
		{"no supplier", "ACH-100", "FICTA:ACH-100", "DEMO:PCV-50"},
		{"nothing close", "XYZ:QQQQQQQQ", "", ""},
	} {
		t.Run(tc.name, func(t *testing.T) {
			got := Suggest(tc.query, names, 3)
			if len(got) > 3 {
				t.Errorf("Suggest(%q) = %v, more than 3", tc.query, got)
			}
			if tc.first == "" && len(got) > 0 || tc.first != "" && (len(got) == 0 || got[0] != tc.first) {
				t.Errorf("Suggest(%q) = %v, want %q first", tc.query, got, tc.first)
			}
			if tc.absent != "" && slices.Contains(got, tc.absent) {
				t.Errorf("Suggest(%q) = %v suggests %s", tc.query, got, tc.absent)
			}
		})
	}
}

func TestPart(t *testing.T) {
	s := newStore(t)
	mustImport(t, s, sampleEntries(t))
	mustImport(t, s, []record.Entry{lens(t, "OTHER", "PCX-50", 25.84, math.Inf(1), 5.3, 25.4, "517642")})
	for _, tc := range []struct {
		name, id, want string
		notFound       bool
	}{
		{"full id", "TEST:PCX-100", "TEST:PCX-100", false},
		{"part alone, one supplier", "DCX-20", "TEST:DCX-20", false},
		{"part alone, two suppliers", "PCX-50", "", true},
		{"unknown", "TEST:PCX-75", "", true},
	} {
		t.Run(tc.name, func(t *testing.T) {
			e, err := s.Part(ctx, tc.id)
			var nf *NotFoundError
			if tc.notFound {
				if !errors.As(err, &nf) {
					t.Errorf("error %v, want *NotFoundError", err)
				}
				return
			}
			if err != nil || e.Part.ID() != tc.want || len(e.Part.Media) == 0 {
				t.Errorf("Part(%q) = %s, %v", tc.id, e.Part.ID(), err)
			}
		})
	}
}
