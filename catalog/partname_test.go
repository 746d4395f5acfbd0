package catalog

import (
	"errors"
	"slices"
	"testing"
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
		{"µm", "um", 1}, // counted in runes, not bytes
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

func TestResolvePart(t *testing.T) {
	ids := []string{"DEMO:PCX-50", "DEMO:pcx-500", "FICTA:PCX-50", "FICTA:ACH-100", "TARNWICK:BCX-25"}
	for _, tc := range []struct {
		name, query string
		want        int  // index in ids, -1 for none
		ambiguous   bool // several suppliers have PART
		suggest     string
	}{
		{"exact", "FICTA:ACH-100", 3, false, ""},
		{"exact wins over case", "DEMO:pcx-500", 1, false, ""},
		{"case ignored", "demo:PCX-500", 1, false, ""},
		{"spaces trimmed", "  FICTA:ACH-100 ", 3, false, ""},
		{"part alone", "ach-100", 3, false, ""},
		{"part alone, lower case", "pcx-500", 1, false, ""},
		{"part alone, two suppliers", "PCX-50", -1, true, "DEMO:PCX-50"},
		{"wrong supplier", "TARNWICK:ACH-100", -1, false, "FICTA:ACH-100"},
		{"typo", "FICTA:ACH-1OO", -1, false, "FICTA:ACH-100"},
		{"nothing close", "QQQQQQQQQQ", -1, false, ""},
	} {
		t.Run(tc.name, func(t *testing.T) {
			i, err := ResolvePart(tc.query, ids, "")
			if i != tc.want {
				t.Fatalf("ResolvePart(%q) = %d, %v; want %d", tc.query, i, err, tc.want)
			}
			if tc.want >= 0 {
				if err != nil {
					t.Fatalf("found with an error: %v", err)
				}
				return
			}
			var nf *NotFoundError
			if !errors.As(err, &nf) || nf.Ambiguous != tc.ambiguous {
				t.Fatalf("error %#v, want a *NotFoundError, ambiguous %v", err, tc.ambiguous)
			}
			if tc.suggest == "" && len(nf.Suggestions) > 0 || tc.suggest != "" && (len(nf.Suggestions) == 0 || nf.Suggestions[0] != tc.suggest) {
				t.Errorf("suggestions %v, want %q first", nf.Suggestions, tc.suggest)
			}
		})
	}
}

func TestResolveParts(t *testing.T) {
	ids := []string{"DEMO:PCX-50", "DEMO:PCX-100", "FICTA:ACH-100"}
	got, missing := ResolveParts([]string{"ach-100", "DEMO:PCX-5O", "FICTA:ACH-100", "DEMO:PCX-50"}, ids, "lenses.csv")
	if !slices.Equal(got, []int{2, 0}) {
		t.Errorf("found %v, want [2 0]: in the order asked, a part named twice once", got)
	}
	if len(missing) != 1 || missing[0].Name != "DEMO:PCX-5O" {
		t.Fatalf("missing %v, want DEMO:PCX-5O alone", missing)
	}
	const want = `no part "DEMO:PCX-5O" in lenses.csv; did you mean DEMO:PCX-50, DEMO:PCX-100?`
	if missing[0].Error() != want {
		t.Errorf("message %q, want %q", missing[0].Error(), want)
	}
}
