package catalog

import (
	"context"
	"database/sql"
	"errors"
	"fmt"
	"strconv"
	"strings"
	"time"
)

// A SavedSearch is a search the solver ran: its kind (focus, image,
// expand), the requirement and the results as the solver encoded them
// (JSON), and when it ran.
type SavedSearch struct {
	ID          int64
	Kind        string
	Requirement []byte
	Results     []byte
	At          time.Time
}

// SaveSearch stores a search and returns its id.
func (s *Store) SaveSearch(ctx context.Context, kind string, requirement, results []byte, at time.Time) (int64, error) {
	res, err := s.db.ExecContext(ctx, "INSERT INTO searches (kind, requirement, results, created_at) VALUES (?, ?, ?, ?)",
		kind, string(requirement), string(results), at.UTC().Format(time.RFC3339Nano))
	if err != nil {
		return 0, s.wrapWriteError(err)
	}
	return res.LastInsertId()
}

// LoadSearch returns the search with the id ref, or the latest one when
// ref is "last". A search that is not there gives a *NotFoundError.
func (s *Store) LoadSearch(ctx context.Context, ref string) (SavedSearch, error) {
	var row *sql.Row
	const cols = "SELECT id, kind, requirement, results, created_at FROM searches "
	ref = strings.TrimSpace(ref)
	if strings.EqualFold(ref, "last") {
		row = s.db.QueryRowContext(ctx, cols+"ORDER BY id DESC LIMIT 1")
	} else {
		id, err := strconv.ParseInt(ref, 10, 64)
		if err != nil {
			return SavedSearch{}, fmt.Errorf("search %q: give a search number or \"last\"", ref)
		}
		row = s.db.QueryRowContext(ctx, cols+"WHERE id = ?", id)
	}
	var ss SavedSearch
	var req, res, at string
	err := row.Scan(&ss.ID, &ss.Kind, &req, &res, &at)
	if errors.Is(err, sql.ErrNoRows) {
		return ss, &NotFoundError{What: "saved search", Name: ref}
	}
	if err != nil {
		return ss, err
	}
	ss.Requirement, ss.Results = []byte(req), []byte(res)
	if ss.At, err = time.Parse(time.RFC3339Nano, at); err != nil {
		return ss, fmt.Errorf("saved search %d: time %q: %w", ss.ID, at, err)
	}
	return ss, nil
}
