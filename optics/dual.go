package optics

import "math"

// A Dual is a number with its first derivative with respect to one chosen
// parameter: forward-mode differentiation, where every operation applies
// the rules of differential calculus to the derivative (A. Griewank and
// A. Walther, Evaluating Derivatives, 2nd ed., SIAM 2008, ch. 3, the
// forward mode; chapter from memory). Products of ray-transfer
// matrices of Duals carry the exact derivative of the matrix by the product
// rule, so a sensitivity needs no finite difference.
type Dual struct{ V, D float64 }

// Const is a Dual that does not depend on the parameter.
func Const(v float64) Dual { return Dual{V: v} }

// Var is the parameter itself, at the value v (its derivative is 1).
func Var(v float64) Dual { return Dual{V: v, D: 1} }

// Add is x + y.
func (x Dual) Add(y Dual) Dual { return Dual{x.V + y.V, x.D + y.D} }

// Sub is x - y.
func (x Dual) Sub(y Dual) Dual { return Dual{x.V - y.V, x.D - y.D} }

// Mul is x y.
func (x Dual) Mul(y Dual) Dual { return Dual{x.V * y.V, x.D*y.V + x.V*y.D} }

// Scale is k x for a constant k.
func (x Dual) Scale(k float64) Dual { return Dual{k * x.V, k * x.D} }

// Div is x / y.
func (x Dual) Div(y Dual) Dual {
	q := x.V / y.V
	return Dual{q, (x.D - q*y.D) / y.V}
}

// Neg is -x.
func (x Dual) Neg() Dual { return Dual{-x.V, -x.D} }

// Sqrt is the square root of x, whose derivative is x' / (2 sqrt x).
func (x Dual) Sqrt() Dual {
	r := math.Sqrt(x.V)
	return Dual{r, x.D / (2 * r)}
}

// Abs is |x|.
func (x Dual) Abs() Dual {
	if x.V < 0 {
		return x.Neg()
	}
	return x
}

// DMat is a reduced ray-transfer matrix of Duals: the matrix and its
// derivative with respect to one parameter.
type DMat struct{ A, B, C, D Dual }

// DIdentity is the matrix of no optics, independent of the parameter.
var DIdentity = DMat{A: Const(1), D: Const(1)}

// Lift is the constant matrix m.
func Lift(m Mat2) DMat { return DMat{Const(m.A), Const(m.B), Const(m.C), Const(m.D)} }

// Value is the matrix without its derivative.
func (m DMat) Value() Mat2 { return Mat2{m.A.V, m.B.V, m.C.V, m.D.V} }

// Deriv is the derivative of the matrix.
func (m DMat) Deriv() Mat2 { return Mat2{m.A.D, m.B.D, m.C.D, m.D.D} }

// DRefraction is the matrix of a surface of power phi (see Refraction).
func DRefraction(power Dual) DMat { return DMat{A: Const(1), C: power.Neg(), D: Const(1)} }

// DTransfer is the matrix of a distance t through a medium of index n (see
// Transfer).
func DTransfer(t, n Dual) DMat { return DMat{A: Const(1), B: t.Div(n), D: Const(1)} }

// Then returns the matrix of m followed by next: next x m, the derivative
// by the product rule.
func (m DMat) Then(next DMat) DMat {
	return DMat{
		A: next.A.Mul(m.A).Add(next.B.Mul(m.C)),
		B: next.A.Mul(m.B).Add(next.B.Mul(m.D)),
		C: next.C.Mul(m.A).Add(next.D.Mul(m.C)),
		D: next.C.Mul(m.B).Add(next.D.Mul(m.D)),
	}
}
