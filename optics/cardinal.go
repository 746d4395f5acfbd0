package optics

import "math"

// AfocalPower is the power in 1/mm below which a system is treated as afocal
// (a focal length beyond 10^9 mm).
const AfocalPower = 1e-9

// Cardinal holds the first-order properties of a system at one wavelength.
// Front positions are from the first vertex, back positions from the last
// vertex, all positive toward image space (see the package comment). For an
// afocal system the focal quantities are zero and Afocal is true.
type Cardinal struct {
	Wavelength      float64 // nm
	NObject, NImage float64 // indices of object and image space
	Length          float64 // first to last vertex, mm
	Matrix          Mat2    // first vertex to last vertex, reduced

	Power  float64 // 1/mm
	Afocal bool
	// AngularMagnification and LateralMagnification describe an afocal
	// system (u'/u and y'/y); for a focal one they are zero.
	AngularMagnification, LateralMagnification float64

	EFL           float64 // 1/Power
	FFront, FBack float64 // P to F and P' to F'
	F, FPrime     float64 // focal points: F = FFD, F' = BFD
	P, PPrime     float64 // principal points (lateral magnification +1)
	N, NPrime     float64 // nodal points (angular magnification +1)
	AP, APPrime   float64 // anti-principal points (lateral magnification -1)
	AN, ANPrime   float64 // anti-nodal points (angular magnification -1)
}

// Cardinal computes the cardinal points of the system at a wavelength.
func (s System) Cardinal(wavelengthNm float64) Cardinal {
	n := s.Indices(wavelengthNm)
	c := FromMatrix(s.Matrix(wavelengthNm), n[0], n[len(n)-1])
	c.Wavelength = wavelengthNm
	c.Length = s.Length()
	return c
}

// FromMatrix derives the cardinal points from the reduced matrix of a system
// between media of index n (object) and n' (image). With M = [A B; C D] and
// power phi = -C (W. J. Smith, Modern Optical Engineering, 4th ed., 2008,
// sec. 3.4; Gerrard and Burch, ch. III):
//
//	F  = -n D / phi      F' = n' A / phi      (from the vertices)
//	f  = -n / phi        f' = n' / phi        (P to F, P' to F')
//	P  = F - f           P' = F' - f'
//	N  = F + f'          N' = F' + f          (P N = P' N' = (n' - n)/phi)
//	AP = F + f           AP' = F' + f'        (Newton: x x' = f f', m = -f/x)
//	AN = F - f'          AN' = F' - f
func FromMatrix(m Mat2, n, nPrime float64) Cardinal {
	c := Cardinal{NObject: n, NImage: nPrime, Matrix: m, Power: -m.C}
	if math.Abs(c.Power) < AfocalPower {
		c.Power = 0
		c.Afocal = true
		c.LateralMagnification = m.A
		c.AngularMagnification = n * m.D / nPrime // Lagrange invariant with C = 0, AD = 1
		return c
	}
	phi := c.Power
	c.EFL = 1 / phi
	c.FFront, c.FBack = -n/phi, nPrime/phi
	c.F, c.FPrime = -n*m.D/phi, nPrime*m.A/phi
	c.P, c.PPrime = c.F-c.FFront, c.FPrime-c.FBack
	c.N, c.NPrime = c.F+c.FBack, c.FPrime+c.FFront
	c.AP, c.APPrime = c.F+c.FFront, c.FPrime+c.FBack
	c.AN, c.ANPrime = c.F-c.FBack, c.FPrime-c.FFront
	return c
}

// FFD is the front focal distance: the position of F from the first vertex.
func (c Cardinal) FFD() float64 { return c.F }

// BFD is the back focal distance: the position of F' from the last vertex.
func (c Cardinal) BFD() float64 { return c.FPrime }

// Dioptres is the power in dioptres (1/m).
func (c Cardinal) Dioptres() float64 { return c.Power * 1000 }
