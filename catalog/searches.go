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
// expand), the requirement, the results and the rest of what the search
// printed (Outcome) as the caller encoded them (JSON), when it ran, how
// many results it holds and a note of the user's. The catalog stores the
// bytes; package search/saved gives them their meaning.
type SavedSearch struct {
	ID          int64
	Kind        string
	Requirement []byte
	Results     []byte
	Outcome     []byte // empty: "{}"
	Count       int    // number of results
	Note        string
	At          time.Time
}

// A SearchSummary is a saved search without its results: what a list of
// saved searches shows.
type SearchSummary struct {
	ID          int64
	Kind        string
	Requirement []byte
	Count       int
	Note        string
	At          time.Time
}

// SaveSearch stores a search and returns its id; ss.ID is ignored.
func (s *Store) SaveSearch(ctx context.Context, ss SavedSearch) (_ int64, err error) {
	defer s.classify(&err)
	outcome := ss.Outcome
	if len(outcome) == 0 {
		outcome = []byte("{}")
	}
	res, err := s.db.ExecContext(ctx, "INSERT INTO searches (kind, requirement, results, outcome, result_count, note, created_at) VALUES (?, ?, ?, ?, ?, ?, ?)",
		ss.Kind, string(ss.Requirement), string(ss.Results), string(outcome), ss.Count, ss.Note, ss.At.UTC().Format(time.RFC3339Nano))
	if err != nil {
		return 0, s.wrapWriteError(err)
	}
	return res.LastInsertId()
}

// SearchID resolves a reference to a saved search: its number, or "last"
// for the latest. A search that is not there gives a *NotFoundError, a
// reference that is neither a *RefError.
func (s *Store) SearchID(ctx context.Context, ref string) (int64, error) {
	ref = strings.TrimSpace(ref)
	var id int64
	var err error
	if strings.EqualFold(ref, "last") {
		err = s.db.QueryRowContext(ctx, "SELECT id FROM searches ORDER BY id DESC LIMIT 1").Scan(&id)
	} else {
		id, err = strconv.ParseInt(ref, 10, 64)
		if err != nil || id < 1 {
			return 0, &RefError{Ref: ref}
		}
		err = s.db.QueryRowContext(ctx, "SELECT id FROM searches WHERE id = ?", id).Scan(&id)
	}
	if errors.Is(err, sql.ErrNoRows) {
		return 0, &NotFoundError{What: "saved search", Name: ref}
	}
	return id, err
}

// A RefError is a reference to a saved search that is neither a number
// nor "last".
type RefError struct{ Ref string }

func (e *RefError) Error() string {
	return fmt.Sprintf("search %q: give a search number or \"last\"", e.Ref)
}

// LoadSearch returns the search with the id ref, or the latest one when
// ref is "last". A search that is not there gives a *NotFoundError.
func (s *Store) LoadSearch(ctx context.Context, ref string) (_ SavedSearch, err error) {
	defer s.classify(&err)
	id, err := s.SearchID(ctx, ref)
	if err != nil {
		return SavedSearch{}, err
	}
	ss := SavedSearch{ID: id}
	var req, res, outcome, at string
	err = s.db.QueryRowContext(ctx, "SELECT kind, requirement, results, outcome, result_count, note, created_at FROM searches WHERE id = ?", id).
		Scan(&ss.Kind, &req, &res, &outcome, &ss.Count, &ss.Note, &at)
	if errors.Is(err, sql.ErrNoRows) { // removed since SearchID
		return ss, &NotFoundError{What: "saved search", Name: ref}
	}
	if err != nil {
		return ss, err
	}
	ss.Requirement, ss.Results, ss.Outcome = []byte(req), []byte(res), []byte(outcome)
	ss.At, err = parseSearchTime(id, at)
	return ss, err
}

func parseSearchTime(id int64, at string) (time.Time, error) {
	t, err := time.Parse(time.RFC3339Nano, at)
	if err != nil {
		return t, fmt.Errorf("saved search %d: time %q: %w", id, at, err)
	}
	return t, nil
}

// Searches lists the saved searches without their results, oldest first.
func (s *Store) Searches(ctx context.Context) ([]SearchSummary, error) {
	rows, err := s.db.QueryContext(ctx, "SELECT id, kind, requirement, result_count, note, created_at FROM searches ORDER BY id")
	if err != nil {
		return nil, err
	}
	defer rows.Close()
	var out []SearchSummary
	for rows.Next() {
		var ss SearchSummary
		var req, at string
		if err := rows.Scan(&ss.ID, &ss.Kind, &req, &ss.Count, &ss.Note, &at); err != nil {
			return nil, err
		}
		ss.Requirement = []byte(req)
		if ss.At, err = parseSearchTime(ss.ID, at); err != nil {
			return nil, err
		}
		out = append(out, ss)
	}
	return out, rows.Err()
}

// NoteSearch sets the note of a saved search ("" removes it).
func (s *Store) NoteSearch(ctx context.Context, id int64, note string) error {
	return s.changeSearch(ctx, id, "UPDATE searches SET note = ? WHERE id = ?", note, id)
}

// RemoveSearch removes a saved search. Its number is not given again.
func (s *Store) RemoveSearch(ctx context.Context, id int64) error {
	return s.changeSearch(ctx, id, "DELETE FROM searches WHERE id = ?", id)
}

func (s *Store) changeSearch(ctx context.Context, id int64, query string, args ...any) error {
	res, err := s.db.ExecContext(ctx, query, args...)
	if err != nil {
		return s.wrapWriteError(err)
	}
	n, err := res.RowsAffected()
	if err != nil {
		return err
	}
	if n == 0 {
		return &NotFoundError{What: "saved search", Name: strconv.FormatInt(id, 10)}
	}
	return nil
}
