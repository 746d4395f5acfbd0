package optics

import (
	"errors"
	"math"
)

// Seidel holds the primary (third-order) aberration sums of a system for
// one object, aperture and field, from the paraxial marginal and chief
// rays at one wavelength, and the primary chromatic sums for a pair of
// wavelengths (W. T. Welford, Aberrations of Optical Systems, 1986,
// ch. 7-8). In that convention the wavefront aberration at normalised
// pupil radius rho, azimuth theta from the meridian, full field, is
//
//	W = S1 rho^4/8 + S2 rho^3 cos(theta)/2 + S3 rho^2 cos^2(theta)/2
//	  + (S3 + S4) rho^2/4 + S5 rho cos(theta)/2
//
// and the chromatic part is CL rho^2/2 + CT rho cos(theta). All sums are in
// mm. A positive S1 is under-corrected spherical aberration (the marginal
// focus nearer the lens), as in a simple positive lens.
type Seidel struct {
	S1, S2, S3, S4, S5 float64 // spherical, coma, astigmatism, Petzval, distortion
	CL, CT             float64 // axial and lateral colour
	// H is the Lagrange invariant n (u ybar - ubar y).
	H float64
	// NImage and UImage are n' and the angle u' of the paraxial marginal
	// ray in image space; UImage is 0 for an afocal system, and then the
	// transverse and longitudinal forms below are 0 too.
	NImage, UImage float64
}

// paraxialRay is a paraxial ray: height and angle (slope) before a surface.
type paraxialRay struct{ y, u float64 }

// Seidel computes the Seidel sums at wavelengthNm for the object and
// field (object height in mm, or field angle in degrees at infinity; see
// Bundle), with the chromatic sums over the dispersion n(short) - n(long)
// of each medium.
func (s System) Seidel(obj Object, field, wavelengthNm, shortNm, longNm float64) (Seidel, error) {
	p, err := s.EntrancePupil(obj, wavelengthNm)
	if err != nil {
		return Seidel{}, err
	}
	m, c := startRays(obj, p, field)
	n := s.Indices(wavelengthNm)
	dn := s.Indices(shortNm)
	for i, v := range s.Indices(longNm) {
		dn[i] -= v
	}
	sd := Seidel{H: n[0] * (m.u*c.y - c.u*m.y), NImage: n[len(n)-1]}
	for i, surf := range s.Surfaces {
		m, c = sd.addSurface(surf, n[i], n[i+1], dn[i], dn[i+1], m, c)
		if i < len(s.Gaps) {
			m.y += s.Gaps[i] * m.u
			c.y += s.Gaps[i] * c.u
		}
	}
	sd.UImage = m.u
	if math.Abs(m.u) < 1e-15 {
		sd.UImage = 0
	}
	return sd, nil
}

// startRays returns the paraxial marginal ray (axial object point to the
// pupil's edge) and chief ray (field point to the pupil's centre) at the
// first vertex.
func startRays(obj Object, p Pupil, field float64) (marginal, chief paraxialRay) {
	if obj.AtInfinity() {
		u := math.Tan(field * math.Pi / 180)
		return paraxialRay{y: p.Radius}, paraxialRay{y: -u * p.Z, u: u}
	}
	l := p.Z - obj.Z
	marginal.u = p.Radius / l
	marginal.y = -marginal.u * obj.Z
	chief.u = -field / l
	chief.y = field - chief.u*obj.Z
	return marginal, chief
}

// addSurface adds one surface's contributions and refracts both rays
// (Welford 1986, ch. 7-8): with A = n (u + y c), Abar = n (ubar + ybar c),
// Delta(x) the change of x across the surface,
//
//	S1 = -A^2 y Delta(u/n)      S2 = -A Abar y Delta(u/n)
//	S3 = -Abar^2 y Delta(u/n)   S4 = -H^2 c Delta(1/n)
//	S5 = (Abar/A)(S3 + S4)      CL = A y Delta(dn/n)   CT = Abar y Delta(dn/n)
//
// S5 is evaluated in the equivalent form that does not divide by A,
// -Abar^3 y Delta(1/n^2) + Abar ybar c Delta(1/n) (2 Abar y - A ybar),
// which follows from y Delta(u/n) = A y Delta(1/n^2) - y^2 c Delta(1/n) and
// H = A ybar - Abar y. An aspheric surface with fourth-order sag beyond the
// sphere's, b = k c^3/8 + a4, adds 8 b (n' - n) times y^4, y^3 ybar,
// y^2 ybar^2 and y ybar^3 to S1, S2, S3 and S5 (Welford 1986, ch. 8, on
// aspheric surfaces).
func (sd *Seidel) addSurface(surf Surface, n1, n2, dn1, dn2 float64, m, c paraxialRay) (paraxialRay, paraxialRay) {
	cv := surf.Curvature()
	a, ab := n1*(m.u+m.y*cv), n1*(c.u+c.y*cv)
	u2 := (n1*m.u - m.y*cv*(n2-n1)) / n2 // n'u' = n u - y c (n' - n)
	ub2 := (n1*c.u - c.y*cv*(n2-n1)) / n2
	du := u2/n2 - m.u/n1
	dInv, dInv2 := 1/n2-1/n1, 1/(n2*n2)-1/(n1*n1)
	sd.S1 -= a * a * m.y * du
	sd.S2 -= a * ab * m.y * du
	sd.S3 -= ab * ab * m.y * du
	sd.S4 -= sd.H * sd.H * cv * dInv
	sd.S5 += -ab*ab*ab*m.y*dInv2 + ab*c.y*cv*dInv*(2*ab*m.y-a*c.y)
	ddn := dn2/n2 - dn1/n1
	sd.CL += a * m.y * ddn
	sd.CT += ab * m.y * ddn
	if surf.IsAsphere() {
		d := 8 * (surf.Conic*cv*cv*cv/8 + surf.Asph[0]) * (n2 - n1)
		y, yb := m.y, c.y
		sd.S1 += d * y * y * y * y
		sd.S2 += d * y * y * y * yb
		sd.S3 += d * y * y * yb * yb
		sd.S5 += d * y * yb * yb * yb
	}
	return paraxialRay{m.y, u2}, paraxialRay{c.y, ub2}
}

// The transverse and longitudinal forms below follow from W by
// eps = (1/(n' u')) dW/drho and dz = -eps/u' (Welford 1986, ch. 7, on ray
// and wavefront aberrations; the signs are checked against real rays in
// the tests). Transverse values are measured on the paraxial image plane,
// longitudinal ones from the paraxial image, positive toward image space.

// TransverseSpherical is the third-order transverse spherical aberration
// of the marginal ray at the paraxial image, S1 / (2 n' u').
func (sd Seidel) TransverseSpherical() float64 { return sd.transverse(sd.S1 / 2) }

// LongitudinalSpherical is the third-order axial distance from the
// paraxial focus to the marginal ray's focus, -S1 / (2 n' u'^2).
func (sd Seidel) LongitudinalSpherical() float64 { return sd.longitudinal(sd.S1 / 2) }

// TangentialComa is the third-order tangential coma: the mean height of
// the upper and lower marginal rays of the meridional fan from the chief
// ray, 3 S2 / (2 n' u').
func (sd Seidel) TangentialComa() float64 { return sd.transverse(1.5 * sd.S2) }

// Distortion is the third-order displacement of the chief ray from the
// paraxial image height, S5 / (2 n' u').
func (sd Seidel) Distortion() float64 { return sd.transverse(sd.S5 / 2) }

// AxialColour is the paraxial focus of the short wavelength less that of
// the long one, -CL / (n' u'^2).
func (sd Seidel) AxialColour() float64 { return sd.longitudinal(sd.CL) }

// LateralColour is the chief ray's height at the short wavelength less
// that at the long one, on the paraxial image plane, CT / (n' u').
func (sd Seidel) LateralColour() float64 { return sd.transverse(sd.CT) }

func (sd Seidel) transverse(dw float64) float64 {
	if sd.UImage == 0 {
		return 0
	}
	return dw / (sd.NImage * sd.UImage)
}

func (sd Seidel) longitudinal(dw float64) float64 {
	if sd.UImage == 0 {
		return 0
	}
	return -dw / (sd.NImage * sd.UImage * sd.UImage)
}

var errAfocal = errors.New("the system is afocal: it forms no focused image to judge; judge it by angles instead")
