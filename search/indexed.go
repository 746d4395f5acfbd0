package search

import (
	"context"
	"slices"
	"strings"

	"cardinal/catalog"
	"cardinal/optics"
)

// FindIndexed runs the pruned search on a catalog's search index: the
// candidates come from the index records (the stored cardinal points at
// the reference wavelength, or the paraxial prescription at another), and
// only the layouts that go on to the real-ray stage have their full
// prescriptions read, from the index's snapshot of the catalog. It returns
// what Find returns on the same parts read in full.
func FindIndexed(ctx context.Context, ix *catalog.Index, req Requirement) (Outcome, error) {
	if err := req.Validate(); err != nil {
		return Outcome{}, err
	}
	return runPrepared(prepareIndex(ctx, ix, req), req, true)
}

// prepareIndex is prepare on index records: in one pass over the parts it
// filters them and works out the candidates, touching only the
// prescription's radii, thicknesses and glasses, and those only away from
// the reference wavelength.
func prepareIndex(ctx context.Context, ix *catalog.Index, req Requirement) *prepared {
	lambda := req.Lambda()
	air := optics.Air.Index(lambda)
	var n []float64 // index of each glass at lambda; nil at the reference
	if lambda != catalog.Wavelength {
		n = make([]float64, len(ix.Media))
		for i, m := range ix.Media {
			n[i] = m.Index(lambda)
		}
	}
	keys := indexRanks(ix.Parts)
	single := func(i int) bool { return ix.Parts[i].Symmetric }
	p := inChunks(len(ix.Parts), single, func(q *prepared, lo, hi int) {
		prepareIndexChunk(q, ix, lo, hi, req, n, air)
	})
	p.keys = keys
	p.info = func(i int32) partInfo {
		q := &ix.Parts[i]
		return partInfo{supplier: q.Supplier, name: q.Name, currency: q.Currency, price: q.Price, diameter: q.Diameter}
	}
	full := map[int32]optics.Part{}
	tols := map[int32]optics.Tolerances{}
	p.tols = func(i int32) optics.Tolerances { return tols[i] }
	p.full = func(i int32) optics.Part {
		part, ok := full[i]
		if !ok {
			panic("search: full prescription asked for before it was fetched")
		}
		return part
	}
	p.fetch = func(items []int32) error {
		ids := make([]int64, 0, len(items))
		for _, i := range items {
			if _, ok := full[i]; !ok {
				ids = append(ids, ix.Parts[i].ID)
			}
		}
		entries, err := ix.Entries(ctx, ids)
		if err != nil {
			return err
		}
		for _, i := range items {
			if e, ok := entries[ix.Parts[i].ID]; ok {
				full[i], tols[i] = e.Part, e.Tolerances
			}
		}
		return nil
	}
	p.finish(req)
	return p
}

// prepareIndexChunk computes the candidates of ix.Parts[lo:hi] into p.
func prepareIndexChunk(p *prepared, ix *catalog.Index, lo, hi int, req Requirement, n []float64, air float64) {
	used := make([]bool, len(ix.Media))
	for i := lo; i < hi; i++ {
		q := &ix.Parts[i]
		if reason := setAside(q.Supplier, q.Diameter, q.Quantity, req); reason != "" {
			p.skipped[reason]++
			continue
		}
		for _, g := range q.Glass {
			used[g] = true
		}
		m := q.Matrix
		if n != nil {
			m = q.MatrixAt(n, air)
		}
		c := optics.FromMatrix(m, air, air)
		c.Length = q.Length()
		if c.Afocal {
			p.skipped["no focusing power (afocal part)"]++
			continue
		}
		p.setOuter(int32(i), q.First(), q.Last())
		p.add(c, q.Aperture/2, q.Quantity, int32(i), false)
		if !q.Symmetric {
			// The part turned around, as prepareChunk turns it.
			rc := optics.FromMatrix(optics.Mat2{A: m.D, B: m.B, C: m.C, D: m.A}, 1, 1)
			rc.Length = c.Length
			p.add(rc, q.Aperture/2, q.Quantity, int32(i), true)
		}
	}
	for g, u := range used {
		if u {
			m := ix.Media[g]
			if lo, hi := m.Range(); optics.RangeWarning(m, req.Lambda()) != "" {
				p.outside = append(p.outside, rangeNote(m.Name(), lo, hi))
			}
		}
	}
}

// indexRanks gives each part the rank of its ID: the index reads them in
// that order already, which is checked rather than trusted.
func indexRanks(parts []catalog.IndexPart) []int32 {
	keys := make([]int32, len(parts))
	var prev, cur []byte
	sorted := true
	for i := range parts {
		keys[i] = int32(i)
		cur = append(append(append(cur[:0], parts[i].Supplier...), ':'), parts[i].Name...)
		if i > 0 && string(prev) >= string(cur) {
			sorted = false
		}
		prev, cur = cur, prev
	}
	if sorted {
		return keys
	}
	ids := make([]string, len(parts))
	for i := range parts {
		ids[i] = parts[i].PartID()
	}
	idx := slices.Clone(keys)
	slices.SortStableFunc(idx, func(a, b int32) int { return strings.Compare(ids[a], ids[b]) })
	for rank, i := range idx {
		keys[i] = int32(rank)
	}
	return keys
}

// fetchJudged has the full prescriptions of the parts of the layouts the
// real-ray stage will trace read, when they are not at hand.
func (s *search) fetchJudged(p *prepared, ls []layout) error {
	return s.fetchParts(p, ls[:min(len(ls), maxTraced)])
}

// fetchParts has the full prescriptions of the parts of the layouts read,
// when they are not at hand.
func (s *search) fetchParts(p *prepared, ls []layout) error {
	if p.fetch == nil {
		return nil
	}
	var items []int32
	for k := range ls {
		l := &ls[k]
		items = append(items, s.c[l.a].item)
		if l.pair() {
			items = append(items, s.c[l.b].item)
		}
	}
	return p.fetch(items)
}
