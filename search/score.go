package search

import (
	"math"
	"sort"
)

// Weights of the ranking score. The score of a result is
//
//	Error * |achieved - target| / tolerance      (0 for a pair solved at the target)
//	+ Envelope * envelope / reference length      (EFL for focus, track for image, 100 mm for expand)
//	+ Elements * (number of parts - 1)
//	+ Price * sum over the pieces to order of price / median price of the parts in its currency
//	+ Drawer * number of pieces to order
//	+ Quality * sharpness term                    (only when real rays are traced, see below)
//	+ Yield * max(0, 90 - yield %) / 10           (the build study, see below)
//	+ Spread * 95 % spread of the target after compensation / tolerance
//
// The pieces to order are the pieces the layout uses less those the drawer
// holds: a pair that uses one part twice needs two pieces, so with one in
// the drawer one is to order. A piece already in the drawer costs nothing
// to this build. A price counts against the median of the stated prices of
// the catalog's parts in the same currency (amounts in different
// currencies are never added or compared directly); an unknown price counts
// as that median.
//
// The default weights are Error 1, Envelope 1, Elements 0.5, Price 0.5,
// Drawer 1, Quality 1, Yield 1, Spread 0. So a piece to order at the median price costs 1.5: a
// layout built entirely from the drawer that meets every requirement ranks
// above one that needs two median-priced pieces bought unless that purchase
// is better on the other terms by more than 3, for example three reference
// lengths shorter, or a blur three doublings smaller. --prefer multiplies
// one weight by three.
//
// Lower is better. The first five terms are each a sum over the parts of
// something that can only grow, which is what lets the search bound the
// score of the pairs it has not evaluated (see prune.go).
//
// The quality term is added by the real-ray stage (quality.go) to the
// survivors of the first-order ranking. With A the Airy radius, s the RMS
// spot radius at best focus on axis (and, where a field is given, at the
// field edge on the same plane) and c the RMS blur of the focal shift over
// the band, each field point counts
//
//	log2( sqrt(A^2 + s^2 + c^2) / A )
//
// and the term is their mean: 0 for a perfect image, about 0.04 for a
// spot a third of the Airy radius, 1 when the blur is twice the Airy
// radius, and one more for every further doubling. So halving the blur is
// worth as much as a full tolerance of first-order error or one reference
// length of envelope.
//
// The yield and spread terms come from the build study of each ranked
// result (study.go): a result whose builds meet the tolerance in fewer
// than 90 % of cases sinks by one per 10 % missing (at 80 % it costs as
// much as a tolerance of error), and --prefer robust weights that three
// times and adds the half-width of the target's 95 % spread over the
// tolerance, so that of two results on target the one less sensitive to
// its parts' tolerances ranks first.
type Weights struct {
	Error, Envelope, Elements, Price, Drawer float64
	Quality                                  float64
	Yield, Spread                            float64
}

// WeightsFor returns the weights of a preference: the balanced default, or
// one term made three times as heavy.
func WeightsFor(p Prefer) Weights {
	w := Weights{Error: 1, Envelope: 1, Elements: 0.5, Price: 0.5, Drawer: 1, Quality: 1, Yield: 1}
	switch p {
	case PreferRobust:
		w.Yield *= 3
		w.Spread = 1
	case PreferSharp:
		w.Quality *= 3
	case PreferDraw:
		w.Drawer *= 3
	case PreferShort:
		w.Envelope *= 3
	case PreferCheap:
		w.Price *= 3
	}
	return w
}

// refLength is the length the envelope term is divided by.
func refLength(r Requirement) float64 {
	switch r.Kind {
	case Focus:
		return r.EFL
	case Image:
		return r.Track
	case Match:
		if r.Track > 0 {
			return r.Track
		}
	}
	return 100
}

// priceReferences are the medians of the stated prices, by currency (the
// empty currency is a currency of its own).
func priceReferences(n int, info func(int32) partInfo) map[string]float64 {
	count := map[string]int{}
	for i := range n {
		if e := info(int32(i)); e.price > 0 {
			count[e.currency]++
		}
	}
	by := make(map[string][]float64, len(count))
	for cur, k := range count {
		by[cur] = make([]float64, 0, k)
	}
	for i := range n {
		if e := info(int32(i)); e.price > 0 {
			by[e.currency] = append(by[e.currency], e.price)
		}
	}
	refs := make(map[string]float64, len(by))
	for cur, ps := range by {
		refs[cur] = median(ps)
	}
	return refs
}

// median of a non-empty list; the list is sorted in place.
func median(ps []float64) float64 {
	sort.Float64s(ps)
	n := len(ps)
	if n%2 == 1 {
		return ps[n/2]
	}
	return (ps[n/2-1] + ps[n/2]) / 2
}

// priceTerm is the price of one piece over the median of its currency; an
// unknown price counts as the median.
func priceTerm(price float64, currency string, refs map[string]float64) float64 {
	ref := refs[currency]
	if !(price > 0) || !(ref > 0) {
		return 1
	}
	return price / ref
}

// scorer computes scores for one requirement.
type scorer struct {
	w    Weights
	lref float64
	tol  float64 // absolute tolerance of the first-order target
}

func newScorer(r Requirement) scorer {
	return scorer{w: WeightsFor(r.Prefer), lref: refLength(r), tol: scoreTol(r)}
}

// errTerm is |error| / tolerance, 0 for no error.
func (s scorer) errTerm(err float64) float64 {
	if err == 0 {
		return 0
	}
	return math.Abs(err) / s.tol // tol is never 0 (scoreTol)
}

// singlet scores one part; c.price and c.away are 0 when the drawer holds
// a piece.
func (s scorer) singlet(c *cand, err, envelope float64) float64 {
	return s.w.Error*s.errTerm(err) + s.w.Envelope*envelope/s.lref + s.w.Price*c.price + s.w.Drawer*c.away()
}

// pair scores two parts; away is the number of pieces (0, 1 or 2) to order
// and price their price term (pairAway, pairPrice).
func (s scorer) pair(err, envelope, away, price float64) float64 {
	return s.w.Error*s.errTerm(err) + s.w.Envelope*envelope/s.lref + s.w.Elements +
		s.w.Price*price + s.w.Drawer*away
}

// pairAway counts the pieces of a pair to order after the drawer's: the
// same part twice needs two pieces. It is never less than a.away + b.away,
// which the pruning bounds use.
func pairAway(a, b *cand) float64 {
	if a.item == b.item {
		return float64(max(0, 2-int(a.qty)))
	}
	return a.away() + b.away()
}

// pairPrice is the price term of the pieces of a pair to order; never less
// than a.price + b.price.
func (s *search) pairPrice(a, b *cand) float64 {
	if a.item == b.item {
		return float64(max(0, 2-int(a.qty))) * s.units[a.item]
	}
	return a.price + b.price
}

// onTarget is the first-order error that counts as exactly on target: a
// relative 1e-9 of the target, far below any tolerance a person gives and
// above the rounding of a pair solved at the target. It makes a zero
// tolerance mean "exactly" without dividing by zero.
func onTarget(r Requirement) float64 { return 1e-9 * math.Abs(target(r)) }

// scoreTol is the tolerance the error is scored against: the
// requirement's, or onTarget for a zero tolerance (which means "exactly").
func scoreTol(r Requirement) float64 {
	if t := firstOrderTol(r); t > 0 {
		return t
	}
	return onTarget(r)
}

// firstOrderTol is the absolute tolerance on the requirement's target.
func firstOrderTol(r Requirement) float64 {
	switch r.Kind {
	case Focus:
		return r.EFLTol.Abs(r.EFL)
	case Image:
		return r.MagTol.Abs(r.Mag)
	case Match:
		return 1 - r.MinCoupling()
	}
	return r.ExpandTol.Abs(r.Expansion)
}

// buildTerm is the yield and spread part of the score of a result whose
// build study gave b; tolPct is the requirement's tolerance in percent of
// its target.
func (w Weights) buildTerm(b BuildFigures, tolPct float64) float64 {
	t := w.Yield * math.Max(0, 90-b.Yield) / 10
	if w.Spread != 0 && tolPct > 0 {
		t += w.Spread * math.Max(math.Abs(b.SpreadLow), math.Abs(b.SpreadHigh)) / tolPct
	}
	return t
}
