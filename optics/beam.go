package optics

import (
	"fmt"
	"math"
	"math/cmplx"
)

// A GaussianBeam is a fundamental-mode (TEM00) beam at one plane, held as
// its complex beam parameter q = z + i zR: z the distance past the waist
// (negative before it), zR the Rayleigh range, both in mm in a medium of
// index N (A. E. Siegman, Lasers, University Science Books, 1986, ch. 17).
//
// A beam of quality M^2 > 1 is carried as its embedded Gaussian: the real
// beam's 1/e^2 radius is M times that of a TEM00 beam of the same q, so
// that it follows the same ABCD law with M^2 lambda in place of lambda
// (A. E. Siegman, "New developments in laser resonators", Proc. SPIE 1224,
// 2-14 (1990); ISO 11146-1 on the beam propagation ratio; from memory).
type GaussianBeam struct {
	Wavelength float64    // vacuum wavelength, nm
	N          float64    // index of the medium the plane lies in
	Q          complex128 // mm
	M2         float64    // beam quality M^2; 0 means 1 (TEM00)
}

// NewGaussianBeam returns the beam at a plane z mm past a waist of radius
// w0 (1/e^2 intensity, mm), in a medium of index n:
// zR = pi w0^2 n / lambda0 (Siegman 1986, ch. 17, with lambda = lambda0/n
// in the medium).
func NewGaussianBeam(wavelengthNm, w0, z, n float64) GaussianBeam {
	if !(w0 > 0) || !(wavelengthNm > 0) || !(n > 0) {
		panic(fmt.Sprintf("optics: Gaussian beam needs positive waist, wavelength and index, got %g, %g, %g", w0, wavelengthNm, n))
	}
	zr := math.Pi * w0 * w0 * n / (wavelengthNm * 1e-6)
	return GaussianBeam{Wavelength: wavelengthNm, N: n, Q: complex(z, zr)}
}

// NewEmbeddedBeam is NewGaussianBeam for a beam of quality m2 (M^2 >= 1)
// whose real waist radius is w0: zR = pi w0^2 n / (M^2 lambda0) (Siegman
// 1990; ISO 11146-1).
func NewEmbeddedBeam(wavelengthNm, w0, z, n, m2 float64) GaussianBeam {
	if !(m2 >= 1) {
		panic(fmt.Sprintf("optics: beam quality M^2 must be at least 1, got %g", m2))
	}
	g := NewGaussianBeam(wavelengthNm, w0, z, n)
	g.Q = complex(z, imag(g.Q)/m2)
	g.M2 = m2
	return g
}

// Quality is M^2, 1 for the zero value.
func (g GaussianBeam) Quality() float64 {
	if g.M2 == 0 {
		return 1
	}
	return g.M2
}

// RayleighRange is zR = Im q.
func (g GaussianBeam) RayleighRange() float64 { return imag(g.Q) }

// WaistDistance is how far past the waist this plane lies (Re q);
// negative when the waist is still ahead.
func (g GaussianBeam) WaistDistance() float64 { return real(g.Q) }

// WaistRadius is w0 = sqrt(zR M^2 lambda0 / (pi n)).
func (g GaussianBeam) WaistRadius() float64 {
	return math.Sqrt(g.RayleighRange() * g.Quality() * g.Wavelength * 1e-6 / (math.Pi * g.N))
}

// Radius is the 1/e^2 intensity radius at this plane,
// w = w0 sqrt(1 + (z/zR)^2) (Siegman 1986, ch. 17).
func (g GaussianBeam) Radius() float64 {
	z, zr := real(g.Q), imag(g.Q)
	return g.WaistRadius() * math.Sqrt(1+z*z/(zr*zr))
}

// Divergence is the far-field half-angle M^2 lambda0 / (pi n w0), radians
// (Siegman 1986, ch. 17; Siegman 1990 for M^2).
func (g GaussianBeam) Divergence() float64 { return g.WaistRadius() / g.RayleighRange() }

// Through carries the beam through an optic of reduced ray-transfer matrix
// m into a medium of index nOut. The reduced parameter q/n transforms by
// the ABCD law, q'/n' = (A q/n + B) / (C q/n + D), because the reduced
// matrix acts on (y, n u) (Siegman 1986, ch. 20, on ray matrices with
// dielectric media and the ABCD law for Gaussian beams).
func (g GaussianBeam) Through(m Mat2, nOut float64) GaussianBeam {
	qh := g.Q / complex(g.N, 0)
	qh = (complex(m.A, 0)*qh + complex(m.B, 0)) / (complex(m.C, 0)*qh + complex(m.D, 0))
	return GaussianBeam{Wavelength: g.Wavelength, N: nOut, Q: qh * complex(nOut, 0), M2: g.M2}
}

// Propagate moves the plane d mm further along in the same medium.
func (g GaussianBeam) Propagate(d float64) GaussianBeam {
	g.Q += complex(d, 0)
	return g
}

// Beam carries a Gaussian beam given at the first vertex (in object
// space) through the system to its last vertex (in image space), at the
// beam's wavelength. The output's WaistDistance, negated, is where its
// waist lies from the last vertex.
func (s System) Beam(in GaussianBeam) GaussianBeam {
	n := s.Indices(in.Wavelength)
	if math.Abs(in.N-n[0]) > 1e-9 {
		panic(fmt.Sprintf("optics: beam in index %g, object space has %g", in.N, n[0]))
	}
	out := in.Through(s.Matrix(in.Wavelength), n[len(n)-1])
	if cmplx.IsNaN(out.Q) {
		panic("optics: Gaussian beam parameter became NaN")
	}
	return out
}
