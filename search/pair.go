package search

import (
	"math"

	"cardinal/optics"
)

// pair solves candidate i followed by candidate j and emits every layout it
// admits.
func (s *search) pair(i, j int32) {
	switch s.req.Kind {
	case Focus:
		s.pairFocus(i, j)
	case Image:
		s.pairImage(i, j)
	case Expand:
		s.pairExpand(i, j)
	case Match:
		s.pairMatch(i, j)
	}
}

// pairMatrix is the reduced matrix from the first vertex of a to the last
// vertex of b, gap apart.
func pairMatrix(a, b *cand, gap float64) optics.Mat2 {
	return a.m.Then(optics.Transfer(gap, 1)).Then(b.m)
}

// spacingFor returns the distance e between the back principal point of a
// and the front principal point of b that gives the pair the power phi, from
// Gullstrand's equation phi = phi1 + phi2 - e phi1 phi2 (in air; Hecht,
// Optics, 5th ed., ch. 6; W. J. Smith, Modern Optical Engineering, 4th ed.,
// ch. 4), and the vertex gap it means.
func spacingFor(a, b *cand, phi float64) (e, gap float64) {
	e = (a.phi + b.phi - phi) / (a.phi * b.phi)
	return e, e - b.P + a.Pp
}

// pairFocus puts the pair at the target EFL; the back clearance is the
// back focal distance A/phi of the solved pair's matrix (optics.FromMatrix).
func (s *search) pairFocus(i, j int32) {
	a, b := &s.c[i], &s.c[j]
	_, gap := spacingFor(a, b, 1/s.req.EFL)
	if !(gap >= 0) {
		return
	}
	m := pairMatrix(a, b, gap)
	phi := -m.C
	l := layout{a: i, b: j, gap: gap, env: a.L + gap + b.L, wd: math.NaN()}
	l.value = 1 / phi
	l.err = l.value - s.req.EFL
	l.bc = m.A / phi
	l.track = l.env + l.bc
	if s.finish(&l) {
		s.emit(&l)
	}
}

// pairExpand makes the pair afocal (phi = 0 in Gullstrand's equation, so the
// principal points are f1 + f2 apart; common practice) and reads the
// expansion from the lateral magnification A = -f2/f1 of its matrix.
func (s *search) pairExpand(i, j int32) {
	a, b := &s.c[i], &s.c[j]
	form := Keplerian
	switch {
	case a.phi < 0 && b.phi < 0:
		return
	case a.phi < 0 || b.phi < 0:
		form = Galilean
	}
	_, gap := spacingFor(a, b, 0)
	if !(gap >= 0) {
		return
	}
	m := pairMatrix(a, b, gap)
	l := layout{a: i, b: j, gap: gap, env: a.L + gap + b.L, form: form,
		wd: math.NaN(), bc: math.NaN(), track: math.NaN(), value: math.Abs(m.A)}
	l.err = l.value - s.req.Expansion
	if math.Abs(l.err) > s.lim.admit {
		return
	}
	if s.req.Form != AnyForm && s.req.Form != form {
		l.fails |= failForm
	}
	if s.finish(&l) {
		s.emit(&l)
	}
}

// pairImage solves working distance, gap and back clearance for a fixed
// track T and magnification m. With x the object's distance from the front
// focal point of a (positive toward the image), Newton's equations for each
// part (x x' = -f^2 in air, m = f/x = -x'/f; Hecht, Optics, 5th ed.,
// sec. 5.2.3) and the optical interval D between the back focal point of a
// and the front focal point of b give
//
//	m = f1 f2 / (-f1^2 - D x)    and    T - K = D - (1 + m f2/f1) x,
//
// K being the fixed lengths (focal distances and thicknesses). Eliminating
// D: (1 + m f2/f1) x^2 + (T - K) x + f1 (f1 + f2/m) = 0. Every real root is
// a layout, and D = (T - K) + (1 + m f2/f1) x needs no division, so a pair
// that is afocal at the solved gap (D = 0, the 4f relay) is as accurate as
// any other. Each root is checked against the assembled matrix.
func (s *search) pairImage(i, j int32) {
	a, b := &s.c[i], &s.c[j]
	T, m, f1, f2 := s.req.Track, s.req.Mag, a.efl(), b.efl()
	aF, aFp, bF, bFp := a.ffd(), a.bfd(), b.ffd(), b.bfd()
	k := -aF + a.L + aFp - bF + b.L + bFp
	qa, qb, qc := 1+m*f2/f1, T-k, f1*(f1+f2/m)
	roots, n, family := quadRoots(qa, qb, qc, 1+math.Abs(m*f2/f1),
		math.Abs(T)+math.Abs(aF)+a.L+math.Abs(aFp)+math.Abs(bF)+b.L+math.Abs(bFp),
		f1*f1+math.Abs(f1*f2/m))
	if family {
		// Every object position works (an afocal relay at m = -f2/f1 whose
		// track is its own): take the object at the front focal point, the
		// telecentric 4f arrangement.
		roots[0], n = 0, 1
	}
	for r, x := range roots[:n] {
		d := qb + qa*x
		l := layout{a: i, b: j, root: int8(r), wd: -aF - x, gap: d - bF + aFp, bc: bFp - m*f2*x/f1}
		if l.wd <= 0 || l.gap < 0 || l.bc <= 0 {
			continue
		}
		l.env = a.L + l.gap + b.L
		if bd := s.bound(); s.sc.pair(0, l.env, pairAway(a, b), s.pairPrice(a, b)) > bd+margin(bd) {
			s.solved++ // out of the results whatever the checks say
			continue
		}
		full := optics.Transfer(l.wd, 1).Then(pairMatrix(a, b, l.gap)).Then(optics.Transfer(l.bc, 1))
		if math.Abs(full.B) > 1e-7*T || math.Abs(full.A-m) > 1e-7*(1+math.Abs(m)) {
			s.unverified++
			continue
		}
		l.track = l.wd + l.env + l.bc
		l.value = full.A
		l.err = l.value - m
		if s.finish(&l) {
			s.emit(&l)
		}
	}
}
