package search

import "math"

// singlet solves one candidate alone and emits what it admits.
func (s *search) singlet(i int32) {
	switch s.req.Kind {
	case Focus:
		s.singletFocus(i)
	case Image:
		s.singletImage(i)
	case Match:
		s.singletMatch(i)
	}
}

// singletFocus: the part's own EFL; the focus of a collimated beam lies at
// its back focal point.
func (s *search) singletFocus(i int32) {
	c := &s.c[i]
	f, bfd := c.efl(), c.bfd()
	l := layout{a: i, b: -1, value: f, err: f - s.req.EFL,
		bc: bfd, env: c.L, track: c.L + bfd, wd: math.NaN()}
	if math.Abs(l.err) > s.lim.admit {
		return
	}
	if s.finish(&l) {
		s.emit(&l)
	}
}

// singletImage finds both conjugates of a fixed track. With u and v the
// object and image distances from the principal points, 1/u + 1/v = 1/f
// (the Gaussian lens equation in air; Hecht, Optics, 5th ed., sec. 5.2.3)
// and u + v = D = track - (principal-point separation), so u and v are the
// roots of x^2 - D x + D f = 0, real when D >= 4f; m = -v/u.
func (s *search) singletImage(i int32) {
	c := &s.c[i]
	d, f := s.req.Track-c.sep(), c.efl()
	if f <= 0 || d <= 0 {
		return
	}
	disc := d * (d - 4*f)
	if disc < 0 {
		return
	}
	u1 := (d + math.Sqrt(disc)) / 2
	us := []float64{u1}
	if u2 := d * f / u1; u2 != u1 {
		us = append(us, u2) // product of the roots is D f (Vieta)
	}
	for r, u := range us {
		v := d - u
		l := layout{a: i, b: -1, root: int8(r), wd: u - c.P, bc: c.Pp + v, env: c.L,
			track: s.req.Track, value: -v / u}
		l.err = l.value - s.req.Mag
		if l.wd <= 0 || l.bc <= 0 || math.Abs(l.err) > s.lim.admit {
			continue
		}
		if s.finish(&l) {
			s.emit(&l)
		}
	}
}
