package search

import (
	"math"
	"math/rand/v2"

	"cardinal/optics"
)

// The builds of a study need the values of eval's figures, not their
// derivatives (those are the sensitivities, worked out once per result).
// This file is eval again on plain numbers: the same floating-point
// operations in the same order, leaving out only the derivatives and the
// products with the structural zeros and ones of the matrices, so that
// every build's figures are bit for bit eval's (a test compares the two)
// at a fraction of the cost, with no allocation per build.

// drawValues draws one build's departures, in the units of the
// parameters (percent, mm, index), into v.
func (m *model) drawValues(rng *rand.Rand, dist Distribution, v []float64) {
	for j, p := range m.params {
		v[j] = p.Tol * unitDraw(rng, dist)
	}
}

// offsets turns drawn values into each lens's offsets and the spacing
// errors, as departures does for a draw of Duals. The offsets are the
// model's own scratch space, overwritten by the next call.
func (m *model) offsets(v []float64) (offs []optics.Offsets, gap, wd, plane float64) {
	if m.offs == nil {
		m.offs = make([]optics.Offsets, len(m.lenses))
		for i, l := range m.lenses {
			if l.Tol.RadiusPct > 0 {
				m.offs[i].Radius = make([]float64, len(l.Curv))
			}
			m.offs[i].Thick = make([]float64, l.Elements())
			m.offs[i].Index = make([]float64, l.Elements())
		}
	}
	offs = m.offs
	for j, p := range m.params {
		x := v[j]
		switch p.what {
		case pFocal:
			offs[p.part].Focal = 0.01 * x
		case pRadius:
			offs[p.part].Radius[p.k] = 0.01 * x
		case pThick:
			offs[p.part].Thick[p.k] = x
		case pIndex:
			offs[p.part].Index[p.k] = x
		case pGap:
			gap = x
		case pWD:
			wd = x
		case pPlane:
			plane = x
		}
	}
	return offs, gap, wd, plane
}

// buildValue draws one build into v and compensates it, as build does.
func (m *model) buildValue(rng *rand.Rand, dist Distribution, v []float64) (t trial, ok bool) {
	m.drawValues(rng, dist, v)
	t = m.evalValue(v)
	return t, t.ok && !math.IsNaN(t.figure.V) && !math.IsInf(t.figure.V, 0) && !math.IsNaN(t.adjust.V)
}

// evalValue is eval for drawn values: the trial it returns holds the same
// values, with zero derivatives.
func (m *model) evalValue(v []float64) trial {
	offs, dg, dwd, dplane := m.offsets(v)
	ma, la := m.lenses[0].MatrixValue(offs[0])
	m0, k, length := ma, optics.Mat2{}, la
	pair := len(m.lenses) == 2
	if pair {
		mb, lb := m.lenses[1].MatrixValue(offs[1])
		m0 = optics.Mat2{A: mb.A*ma.A + mb.B*ma.C, B: mb.A*ma.B + mb.B*ma.D, C: mb.C*ma.A + mb.D*ma.C, D: mb.C*ma.B + mb.D*ma.D}
		k = optics.Mat2{A: mb.A * ma.C, B: mb.A * ma.D, C: mb.C * ma.C, D: mb.C * ma.D}
		length = la + lb
	}
	g := gapLine{m0: m0, k: k}
	placed := 0.0
	if pair {
		placed = m.gap + dg
	}
	switch m.kind {
	case Focus:
		return m.evalFocusValue(g, placed, length, dplane)
	case Image:
		return m.evalImageValue(g, placed, length, m.wd+dwd, dplane)
	}
	return m.evalExpandValue(g, placed)
}

// gapLine is the system matrix as a function of the gap g,
// M(g) = M0 + g K (eval).
type gapLine struct{ m0, k optics.Mat2 }

func (l gapLine) at(g float64) optics.Mat2 {
	return optics.Mat2{A: l.m0.A + g*l.k.A, B: l.m0.B + g*l.k.B, C: l.m0.C + g*l.k.C, D: l.m0.D + g*l.k.D}
}

func valueTrial(adjust, figure float64, ok bool) trial {
	return trial{adjust: optics.Const(adjust), figure: optics.Const(figure), ok: ok}
}

// evalFocusValue is evalFocus on values.
func (m *model) evalFocusValue(l gapLine, placed, length, dplane float64) trial {
	plane := m.plane + dplane
	if m.comp == CompensateGap {
		m0 := l.at(0)
		w := plane - length
		a0, a1, p0, p1 := m0.A, l.k.A, -m0.C, -l.k.C
		g, ok := nearestRootValue(p1, (a1+p0)-p1*w, a0-p0*w, m.gap)
		if !ok {
			return trial{}
		}
		phi := -l.at(g).C
		t := valueTrial(g-m.gap, 1/phi, phi != 0)
		t.at.gap, t.at.imageZ = g, plane-length-g
		return t
	}
	s := l.at(placed)
	phi := -s.C
	if phi == 0 {
		return trial{}
	}
	focus := length + placed + s.A/phi // from the first vertex
	t := valueTrial(0, 1/phi, true)
	t.at.gap = placed
	if m.comp == CompensateNone {
		t.adjust = optics.Const(focus - plane)
		t.at.imageZ = plane - length - placed
	} else {
		t.adjust = optics.Const(focus - m.plane)
		t.at.imageZ, t.at.refocus = s.A/phi, true
	}
	return t
}

// evalImageValue is evalImage on values.
func (m *model) evalImageValue(l gapLine, placed, length, wd, dplane float64) trial {
	plane := m.plane + dplane
	withObject := func(s optics.Mat2) (b, d float64) { return s.A*wd + s.B, s.C*wd + s.D }
	if m.comp == CompensateGap {
		b0, d0 := withObject(l.at(0))
		b1, d1 := withObject(l.k)
		w := plane - wd - length
		g, ok := nearestRootValue(-d1, (b1+w*d1)-d0, b0+w*d0, m.gap)
		if !ok {
			return trial{}
		}
		_, sd := withObject(l.at(g))
		t := valueTrial(g-m.gap, 1/sd, sd != 0)
		t.at.gap, t.at.wd, t.at.imageZ = g, wd, plane-wd-length-g
		return t
	}
	sb, sd := withObject(l.at(placed))
	if sd == 0 {
		return trial{}
	}
	image := wd + length + placed - sb/sd // from the object plane
	t := valueTrial(0, 1/sd, true)
	t.at.gap, t.at.wd = placed, wd
	if m.comp == CompensateNone {
		t.adjust = optics.Const(image - plane)
		t.at.imageZ = plane - wd - length - placed
	} else {
		t.adjust = optics.Const(image - m.plane)
		t.at.imageZ, t.at.refocus = -sb/sd, true
	}
	return t
}

// evalExpandValue is evalExpand on values.
func (m *model) evalExpandValue(l gapLine, placed float64) trial {
	if l.k.C == 0 {
		return trial{}
	}
	collimated := -(l.m0.C / l.k.C)
	if m.comp == CompensateNone {
		return valueTrial(collimated-placed, abs(l.at(placed).A), true)
	}
	return valueTrial(collimated-m.gap, abs(l.at(collimated).A), true)
}

// abs is |x| as optics.Dual.Abs takes it (a zero keeps its sign).
func abs(x float64) float64 {
	if x < 0 {
		return -x
	}
	return x
}

// nearestRootValue is nearestRoot on values.
func nearestRootValue(a, b, c, near float64) (float64, bool) {
	if a == 0 {
		if b == 0 {
			return 0, false
		}
		return -(c / b), true
	}
	disc := b*b - 4*(a*c)
	if disc < 0 {
		return 0, false
	}
	r := math.Sqrt(disc)
	if b < 0 {
		r = -r
	}
	q := -0.5 * (b + r)
	if q == 0 {
		return 0, false
	}
	x1, x2 := q/a, c/q
	if math.Abs(x2-near) < math.Abs(x1-near) {
		return x2, true
	}
	return x1, true
}
