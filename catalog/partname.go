package catalog

import (
	"sort"
	"strings"
)

// The part-name rules, the same for every command that takes a part name
// (inspect, from the catalog or a --file; drawer set; catalog remove) and
// for every message that suggests names: one implementation, here.

// ResolvePart finds the part a person named among ids (SUPPLIER:PART
// names): SUPPLIER:PART exactly, then ignoring case, then PART alone
// (ignoring case) when one supplier only has a part of that name. It
// returns the index in ids, or a *NotFoundError (What "part") that names the
// closest ids, or the suppliers to choose from when PART alone names parts
// of several. in says where the ids come from for the message ("" for the
// catalog, which also gives the hint of how to list its parts, else a file
// name).
func ResolvePart(name string, ids []string, in string) (int, error) {
	name = strings.TrimSpace(name)
	unique := func(eq func(id string) bool) (int, []string) {
		found, all := -1, []string(nil)
		for i, id := range ids {
			if eq(id) {
				found, all = i, append(all, id)
			}
		}
		if len(all) != 1 {
			found = -1
		}
		return found, all
	}
	if i, _ := unique(func(id string) bool { return id == name }); i >= 0 {
		return i, nil
	}
	if i, _ := unique(func(id string) bool { return strings.EqualFold(id, name) }); i >= 0 {
		return i, nil
	}
	if !strings.Contains(name, ":") {
		i, all := unique(func(id string) bool { _, p := SplitID(id); return strings.EqualFold(p, name) })
		if i >= 0 {
			return i, nil
		}
		if len(all) > 1 {
			sort.Strings(all)
			return -1, &NotFoundError{What: "part", Name: name, In: in, Suggestions: all, Ambiguous: true}
		}
	}
	nf := &NotFoundError{What: "part", Name: name, In: in, Suggestions: Suggest(name, ids, maxSuggestions)}
	if in == "" {
		nf.Hint = partsHint
	}
	return -1, nf
}

// partsHint is what to do when a name is close to no part of the catalog.
const partsHint = "'cardinal catalog list' lists every part"

// maxSuggestions is how many close names a message offers.
const maxSuggestions = 5

// ResolveParts resolves each name with ResolvePart, in the order given,
// a part named twice once. It returns the indices found and one
// *NotFoundError per name that matched nothing.
func ResolveParts(names, ids []string, in string) ([]int, []*NotFoundError) {
	var picked []int
	var missing []*NotFoundError
	seen := map[int]bool{}
	for _, n := range names {
		i, err := ResolvePart(n, ids, in)
		switch {
		case err != nil:
			missing = append(missing, err.(*NotFoundError))
		case !seen[i]:
			seen[i] = true
			picked = append(picked, i)
		}
	}
	return picked, missing
}

// Suggest returns up to max names close to name: those within a few edits
// of it (ignoring case, and ignoring the supplier when name has none or a
// wrong one), or holding it, closest first, then in name order.
func Suggest(name string, names []string, max int) []string {
	type scored struct {
		name  string
		score int
	}
	want := strings.ToLower(strings.TrimSpace(name))
	_, wantPart := SplitID(want)
	limit := 2 + len([]rune(want))/5
	var hits []scored
	for _, n := range names {
		low := strings.ToLower(n)
		_, part := SplitID(low)
		score := min(editDistance(want, low), editDistance(wantPart, part)+1)
		if lp, lw := len([]rune(part)), len([]rune(wantPart)); lw >= 3 && strings.Contains(part, wantPart) {
			score = min(score, 1+lp-lw)
		}
		if score <= limit {
			hits = append(hits, scored{n, score})
		}
	}
	sort.Slice(hits, func(i, j int) bool {
		if hits[i].score != hits[j].score {
			return hits[i].score < hits[j].score
		}
		return hits[i].name < hits[j].name
	})
	var out []string
	for i := 0; i < len(hits) && i < max; i++ {
		out = append(out, hits[i].name)
	}
	return out
}

// editDistance is the Levenshtein distance between a and b, in runes
// (V. I. Levenshtein, Soviet Physics Doklady 10, 707 (1966); the two-row
// dynamic programme of Wagner and Fischer, J. ACM 21, 168 (1974)).
func editDistance(a, b string) int {
	ra, rb := []rune(a), []rune(b)
	prev := make([]int, len(rb)+1)
	cur := make([]int, len(rb)+1)
	for j := range prev {
		prev[j] = j
	}
	for i := 1; i <= len(ra); i++ {
		cur[0] = i
		for j := 1; j <= len(rb); j++ {
			cost := 1
			if ra[i-1] == rb[j-1] {
				cost = 0
			}
			cur[j] = min(prev[j]+1, cur[j-1]+1, prev[j-1]+cost)
		}
		prev, cur = cur, prev
	}
	return prev[len(rb)]
}
