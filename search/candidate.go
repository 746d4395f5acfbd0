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

	"cardinal/catalog/record"
	"cardinal/optics"
)

// An Item is one catalog entry offered to the search, with the number of
// pieces of it in the user's drawer.
type Item struct {
	Entry  record.Entry
	Drawer int
}

// cand is one part in one orientation, by its thick-lens cardinal points at
// the search wavelength, in air.
type cand struct {
	item  int32   // index into the items
	key   int32   // rank of the part ID, for deterministic ties
	surf  int32   // see front and back
	rev   bool    // turned around
	tier  int8    // price and drawer group (see tiers)
	phi   float64 // power, 1/mm
	f     float64 // EFL
	L     float64 // first to last vertex
	P, Pp float64 // principal points (front from the first vertex, back from the last)
	F, Fp float64 // focal points, same references
	delta float64 // L + Pp - P: from the front to the back principal point
	m     optics.Mat2
	semi  float64 // clear semi-aperture
	// front and back are the radii of the outer surfaces as turned; surf
	// indexes the first and (next) last of them in prepared.surfs when
	// either has conic or asphere terms, and is -1 for two spheres (the
	// radius is all there is to them).
	front, back float64
	qty         int // pieces in the drawer
	// frontMin is the least sag of the first surface and backMax the
	// greatest sag of the last, over the clear aperture: for spheres, a
	// quick lower bound on the edge clearance.
	frontMin, backMax float64
	unit              float64 // price term of one piece (see score.go)
	price             float64 // price term of using it once: unit, 0 when the drawer holds a piece
	away              float64 // 1 when no piece is in the drawer, else 0
}

// prepared holds the candidates of one search and what was set aside.
type prepared struct {
	info []partInfo // per item
	// full returns an item's full prescription; fetch, when not nil, must
	// first be given the items whose prescriptions will be asked for (the
	// index path reads them from the catalog then).
	full func(item int32) optics.Part
	// tols returns an item's stated tolerances, under the same rule as full.
	tols      func(item int32) optics.Tolerances
	fetch     func(items []int32) error
	cands     []cand // sorted by power
	skipped   map[string]int
	surfs     []optics.Surface // outer surfaces of the candidates with conics or aspheres, two each
	warnings  []string
	outside   []string           // media used outside their dispersion range
	priceRefs map[string]float64 // median price by currency
	// chunks are the candidates as the workers found them, before finish
	// sorts them into cands.
	chunks  [][]cand
	scratch []cand // the array the chunks share
}

// partInfo is what the output says of an item besides its figures.
type partInfo struct {
	supplier, name, currency string
	price                    float64
	diameter                 float64 // mm, for the twin criterion (group.go)
}

// prepare filters the items by the requirement's part constraints and
// computes the candidates at the requirement's wavelength, in chunks over
// the processors, merged in item order.
func prepare(items []Item, req Requirement) *prepared {
	keys := idRanks(items)
	info := make([]partInfo, len(items))
	for i, it := range items {
		e := &it.Entry
		info[i] = partInfo{supplier: e.Part.Supplier, name: e.Part.Name, currency: e.Currency, price: e.Price, diameter: e.Part.Diameter}
	}
	p := inChunks(len(items), func(q *prepared, lo, hi int) { prepareChunk(q, items, keys, lo, hi, req) })
	p.info = info
	p.full = func(i int32) optics.Part { return items[i].Entry.Part }
	p.tols = func(i int32) optics.Tolerances { return items[i].Entry.Tolerances }
	p.finish(req)
	return p
}

// inChunks runs chunk over [0, n) in pieces on the processors and merges
// what they set aside. Each piece is handed a prepared whose cands are its
// own region of a shared array (two candidates a part at most), so nothing
// is copied to merge them; finish sorts the candidates. The few outer
// surfaces with conic or asphere terms are appended to the shared list.
func inChunks(n int, chunk func(q *prepared, lo, hi int)) *prepared {
	workers := max(1, min(runtime.GOMAXPROCS(0), 4, n/1000))
	cands := make([]cand, 2*n)
	p := &prepared{skipped: map[string]int{}, scratch: cands}
	parts := make([]*prepared, workers)
	var wg sync.WaitGroup
	for k := range parts {
		lo, hi := k*n/workers, (k+1)*n/workers
		parts[k] = &prepared{skipped: map[string]int{}, cands: cands[2*lo : 2*lo : 2*hi]}
		wg.Add(1)
		go func(q *prepared) {
			defer wg.Done()
			chunk(q, lo, hi)
		}(parts[k])
	}
	wg.Wait()
	outside := map[string]bool{}
	for _, q := range parts {
		base := int32(len(p.surfs))
		for i := range q.cands {
			if q.cands[i].surf >= 0 {
				q.cands[i].surf += base
			}
		}
		p.surfs = append(p.surfs, q.surfs...)
		p.chunks = append(p.chunks, q.cands)
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
	for _, cs := range p.chunks {
		for i := range cs {
			c := &cs[i]
			e := &p.info[c.item]
			c.unit = priceTerm(e.price, e.currency, p.priceRefs)
			c.price = c.unit * c.away
		}
	}
	p.cands = byTier(p.scratch, p.chunks)
	p.chunks, p.scratch = nil, nil
}

// prepareChunk computes the candidates of items[lo:hi] into p.
func prepareChunk(p *prepared, items []Item, keys []int32, lo, hi int, req Requirement) {
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
}

// add appends the candidate of one part in one orientation, by its
// cardinal points c in air, its clear semi-aperture, its outer surfaces and
// the pieces in the drawer.
func (p *prepared) add(c optics.Cardinal, semi float64, first, last optics.Surface, qty int, item, key int32, rev bool) {
	surf := int32(-1)
	if first.IsAsphere() || last.IsAsphere() {
		surf = int32(len(p.surfs))
		p.surfs = append(p.surfs, first, last)
	}
	p.cands = append(p.cands, cand{
		item: item, rev: rev, key: key, qty: qty, away: float64(b2i(qty < 1)),
		phi: c.Power, f: c.EFL, L: c.Length,
		P: c.P, Pp: c.PPrime, F: c.F, Fp: c.FPrime,
		delta:    c.Length + c.PPrime - c.P,
		m:        c.Matrix,
		semi:     semi,
		front:    first.Radius,
		back:     last.Radius,
		surf:     surf,
		frontMin: sagExtreme(first, semi, math.Min),
		backMax:  sagExtreme(last, semi, math.Max),
	})
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
func tiers(chunks [][]cand) []int8 {
	var ps []float64
	for _, cs := range chunks {
		for i := range cs {
			ps = append(ps, cs[i].price)
		}
	}
	slices.Sort(ps)
	q := func(f float64) float64 {
		if len(ps) == 0 {
			return 0
		}
		return ps[int(f*float64(len(ps)-1))]
	}
	bounds := []float64{q(0.25), q(0.5), q(0.75)}
	t := make([]int8, 0, len(ps))
	for _, cs := range chunks {
		for i := range cs {
			k := int8(0)
			for _, b := range bounds {
				if cs[i].price > b {
					k++
				}
			}
			t = append(t, k+4*int8(cs[i].away))
		}
	}
	return t
}

// byTier returns the candidates of the chunks, taken in order, grouped by
// tier and sorted by power within each tier, ties in their first order.
// The chunks are pieces of all, in order; the result is sorted in all's
// own storage (the candidates are large, and there are up to 400,000),
// comparing small keys so that the comparisons stay in the cache.
func byTier(all []cand, chunks [][]cand) []cand {
	t := tiers(chunks)
	n := 0
	for _, cs := range chunks {
		n += copy(all[n:], cs) // moves down or stays: the chunks are in order
	}
	all = all[:n]
	type sortKey struct {
		phi  float64
		i    int32
		tier int8
	}
	keys := make([]sortKey, n)
	for i := range all {
		keys[i] = sortKey{phi: all[i].phi, i: int32(i), tier: t[i]}
	}
	slices.SortFunc(keys, func(a, b sortKey) int {
		if c := cmp.Compare(a.tier, b.tier); c != 0 {
			return c
		}
		if c := cmp.Compare(a.phi, b.phi); c != 0 {
			return c
		}
		return cmp.Compare(a.i, b.i)
	})
	// Position k takes the candidate at keys[k].i: follow each cycle of
	// the permutation once.
	for k := range keys {
		if keys[k].i < 0 || int(keys[k].i) == k {
			continue
		}
		tmp, j := all[k], k
		for {
			src := int(keys[j].i)
			keys[j].i = -1
			if src == k {
				all[j] = tmp
				break
			}
			all[j] = all[src]
			j = src
		}
	}
	for k := range all {
		all[k].tier = keys[k].tier
	}
	return all
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
