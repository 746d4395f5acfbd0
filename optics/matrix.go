package optics

// Mat2 is a reduced ray-transfer matrix acting on (y, n u): height and
// reduced angle (A. Gerrard and J. M. Burch, Introduction to Matrix Methods
// in Optics, Wiley 1975, ch. III). Its determinant is 1.
type Mat2 struct{ A, B, C, D float64 }

// Identity is the matrix of no optics at all.
var Identity = Mat2{A: 1, D: 1}

// Refraction is the matrix of a surface of power phi = (n' - n) c.
func Refraction(power float64) Mat2 { return Mat2{A: 1, C: -power, D: 1} }

// Transfer is the matrix of a distance t through a medium of index n.
func Transfer(t, n float64) Mat2 { return Mat2{A: 1, B: t / n, D: 1} }

// Then returns the matrix of m followed by next: next x m.
func (m Mat2) Then(next Mat2) Mat2 {
	return Mat2{
		A: next.A*m.A + next.B*m.C,
		B: next.A*m.B + next.B*m.D,
		C: next.C*m.A + next.D*m.C,
		D: next.C*m.B + next.D*m.D,
	}
}

// Det is the determinant, 1 up to rounding for any reduced matrix.
func (m Mat2) Det() float64 { return m.A*m.D - m.B*m.C }

// Apply maps a ray (y, n u) through the matrix.
func (m Mat2) Apply(y, nu float64) (float64, float64) {
	return m.A*y + m.B*nu, m.C*y + m.D*nu
}
