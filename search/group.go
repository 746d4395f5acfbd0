package search

import (
	"fmt"
	"math"
	"slices"
)

// Grouping: one row per real alternative.
//
// Layouts that use the same set of parts (another order, other
// orientations, the other root of the same pair) are one optical solution
// built differently; parts that are optically the same ("twins") from
// other suppliers or under other part numbers make the same solution
// bought elsewhere. The results hold one row per set of parts, twins taken
// as one part: the best layout of the set is the row, the others that meet
// follow it in Result.Arrangements (best first), and the twins they use in
// place of the row's parts are named in Result.Alternatives.
//
// Two parts are twins when, at the search wavelength in air, their EFLs
// differ by at most 0.5 % and their front and back focal distances by at
// most 0.5 % of the EFL, and their diameters by at most 0.01 mm: then each
// orientation of one focuses where the same orientation of the other does,
// within a tolerance well inside a stock part's usual EFL tolerance of
// 1-2 % (common practice). Twins are found in part-ID order: each part
// joins the first part before it that it matches, so a class is led by its
// smallest ID and never chains past 0.5 % of its leader.
const twinTol = 0.005

// twinDiameterTol is the diameter difference, mm, within which two parts
// count as the same size.
const twinDiameterTol = 0.01

// twinClasses gives each item the item that leads its class of twins (an
// item is its own leader when it has no twin); -1 for an item that took no
// part in the search.
func twinClasses(p *prepared, cs []cand) []int32 {
	class := make([]int32, p.items)
	for i := range class {
		class[i] = -1
	}
	// The forward candidate of each item in the search, until the item
	// is classed; the items in part-ID order (keys are the ranks 0..n-1).
	for i := range cs {
		if c := &cs[i]; !c.rev {
			class[c.item] = int32(i)
		}
	}
	byKey := make([]int32, p.items)
	for item, k := range p.keys {
		byKey[k] = int32(item)
	}
	// leaders by diameter, each list sorted by EFL
	leaders := map[int64][]leader{}
	for _, item := range byKey {
		if class[item] < 0 {
			continue
		}
		c := &cs[class[item]]
		x := leader{f: c.efl(), ff: c.ffd(), bf: c.bfd(), d: p.info(item).diameter, item: item}
		class[item] = item
		bucket := int64(math.Round(x.d / twinDiameterTol))
		found := false
		for _, b := range []int64{bucket - 1, bucket, bucket + 1} {
			ls := leaders[b]
			lo, hi := x.f-twinTol*math.Abs(x.f)*1.01, x.f+twinTol*math.Abs(x.f)*1.01
			for k := firstAtLeast(ls, lo); k < len(ls) && ls[k].f <= hi; k++ {
				if twins(ls[k].f, ls[k].ff, ls[k].bf, ls[k].d, x.f, x.ff, x.bf, x.d) {
					class[item] = ls[k].item
					found = true
					break
				}
			}
			if found {
				break
			}
		}
		if !found {
			ls := leaders[bucket]
			ls = slices.Insert(ls, firstAtLeast(ls, x.f), x)
			leaders[bucket] = ls
		}
	}
	return class
}

// leader is a part that leads a class of twins, by the figures the
// criterion compares.
type leader struct {
	f, ff, bf, d float64
	item         int32
}

// firstAtLeast is the first index of leaders sorted by EFL whose EFL is at
// least f (sort.Search's answer, without the closure).
func firstAtLeast(ls []leader, f float64) int {
	lo, hi := 0, len(ls)
	for lo < hi {
		m := int(uint(lo+hi) >> 1)
		if ls[m].f >= f {
			hi = m
		} else {
			lo = m + 1
		}
	}
	return lo
}

// twins applies the criterion to a leader (f, ff, bf, d) and a part.
func twins(f, ff, bf, d, g, gf, gb, e float64) bool {
	tol := twinTol * math.Abs(f)
	return math.Abs(f-g) <= tol && math.Abs(ff-gf) <= tol && math.Abs(bf-gb) <= tol && math.Abs(d-e) <= twinDiameterTol
}

// groupKey is the set of twin classes a layout uses, in a fixed order.
type groupKey [2]int32

func (s *search) groupKey(class []int32, l *layout) groupKey {
	a := class[s.c[l.a].item]
	if !l.pair() {
		return groupKey{a, -1}
	}
	b := class[s.c[l.b].item]
	if b < a {
		a, b = b, a
	}
	return groupKey{a, b}
}

// groups splits layouts, in their order, into groups of the same key, each
// group in that order and the groups by their first layout.
func (s *search) groups(class []int32, ls []layout) [][]int {
	at := map[groupKey]int{}
	var gs [][]int
	for i := range ls {
		k := s.groupKey(class, &ls[i])
		g, ok := at[k]
		if !ok {
			g = len(gs)
			at[k] = g
			gs = append(gs, nil)
		}
		gs[g] = append(gs[g], i)
	}
	return gs
}

// countGroups is the number of distinct keys among the layouts.
func (s *search) countGroups(class []int32, ls []layout) int {
	seen := map[groupKey]bool{}
	for i := range ls {
		seen[s.groupKey(class, &ls[i])] = true
	}
	return len(seen)
}

// An Alternative is a part optically the same as one of the row's (see
// "Grouping" above) that an arrangement of the row uses in its place.
type Alternative struct {
	For      string  `json:"for"`  // the row's part, SUPPLIER:PART
	Part     string  `json:"part"` // the twin, SUPPLIER:PART
	Price    *Amount `json:"price,omitempty"`
	InDrawer bool    `json:"in_drawer"`
}

// Text is "also TARNWICK:KC-12-125, 15.90 XTS".
func (a Alternative) Text() string {
	s := "also " + a.Part
	if a.Price != nil {
		s += ", " + a.Price.String()
	}
	if a.InDrawer {
		s += ", in the drawer"
	}
	return s
}

// alternatives lists the twins the arrangements use in place of the row's
// parts, once each, in the arrangements' order.
func (s *search) alternatives(p *prepared, class []int32, row *layout, others []layout) []Alternative {
	mine := map[int32]int32{} // class -> the row's item
	for _, ci := range row.cands() {
		it := s.c[ci].item
		mine[class[it]] = it
	}
	seen := map[int32]bool{}
	for _, it := range mine {
		seen[it] = true
	}
	var out []Alternative
	for k := range others {
		for _, ci := range others[k].cands() {
			c := &s.c[ci]
			if seen[c.item] {
				continue
			}
			seen[c.item] = true
			for_ := p.info(mine[class[c.item]])
			e := p.info(c.item)
			a := Alternative{For: for_.supplier + ":" + for_.name, Part: e.supplier + ":" + e.name, InDrawer: c.qty > 0}
			if e.price > 0 {
				a.Price = &Amount{Amount: e.price, Currency: e.currency}
			}
			out = append(out, a)
		}
	}
	return out
}

// cands are the candidate indices of the layout, in light order.
func (l *layout) cands() []int32 {
	if l.pair() {
		return []int32{l.a, l.b}
	}
	return []int32{l.a}
}

// arrangementsText is "+3" for three other arrangements, "" for none.
func arrangementsText(n int) string {
	if n == 0 {
		return ""
	}
	return fmt.Sprintf("+%d", n)
}
