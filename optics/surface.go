package optics

import (
	"fmt"
	"math"
)

// A Surface is a rotationally symmetric refracting surface: a sphere, a plane
// (zero curvature) or an even asphere. The zero value is a plane.
type Surface struct {
	// Radius is the vertex radius in mm, positive when the centre of
	// curvature lies to the right of the vertex; an infinite radius is a
	// plane, and so is 0, so that the zero Surface is a plane. Kept as the
	// radius, not the curvature, so that prescriptions round-trip exactly.
	Radius float64
	// Conic is the conic constant k (0 sphere, -1 paraboloid).
	Conic float64
	// Asph holds the even-asphere coefficients a4, a6, ..., a16 of h^4 ... h^16
	// in mm^(1-2i).
	Asph [7]float64
}

// Sphere returns a spherical surface of the given radius; an infinite radius
// gives a plane.
func Sphere(radius float64) Surface {
	if radius == 0 {
		panic("optics: zero radius")
	}
	return Surface{Radius: radius}
}

// Curvature is 1/R in 1/mm; 0 for a plane.
func (s Surface) Curvature() float64 {
	if s.Radius == 0 || math.IsInf(s.Radius, 0) {
		return 0
	}
	return 1 / s.Radius
}

// IsPlane tells whether the vertex curvature is zero.
func (s Surface) IsPlane() bool { return s.Curvature() == 0 }

// IsAsphere tells whether the surface departs from a sphere.
func (s Surface) IsAsphere() bool { return s.Conic != 0 || s.Asph != [7]float64{} }

// Sag is the axial departure z(h) of the surface from its vertex plane at
// height h, in the form of ISO 10110-12:2019, eq. 1:
// z = c h^2 / (1 + sqrt(1 - (1+k) c^2 h^2)) + sum a_2i h^2i.
// ok is false where the conic has no point at that height.
func (s Surface) Sag(h float64) (z float64, ok bool) {
	h2 := h * h
	c := s.Curvature()
	arg := 1 - (1+s.Conic)*c*c*h2
	if arg < 0 && arg > -rimSlack {
		arg = 0 // the rim of a hemisphere (a ball lens), rounded past it
	}
	if arg < 0 {
		return math.NaN(), false
	}
	z = c * h2 / (1 + math.Sqrt(arg))
	p := h2 * h2
	for _, a := range s.Asph {
		z += a * p
		p *= h2
	}
	return z, true
}

// SagSlope is dz/dh at height h, for the real-ray tracer's surface normal.
func (s Surface) SagSlope(h float64) float64 {
	c := s.Curvature()
	arg := 1 - (1+s.Conic)*c*c*h*h
	d := c * h / math.Sqrt(arg)
	p := h * h * h
	for i, a := range s.Asph {
		d += float64(2*i+4) * a * p
		p *= h * h
	}
	return d
}

// Reversed returns the surface as seen with the part turned around: the
// sag changes sign.
func (s Surface) Reversed() Surface {
	r := Surface{Radius: -s.Radius, Conic: s.Conic}
	if s.IsPlane() {
		r.Radius = s.Radius
	}
	for i, a := range s.Asph {
		r.Asph[i] = -a
	}
	return r
}

// rimSlack is how far 1 - (1+k) c^2 h^2 may fall below zero and still
// count as the rim: a radius equal to the semi-diameter to a relative
// 1e-9 (a ball lens or hemisphere whose figures were rounded) reaches it.
const rimSlack = 4e-9

// checkHeight tells why the surface cannot reach height h, or returns nil.
// A radius equal to h to a relative 1e-9 reaches it (a hemisphere).
func (s Surface) checkHeight(h float64) error {
	if !s.IsPlane() && s.Conic == 0 && math.Abs(s.Radius) < h*(1-1e-9) {
		return fmt.Errorf("radius %.4g mm is smaller than the %.4g mm semi-diameter", math.Abs(s.Radius), h)
	}
	if _, ok := s.Sag(h); !ok {
		return fmt.Errorf("the conic surface (R %.4g mm, k %.4g) does not reach the %.4g mm semi-diameter", s.Radius, s.Conic, h)
	}
	return nil
}
