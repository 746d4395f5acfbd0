package importers

import (
	"fmt"
	"math"

	"cardinal/optics"
)

// MaxIndex is the largest refractive index a glass may have anywhere in its
// band. Optical materials stay below about 4 where they transmit
// (germanium, about 4.0 in the infrared, is the highest in common use;
// common practice); the cap keeps n^2 and the Fresnel terms finite.
const MaxIndex = 10

// indexBudget caps the evaluations lowestIndex spends on one glass; a
// formula it cannot settle within it is refused rather than trusted.
const indexBudget = 20000

// A dispersion is a glass formula written as f(u) over a variable u that
// grows or shrinks with the wavelength, with a bound on |f'| over any
// interval of u: the index is at least 1 wherever f(u) >= 1.
type dispersion struct {
	f     func(u float64) float64
	fmax  float64                    // f at MaxIndex
	n     func(f float64) float64    // the index from f
	slope func(a, b float64) float64 // an upper bound of |f'| on [a, b]
	u     func(nm float64) float64
	nm    func(u float64) float64
}

// indexProblem proves that the glass's index is a finite number >= 1 at
// every wavelength from lo to hi nm (and at most MaxIndex), or says where it
// is not. Sampling alone misses a dip between the samples; the proof splits
// the band until on each piece the value at its middle, less and plus the
// largest slope times half its width, stays within 1 to MaxIndex (the
// mean-value theorem), and fails on the first sample outside.
func (g Glass) indexProblem(lo, hi float64) string {
	d, ok := g.dispersion()
	if !ok { // constant: one number, checked as it is
		if n := g.Coefficients[0]; !(n >= 1 && n <= MaxIndex) {
			return fmt.Sprintf("the index %.6g is not a number from 1 to %d", n, MaxIndex)
		}
		return ""
	}
	a, b := d.u(lo), d.u(hi)
	if a > b {
		a, b = b, a
	}
	budget := indexBudget
	u, v, settled := lowest(d, a, b, &budget)
	n := d.n(v)
	switch {
	case !settled && v >= 1 && v <= d.fmax:
		return fmt.Sprintf("the index could not be shown to stay from 1 to %d between %.1f and %.1f nm (near %.1f nm it is %.6g); check the coefficients and their order", MaxIndex, lo, hi, d.nm(u), n)
	case !settled:
		return fmt.Sprintf("the index at %.1f nm is %.6g, not a number from 1 to %d; check the coefficients and their order", d.nm(u), n, MaxIndex)
	}
	return ""
}

// lowest settles [a, b]: true when 1 <= f <= fmax throughout, else false with the
// point and value that broke it (or were not settled within budget).
func lowest(d dispersion, a, b float64, budget *int) (float64, float64, bool) {
	m := a + (b-a)/2
	v := d.f(m)
	*budget--
	if !(v >= 1 && v <= d.fmax) {
		return m, v, false
	}
	if s := d.slope(a, b) * (b - a) / 2; v-s >= 1 && v+s <= d.fmax {
		return m, v, true
	}
	if *budget <= 0 || !(m > a && m < b) {
		return m, v, false
	}
	if u, n, ok := lowest(d, a, m, budget); !ok {
		return u, n, false
	}
	return lowest(d, m, b, budget)
}

// dispersion writes the glass's formula over u: for Cauchy u = 1/lambda^2
// and f = n, a polynomial (Born and Wolf, Principles of Optics, 7th ed.,
// section 2.3.4); for Sellmeier u = lambda^2 and f = n^2, a sum of
// B u/(u - C) whose derivative is -B C/(u - C)^2 (lambda in um). Constant
// has no variable (ok false).
func (g Glass) dispersion() (dispersion, bool) {
	m := g.Medium()
	switch med := m.(type) {
	case optics.Cauchy:
		return cauchyDispersion(med.A), true
	case optics.Sellmeier:
		return sellmeierDispersion(med.B, med.C), true
	}
	return dispersion{}, false
}

func cauchyDispersion(A []float64) dispersion {
	return dispersion{
		f: func(u float64) float64 {
			n, p := 0.0, 1.0
			for _, a := range A {
				n += a * p
				p *= u
			}
			return n
		},
		slope: func(_, b float64) float64 { // u > 0: |sum k A_k u^(k-1)| <= sum k |A_k| b^(k-1)
			s, p := 0.0, 1.0
			for k := 1; k < len(A); k++ {
				s += float64(k) * math.Abs(A[k]) * p
				p *= b
			}
			return s
		},
		fmax: MaxIndex,
		n:    func(f float64) float64 { return f },
		u:    func(nm float64) float64 { return 1 / (nm * nm * 1e-6) },
		nm:   func(u float64) float64 { return 1e3 / math.Sqrt(u) },
	}
}

func sellmeierDispersion(B, C []float64) dispersion {
	return dispersion{
		f: func(u float64) float64 {
			n2 := 1.0
			for i := range B {
				n2 += B[i] * u / (u - C[i])
			}
			return n2
		},
		slope: func(a, b float64) float64 { // no pole lies in [a, b] (checkIndex refuses one)
			s := 0.0
			for i := range B {
				near := math.Min(math.Abs(a-C[i]), math.Abs(b-C[i]))
				s += math.Abs(B[i]*C[i]) / (near * near)
			}
			return s
		},
		fmax: MaxIndex * MaxIndex,
		n:    math.Sqrt,
		u:    func(nm float64) float64 { return nm * nm * 1e-6 },
		nm:   func(u float64) float64 { return 1e3 * math.Sqrt(u) },
	}
}
