package optics

import (
	"errors"
	"fmt"
	"math"
)

// A Focus compares the real marginal ray with the paraxial image.
type Focus struct {
	// Paraxial is the paraxial image position from the last vertex.
	Paraxial float64
	// Marginal is where the real meridional marginal ray (pupil edge,
	// axial object point) crosses the axis, from the last vertex.
	Marginal float64
	// LSA is the longitudinal spherical aberration Marginal - Paraxial:
	// negative when the marginal ray focuses nearer the lens
	// (under-corrected, as in a simple positive lens).
	LSA float64
	// NA is the image-space numerical aperture n' sin U' of the real
	// marginal ray.
	NA float64
}

// MarginalFocus traces the real marginal ray of the axial object point at
// a wavelength and compares its focus with the paraxial image. Clear
// apertures are not enforced here: this is the ray the aperture setting
// asks for, and a bundle trace reports any clipping.
func (s System) MarginalFocus(obj Object, wavelengthNm float64) (Focus, error) {
	c := s.Cardinal(wavelengthNm)
	zp, _, st := c.Image(obj.Z)
	if obj.AtInfinity() && c.Afocal || st != Solved {
		return Focus{}, errors.New("the image is at infinity, so there is no focus to compare")
	}
	b, err := s.Bundle(obj, 0, wavelengthNm, []PupilPoint{{Y: 1}})
	if err != nil {
		return Focus{}, err
	}
	tr := s.Tracer(wavelengthNm)
	tr.Unclipped = true
	p := tr.Trace(b.Rays[0], zp)
	if p.Status != Passed {
		return Focus{}, fmt.Errorf("marginal ray: %w", p.Err())
	}
	if math.Abs(p.Dir.Y) < 1e-15 {
		return Focus{}, errors.New("the marginal ray leaves parallel to the axis")
	}
	zm := p.Image.Z - p.Image.Y*p.Dir.Z/p.Dir.Y - tr.LastVertex()
	return Focus{Paraxial: zp, Marginal: zm, LSA: zm - zp, NA: c.NImage * math.Abs(p.Dir.Y)}, nil
}
