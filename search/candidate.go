package search

import (
	"cmp"
	"fmt"
	"math"
	"slices"
	"sort"
	"strings"

	"cardinal/importers"
	"cardinal/optics"
)

// An Item is one catalog entry offered to the search, with the number of
// pieces of it in the user's drawer.
type Item struct {
	Entry  importers.Entry
	Drawer int
}

// cand is one part in one orientation, by its thick-lens cardinal points at
// the search wavelength, in air.
type cand struct {
	item  int32 // index into the items
	rev   bool
	phi   float64 // power, 1/mm
	f     float64 // EFL
	L     float64 // first to last vertex
	P, Pp float64 // principal points (front from the first vertex, back from the last)
	F, Fp float64 // focal points, same references
	delta float64 // L + Pp - P: from the front to the back principal point
	m     optics.Mat2
	semi  float64         // clear semi-aperture
	first *optics.Surface // first and last surfaces, for the edge clearance
	last  *optics.Surface
	price float64 // price term of one piece (see score.go)
	away  float64 // 1 when no piece is in the drawer, else 0
	qty   int     // pieces in the drawer
	key   int32   // rank of the part ID, for deterministic ties
	tier  int8    // price and drawer group (see tiers)
}

// prepared holds the candidates of one search and what was set aside.
type prepared struct {
	items    []Item
	cands    []cand // sorted by power
	skipped  map[string]int
	warnings []string
	outside  []string // media used outside their dispersion range
	priceRef float64
}

// prepare filters the items by the requirement's part constraints and
// computes the candidates at the requirement's wavelength.
func prepare(items []Item, req Requirement) *prepared {
	p := &prepared{items: items, skipped: map[string]int{}, cands: make([]cand, 0, 2*len(items))}
	lambda := req.Lambda()
	keys := idRanks(items)
	warned := map[string]bool{}
	for i, it := range items {
		part := it.Entry.Part
		if reason := p.filter(it, req); reason != "" {
			p.skipped[reason]++
			continue
		}
		for _, rev := range orientations(part) {
			pp := part
			if rev {
				pp = part.Reversed()
			}
			sys := pp.System(nil, nil)
			if !rev {
				p.warn(sys, lambda, warned)
			}
			c, ok := newCand(pp, sys.Cardinal(lambda))
			if !ok {
				p.skipped["no focusing power (afocal part)"]++
				break
			}
			c.item, c.rev, c.key = int32(i), rev, keys[i]
			c.qty = it.Drawer
			if it.Drawer < 1 {
				c.away = 1
			}
			p.cands = append(p.cands, c)
		}
	}
	if len(p.outside) > 0 {
		sort.Strings(p.outside)
		p.warnings = append(p.warnings, fmt.Sprintf("%g nm is outside the range of the dispersion formulas of %s: their indices are extrapolated",
			lambda, strings.Join(p.outside, ", ")))
	}
	p.priceRef = priceReference(items)
	for i := range p.cands {
		p.cands[i].price = priceTerm(items[p.cands[i].item].Entry.Price, p.priceRef)
	}
	p.cands = byTier(p.cands)
	return p
}

// warn notes the media used outside their dispersion range, once each.
func (p *prepared) warn(sys optics.System, lambda float64, warned map[string]bool) {
	for _, m := range sys.Media {
		if warned[m.Name()] {
			continue
		}
		warned[m.Name()] = true
		if lo, hi := m.Range(); optics.RangeWarning(m, lambda) != "" {
			p.outside = append(p.outside, fmt.Sprintf("%s (%.0f-%.0f nm)", m.Name(), lo, hi))
		}
	}
}

// filter tells why an item takes no part in the search, or "".
func (p *prepared) filter(it Item, req Requirement) string {
	part := it.Entry.Part
	switch {
	case req.Supplier != "" && !strings.EqualFold(part.Supplier, req.Supplier):
		return "other supplier"
	case req.DrawerOnly && it.Drawer < 1:
		return "not in the drawer"
	case req.DiameterMax > 0 && part.Diameter > req.DiameterMax:
		return fmt.Sprintf("diameter over %g mm", req.DiameterMax)
	case part.Validate() != nil:
		return "invalid prescription"
	}
	return ""
}

// orientations lists the orientations to try: a symmetric part once.
func orientations(p optics.Part) []bool {
	if p.Symmetric() {
		return []bool{false}
	}
	return []bool{false, true}
}

func newCand(p optics.Part, c optics.Cardinal) (cand, bool) {
	if c.Afocal || math.Abs(c.Power) < optics.AfocalPower {
		return cand{}, false
	}
	return cand{
		phi: c.Power, f: c.EFL, L: c.Length,
		P: c.P, Pp: c.PPrime, F: c.F, Fp: c.FPrime,
		delta: c.Length + c.PPrime - c.P,
		m:     c.Matrix,
		semi:  p.Aperture() / 2,
		first: &p.Surfaces[0], last: &p.Surfaces[len(p.Surfaces)-1],
	}, true
}

// tier groups candidates of like price and drawer availability, so that
// the score bound can cut whole groups: four price quartiles, in the drawer
// or not.
func tiers(cs []cand) []int8 {
	ps := make([]float64, len(cs))
	for i := range cs {
		ps[i] = cs[i].price
	}
	slices.Sort(ps)
	q := func(f float64) float64 {
		if len(ps) == 0 {
			return 0
		}
		return ps[int(f*float64(len(ps)-1))]
	}
	bounds := []float64{q(0.25), q(0.5), q(0.75)}
	t := make([]int8, len(cs))
	for i := range cs {
		k := int8(0)
		for _, b := range bounds {
			if cs[i].price > b {
				k++
			}
		}
		t[i] = k + 4*int8(cs[i].away)
	}
	return t
}

// byTier returns the candidates grouped by tier and sorted by power within
// each tier, ties in their first order; sorting indices keeps the large
// structs from being moved more than once.
func byTier(cs []cand) []cand {
	t := tiers(cs)
	idx := make([]int32, len(cs))
	for i := range idx {
		idx[i] = int32(i)
	}
	slices.SortFunc(idx, func(a, b int32) int {
		if c := cmp.Compare(t[a], t[b]); c != 0 {
			return c
		}
		if c := cmp.Compare(cs[a].phi, cs[b].phi); c != 0 {
			return c
		}
		return cmp.Compare(a, b)
	})
	out := make([]cand, len(cs))
	for k, i := range idx {
		out[k] = cs[i]
		out[k].tier = t[i]
	}
	return out
}

// idRanks gives each item the rank of its part ID in sorted order.
func idRanks(items []Item) []int32 {
	ids := make([]string, len(items))
	idx := make([]int32, len(items))
	for i, it := range items {
		ids[i], idx[i] = it.Entry.Part.ID(), int32(i)
	}
	slices.SortFunc(idx, func(a, b int32) int {
		if c := strings.Compare(ids[a], ids[b]); c != 0 {
			return c
		}
		return cmp.Compare(a, b)
	})
	r := make([]int32, len(items))
	for rank, i := range idx {
		r[i] = int32(rank)
	}
	return r
}
