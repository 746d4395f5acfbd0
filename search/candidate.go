package search

import (
	"cmp"
	"fmt"
	"math"
	"runtime"
	"slices"
	"sort"
	"strings"
	"sync"

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
	semi  float64 // clear semi-aperture
	surf  int32   // index of the first and (next) last surfaces in prepared.surfs
	// frontMin is the least sag of the first surface and backMax the
	// greatest sag of the last, over the clear aperture: for spheres, a
	// quick lower bound on the edge clearance.
	frontMin, backMax float64
	unit              float64 // price term of one piece (see score.go)
	price             float64 // price term of using it once: unit, 0 when the drawer holds a piece
	away              float64 // 1 when no piece is in the drawer, else 0
	qty               int     // pieces in the drawer
	key               int32   // rank of the part ID, for deterministic ties
	tier              int8    // price and drawer group (see tiers)
}

// prepared holds the candidates of one search and what was set aside.
type prepared struct {
	info []partInfo // per item
	// full returns an item's full prescription; fetch, when not nil, must
	// first be given the items whose prescriptions will be asked for (the
	// index path reads them from the catalog then).
	full      func(item int32) optics.Part
	fetch     func(items []int32) error
	cands     []cand // sorted by power
	skipped   map[string]int
	surfs     []optics.Surface // outer surfaces of the candidates, two each
	warnings  []string
	outside   []string           // media used outside their dispersion range
	priceRefs map[string]float64 // median price by currency
}

// partInfo is what the output says of an item besides its figures.
type partInfo struct {
	supplier, name, currency string
	price                    float64
}

// prepare filters the items by the requirement's part constraints and
// computes the candidates at the requirement's wavelength, in chunks over
// the processors, merged in item order.
func prepare(items []Item, req Requirement) *prepared {
	keys := idRanks(items)
	info := make([]partInfo, len(items))
	for i, it := range items {
		e := &it.Entry
		info[i] = partInfo{supplier: e.Part.Supplier, name: e.Part.Name, currency: e.Currency, price: e.Price}
	}
	p := inChunks(len(items), func(lo, hi int) *prepared { return prepareChunk(items, keys, lo, hi, req) })
	p.info = info
	p.full = func(i int32) optics.Part { return items[i].Entry.Part }
	p.finish(req)
	return p
}

// inChunks runs chunk over [0, n) in pieces on the processors and merges
// what they prepared, in order.
func inChunks(n int, chunk func(lo, hi int) *prepared) *prepared {
	workers := max(1, min(runtime.GOMAXPROCS(0), 4, n/1000))
	parts := make([]*prepared, workers)
	var wg sync.WaitGroup
	for k := range parts {
		lo, hi := k*n/workers, (k+1)*n/workers
		wg.Add(1)
		go func(k int) {
			defer wg.Done()
			parts[k] = chunk(lo, hi)
		}(k)
	}
	wg.Wait()
	total := 0
	for _, q := range parts {
		total += len(q.cands)
	}
	p := &prepared{skipped: map[string]int{}, cands: make([]cand, 0, total), surfs: make([]optics.Surface, 0, 2*total)}
	outside := map[string]bool{}
	for _, q := range parts {
		for _, c := range q.cands {
			c.surf += int32(len(p.surfs))
			p.cands = append(p.cands, c)
		}
		p.surfs = append(p.surfs, q.surfs...)
		for r, n := range q.skipped {
			p.skipped[r] += n
		}
		for _, o := range q.outside {
			if !outside[o] {
				outside[o] = true
				p.outside = append(p.outside, o)
			}
		}
	}
	return p
}

// finish words the warnings, prices the candidates and sorts them.
func (p *prepared) finish(req Requirement) {
	if len(p.outside) > 0 {
		sort.Strings(p.outside)
		p.warnings = append(p.warnings, fmt.Sprintf("%g nm is outside the range of the dispersion formulas of %s: their indices are extrapolated",
			req.Lambda(), strings.Join(p.outside, ", ")))
	}
	p.priceRefs = priceReferences(p.info)
	for i := range p.cands {
		c := &p.cands[i]
		e := &p.info[c.item]
		c.unit = priceTerm(e.price, e.currency, p.priceRefs)
		c.price = c.unit * c.away
	}
	p.cands = byTier(p.cands)
}

// prepareChunk computes the candidates of items[lo:hi].
func prepareChunk(items []Item, keys []int32, lo, hi int, req Requirement) *prepared {
	p := &prepared{skipped: map[string]int{},
		cands: make([]cand, 0, 2*(hi-lo)), surfs: make([]optics.Surface, 0, 4*(hi-lo))}
	lambda := req.Lambda()
	warned := map[string]bool{}
	for i := lo; i < hi; i++ {
		it := items[i]
		part := it.Entry.Part
		if reason := p.filter(it, req); reason != "" {
			p.skipped[reason]++
			continue
		}
		sys := part.System(nil, nil)
		p.warn(sys, lambda, warned)
		c := sys.Cardinal(lambda)
		if c.Afocal {
			p.skipped["no focusing power (afocal part)"]++
			continue
		}
		first, last := part.Surfaces[0], part.Surfaces[len(part.Surfaces)-1]
		p.add(c, part.Aperture()/2, first, last, it.Drawer, int32(i), keys[i], false)
		if !part.Symmetric() {
			// The part turned around, in air: its reduced matrix is
			// [D B; C A] (reversibility of paraxial rays; Gerrard and
			// Burch, ch. III), checked in tests against the reversed part.
			m := c.Matrix
			rc := optics.FromMatrix(optics.Mat2{A: m.D, B: m.B, C: m.C, D: m.A}, 1, 1)
			rc.Length = c.Length
			p.add(rc, part.Aperture()/2, last.Reversed(), first.Reversed(), it.Drawer, int32(i), keys[i], true)
		}
	}
	return p
}

// add appends the candidate of one part in one orientation, by its
// cardinal points c in air, its clear semi-aperture, its outer surfaces and
// the pieces in the drawer.
func (p *prepared) add(c optics.Cardinal, semi float64, first, last optics.Surface, qty int, item, key int32, rev bool) {
	p.cands = append(p.cands, cand{
		item: item, rev: rev, key: key, qty: qty, away: float64(b2i(qty < 1)),
		phi: c.Power, f: c.EFL, L: c.Length,
		P: c.P, Pp: c.PPrime, F: c.F, Fp: c.FPrime,
		delta:    c.Length + c.PPrime - c.P,
		m:        c.Matrix,
		semi:     semi,
		surf:     int32(len(p.surfs)),
		frontMin: sagExtreme(first, semi, math.Min),
		backMax:  sagExtreme(last, semi, math.Max),
	})
	p.surfs = append(p.surfs, first, last)
}

// warn notes the media used outside their dispersion range, once each.
func (p *prepared) warn(sys optics.System, lambda float64, warned map[string]bool) {
	for _, m := range sys.Media {
		if warned[m.Name()] {
			continue
		}
		warned[m.Name()] = true
		if lo, hi := m.Range(); optics.RangeWarning(m, lambda) != "" {
			p.outside = append(p.outside, rangeNote(m.Name(), lo, hi))
		}
	}
}

// rangeNote names a medium with the range of its dispersion formula.
func rangeNote(name string, lo, hi float64) string {
	return fmt.Sprintf("%s (%.0f-%.0f nm)", name, lo, hi)
}

// filter tells why an item takes no part in the search, or "".
func (p *prepared) filter(it Item, req Requirement) string {
	part := it.Entry.Part
	if r := setAside(part.Supplier, part.Diameter, it.Drawer, req); r != "" {
		return r
	}
	if part.Validate() != nil {
		return "invalid prescription"
	}
	return ""
}

// setAside tells why a part of this supplier, diameter and drawer quantity
// takes no part in the search, or "".
func setAside(supplier string, diameter float64, qty int, req Requirement) string {
	switch {
	case req.Supplier != "" && !strings.EqualFold(supplier, req.Supplier):
		return "other supplier"
	case req.DrawerOnly && qty < 1:
		return "not in the drawer"
	case req.DiameterMax > 0 && diameter > req.DiameterMax:
		return fmt.Sprintf("diameter over %g mm", req.DiameterMax)
	}
	return ""
}

// sagExtreme is the sag at 0 or h picked by pick (math.Min or math.Max):
// the extreme over heights 0 to h of a sphere, whose sag is monotonic. For a
// conic or an asphere it means nothing; edgeClearance samples those.
func sagExtreme(s optics.Surface, h float64, pick func(a, b float64) float64) float64 {
	z, _ := s.Sag(h)
	return pick(0, z)
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
