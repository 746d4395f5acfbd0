package saved

import (
	"fmt"
	"strings"
)

// A NotFoundError names a saved search the catalog does not hold.
type NotFoundError struct {
	Ref  string // as given: a number, "last", or "demo:N"
	Path string // the catalog file looked in
}

func (e *NotFoundError) Error() string {
	if strings.EqualFold(strings.TrimSpace(e.Ref), "last") {
		return fmt.Sprintf("no saved searches in %s", e.Path)
	}
	return fmt.Sprintf("no saved search %s in %s", e.Ref, e.Path)
}

// A PickError is a rank the saved search does not have.
type PickError struct {
	ID   int64 // the search
	Rank int   // asked
	Have int   // results the search holds
}

func (e *PickError) Error() string {
	if e.Have == 0 {
		return fmt.Sprintf("search %d met nothing: it has no result %d to pick", e.ID, e.Rank)
	}
	return fmt.Sprintf("search %d has %d results: rank %d is not one of them", e.ID, e.Have, e.Rank)
}

// A MissingPartError is a part of a picked result that the catalog no
// longer holds.
type MissingPartError struct {
	ID   int64  // the search
	Part string // SUPPLIER:PART
}

func (e *MissingPartError) Error() string {
	return fmt.Sprintf("part %s of search %d is no longer in the catalog", e.Part, e.ID)
}

// A DecodeError is a saved search whose stored JSON does not read back.
type DecodeError struct {
	ID   int64
	What string // requirement, results, outcome
	Err  error
}

func (e *DecodeError) Error() string {
	return fmt.Sprintf("saved search %d: %s: %v", e.ID, e.What, e.Err)
}

func (e *DecodeError) Unwrap() error { return e.Err }

// A RefError is a reference that names no saved search: neither a number,
// "last", nor either with "demo:" before it.
type RefError struct{ Ref string }

func (e *RefError) Error() string {
	return fmt.Sprintf("search %q: give a search number, \"last\", or demo:N for a search run on the demo catalog", e.Ref)
}
