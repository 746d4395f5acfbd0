package saved

import (
	"context"
	"errors"
	"time"

	"cardinal/catalog"
	"cardinal/search"
)

// A Book is the saved searches of one catalog.
type Book struct {
	st *catalog.Store
}

// New returns the book of the catalog st.
func New(st *catalog.Store) *Book { return &Book{st: st} }

// Path is the catalog file the book is kept in (catalog.Memory for an
// in-memory one).
func (b *Book) Path() string { return b.st.Path() }

// Save stores a search and returns its number; s.ID is ignored.
func (b *Book) Save(ctx context.Context, s Search) (int64, error) {
	row, err := s.encode()
	if err != nil {
		return 0, err
	}
	return b.st.SaveSearch(ctx, row)
}

// Load reads a saved search back. The reference's Demo mark is the
// caller's to honour (by opening the demo catalog's book); a search that
// is not there gives a *NotFoundError.
func (b *Book) Load(ctx context.Context, ref Ref) (*Search, error) {
	row, err := b.st.LoadSearch(ctx, ref.Number())
	if err != nil {
		return nil, b.notFound(err, ref)
	}
	return decode(row)
}

// A Summary is a saved search as a list shows it: without its results.
type Summary struct {
	ID          int64
	At          time.Time
	Requirement search.Requirement
	Count       int // results it holds
	Note        string
}

// List returns the saved searches, oldest first.
func (b *Book) List(ctx context.Context) ([]Summary, error) {
	rows, err := b.st.Searches(ctx)
	if err != nil {
		return nil, err
	}
	out := make([]Summary, len(rows))
	for i, r := range rows {
		s, err := decode(catalog.SavedSearch{ID: r.ID, Requirement: r.Requirement, Results: []byte("[]")})
		if err != nil {
			return nil, err
		}
		out[i] = Summary{ID: r.ID, At: r.At, Requirement: s.Requirement, Count: r.Count, Note: r.Note}
	}
	return out, nil
}

// Annotate sets the user's note on a saved search ("" removes it) and
// returns the search's number.
func (b *Book) Annotate(ctx context.Context, ref Ref, note string) (int64, error) {
	id, err := b.st.SearchID(ctx, ref.Number())
	if err == nil {
		err = b.st.NoteSearch(ctx, id, note)
	}
	return id, b.notFound(err, ref)
}

// Remove removes a saved search and returns its number, which is never
// given to another search.
func (b *Book) Remove(ctx context.Context, ref Ref) (int64, error) {
	id, err := b.st.SearchID(ctx, ref.Number())
	if err == nil {
		err = b.st.RemoveSearch(ctx, id)
	}
	return id, b.notFound(err, ref)
}

// notFound turns the catalog's not-found error into this package's.
func (b *Book) notFound(err error, ref Ref) error {
	var nf *catalog.NotFoundError
	if errors.As(err, &nf) {
		return &NotFoundError{Ref: ref.String(), Path: b.st.Path()}
	}
	return err
}
