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
// the search wavelength, in air. It holds what the pruned search reads for
// every candidate it passes over, compactly: what follows from these (the
// focal lengths and points, the principal-point separation) is worked out
// by the methods below with the same operations optics.FromMatrix uses, so
// that the figures agree to the last bit, and what belongs to the part
// rather than the orientation lives in the prepared items (itemData).
type cand struct {
	phi   float64     // power, 1/mm
	L     float64     // first to last vertex
	P, Pp float64     // principal points (front from the first vertex, back from the last)
	m     optics.Mat2 // reduced matrix, first to last vertex, in air
	semi  float64     // clear semi-aperture
	price float64     // price term of using it once: the item's unit, 0 when the drawer holds a piece
	item  int32       // index into the items
	qty   int8        // pieces in the drawer, held to 127 (only up to 2 are ever told apart)
	rev   bool        // turned around
	tier  int8        // price and drawer group (see tiers)
}

// efl is the effective focal length, 1/phi (optics.FromMatrix).
func (c *cand) efl() float64 { return 1 / c.phi }

// ffd is the front focal point from the first vertex, -D/phi in air
// (optics.FromMatrix with n = 1).
func (c *cand) ffd() float64 { return -c.m.D / c.phi }

// bfd is the back focal point from the last vertex, A/phi in air.
func (c *cand) bfd() float64 { return c.m.A / c.phi }

// sep is L + P' - P: from the front to the back principal point.
func (c *cand) sep() float64 { return c.L + c.Pp - c.P }

// away is 1 when no piece is in the drawer, else 0.
func (c *cand) away() float64 { return float64(b2i(c.qty < 1)) }

// itemData is what the search keeps per item rather than per candidate.
type itemData struct {
	keys  []int32   // rank of the part ID, for deterministic ties
	units []float64 // price term of one piece (see score.go)
	outer []outer   // outer surfaces, for the edge clearance
	surfs []optics.Surface
}

// outer is what the edge clearance needs of an item's outer surfaces as
// catalogued (not turned): their radii, and surf, which indexes the first
// and (next) last of them in itemData.surfs when either has conic or
// asphere terms and is -1 for two spheres (the radius is all there is to
// them).
type outer struct {
	first, last float64
	surf        int32
}

// prepared holds the candidates of one search and what was set aside.
type prepared struct {
	itemData
	items int // how many items
	// info tells what the output says of an item besides its figures.
	info func(item int32) partInfo
	// full returns an item's full prescription; fetch, when not nil, must
	// first be given the items whose prescriptions will be asked for (the
	// index path reads them from the catalog then).
	full func(item int32) optics.Part
	// tols returns an item's stated tolerances, under the same rule as full.
	tols      func(item int32) optics.Tolerances
	fetch     func(items []int32) error
	cands     []cand // sorted by tier, then power
	forest    forest // built by the first search that prunes, freed after the first-order ranking
	skipped   map[string]int
	warnings  []string
	outside   []string           // media used outside their dispersion range
	priceRefs map[string]float64 // median price by currency
	// chunks are the candidates as the workers found them, before finish
	// sorts them into cands.
	chunks  [][]cand
	scratch []cand // the array the chunks share
	lo, hi  int    // the items of a chunk
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
	p := inChunks(len(items), nil, func(q *prepared, lo, hi int) { prepareChunk(q, items, lo, hi, req) })
	p.keys = keys
	p.info = func(i int32) partInfo {
		e := &items[i].Entry
		return partInfo{supplier: e.Part.Supplier, name: e.Part.Name, currency: e.Currency, price: e.Price, diameter: e.Part.Diameter}
	}
	p.full = func(i int32) optics.Part { return items[i].Entry.Part }
	p.tols = func(i int32) optics.Tolerances { return items[i].Entry.Tolerances }
	p.finish(req)
	return p
}

// inChunks runs chunk over [0, n) in pieces on the processors and merges
// what they set aside. Each piece is handed a prepared whose cands are its
// own region of a shared array, so nothing is copied to merge them; finish
// sorts the candidates. The region of item i holds two candidates, or
// one where single(i) (the part is the same turned around; single may be
// nil). The items' outer surfaces are written in place, and the few with
// conic or asphere terms appended to the shared list.
func inChunks(n int, single func(i int) bool, chunk func(q *prepared, lo, hi int)) *prepared {
	workers := max(1, min(runtime.GOMAXPROCS(0), 4, n/1000))
	bounds := make([]int, workers+1) // start of each region in the shared array
	for k := range workers {
		lo, hi := k*n/workers, (k+1)*n/workers
		size := 2 * (hi - lo)
		if single != nil {
			for i := lo; i < hi; i++ {
				size -= b2i(single(i))
			}
		}
		bounds[k+1] = bounds[k] + size
	}
	cands := make([]cand, bounds[workers])
	p := &prepared{items: n, skipped: map[string]int{}, scratch: cands}
	p.outer = make([]outer, n)
	parts := make([]*prepared, workers)
	var wg sync.WaitGroup
	for k := range parts {
		lo, hi := k*n/workers, (k+1)*n/workers
		q := &prepared{skipped: map[string]int{}, cands: cands[bounds[k]:bounds[k]:bounds[k+1]], lo: lo, hi: hi}
		q.outer = p.outer
		parts[k] = q
		wg.Add(1)
		go func(q *prepared) {
			defer wg.Done()
			chunk(q, lo, hi)
		}(q)
	}
	wg.Wait()
	outside := map[string]bool{}
	for _, q := range parts {
		base := int32(len(p.surfs))
		for i := q.lo; i < q.hi; i++ {
			if p.outer[i].surf >= 0 {
				p.outer[i].surf += base
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
	p.priceRefs = priceReferences(p.items, p.info)
	p.units = make([]float64, p.items)
	for i := range p.units {
		e := p.info(int32(i))
		p.units[i] = priceTerm(e.price, e.currency, p.priceRefs)
	}
	for _, cs := range p.chunks {
		for i := range cs {
			c := &cs[i]
			c.price = p.units[c.item] * c.away()
		}
	}
	p.cands = byTier(p.scratch, p.chunks)
	p.chunks, p.scratch = nil, nil
}

// prepareChunk computes the candidates of items[lo:hi] into p.
func prepareChunk(p *prepared, items []Item, lo, hi int, req Requirement) {
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
		p.setOuter(int32(i), part.Surfaces[0], part.Surfaces[len(part.Surfaces)-1])
		p.add(c, part.Aperture()/2, it.Drawer, int32(i), false)
		if !part.Symmetric() {
			// The part turned around, in air: its reduced matrix is
			// [D B; C A] (reversibility of paraxial rays; Gerrard and
			// Burch, ch. III), checked in tests against the reversed part.
			m := c.Matrix
			rc := optics.FromMatrix(optics.Mat2{A: m.D, B: m.B, C: m.C, D: m.A}, 1, 1)
			rc.Length = c.Length
			p.add(rc, part.Aperture()/2, it.Drawer, int32(i), true)
		}
	}
}

// setOuter records an item's outer surfaces (as catalogued) for the edge
// clearance: their radii, and the surfaces in full when either has conic
// or asphere terms.
func (p *prepared) setOuter(item int32, first, last optics.Surface) {
	o := outer{first: first.Radius, last: last.Radius, surf: -1}
	if first.IsAsphere() || last.IsAsphere() {
		o.surf = int32(len(p.surfs))
		p.surfs = append(p.surfs, first, last)
	}
	p.outer[item] = o
}

// add appends the candidate of one part in one orientation, by its
// cardinal points c in air, its clear semi-aperture and the pieces in the
// drawer.
func (p *prepared) add(c optics.Cardinal, semi float64, qty int, item int32, rev bool) {
	p.cands = append(p.cands, cand{
		item: item, rev: rev, qty: int8(min(max(qty, -128), 127)),
		phi: c.Power, L: c.Length, P: c.P, Pp: c.PPrime,
		m:    c.Matrix,
		semi: semi,
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

// tier groups candidates of like price and drawer availability, so that
// the score bound can cut whole groups: four price quartiles, in the drawer
// or not.
func tiers(chunks [][]cand) []int8 {
	n := 0
	for _, cs := range chunks {
		n += len(cs)
	}
	ps := make([]float64, 0, n)
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
			t = append(t, k+4*int8(b2i(cs[i].qty < 1)))
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
	keys := make([]sortKey, n)
	radix := true
	for i := range all {
		phi := all[i].phi
		keys[i] = sortKey{u: orderedBits(phi), i: int32(i), tier: t[i]}
		radix = radix && phi == phi && phi != 0 // no NaN, no signed zeros
	}
	if radix {
		keys = radixSort(keys, make([]sortKey, n))
	} else {
		slices.SortFunc(keys, func(a, b sortKey) int {
			if c := cmp.Compare(a.tier, b.tier); c != 0 {
				return c
			}
			if c := cmp.Compare(all[a.i].phi, all[b.i].phi); c != 0 {
				return c
			}
			return cmp.Compare(a.i, b.i)
		})
	}
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

// sortKey is a candidate's place in byTier's sort: its tier, its power as
// orderedBits, its index.
type sortKey struct {
	u    uint64
	i    int32
	tier int8
}

// orderedBits maps a float64 other than NaN to an integer of the same
// order (negative numbers have their bits inverted, positive ones their
// sign bit set; the IEEE 754 layout orders magnitudes as integers), -0
// below +0.
func orderedBits(x float64) uint64 {
	u := math.Float64bits(x)
	if u>>63 != 0 {
		return ^u
	}
	return u | 1<<63
}

// fromOrderedBits is the float64 x of orderedBits(x).
func fromOrderedBits(u uint64) float64 {
	if u>>63 != 0 {
		return math.Float64frombits(u &^ (1 << 63))
	}
	return math.Float64frombits(^u)
}

// radixSort sorts keys by tier, then u, ties in their order: one stable
// counting pass per radixBits-bit digit of u, least significant first,
// skipping the digits every key shares, and one by tier. buf is as long as
// keys; the result is one of the two.
func radixSort(keys, buf []sortKey) []sortKey {
	var at [1 << radixBits]int
	for shift := 0; shift < 64+radixBits; shift += radixBits {
		clear(at[:])
		for i := range keys {
			at[keys[i].digit(shift)]++
		}
		if len(keys) == 0 || at[keys[0].digit(shift)] == len(keys) {
			continue
		}
		pos := 0
		for d, c := range at {
			at[d], pos = pos, pos+c
		}
		for i := range keys {
			d := keys[i].digit(shift)
			buf[at[d]] = keys[i]
			at[d]++
		}
		keys, buf = buf, keys
	}
	return keys
}

// radixBits is the width of radixSort's digits: six passes cover the 64
// bits, and the counts (16 KB) stay in the first-level cache.
const radixBits = 11

// digit is the digit of u at shift, or the tier past the last digit.
func (k *sortKey) digit(shift int) int {
	if shift >= 64 {
		return int(uint8(k.tier))
	}
	return int(k.u>>shift) & (1<<radixBits - 1)
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
