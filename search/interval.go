package search

import "math"

// iv is a closed interval of real numbers, for the enclosures the pruning
// relies on (R. E. Moore, Interval Analysis, Prentice-Hall 1966: the natural
// interval extension of an expression encloses its range). No directed
// rounding: callers widen the final test by a relative margin instead.
type iv struct{ lo, hi float64 }

func pt(x float64) iv { return iv{x, x} }

func span(a, b float64) iv { return iv{min(a, b), max(a, b)} }

func (a iv) add(b iv) iv { return iv{a.lo + b.lo, a.hi + b.hi} }

func (a iv) sub(b iv) iv { return iv{a.lo - b.hi, a.hi - b.lo} }

func (a iv) mul(b iv) iv {
	p, q, r, t := a.lo*b.lo, a.lo*b.hi, a.hi*b.lo, a.hi*b.hi
	return iv{min(p, q, r, t), max(p, q, r, t)}
}

// sq is the range of x^2 over the interval, tighter than a.mul(a).
func (a iv) sq() iv {
	l, h := a.lo*a.lo, a.hi*a.hi
	if a.lo <= 0 && a.hi >= 0 {
		return iv{0, max(l, h)}
	}
	return span(l, h)
}

// mag is the largest absolute value in the interval.
func (a iv) mag() float64 { return max(math.Abs(a.lo), math.Abs(a.hi)) }

// holdsZero tells whether the interval, widened by margin, contains 0.
func (a iv) holdsZero(margin float64) bool { return a.lo <= margin && a.hi >= -margin }

// least is the smallest absolute value in the interval: 0 when it holds 0.
func (a iv) least() float64 {
	if a.lo <= 0 && a.hi >= 0 {
		return 0
	}
	return min(math.Abs(a.lo), math.Abs(a.hi))
}

// meet is the intersection of two intervals (empty when lo > hi).
func (a iv) meet(b iv) iv { return iv{max(a.lo, b.lo), min(a.hi, b.hi)} }

// widen is the interval grown by a relative margin of its magnitude.
func (a iv) widen(rel float64) iv {
	m := rel * (1 + a.mag())
	return iv{a.lo - m, a.hi + m}
}
