package search

import "math"

// node is a node of the tree over the candidates sorted by power: the range
// of its candidates and bounds on everything the pruning tests use.
type node struct {
	lo, hi       int32 // candidates [lo, hi)
	left, right  int32 // children; -1 for a leaf
	phiLo, phiHi float64
	pMin, pMax   float64 // front principal point
	ppMin, ppMax float64 // back principal point
	lMin         float64 // length
	dMin, dMax   float64 // principal-point separation
	priceMin     float64
	awayMin      float64
	semiMax      float64 // clear semi-aperture
}

const leafSize = 8

// forest is the power trees over a search's candidates: the nodes, and the
// root of each tree; and the first parts in the order firstOrder gives for
// the gap minimum gapMin (ordered is nil until it is worked out), which
// every search of the candidates with that minimum shares.
type forest struct {
	nodes   []node
	roots   []int32
	ordered []sortKey
	gapMin  float64
}

// buildTree builds the tree over cands[lo:hi] (all of one sign of power)
// and returns its root, or -1 when the range is empty.
func (s *search) buildTree(lo, hi int32) int32 {
	if lo >= hi {
		return -1
	}
	id := int32(len(s.tree.nodes))
	s.tree.nodes = append(s.tree.nodes, node{lo: lo, hi: hi, left: -1, right: -1})
	if hi-lo > leafSize {
		mid := (lo + hi) / 2
		l := s.buildTree(lo, mid)
		r := s.buildTree(mid, hi)
		nodes := s.tree.nodes
		nodes[id].left, nodes[id].right = l, r
		nodes[id].bounds(nodes[l], nodes[r])
		return id
	}
	n := &s.tree.nodes[id]
	n.phiLo, n.phiHi = s.c[lo].phi, s.c[hi-1].phi
	n.pMin, n.pMax, n.ppMin, n.ppMax = math.Inf(1), math.Inf(-1), math.Inf(1), math.Inf(-1)
	n.lMin, n.dMin, n.dMax = math.Inf(1), math.Inf(1), math.Inf(-1)
	n.priceMin, n.awayMin = math.Inf(1), math.Inf(1)
	n.semiMax = math.Inf(-1)
	for i := lo; i < hi; i++ {
		c := &s.c[i]
		n.pMin, n.pMax = min(n.pMin, c.P), max(n.pMax, c.P)
		n.ppMin, n.ppMax = min(n.ppMin, c.Pp), max(n.ppMax, c.Pp)
		n.lMin = min(n.lMin, c.L)
		d := c.sep()
		n.dMin, n.dMax = min(n.dMin, d), max(n.dMax, d)
		n.priceMin, n.awayMin = min(n.priceMin, c.price), min(n.awayMin, c.away())
		n.semiMax = max(n.semiMax, c.semi)
	}
	return id
}

func (n *node) bounds(l, r node) {
	n.phiLo, n.phiHi = l.phiLo, r.phiHi
	n.pMin, n.pMax = min(l.pMin, r.pMin), max(l.pMax, r.pMax)
	n.ppMin, n.ppMax = min(l.ppMin, r.ppMin), max(l.ppMax, r.ppMax)
	n.lMin = min(l.lMin, r.lMin)
	n.dMin, n.dMax = min(l.dMin, r.dMin), max(l.dMax, r.dMax)
	n.priceMin, n.awayMin = min(l.priceMin, r.priceMin), min(l.awayMin, r.awayMin)
	n.semiMax = max(l.semiMax, r.semiMax)
}

// margin widens every pruning test so that rounding never prunes a pair
// the exhaustive search would keep.
func margin(x float64) float64 { return 1e-9 * (1 + math.Abs(x)) }

// restBound is the least score of any pair a then b with b in n, leaving
// out the envelope and error terms.
func (s *search) restBound(a *cand, n *node) float64 {
	w := s.sc.w
	return w.Elements + w.Price*(a.price+n.priceMin) + w.Drawer*(a.away()+n.awayMin)
}

// open tells whether some candidate b in node n could, after a, give a
// layout the search keeps: within the gap, envelope and clearance limits,
// and with a score no worse than the current bound. It also returns a lower
// bound on the score of any such layout, by which open nodes are visited.
func (s *search) open(a *cand, n *node) (bool, float64) {
	bound := s.bound()
	rest := s.restBound(a, n)
	if rest > bound+margin(bound) {
		return false, rest
	}
	// Envelope limit: the length maximum, and what the score bound allows.
	envMax := s.lim.lengthMax
	if !math.IsInf(bound, 1) {
		envMax = min(envMax, (bound+margin(bound)-rest)*s.sc.lref/s.sc.w.Envelope)
	}
	gMin := s.lim.gapMin
	gMax := envMax - a.L - n.lMin
	gMax += margin(gMax)
	if gMax < gMin {
		return false, rest
	}
	f2 := span(1/n.phiLo, 1/n.phiHi)
	if s.nodeOut(a, n, f2) {
		return false, rest
	}
	var ok bool
	var gLo, miss float64
	switch s.req.Kind {
	case Focus:
		ok, gLo = s.openFocus(a, n, f2, gMin, gMax)
	case Expand:
		ok, gLo, miss = s.openExpand(a, n, f2, gMin, gMax)
	case Match:
		ok, gLo = s.openMatch(a, n, gMin, gMax)
	default:
		ok, gLo = s.openImage(a, n, gMin, gMax)
	}
	if !ok {
		return false, rest
	}
	env := a.L + max(gMin, gLo) + n.lMin
	lb := rest + s.sc.w.Envelope*env/s.sc.lref
	if miss > 0 {
		lb += s.sc.w.Error * s.sc.errTerm(miss)
	}
	return lb <= bound+margin(bound), lb
}

// openFocus: with e = f1 + f2 (1 - f1/f0) from Gullstrand's equation (see
// spacingFor) the gap is linear in f2, and so is the back clearance
// P'b + f2 (1 - f0/f1). It returns the least gap possible.
func (s *search) openFocus(a *cand, n *node, f2 iv, gMin, gMax float64) (bool, float64) {
	f0 := s.req.EFL
	f1 := a.efl()
	e := pt(f1).add(f2.mul(pt(1 - f1/f0)))
	g := e.sub(iv{n.pMin, n.pMax}).add(pt(a.Pp))
	if g.hi+margin(g.hi) < gMin || g.lo-margin(g.lo) > gMax {
		return false, 0
	}
	bc := iv{n.ppMin, n.ppMax}.add(f2.mul(pt(1 - f0/f1)))
	return bc.hi+margin(bc.hi) >= s.lim.bfdMin, g.lo - margin(g.lo)
}

// openMatch: a mode-matching pair has a real input and output waist, so
// on a fixed track the gap leaves room for a positive working distance
// and back clearance at their minimums; the score bound does the rest.
func (s *search) openMatch(a *cand, n *node, gMin, gMax float64) (bool, float64) {
	if T := s.req.Track; T > 0 {
		gMax = min(gMax, T-max(0, s.lim.wdMin)-max(0, s.lim.bfdMin)-a.L-n.lMin)
	}
	return gMax >= gMin-margin(gMin), gMin
}

// openExpand: afocal, so the principal points are f1 + f2 apart and the
// expansion is |f2/f1|. It returns the least gap possible and the least
// departure from the target expansion.
func (s *search) openExpand(a *cand, n *node, f2 iv, gMin, gMax float64) (bool, float64, float64) {
	if a.phi < 0 && n.phiHi < 0 {
		return false, 0, 0
	}
	if s.lim.form == Keplerian && (a.phi < 0 || n.phiHi < 0) || s.lim.form == Galilean && (a.phi > 0) == (n.phiLo > 0) {
		return false, 0, 0
	}
	f1 := a.efl()
	g := pt(f1).add(f2).sub(iv{n.pMin, n.pMax}).add(pt(a.Pp))
	if g.hi+margin(g.hi) < gMin || g.lo-margin(g.lo) > gMax {
		return false, 0, 0
	}
	ratio := f2.mul(pt(1 / f1))
	e := span(math.Abs(ratio.lo), math.Abs(ratio.hi))
	if ratio.lo < 0 && ratio.hi > 0 {
		e.lo = 0
	}
	miss := max(0, max(e.lo-s.req.Expansion, s.req.Expansion-e.hi))
	miss -= margin(s.req.Expansion)
	return miss <= s.lim.admit, g.lo - margin(g.lo), miss
}

// openImage tests the relation every image layout of the pair satisfies:
// with R = T - (principal-point separations of a and b), M = 2 - m - 1/m
// and e the distance between the back principal point of a and the front
// one of b,
//
//	h = M - R (phi1 + phi2 - e phi1 phi2) - phi1 phi2 e^2 = 0,
//
// from T = (principal-point separation of the pair) + f (2 - m - 1/m)
// (object and image distances f (1 - 1/m) and f (1 - m) from the principal
// points; Smith, Modern Optical Engineering, 4th ed., ch. 2) and the pair's
// principal-point separation from Gullstrand's equation (Hecht, Optics,
// 5th ed., ch. 6). An afocal pair satisfies it too. The node stays open
// when the interval of h over the node's bounds holds zero and the
// working distance and back clearance can lie within their limits
// (imageOpen); the least e for which they do, found by bisection, bounds
// the gap from below.
func (s *search) openImage(a *cand, n *node, gMin, gMax float64) (bool, float64) {
	T := s.req.Track
	// A real object and a real image: both distances are positive.
	gMax = min(gMax, T-max(0, s.lim.wdMin)-max(0, s.lim.bfdMin)-a.L-n.lMin)
	if gMax < gMin-margin(gMin) {
		return false, 0
	}
	e := iv{gMin + n.pMin - a.Pp, gMax + n.pMax - a.Pp}
	box := s.imageBoxOf(a, n)
	lo, ok := s.leastImageE(&box, e, imageDepth)
	if !ok {
		return false, 0
	}
	return true, lo - n.pMax + a.Pp - margin(lo)
}

// imageDepth is how many times leastImageE halves the interval of e.
const imageDepth = 6

// leastImageE returns the lower end of the first piece of e, halved depth
// times, on which imageOpen holds, or false when it holds on none: a lower
// bound on e over the layouts of a and the node's parts.
func (s *search) leastImageE(box *imageBox, e iv, depth int) (float64, bool) {
	if !s.imageOpen(box, e, s.win) {
		return 0, false
	}
	if depth == 0 {
		return e.lo, true
	}
	mid := (e.lo + e.hi) / 2
	if lo, ok := s.leastImageE(box, iv{e.lo, mid}, depth-1); ok {
		return lo, true
	}
	return s.leastImageE(box, iv{mid, e.hi}, depth-1)
}

// imageBox is what the tests of a first part a and a node of second parts
// use that does not depend on e, worked out once for the bisection of e
// by the same operations as written out in full, so to the same values.
type imageBox struct {
	a     *cand
	phi   [2]float64 // the node's least and greatest power
	sum   [2]float64 // a.phi + phi
	pp    iv         // the node's back principal points
	R     iv         // T - (principal-point separations of a and b)
	p12   iv         // phi1 phi2
	base  iv         // M - R (phi1 + phi2)
	scale float64    // |M| + |R| |phi1 + phi2|
	bcHi  float64    // greatest back clearance the marginal ray allows
}

func (s *search) imageBoxOf(a *cand, n *node) imageBox {
	T, sa := s.req.Track, a.sep()
	R := iv{T - sa - n.dMax, T - sa - n.dMin}
	phi1, phi2 := pt(a.phi), iv{n.phiLo, n.phiHi}
	mm := s.img.mm
	b := imageBox{a: a, phi: [2]float64{n.phiLo, n.phiHi}, pp: iv{n.ppMin, n.ppMax}, R: R,
		p12: phi1.mul(phi2), base: pt(mm).sub(R.mul(phi1.add(phi2))),
		scale: math.Abs(mm) + R.mag()*phi1.add(phi2).mag(), bcHi: math.Inf(1)}
	b.sum = [2]float64{a.phi + n.phiLo, a.phi + n.phiHi}
	if s.img.naChecked {
		b.bcHi = math.Abs(s.req.Mag) * n.semiMax * (1 + apertureSlack) / s.req.NA
	}
	return b
}

// imageRelation tells whether the relation every image layout satisfies
// can hold for some b in the box's node with e in the given interval.
func (b *imageBox) imageRelation(e iv) bool {
	// h = M - R (phi1 + phi2) + phi1 phi2 (R e - e^2), with the exact range
	// of q = R e - e^2 over the box (concave in e, linear in R) so that e,
	// the widest interval, is not counted twice.
	q := reMinusESq(b.R, e)
	h := b.base.add(b.p12.mul(q))
	return h.holdsZero(1e-9 * (b.scale + b.p12.mag()*q.mag()))
}

// reMinusESq is the exact range of R e - e^2 over a box: the least value at
// a corner (the function is concave in e and linear in R), the greatest at
// R = R_lo or R_hi with e as near R/2 as the box allows.
func reMinusESq(R, e iv) iv {
	f := func(r, x float64) float64 { return r*x - x*x }
	lo := min(min(f(R.lo, e.lo), f(R.lo, e.hi)), min(f(R.hi, e.lo), f(R.hi, e.hi)))
	clamp := func(x float64) float64 { return max(e.lo, min(e.hi, x)) }
	hi := max(f(R.lo, clamp(R.lo/2)), f(R.hi, clamp(R.hi/2)))
	return iv{lo, hi}
}
