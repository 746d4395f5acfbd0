package search

import "math"

// quadRoots returns the real roots of a x^2 + b x + c = 0, each once, in
// increasing order. It uses the cancellation-free form
// q = -(b + sgn(b) sqrt(b^2 - 4ac))/2, x1 = q/a, x2 = c/q (W. H. Press et
// al., Numerical Recipes, 3rd ed., 2007, sec. 5.6), so that a root stays
// accurate when a is nearly zero and the equation nearly linear. A
// discriminant negative only by rounding is taken as zero (a double root).
// An equation whose coefficients are all zero within rounding (every x is a
// root) reports degenerate and no roots.
func quadRoots(a, b, c, scaleA, scaleB, scaleC float64) (roots [2]float64, n int, degenerate bool) {
	const tiny = 64 * 2.220446049250313e-16
	if math.Abs(a) <= tiny*scaleA && math.Abs(b) <= tiny*scaleB && math.Abs(c) <= tiny*scaleC {
		return roots, 0, true
	}
	disc := b*b - 4*a*c
	if disc < 0 {
		if -disc > tiny*(b*b+4*math.Abs(a*c)) {
			return roots, 0, false
		}
		disc = 0
	}
	s := math.Sqrt(disc)
	if b < 0 {
		s = -s
	}
	q := -(b + s) / 2
	add := func(x float64) {
		if math.IsNaN(x) || math.IsInf(x, 0) || n == 1 && roots[0] == x {
			return
		}
		roots[n] = x
		n++
	}
	if q == 0 {
		// b = 0 and ac = 0: with a != 0 the roots are both 0; with a = 0
		// the equation is c = 0, which the degenerate test or no root covers.
		if a != 0 {
			add(0)
		}
		return roots, n, false
	}
	if a != 0 {
		add(q / a)
	}
	add(c / q)
	if n == 2 && roots[0] > roots[1] {
		roots[0], roots[1] = roots[1], roots[0]
	}
	return roots, n, false
}
