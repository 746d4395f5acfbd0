package search

import (
	"math"
	"sort"

	"cardinal/optics"
)

// collimates tells whether the search solves laser expanders for the gap
// that collimates the Gaussian beam.
func (r Requirement) collimates() bool { return r.Kind == Expand && r.Gaussian() }

// collimatingGap solves the gap between a and b that puts the output
// waist of the input beam d beyond the last vertex of b. With q1 = x + i y
// the beam parameter at b's first vertex (x = Re q after a, plus the gap)
// and [A B; C D] b's matrix followed by d of air, the output
// (A q1 + B) / (C q1 + D) is a waist when its real part is zero:
//
//	A C (x^2 + y^2) + (A D + B C) x + B D = 0
//
// (the ABCD law, Siegman, Lasers, 1986, ch. 20; Re of (A q + B)(C q* + D)
// with AD - BC = 1). Of its roots the one nearest the afocal gap g0 is
// the expander (the other puts b by the intermediate waist); ok is false
// when no root gives a gap of at least zero.
func collimatingGap(in optics.GaussianBeam, a, b *cand, d, g0 float64) (gap float64, ok bool) {
	q := in.Through(a.m, 1)
	m := b.m.Then(optics.Transfer(d, 1))
	x0, y := real(q.Q), imag(q.Q)
	qa, qb, qc := m.A*m.C, m.A*m.D+m.B*m.C, m.A*m.C*y*y+m.B*m.D
	scale := math.Abs(m.A*m.C)*(x0*x0+y*y+g0*g0) + math.Abs(m.B*m.D) + 1e-300
	roots, n, _ := quadRoots(qa, qb, qc, scale, scale/(1+math.Abs(g0)), scale)
	best := math.Inf(1)
	for _, x := range roots[:n] {
		g := x - x0
		if g >= 0 && math.Abs(g-g0) < math.Abs(best-g0) {
			best, ok = g, true
		}
	}
	return best, ok
}

// collimation is the laser stage of an expander: the figures at the
// collimating gap and the ranking term.
type collimation struct {
	fig  LaserFigures
	term float64 // log2 of the divergence over its diffraction limit
}

// collimate solves each expander for the gap that collimates the beam,
// moves the layout to that gap (rechecking the gap and envelope limits),
// measures the wavefront there with real rays, and ranks by the score plus
// the divergence term; it keeps the requirement's top N.
func (s *search) collimate(p *prepared, ls []layout) ([]layout, []collimation) {
	cs := make([]collimation, len(ls))
	in := s.req.InputBeam()
	for i := range ls {
		cs[i] = s.collimateOne(p, &ls[i], in)
	}
	idx := make([]int, len(ls))
	for i := range idx {
		idx[i] = i
	}
	sort.SliceStable(idx, func(x, y int) bool {
		lx, ly := &ls[idx[x]], &ls[idx[y]]
		if lx.meets() != ly.meets() {
			return lx.meets()
		}
		tx, ty := lx.score+s.sc.w.Quality*cs[idx[x]].term, ly.score+s.sc.w.Quality*cs[idx[y]].term
		if tx != ty {
			return tx < ty
		}
		return s.better(lx, ly)
	})
	if s.req.Top > 0 && len(idx) > s.req.Top {
		idx = idx[:s.req.Top]
	}
	outL, outC := make([]layout, len(idx)), make([]collimation, len(idx))
	for k, i := range idx {
		outL[k], outC[k] = ls[i], cs[i]
	}
	return outL, outC
}

func (s *search) collimateOne(p *prepared, l *layout, in optics.GaussianBeam) collimation {
	a, b := &s.c[l.a], &s.c[l.b]
	g0 := l.gap
	c := collimation{fig: LaserFigures{AfocalGap: ptr(g0)}}
	g, ok := collimatingGap(in, a, b, s.req.WaistOutAt, g0)
	if !ok {
		l.fails |= failCollimate
		g = g0
	} else {
		s.regap(l, g)
	}
	out := in.Through(pairMatrix(a, b, g), 1)
	fig := outFigures(out)
	fig.AfocalGap = c.fig.AfocalGap
	fig.Divergence = ptr(1000 * out.Divergence())
	rms, err := s.system(p, l).CollimatedWavefront(s.req.BeamDiameter(), s.req.Lambda())
	if err == nil {
		// The far-field peak of an aberrated beam falls to the Strehl
		// ratio S = exp(-(2 pi W)^2) of the ideal (Marechal; Born and
		// Wolf, Principles of Optics, 7th ed., sec. 9.1; common practice);
		// at fixed power the far-field spot's area grows as 1/S, so the
		// divergence grows about as S^(-1/2) (an estimate, derived here).
		ratio := math.Exp(2 * math.Pi * math.Pi * rms * rms)
		fig.WavefrontRMS, fig.DivergenceRatio = ptr(rms), ptr(ratio)
		c.term = math.Log2(ratio)
	}
	c.fig = fig
	return c
}

// regap moves a pair to a new gap and redoes the checks that depend on it.
func (s *search) regap(l *layout, g float64) {
	a, b := &s.c[l.a], &s.c[l.b]
	l.gap, l.env = g, a.L+g+b.L
	l.fails &^= failGap | failEnvelope | failAperture
	if l.edge = s.edgeClearance(a, b, g); l.edge < s.req.GapMin {
		l.fails |= failGap
	}
	if s.req.LengthMax > 0 && l.env > s.req.LengthMax {
		l.fails |= failEnvelope
	}
	if s.req.ChecksAperture() {
		s.rayHeights(l)
		if l.vigRatio > 1 {
			l.fails |= failAperture
		}
	}
}
