package synth

import (
	"errors"
	"math"

	"cardinal/optics"
)

// solve finds thicknesses and the curvature scale together: each element's
// centre thickness is the larger of its minimum and what gives the minimum
// edge (rounded up to 0.1 mm), and the scale makes the thick-lens power phi.
// Both depend on each other, so it alternates until the thicknesses settle.
func (l *layout) solve(phi, diameter float64) error {
	h := diameter / 2
	var err error
	if l.t, err = l.thicknesses(h); err != nil {
		return err
	}
	for range 20 {
		if err := l.solveScale(phi); err != nil {
			return err
		}
		t, err := l.thicknesses(h)
		if err != nil {
			return err
		}
		if equal(t, l.t) {
			break
		}
		l.t = t
	}
	// Should the 0.1 mm steps not settle, the power is still solved for
	// the thicknesses kept (solving again from a solution costs one step).
	if err := l.solveScale(phi); err != nil {
		return err
	}
	for _, t := range l.t {
		if t > 0.6*diameter {
			return errors.New("too thick for a stock part: centre thickness over 0.6 of the diameter")
		}
	}
	return nil
}

// thicknesses applies the edge rule at semi-diameter h to the current
// curvatures: t_i = max(min_i, edgeMin + sag_i(h) - sag_i+1(h)).
func (l *layout) thicknesses(h float64) ([]float64, error) {
	te := edgeMin(2 * h)
	t := make([]float64, len(l.ctMins))
	for i, ctMin := range l.ctMins {
		s1, err := sphereSag(l.c[i]*l.scale, h)
		if err != nil {
			return nil, err
		}
		s2, err := sphereSag(l.c[i+1]*l.scale, h)
		if err != nil {
			return nil, err
		}
		t[i] = math.Ceil((math.Max(ctMin, te+s1-s2))*10-1e-9) / 10
	}
	return t, nil
}

// sphereSag is z = c h^2 / (1 + sqrt(1 - c^2 h^2)) (ISO 10110-12, eq. 1 with
// k = 0). A radius within 2 % of the semi-diameter is refused: no stock
// part is a full hemisphere.
func sphereSag(c, h float64) (float64, error) {
	if math.Abs(c)*h*1.02 >= 1 {
		return 0, errors.New("too strong for the diameter: a radius comes within 2 % of the semi-diameter")
	}
	return c * h * h / (1 + math.Sqrt(1-c*c*h*h)), nil
}

// power is the thick-lens power in 1/mm at the d line for a curvature scale
// s, from the reduced ray-transfer matrix (optics.Mat2).
func (l *layout) power(s float64) float64 { return l.powerAt(s, l.n) }

// powerAt is the power with the media of indices n.
func (l *layout) powerAt(s float64, n []float64) float64 {
	m := optics.Identity
	prev := 1.0
	for i, c := range l.c {
		next := 1.0
		if i < len(n) {
			next = n[i]
		}
		m = m.Then(optics.Refraction((next - prev) * c * s))
		if i < len(l.t) {
			m = m.Then(optics.Transfer(l.t[i], next))
		}
		prev = next
	}
	return -m.C
}

// solveScale finds the curvature scale giving power phi by the secant
// method, starting from the current scale.
func (l *layout) solveScale(phi float64) error {
	s0, s1 := l.scale, l.scale*1.001
	f0, f1 := l.power(s0)-phi, l.power(s1)-phi
	for range 60 {
		if math.Abs(f1) <= 1e-14*math.Abs(phi) || f1 == f0 {
			break
		}
		s0, s1, f0 = s1, s1-f1*(s1-s0)/(f1-f0), f1
		f1 = l.power(s1) - phi
	}
	if !(math.Abs(f1) <= 1e-9*math.Abs(phi)) || !(s1 > 0) {
		return errors.New("no thick lens of this shape reaches the power")
	}
	l.scale = s1
	return nil
}

func equal(a, b []float64) bool {
	for i := range a {
		if a[i] != b[i] {
			return false
		}
	}
	return len(a) == len(b)
}
