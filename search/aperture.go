package search

import "math"

// Pruning by the clear apertures. A layout whose paraxial marginal ray
// passes outside a part's clear aperture fails the aperture check
// (rayHeights) and is never kept by a search that keeps only the layouts
// that meet every check; the near-miss search keeps such layouts, so it
// does not prune this way. When nothing meets, the counts of the failed
// checks explain why (why.go): the search then runs again without this
// pruning (pruned), so that they count what they counted before it.
//
// For a collimated input beam of radius y0 (focus and expand) the heights
// need no solved gap. With the pair's power phi (the target 1/EFL, or 0
// for an afocal pair) and e the distance from the back principal point of
// a to the front one of b, Gullstrand's equation phi = phi1 + phi2 -
// e phi1 phi2 (Hecht, Optics, 5th ed., ch. 6) gives the height at the
// principal planes of b, y0 (1 - e phi1) = y0 (phi - phi1) / phi2; the ray
// between the parts has the angle -phi1 y0 and after b -phi y0 (the pair's
// power acting on a ray parallel to the axis; W. J. Smith, Modern Optical
// Engineering, 4th ed., ch. 2), so at b's vertices, P and P' from them,
//
//	front: y0 [(phi - phi1) / phi2 + P phi1]
//	back:  y0 [(phi - phi1) / phi2 + P' phi].
//
// The first part alone sees y0 at its first vertex and A y0 at its last
// (its reduced matrix [A B; C D] acting on a ray parallel to the axis).

// apertureSlack widens every aperture test, so that rounding never prunes
// a layout the exhaustive search keeps.
const apertureSlack = 1e-9

// setAperture turns the aperture pruning on where it applies: focus and
// expand with a beam diameter, when the search is strict.
func (s *search) setAperture() {
	s.beamY = 0
	s.setImage()
	if !s.req.ChecksAperture() {
		return
	}
	switch s.req.Kind {
	case Focus:
		s.beamY, s.phi0 = s.req.BeamDiameter()/2, 1/s.req.EFL
	case Expand:
		s.beamY, s.phi0 = s.req.BeamDiameter()/2, 0
	}
}

// imageTerms are the figures of an image requirement that imageOpen and
// imageRelation use for every node they test, worked out once per search
// (the same operations, so the same values, as written out in full).
type imageTerms struct {
	oneMinusInvM, oneMinusM float64 // 1 - 1/m and 1 - m
	mm                      float64 // 2 - m - 1/m
	slack                   float64 // 1e-6 of the track
	bcLo                    float64 // least back clearance: 0, or the minimum when strict
	naChecked               bool    // strict, and the marginal ray's height is checked at b
}

// setImage works out the image terms for the search as it is now (strict
// or not).
func (s *search) setImage() {
	m := s.req.Mag
	s.img = imageTerms{oneMinusInvM: 1 - 1/m, oneMinusM: 1 - m, mm: 2 - m - 1/m, slack: 1e-6 * s.req.Track}
	if s.strict() {
		s.img.bcLo = max(0, s.lim.bfdMin)
		s.img.naChecked = s.req.ChecksAperture() && s.req.NA > 0
	}
}

// strict tells whether the search may prune layouts that fail a check:
// it keeps only layouts that meet, and is not counting why none does.
func (s *search) strict() bool { return !s.misses && !s.lax }

// firstOut tells whether candidate a, as the first part of a pair, passes
// the beam outside its own clear aperture, whatever follows it.
func (s *search) firstOut(a *cand) bool {
	if s.beamY <= 0 || !s.strict() {
		return false
	}
	return s.beamY*max(1, math.Abs(a.m.A)) > a.semi*(1+apertureSlack)
}

// secondOut tells whether b after a passes the beam outside b's clear
// aperture (the heights above, at b's two vertices).
func (s *search) secondOut(a, b *cand) bool {
	if s.beamY <= 0 || !s.strict() {
		return false
	}
	y := (s.phi0 - a.phi) / b.phi
	front, back := y+b.P*a.phi, y+b.Pp*s.phi0
	scale := math.Abs(y) + math.Abs(b.P*a.phi) + math.Abs(b.Pp*s.phi0)
	return s.beamY*(max(math.Abs(front), math.Abs(back))-apertureSlack*scale) > b.semi*(1+apertureSlack)
}

// nodeOut tells whether every b in node n after a passes the beam outside
// its clear aperture: the least heights over the node's bounds exceed its
// largest clear semi-aperture.
func (s *search) nodeOut(a *cand, n *node, f2 iv) bool {
	if s.beamY <= 0 || !s.strict() {
		return false
	}
	y := f2.mul(pt(s.phi0 - a.phi))
	front := y.add(iv{n.pMin, n.pMax}.mul(pt(a.phi)))
	back := y.add(iv{n.ppMin, n.ppMax}.mul(pt(s.phi0)))
	scale := y.mag() + max(math.Abs(n.pMin), math.Abs(n.pMax))*math.Abs(a.phi) +
		max(math.Abs(n.ppMin), math.Abs(n.ppMax))*math.Abs(s.phi0)
	least := max(front.least(), back.least()) - apertureSlack*scale
	return s.beamY*least > n.semiMax*(1+apertureSlack)
}

// For an image, a pair's layouts are fixed by e once the track and the
// magnification m are: with phi = phi1 + phi2 - e phi1 phi2 the pair's
// power, its principal planes lie e phi2 / phi after a's front one and
// e phi1 / phi before b's back one (Hecht, Optics, 5th ed., ch. 6), and the
// object and image lie f (1 - 1/m) and f (1 - m) from them (W. J. Smith,
// Modern Optical Engineering, 4th ed., ch. 2), so that
//
//	wd = (1 - 1/m - e phi2) / phi - P(a)
//	bc = (1 - m - e phi1) / phi + P'(b).
//
// Each is a ratio of functions linear in e and in phi2, monotonic in
// either while the other is held, so over a box of e and phi2 on which phi
// keeps its sign its extremes lie at the corners.

// imageWindow is the range of working distances a pair with a first can
// have and still be solved, a real object within the track, and, when the
// search is strict, kept: beyond the minimum and, when ray heights are
// checked, the marginal ray (angle NA from
// the axial object) and the chief ray (from the field edge, through the
// first vertex) within a's clear aperture: NA wd <= semi at the first
// vertex, and at the last, where the heights are NA (A wd + B) and B h / wd,
// each of the two terms within it. The window holds every working
// distance that passes, perhaps more.
func (s *search) imageWindow(a *cand) iv {
	w := iv{0, s.req.Track}
	if !s.strict() {
		return w
	}
	w.lo = max(0, s.lim.wdMin)
	if !s.req.ChecksAperture() {
		return w
	}
	semi := a.semi * (1 + apertureSlack)
	if na := s.req.NA; na > 0 {
		w.hi = min(w.hi, semi/na)
		if A, B := a.m.A, a.m.B; A != 0 {
			w = w.meet(span((-semi/na-B)/A, (semi/na-B)/A).widen(apertureSlack))
		} else if math.Abs(B) > semi/na {
			return iv{1, 0}
		}
	}
	if h := s.req.ObjectHeight; h > 0 {
		w.lo = max(w.lo, math.Abs(a.m.B)*h/semi*(1-apertureSlack))
	}
	return w
}

// imageOpen tells whether some b in the box's node, after its first part,
// can have a layout with e in the given interval: the relation every image
// layout satisfies (imageRelation), a working distance in win
// (imageWindow) and a positive back clearance; when the search is strict,
// above its minimum and, when ray heights are checked, with the marginal
// ray, of angle NA / m there, within b's clear aperture at its last vertex.
func (s *search) imageOpen(b *imageBox, e iv, win iv) bool {
	var den, wq [4]float64
	var xa [2]float64 // x phi1
	k := 0
	for i, x := range [2]float64{e.lo, e.hi} {
		xa[i] = x * b.a.phi
		for j, p := range b.phi {
			den[k] = b.sum[j] - xa[i]*p
			wq[k] = (s.img.oneMinusInvM - x*p) / den[k]
			k++
		}
	}
	wd, bc := iv{math.Inf(-1), math.Inf(1)}, iv{math.Inf(-1), math.Inf(1)}
	signed := den[0] > 0 && den[1] > 0 && den[2] > 0 && den[3] > 0 || den[0] < 0 && den[1] < 0 && den[2] < 0 && den[3] < 0
	if signed {
		wd = hull(wq).sub(pt(b.a.P))
	}
	slack := s.img.slack
	if wd.hi+slack+1e-6*math.Abs(wd.hi) < win.lo || wd.lo-slack-1e-6*math.Abs(wd.lo) > win.hi {
		return false
	}
	if signed {
		bq := [4]float64{(s.img.oneMinusM - xa[0]) / den[0], (s.img.oneMinusM - xa[0]) / den[1],
			(s.img.oneMinusM - xa[1]) / den[2], (s.img.oneMinusM - xa[1]) / den[3]}
		bc = hull(bq).add(b.pp)
	}
	if bc.hi+slack+1e-6*math.Abs(bc.hi) < s.img.bcLo || bc.lo-slack-1e-6*math.Abs(bc.lo) > b.bcHi {
		return false
	}
	return b.imageRelation(e)
}

// hull is the least interval holding the four values, by comparisons
// (cheaper than the builtin min and max, which also order NaNs and signed
// zeros: imageOpen's values are never NaN, their denominators sharing a
// sign).
func hull(v [4]float64) iv {
	lo, hi := v[0], v[0]
	for _, x := range v[1:] {
		if x < lo {
			lo = x
		}
		if x > hi {
			hi = x
		}
	}
	return iv{lo, hi}
}
