package saved

import (
	"context"
	"errors"
	"slices"

	"cardinal/catalog"
	"cardinal/catalog/record"
	"cardinal/search"
	"cardinal/search/purchase"
	"cardinal/search/solution"
)

// Pick returns the results of the given ranks (as find printed them), in
// the order asked. A rank the search does not hold gives a *PickError.
func (s *Search) Pick(ranks []int) ([]search.Result, error) {
	out := make([]search.Result, 0, len(ranks))
	for _, p := range ranks {
		i := slices.IndexFunc(s.Results, func(r search.Result) bool { return r.Rank == p })
		if i < 0 {
			return nil, &PickError{ID: s.ID, Rank: p, Have: len(s.Results)}
		}
		out = append(out, s.Results[i])
	}
	return out, nil
}

// Picked is a saved search's chosen results with what the catalog holds
// today of their parts: what request, draw and report start from.
type Picked struct {
	Search  *Search
	Results []search.Result // in the order asked
	// Entries are the picked parts' prescriptions, by SUPPLIER:PART.
	Entries map[string]record.Entry
	// Drawer is the whole drawer, by SUPPLIER:PART.
	Drawer map[string]record.DrawerItem
}

// Pick chooses results of the search by rank and reads their parts and the
// drawer from the catalog. A part no longer there gives a
// *MissingPartError.
func (b *Book) Pick(ctx context.Context, s *Search, ranks []int) (*Picked, error) {
	rs, err := s.Pick(ranks)
	if err != nil {
		return nil, err
	}
	p := &Picked{Search: s, Results: rs, Entries: map[string]record.Entry{}}
	for _, r := range rs {
		for _, u := range r.Parts {
			if _, ok := p.Entries[u.ID()]; ok {
				continue
			}
			en, err := b.st.Part(ctx, u.ID())
			var nf *catalog.NotFoundError
			if errors.As(err, &nf) {
				return nil, &MissingPartError{ID: s.ID, Part: u.ID()}
			}
			if err != nil {
				return nil, err
			}
			p.Entries[u.ID()] = en
		}
	}
	if p.Drawer, err = b.st.Drawer(ctx); err != nil {
		return nil, err
	}
	return p, nil
}

// Stock pairs each picked part with its drawer row, for a purchase
// request.
func (p *Picked) Stock() map[string]purchase.Stock {
	m := make(map[string]purchase.Stock, len(p.Entries))
	for id, en := range p.Entries {
		d := p.Drawer[id]
		m[id] = purchase.Stock{Entry: en, InDrawer: d.Quantity, Location: d.Location}
	}
	return m
}

// Rebuild turns the picked results into optical systems from today's
// prescriptions and lists, in words, every first-order figure that differs
// from what the search saved (a part re-imported with another prescription
// since, say); no changes means each rebuilt system is the one the search
// found.
func (p *Picked) Rebuild() ([]solution.Solution, []string, error) {
	var sols []solution.Solution
	var changes []string
	for _, r := range p.Results {
		s, err := solution.New(p.Search.Requirement, r, p.Entries)
		if err != nil {
			return nil, nil, &DecodeError{ID: p.Search.ID, What: "results", Err: err}
		}
		changes = append(changes, s.Verify()...)
		sols = append(sols, s)
	}
	return sols, changes, nil
}
