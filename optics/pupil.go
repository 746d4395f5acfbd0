package optics

import (
	"errors"
	"fmt"
	"math"
)

// An Aperture says how much light the system takes. Set at most one
// field; the zero value fills the clear semi-aperture of the stop surface.
type Aperture struct {
	// Beam is the entrance-pupil diameter in mm: the diameter of a
	// collimated beam for an object at infinity.
	Beam float64
	// NA is the object-space numerical aperture n sin U (finite object).
	NA float64
	// FNumber is EFL / entrance-pupil diameter for an object at infinity;
	// for a finite object it is the image-side working f-number
	// 1 / (2 NA'), and the object NA follows as |m| NA' (Lagrange
	// invariant, paraxially; Smith, Modern Optical Engineering, 4th ed.,
	// sec. 4.2).
	FNumber float64
}

// An Object says where the light comes from and where the stop is.
type Object struct {
	// Z is the object plane's position from the first vertex, negative in
	// front of it; math.Inf(-1) puts the object at infinity.
	Z        float64
	Aperture Aperture
	// Stop is the index of the aperture-stop surface; the zero value is
	// the first surface.
	Stop int
}

// AtInfinity tells whether the object is at infinity.
func (o Object) AtInfinity() bool { return math.IsInf(o.Z, -1) }

// A Pupil is the paraxial entrance pupil: the image of the stop in object
// space.
type Pupil struct {
	Z      float64 // position from the first vertex, mm
	Radius float64 // semi-diameter, mm
	// Magnification is the paraxial magnification from the entrance pupil
	// to the stop.
	Magnification float64
}

// EntrancePupil finds the paraxial entrance pupil for the object at a
// wavelength. With [A B; C D] the reduced matrix from the first vertex to
// the stop's vertex, the axial point at z images onto the stop when
// A (-z) u + B n u = 0, so z = n B / A, and the pupil-to-stop
// magnification is A (Gerrard and Burch, Introduction to Matrix Methods
// in Optics, 1975, ch. III: B = 0 between conjugate planes).
func (s System) EntrancePupil(obj Object, wavelengthNm float64) (Pupil, error) {
	if obj.Stop < 0 || obj.Stop >= len(s.Surfaces) {
		panic(fmt.Sprintf("optics: stop at surface %d of a %d-surface system", obj.Stop, len(s.Surfaces)))
	}
	if !obj.AtInfinity() && !(obj.Z < 0) {
		return Pupil{}, fmt.Errorf("object at %g mm: a real object lies in front of the first vertex (negative z) or at infinity", obj.Z)
	}
	n := s.Indices(wavelengthNm)
	m := s.matrixTo(obj.Stop, n)
	if math.Abs(m.A) < 1e-12 {
		return Pupil{}, errors.New("the entrance pupil is at infinity (telecentric in object space)")
	}
	p := Pupil{Z: n[0] * m.B / m.A, Magnification: m.A}
	r, err := s.pupilRadius(obj, p, n, wavelengthNm)
	if err != nil {
		return Pupil{}, err
	}
	p.Radius = r
	if !obj.AtInfinity() && !(p.Z > obj.Z) {
		return Pupil{}, fmt.Errorf("object at %g mm lies at or behind the entrance pupil at %g mm", obj.Z, p.Z)
	}
	return p, nil
}

// matrixTo is the reduced matrix from the first vertex to the vertex of
// surface k, before refraction there.
func (s System) matrixTo(k int, n []float64) Mat2 {
	m := Identity
	for i := 0; i < k; i++ {
		m = m.Then(Refraction((n[i+1] - n[i]) * s.Surfaces[i].Curvature()))
		m = m.Then(Transfer(s.Gaps[i], n[i+1]))
	}
	return m
}

// pupilRadius turns the aperture setting into the entrance-pupil radius.
func (s System) pupilRadius(obj Object, p Pupil, n []float64, wl float64) (float64, error) {
	ap := obj.Aperture
	switch {
	case ap.Beam < 0 || ap.NA < 0 || ap.FNumber < 0:
		return 0, fmt.Errorf("aperture %+v: values must be positive", ap)
	case ap.Beam > 0:
		return ap.Beam / 2, nil
	case ap.NA > 0:
		return naRadius(obj, p, n[0], ap.NA)
	case ap.FNumber > 0:
		return s.fNumberRadius(obj, p, n, wl)
	}
	if obj.Stop < len(s.SemiApertures) && s.SemiApertures[obj.Stop] > 0 {
		return s.SemiApertures[obj.Stop] / math.Abs(p.Magnification), nil
	}
	return 0, errors.New("no aperture: give a beam diameter, an NA or an f-number, or a clear aperture for the stop")
}

// naRadius: the marginal ray from the axial object point to the pupil edge
// makes angle U with sin U = NA / n.
func naRadius(obj Object, p Pupil, n0, na float64) (float64, error) {
	if obj.AtInfinity() {
		return 0, errors.New("an NA needs an object at a finite distance; give a beam diameter for an object at infinity")
	}
	if na >= n0 {
		return 0, fmt.Errorf("NA %g is not below the object-space index %g", na, n0)
	}
	return (p.Z - obj.Z) * math.Tan(math.Asin(na/n0)), nil
}

func (s System) fNumberRadius(obj Object, p Pupil, n []float64, wl float64) (float64, error) {
	c := FromMatrix(s.Matrix(wl), n[0], n[len(n)-1])
	if c.Afocal {
		return 0, errors.New("an f-number means nothing for an afocal system; give a beam diameter")
	}
	if obj.AtInfinity() {
		return math.Abs(c.EFL) / (2 * obj.Aperture.FNumber), nil // N = f / D (common practice)
	}
	_, mag, st := c.Image(obj.Z)
	if st != Solved || mag == 0 {
		return 0, errors.New("the image is at infinity, so a working f-number has no meaning; give an NA")
	}
	return naRadius(obj, p, n[0], math.Abs(mag)/(2*obj.Aperture.FNumber)) // NA = |m| NA', NA' = 1/(2 N_w)
}
