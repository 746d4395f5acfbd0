package search

import (
	"math"

	"cardinal/optics"
)

// edgeClearance is the least axial distance between the last surface of a
// and the first surface of b, a gap apart at their vertices, over the
// heights both clear apertures share. For two spheres the distance
// gap - sagA(h) + sagB(h) is monotonic in h (the sag slope c h /
// sqrt(1 - c^2 h^2) grows with the curvature c), so its least value is at
// the axis or at the shared clear aperture; conics and aspheres are sampled.
func (s *search) edgeClearance(a, b *cand, gap float64) float64 {
	last, first := s.lastSurface(a), s.firstSurface(b)
	h := min(a.semi, b.semi)
	at := func(h float64) float64 {
		za, _ := last.Sag(h)
		zb, _ := first.Sag(h)
		return gap - za + zb
	}
	least := min(gap, at(h))
	if last.IsAsphere() || first.IsAsphere() {
		const samples = 32
		for i := 1; i < samples; i++ {
			least = min(least, at(h*float64(i)/samples))
		}
	}
	return least
}

// quickClearance is a lower bound on edgeClearance for two spheres, from
// each surface's extreme sag over its whole clear aperture; -Inf when either
// surface is a conic or an asphere.
func (s *search) quickClearance(a, b *cand, gap float64) float64 {
	last, first := s.lastSurface(a), s.firstSurface(b)
	if last.IsAsphere() || first.IsAsphere() {
		return math.Inf(-1)
	}
	return gap - sagMax(last, a.semi) + sagMin(first, b.semi)
}

// frontMin is the least sag of c's first surface over its clear aperture
// and backMax the greatest sag of its last: for spheres, what bounds the
// edge clearance.
func (s *search) frontMin(c *cand) float64 { return sagMin(s.firstSurface(c), c.semi) }

func (s *search) backMax(c *cand) float64 { return sagMax(s.lastSurface(c), c.semi) }

// sagMin and sagMax are the least and greatest of the sags at 0 and h: the
// extremes over heights 0 to h of a sphere, whose sag is monotonic. For a
// conic or an asphere they mean nothing; edgeClearance samples those.
func sagMin(s optics.Surface, h float64) float64 {
	z, _ := s.Sag(h)
	return min(0, z)
}

func sagMax(s optics.Surface, h float64) float64 {
	z, _ := s.Sag(h)
	return max(0, z)
}

// firstSurface is the first surface of candidate c as turned.
func (s *search) firstSurface(c *cand) optics.Surface {
	o := &s.outer[c.item]
	switch {
	case c.rev && o.surf < 0:
		return optics.Surface{Radius: o.last}.Reversed()
	case c.rev:
		return s.surfs[o.surf+1].Reversed()
	case o.surf < 0:
		return optics.Surface{Radius: o.first}
	}
	return s.surfs[o.surf]
}

// lastSurface is the last surface of candidate c as turned.
func (s *search) lastSurface(c *cand) optics.Surface {
	o := &s.outer[c.item]
	switch {
	case c.rev && o.surf < 0:
		return optics.Surface{Radius: o.first}.Reversed()
	case c.rev:
		return s.surfs[o.surf].Reversed()
	case o.surf < 0:
		return optics.Surface{Radius: o.last}
	}
	return s.surfs[o.surf+1]
}

// ray is a paraxial ray in air: height and angle (reduced angle with n = 1).
type ray struct{ y, u float64 }

func (r ray) through(m optics.Mat2) ray {
	y, u := m.Apply(r.y, r.u)
	return ray{y, u}
}

func (r ray) travel(d float64) ray { return ray{r.y + d*r.u, r.u} }

// rayHeights traces the paraxial marginal and chief rays through the layout
// and records the largest height over clear semi-aperture at the outer
// surfaces of each part. A collimated beam (focus, expand) enters at half
// its diameter; for an image the marginal ray leaves the axial object point
// at the NA and the chief ray leaves the edge of the field towards the first
// vertex, where the aperture stop is taken to be.
func (s *search) rayHeights(l *layout) {
	if s.req.Kind == Match {
		s.beamHeights(l)
		return
	}
	var marg, chief ray
	switch s.req.Kind {
	case Image:
		marg = ray{s.req.NA * l.wd, s.req.NA}
		chief = ray{0, -s.req.ObjectHeight / l.wd}
	default:
		marg = ray{s.req.BeamDiameter() / 2, 0}
	}
	parts := [2]int32{l.a, l.b}
	l.vigRatio, l.vigPart = 0, 0
	for k, ci := range parts[:l.elements()] {
		c := &s.c[ci]
		if k > 0 {
			marg, chief = marg.travel(l.gap), chief.travel(l.gap)
		}
		front := (math.Abs(marg.y) + math.Abs(chief.y)) / c.semi
		marg, chief = marg.through(c.m), chief.through(c.m)
		back := (math.Abs(marg.y) + math.Abs(chief.y)) / c.semi
		if r := max(front, back); r > l.vigRatio {
			l.vigRatio, l.vigPart = r, int8(k)
		}
	}
}

// beamHeights is rayHeights for a Gaussian beam (mode matching): the beam's
// 1/e^2 radius w at the outer surfaces of each part, counted as 1.5 w so
// that the clear aperture passes about 99 % of the power (a circular
// aperture of radius a passes 1 - exp(-2 a^2 / w^2) of a centred Gaussian
// beam, 98.9 % at a = 1.5 w; Siegman, Lasers, 1986, ch. 17).
func (s *search) beamHeights(l *layout) {
	g := optics.NewGaussianBeam(s.req.Lambda(), s.req.WaistIn, l.wd, 1)
	parts := [2]int32{l.a, l.b}
	l.vigRatio, l.vigPart = 0, 0
	for k, ci := range parts[:l.elements()] {
		c := &s.c[ci]
		if k > 0 {
			g = g.Propagate(l.gap)
		}
		front := 1.5 * g.Radius() / c.semi
		g = g.Through(c.m, 1)
		back := 1.5 * g.Radius() / c.semi
		if r := max(front, back); r > l.vigRatio {
			l.vigRatio, l.vigPart = r, int8(k)
		}
	}
}
