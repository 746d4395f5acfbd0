package optics

import "math"

// ConjugateStatus tells how a conjugate solve ended, apart from errors.
type ConjugateStatus int

const (
	// Solved: both planes are at finite positions.
	Solved ConjugateStatus = iota
	// AtInfinity: the image (or the object) lies at infinity.
	AtInfinity
	// NoSolution: an afocal system cannot reach the asked magnification,
	// or cannot form an image of an object at infinity.
	NoSolution
)

func (s ConjugateStatus) String() string {
	return [...]string{"solved", "at infinity", "no solution"}[s]
}

// Image finds the image of an object plane at position z (from the first
// vertex, negative in front of it; -Inf for an object at infinity). It
// returns the image position from the last vertex and the lateral
// magnification. Worked from the matrix, so it holds for afocal systems too:
// with M the vertex-to-vertex matrix, the object-to-image matrix
// T(d'/n') M T(s/n) has B = 0 at the image (Gerrard and Burch, ch. III).
func (c Cardinal) Image(z float64) (zImage, mag float64, status ConjugateStatus) {
	if math.IsInf(z, -1) {
		if c.Afocal {
			return 0, 0, NoSolution
		}
		return c.FPrime, 0, Solved
	}
	m := c.Matrix
	s := -z / c.NObject
	num := m.A*s + m.B
	den := m.C*s + m.D
	if math.Abs(den) <= 1e-12*(math.Abs(m.C*s)+math.Abs(m.D)) {
		return math.Inf(1), math.Inf(1), AtInfinity
	}
	d := -c.NImage * num / den
	return d, m.A + d*m.C/c.NImage, Solved
}

// ForMagnification finds the object and image positions (front from the
// first vertex, back from the last) that give lateral magnification mag,
// from Newton's form x = -f/m, x' = -m f' (Smith, Modern Optical
// Engineering, 4th ed., sec. 2.4; f = P to F, f' = P' to F'). A zero
// magnification puts the object at infinity.
func (c Cardinal) ForMagnification(mag float64) (zObject, zImage float64, status ConjugateStatus) {
	if c.Afocal {
		return 0, 0, NoSolution
	}
	if mag == 0 {
		return math.Inf(-1), c.FPrime, AtInfinity
	}
	return c.F - c.FFront/mag, c.FPrime - mag*c.FBack, Solved
}

// NewtonImage returns x' = f f' / x: the image distance from F' for an object
// at distance x from F (Newton's equation; Hecht, Optics, 5th ed., eq. 5.23
// in its general form with f = P to F and f' = P' to F').
func (c Cardinal) NewtonImage(x float64) float64 { return c.FFront * c.FBack / x }
