package search

import "math"

// Pruning by the clear apertures. A layout whose paraxial marginal ray
// passes outside a part's clear aperture fails the aperture check
// (rayHeights) and is never kept by a search that keeps only the layouts
// that meet every check; the near-miss search keeps such layouts, so it
// does not prune this way.
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
// expand with a beam diameter, in a search that keeps only what meets.
func (s *search) setAperture() {
	s.beamY = 0
	if s.misses || !s.req.ChecksAperture() {
		return
	}
	switch s.req.Kind {
	case Focus:
		s.beamY, s.phi0 = s.req.BeamDiameter()/2, 1/s.req.EFL
	case Expand:
		s.beamY, s.phi0 = s.req.BeamDiameter()/2, 0
	}
}

// firstOut tells whether candidate a, as the first part of a pair, passes
// the beam outside its own clear aperture, whatever follows it.
func (s *search) firstOut(a *cand) bool {
	if s.beamY <= 0 {
		return false
	}
	return s.beamY*math.Max(1, math.Abs(a.m.A)) > a.semi*(1+apertureSlack)
}

// secondOut tells whether b after a passes the beam outside b's clear
// aperture (the heights above, at b's two vertices).
func (s *search) secondOut(a, b *cand) bool {
	if s.beamY <= 0 {
		return false
	}
	y := (s.phi0 - a.phi) / b.phi
	front, back := y+b.P*a.phi, y+b.Pp*s.phi0
	scale := math.Abs(y) + math.Abs(b.P*a.phi) + math.Abs(b.Pp*s.phi0)
	return s.beamY*(math.Max(math.Abs(front), math.Abs(back))-apertureSlack*scale) > b.semi*(1+apertureSlack)
}

// nodeOut tells whether every b in node n after a passes the beam outside
// its clear aperture: the least heights over the node's bounds exceed its
// largest clear semi-aperture.
func (s *search) nodeOut(a *cand, n *node, f2 iv) bool {
	if s.beamY <= 0 {
		return false
	}
	y := f2.mul(pt(s.phi0 - a.phi))
	front := y.add(iv{n.pMin, n.pMax}.mul(pt(a.phi)))
	back := y.add(iv{n.ppMin, n.ppMax}.mul(pt(s.phi0)))
	scale := y.mag() + math.Max(math.Abs(n.pMin), math.Abs(n.pMax))*math.Abs(a.phi) +
		math.Max(math.Abs(n.ppMin), math.Abs(n.ppMax))*math.Abs(s.phi0)
	least := math.Max(front.least(), back.least()) - apertureSlack*scale
	return s.beamY*least > n.semiMax*(1+apertureSlack)
}
