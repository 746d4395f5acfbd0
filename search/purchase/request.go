package purchase

import (
	"fmt"
	"sort"

	"cardinal/catalog/record"
	"cardinal/search"
	"cardinal/search/solution"
)

// Stock is what the catalog and the drawer hold of one part.
type Stock struct {
	Entry    record.Entry
	InDrawer int    // pieces in the drawer
	Location string // where they are
}

// Money is an amount in one currency. Amounts in different currencies are
// kept apart, never summed.
type Money struct {
	Currency string  `json:"currency"`
	Amount   float64 `json:"amount"`
}

// A RequestLine is one part to have at hand.
type RequestLine struct {
	Supplier    string `json:"supplier"`
	Part        string `json:"part"`
	Description string `json:"description"`
	// Needed is the number of pieces the picked solutions use, times the
	// number of systems (a pair using the same part twice needs two per
	// system).
	Needed   int    `json:"needed"`
	InDrawer int    `json:"in_drawer"`
	Location string `json:"location,omitempty"`
	ToOrder  int    `json:"to_order"`
	// UnitPrice and LineTotal are nil when the catalog states no price.
	UnitPrice *float64 `json:"unit_price"`
	LineTotal *float64 `json:"line_total"`
	Currency  string   `json:"currency,omitempty"`
	URL       string   `json:"url,omitempty"`
	// UsedBy lists the ranks of the picked solutions that use the part.
	UsedBy []int `json:"used_by"`
}

// A SupplierGroup is the lines to order from one supplier, with a
// subtotal per currency.
type SupplierGroup struct {
	Supplier  string        `json:"supplier"`
	Lines     []RequestLine `json:"lines"`
	Subtotals []Money       `json:"subtotals"`
}

// A PickedSolution is one solution the request is for, in words, so that
// the request explains itself.
type PickedSolution struct {
	Rank     int    `json:"rank"`
	Parts    string `json:"parts"`
	Spacings string `json:"spacings"`
	// Build is how to put the solution together (AddBuilds); nil when the
	// request was made without the rebuilt solutions.
	Build *solution.Build `json:"build,omitempty"`
}

// A Request is a purchase request for the picked solutions of a search.
type Request struct {
	Search      int64              `json:"search"`
	Requirement search.Requirement `json:"requirement"`
	// RequirementText is the requirement in words.
	RequirementText string           `json:"requirement_text"`
	Systems         int              `json:"systems"`
	Solutions       []PickedSolution `json:"solutions"`
	Suppliers       []SupplierGroup  `json:"suppliers"`
	// Totals is the grand total per currency, over the parts to order.
	Totals []Money `json:"totals"`
	// Unpriced lists SUPPLIER:PART of parts to order whose price the
	// catalog does not state: the totals leave them out.
	Unpriced []string `json:"unpriced,omitempty"`
	Cautions []string `json:"cautions,omitempty"`
}

// BuildRequest gathers the parts of the picked results for the given
// number of systems, takes off what the drawer holds, and groups what is
// left by supplier with line totals, subtotals and grand totals per
// currency. stock holds every part of the picks, keyed by SUPPLIER:PART.
func BuildRequest(searchID int64, req search.Requirement, picks []search.Result, systems int, stock map[string]Stock) (Request, error) {
	if systems < 1 {
		return Request{}, fmt.Errorf("the number of systems must be 1 or more, not %d", systems)
	}
	rq := Request{Search: searchID, Requirement: req, RequirementText: solution.DescribeRequirement(req), Systems: systems, Cautions: solution.Cautions(req, picks...)}
	lines := map[string]*RequestLine{}
	for _, r := range picks {
		rq.Solutions = append(rq.Solutions, PickedSolution{Rank: r.Rank, Parts: solution.DescribeParts(r.Parts), Spacings: solution.DescribeSpacings(req.Kind, r)})
		for _, u := range r.Parts {
			l, err := lineFor(lines, u, stock)
			if err != nil {
				return Request{}, err
			}
			l.Needed += systems
			if len(l.UsedBy) == 0 || l.UsedBy[len(l.UsedBy)-1] != r.Rank {
				l.UsedBy = append(l.UsedBy, r.Rank)
			}
		}
	}
	rq.group(lines)
	return rq, nil
}

// AddBuilds attaches to each picked solution its build sheet, from the
// solutions rebuilt from the catalog (matched by rank).
func (rq *Request) AddBuilds(sols []solution.Solution) {
	for _, s := range sols {
		for i := range rq.Solutions {
			if rq.Solutions[i].Rank == s.Result.Rank {
				b := s.Build()
				rq.Solutions[i].Build = &b
			}
		}
	}
}

// lineFor returns the line of a part, making it from the stock on first use.
func lineFor(lines map[string]*RequestLine, u search.PartUse, stock map[string]Stock) (*RequestLine, error) {
	if l, ok := lines[u.ID()]; ok {
		return l, nil
	}
	st, ok := stock[u.ID()]
	if !ok {
		return nil, fmt.Errorf("part %s is not in the catalog", u.ID())
	}
	e := st.Entry
	l := &RequestLine{Supplier: u.Supplier, Part: u.Part, Description: e.Part.Description,
		InDrawer: st.InDrawer, Location: st.Location, Currency: e.Currency, URL: e.URL}
	if e.Price > 0 {
		l.UnitPrice = &e.Price
	}
	lines[u.ID()] = l
	return l, nil
}

// group finishes the lines (to order, totals) and sorts them into
// supplier groups, suppliers and parts in name order.
func (rq *Request) group(lines map[string]*RequestLine) {
	ids := make([]string, 0, len(lines))
	for id := range lines {
		ids = append(ids, id)
	}
	sort.Slice(ids, func(i, j int) bool {
		a, b := lines[ids[i]], lines[ids[j]]
		if a.Supplier != b.Supplier {
			return a.Supplier < b.Supplier
		}
		return a.Part < b.Part
	})
	grand := map[string]float64{}
	for _, id := range ids {
		l := lines[id]
		l.ToOrder = max(0, l.Needed-l.InDrawer)
		if n := len(rq.Suppliers); n == 0 || rq.Suppliers[n-1].Supplier != l.Supplier {
			rq.Suppliers = append(rq.Suppliers, SupplierGroup{Supplier: l.Supplier})
		}
		g := &rq.Suppliers[len(rq.Suppliers)-1]
		switch {
		case l.UnitPrice != nil:
			t := float64(l.ToOrder) * *l.UnitPrice
			l.LineTotal = &t
			grand[l.Currency] += t
		case l.ToOrder > 0:
			rq.Unpriced = append(rq.Unpriced, id)
		}
		g.Lines = append(g.Lines, *l)
	}
	for i := range rq.Suppliers {
		rq.Suppliers[i].Subtotals = subtotals(rq.Suppliers[i].Lines)
	}
	rq.Totals = sortedMoney(grand)
}

// subtotals sums the priced line totals of a group per currency.
func subtotals(lines []RequestLine) []Money {
	sum := map[string]float64{}
	for _, l := range lines {
		if l.LineTotal != nil {
			sum[l.Currency] += *l.LineTotal
		}
	}
	return sortedMoney(sum)
}

func sortedMoney(m map[string]float64) []Money {
	out := make([]Money, 0, len(m))
	for c, a := range m {
		out = append(out, Money{Currency: c, Amount: a})
	}
	sort.Slice(out, func(i, j int) bool { return out[i].Currency < out[j].Currency })
	return out
}
