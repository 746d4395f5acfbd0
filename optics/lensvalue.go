package optics

import "math"

// Offsets are a Departure's values without derivatives: what one
// simulated build draws. A nil slice means no departure there, as in
// Departure.
type Offsets struct {
	Focal  float64   // relative focal-length error e
	Radius []float64 // relative error of each radius, on top of Focal
	Thick  []float64 // mm added to each glass element's thickness
	Index  []float64 // amount added to each glass element's index
}

// MatrixValue is Matrix without the derivative, for a build that needs
// only the value: it returns exactly Matrix(d).Value() and the length's
// value for the departure d whose Duals hold the offsets o and no
// derivative, bit for bit, because it carries out the same floating-point
// operations in the same order and leaves out only those that multiply
// by the structural zeros and ones of the refraction and transfer
// matrices or feed a derivative (a test compares the two). It allocates
// nothing, so a Monte Carlo study can call it for every build.
func (l Lens) MatrixValue(o Offsets) (Mat2, float64) {
	u := l.curvatureFactorValue(o.Focal)
	a, b, c, d := 1.0, 0.0, 0.0, 1.0
	length := 0.0
	prev := 1.0
	g := 0
	for i, cv := range l.Curv {
		k := cv * u
		if o.Radius != nil {
			k = k / (1 + o.Radius[i])
		}
		n := 1.0
		if i < len(l.Index) {
			n = l.Index[i]
			if l.Glass[i] && o.Index != nil {
				n = n + o.Index[g]
			}
		}
		r := -((n - prev) * k) // the refraction's C (Refraction)
		c, d = r*a+c, r*b+d
		if i < len(l.Thick) {
			t := l.Thick[i]
			if l.Glass[i] {
				if o.Thick != nil {
					t = t + o.Thick[g]
				}
				g++
			}
			tn := t / n // the transfer's B (Transfer)
			a, b = a+tn*c, b+tn*d
			length = length + t
		}
		prev = n
	}
	return Mat2{A: a, B: b, C: c, D: d}, length
}

// curvatureFactorValue is the value of curvatureFactor(Const(e)), by the
// same Newton steps on the same floating-point operations (powerSlope).
func (l Lens) curvatureFactorValue(e float64) float64 {
	if e == 0 {
		return 1
	}
	want := l.Power / (1 + e)
	u := 1 / (1 + e) // exact for a thin lens
	for it := 0; it < 8; it++ {
		p, dp := l.powerSlope(u)
		if dp == 0 {
			break
		}
		step := (p - want) / dp
		u -= step
		if math.Abs(step) <= 1e-15*math.Abs(u) {
			break
		}
	}
	return u
}

// powerSlope is the power of the lens with its curvatures times u and the
// power's derivative by u: -C of matrix(Var(u), nil) and its derivative,
// in the operations DMat.Then carries out for those matrices.
func (l Lens) powerSlope(u float64) (p, dp float64) {
	a, aD, b, bD := 1.0, 0.0, 0.0, 0.0
	c, cD, d, dD := 0.0, 0.0, 1.0, 0.0
	prev := 1.0
	for i, cv := range l.Curv {
		n := 1.0
		if i < len(l.Index) {
			n = l.Index[i]
		}
		dn := n - prev
		r, rD := -(dn * (cv * u)), -(dn * cv) // the refraction's C and its derivative
		c, cD = r*a+c, (rD*a+r*aD)+cD
		d, dD = r*b+d, (rD*b+r*bD)+dD
		if i < len(l.Thick) {
			tn := l.Thick[i] / n
			a, aD = a+tn*c, aD+tn*cD
			b, bD = b+tn*d, bD+tn*dD
		}
		prev = n
	}
	return -c, -cD
}
