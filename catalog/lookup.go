package catalog

import (
	"context"
	"database/sql"
	"errors"
	"sort"
	"strings"

	"cardinal/catalog/record"
)

// Part returns the full prescription of the part named SUPPLIER:PART (or
// PART alone, when one supplier only has a part of that name). A name the
// catalog does not hold gives a *NotFoundError that suggests close names.
func (s *Store) Part(ctx context.Context, id string) (_ record.Entry, err error) {
	defer s.classify(&err)
	tx, err := s.db.BeginTx(ctx, &sql.TxOptions{ReadOnly: true})
	if err != nil {
		return record.Entry{}, err
	}
	defer tx.Rollback()
	pid, err := lookupPart(ctx, tx, id)
	if err != nil {
		return record.Entry{}, err
	}
	glasses, err := readGlassTable(ctx, tx)
	if err != nil {
		return record.Entry{}, err
	}
	entries, _, err := readEntries(ctx, tx, "p.id = ?", []any{pid}, glasses)
	if err != nil {
		return record.Entry{}, err
	}
	return entries[0], nil
}

// lookupPart finds a part id by SUPPLIER:PART, or by PART alone when it
// names the part of one supplier only.
func lookupPart(ctx context.Context, q querier, id string) (int64, error) {
	supplier, part := SplitID(strings.TrimSpace(id))
	if supplier != "" {
		return partID(ctx, q, supplier, part)
	}
	rows, err := q.QueryContext(ctx, "SELECT id FROM parts WHERE part = ?", part)
	if err != nil {
		return 0, err
	}
	defer rows.Close()
	var ids []int64
	for rows.Next() {
		var pid int64
		if err := rows.Scan(&pid); err != nil {
			return 0, err
		}
		ids = append(ids, pid)
	}
	if err := rows.Err(); err != nil {
		return 0, err
	}
	if len(ids) == 1 {
		return ids[0], nil
	}
	return 0, notFound(ctx, q, id)
}

// partID finds a part id by supplier and part name, exactly.
func partID(ctx context.Context, q querier, supplier, part string) (int64, error) {
	var pid int64
	err := q.QueryRowContext(ctx, "SELECT id FROM parts WHERE supplier = ? AND part = ?", supplier, part).Scan(&pid)
	if errors.Is(err, sql.ErrNoRows) {
		return 0, notFound(ctx, q, supplier+":"+part)
	}
	return pid, err
}

// notFound builds the error for a missing part, with the closest names.
func notFound(ctx context.Context, q querier, id string) error {
	names, err := partNames(ctx, q)
	if err != nil {
		return err
	}
	return &NotFoundError{What: "part", Name: id, Suggestions: Suggest(id, names, 5)}
}

// PartNames returns the name (SUPPLIER:PART) of every part, sorted: what
// shell completion offers.
func (s *Store) PartNames(ctx context.Context) ([]string, error) {
	names, err := partNames(ctx, s.db)
	sort.Strings(names)
	return names, err
}

func partNames(ctx context.Context, q querier) ([]string, error) {
	rows, err := q.QueryContext(ctx, "SELECT supplier || ':' || part FROM parts")
	if err != nil {
		return nil, err
	}
	defer rows.Close()
	var names []string
	for rows.Next() {
		var n string
		if err := rows.Scan(&n); err != nil {
			return nil, err
		}
		names = append(names, n)
	}
	return names, rows.Err()
}

// Suggest returns up to max names close to name: those within a few edits
// of it (ignoring case, and ignoring the supplier when name has none or a
// wrong one), or holding it, closest first.
func Suggest(name string, names []string, max int) []string {
	type scored struct {
		name  string
		score int
	}
	want := strings.ToLower(name)
	_, wantPart := SplitID(want)
	limit := 2 + len(want)/5
	var hits []scored
	for _, n := range names {
		low := strings.ToLower(n)
		_, part := SplitID(low)
		score := min(editDistance(want, low), editDistance(wantPart, part)+1)
		if len(wantPart) >= 3 && strings.Contains(part, wantPart) {
			score = min(score, 1+len(part)-len(wantPart))
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

// editDistance is the Levenshtein distance between a and b, in bytes
// (V. I. Levenshtein, Soviet Physics Doklady 10, 707 (1966); the two-row
// dynamic programme of Wagner and Fischer, J. ACM 21, 168 (1974)).
func editDistance(a, b string) int {
	prev := make([]int, len(b)+1)
	cur := make([]int, len(b)+1)
	for j := range prev {
		prev[j] = j
	}
	for i := 1; i <= len(a); i++ {
		cur[0] = i
		for j := 1; j <= len(b); j++ {
			cost := 1
			if a[i-1] == b[j-1] {
				cost = 0
			}
			cur[j] = min(prev[j]+1, cur[j-1]+1, prev[j-1]+cost)
		}
		prev, cur = cur, prev
	}
	return prev[len(b)]
}
