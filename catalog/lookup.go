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

// lookupPart finds a part id by the part-name rules of ResolvePart:
// SUPPLIER:PART as stored (the quick path, by the unique index), else
// ignoring case, or PART alone when one supplier only has it.
func lookupPart(ctx context.Context, q querier, id string) (int64, error) {
	supplier, part := SplitID(strings.TrimSpace(id))
	pid, err := exactPartID(ctx, q, supplier, part)
	if err == nil || !errors.Is(err, sql.ErrNoRows) {
		return pid, err
	}
	names, err := partNames(ctx, q)
	if err != nil {
		return 0, err
	}
	i, err := ResolvePart(id, names, "")
	if err != nil {
		return 0, err
	}
	s, p := SplitID(names[i])
	return exactPartID(ctx, q, s, p)
}

// partID finds a part id by supplier and part name, exactly (the rows of
// a drawer file).
func partID(ctx context.Context, q querier, supplier, part string) (int64, error) {
	pid, err := exactPartID(ctx, q, supplier, part)
	if errors.Is(err, sql.ErrNoRows) {
		return 0, notFound(ctx, q, supplier+":"+part)
	}
	return pid, err
}

func exactPartID(ctx context.Context, q querier, supplier, part string) (int64, error) {
	var pid int64
	err := q.QueryRowContext(ctx, "SELECT id FROM parts WHERE supplier = ? AND part = ?", supplier, part).Scan(&pid)
	return pid, err
}

// notFound builds the error for a missing part, with the closest names.
func notFound(ctx context.Context, q querier, id string) error {
	names, err := partNames(ctx, q)
	if err != nil {
		return err
	}
	return &NotFoundError{What: "part", Name: id, Suggestions: Suggest(id, names, maxSuggestions), Hint: partsHint}
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
