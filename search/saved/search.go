package saved

import (
	"encoding/json"
	"fmt"
	"time"

	"cardinal/catalog"
	"cardinal/search"
)

// A Search is one saved run of the solver: what was asked and everything
// it answered, enough to print its output again without searching.
type Search struct {
	ID          int64
	At          time.Time // when it ran
	Requirement search.Requirement
	Results     []search.Result
	// Why says in words why nothing met the requirement; Misses are the
	// nearest misses then. Both empty when results were found.
	Why    []string
	Misses []search.Result
	// Notes are the solver's own notes (not the cautions, which follow
	// from the requirement).
	Notes []string
	// Note is a short note of the user's.
	Note string
}

// outcome is what a search printed besides its results, as stored.
type outcome struct {
	Why    []string        `json:"why,omitempty"`
	Misses []search.Result `json:"misses,omitempty"`
	Notes  []string        `json:"notes,omitempty"`
}

// encode turns a search into the catalog's row.
func (s Search) encode() (catalog.SavedSearch, error) {
	req, err := json.Marshal(s.Requirement)
	if err != nil {
		return catalog.SavedSearch{}, fmt.Errorf("saved: requirement: %w", err)
	}
	res, err := json.Marshal(nonNil(s.Results))
	if err != nil {
		return catalog.SavedSearch{}, fmt.Errorf("saved: results: %w", err)
	}
	out, err := json.Marshal(outcome{Why: s.Why, Misses: s.Misses, Notes: s.Notes})
	if err != nil {
		return catalog.SavedSearch{}, fmt.Errorf("saved: outcome: %w", err)
	}
	return catalog.SavedSearch{Kind: string(s.Requirement.Kind), Requirement: req, Results: res,
		Outcome: out, Count: len(s.Results), Note: s.Note, At: s.At}, nil
}

// decode reads a catalog row back into a search.
func decode(ss catalog.SavedSearch) (*Search, error) {
	s := &Search{ID: ss.ID, At: ss.At, Note: ss.Note}
	if err := json.Unmarshal(ss.Requirement, &s.Requirement); err != nil {
		return nil, &DecodeError{ID: ss.ID, What: "requirement", Err: err}
	}
	if err := json.Unmarshal(ss.Results, &s.Results); err != nil {
		return nil, &DecodeError{ID: ss.ID, What: "results", Err: err}
	}
	for i := range s.Results {
		// Searches saved before the count was kept listed every
		// arrangement, so their number is the count.
		if r := &s.Results[i]; r.OtherArrangements == 0 {
			r.OtherArrangements = len(r.Arrangements)
		}
	}
	var o outcome
	if len(ss.Outcome) > 0 {
		if err := json.Unmarshal(ss.Outcome, &o); err != nil {
			return nil, &DecodeError{ID: ss.ID, What: "outcome", Err: err}
		}
	}
	s.Why, s.Misses, s.Notes = o.Why, o.Misses, o.Notes
	return s, nil
}

// nonNil keeps an empty result list an empty JSON array, never null.
func nonNil(rs []search.Result) []search.Result {
	if rs == nil {
		return []search.Result{}
	}
	return rs
}
