package optics

import (
	"fmt"
	"math"
)

// Coupling is the fraction of the power of beam a that couples into the
// mode of beam b, both given at the same plane, at the same wavelength and
// in the same medium: the squared overlap of the two fundamental modes,
//
//	eta = 4 Im(qa) Im(qb) / |conj(qa) - qb|^2,
//
// which for waist radii w1, w2 whose waists lie dz apart is
// 4 / ((w1/w2 + w2/w1)^2 + (lambda dz / (pi w1 w2))^2) (H. Kogelnik,
// "Coupling and conversion coefficients for optical modes", Proc. Symp.
// Quasi-Optics, Polytechnic Press, 1964; also D. Marcuse, Light
// Transmission Optics, 2nd ed., 1982, on mode mismatch; from memory). It is
// 1 only when the beams are the same.
func Coupling(a, b GaussianBeam) float64 {
	if a.Wavelength != b.Wavelength || math.Abs(a.N-b.N) > 1e-12 {
		panic(fmt.Sprintf("optics: coupling of beams at %g nm in n=%g and %g nm in n=%g", a.Wavelength, a.N, b.Wavelength, b.N))
	}
	za, zb := imag(a.Q), imag(b.Q)
	dz := real(a.Q) - real(b.Q)
	return 4 * za * zb / (dz*dz + (za+zb)*(za+zb))
}

// A Placement is where a thin lens (or a thick part's principal planes)
// sits to turn one waist into another: D1 from the input waist to the lens
// (its front principal plane), D2 from the lens (its back principal plane)
// to the output waist, both in mm and positive in the direction of the
// light.
type Placement struct{ D1, D2 float64 }

// ModeMatchFocal is f0 = pi w1 w2 / lambda, the least focal length that
// turns a waist of radius w1 into one of radius w2 (H. Kogelnik and T. Li,
// "Laser beams and resonators", Appl. Opt. 5, 1550-1567 (1966), sec. VI).
// Radii in mm, wavelength in nm, in air.
func ModeMatchFocal(w1, w2, wavelengthNm float64) float64 {
	return math.Pi * w1 * w2 / (wavelengthNm * 1e-6)
}

// ModeMatchPlacements returns the placements of a lens of focal length f
// that image a waist of radius w1 onto a waist of radius w2, in air:
//
//	d1 = f +- (w1/w2) sqrt(f^2 - f0^2),   d2 = f +- (w2/w1) sqrt(f^2 - f0^2)
//
// with the same sign in both (Kogelnik and Li 1966, sec. VI, eqs. for
// matching with a single lens). None when f < f0; one when f = f0.
func ModeMatchPlacements(w1, w2, wavelengthNm, f float64) []Placement {
	f0 := ModeMatchFocal(w1, w2, wavelengthNm)
	if !(f >= f0) {
		return nil
	}
	r := math.Sqrt((f - f0) * (f + f0))
	if r == 0 {
		return []Placement{{f, f}}
	}
	return []Placement{{f + w1/w2*r, f + w2/w1*r}, {f - w1/w2*r, f - w2/w1*r}}
}
