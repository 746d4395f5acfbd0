package optics

import (
	"errors"
	"fmt"
	"math"
)

// Chromatic is how focus and image height move across a band of
// wavelengths.
type Chromatic struct {
	Wavelengths []float64 // nm, as given
	// Focus is the paraxial image position at each wavelength, from the
	// last vertex.
	Focus []float64
	// FocalShift is the spread of Focus, max - min (mm).
	FocalShift float64
	// ChiefY is the height of the real chief ray from the field point at
	// each wavelength on the reference image plane (mm).
	ChiefY []float64
	// LateralColour is the spread of ChiefY, max - min (mm); 0 on axis.
	LateralColour float64
}

// Chromatic finds the paraxial focus of the object at each wavelength and
// traces the real chief ray from the field point (object height in mm, or
// field angle in degrees at infinity) at each wavelength to the image
// plane at imageZ from the last vertex. The focal shift is the axial
// colour and the chief-ray spread the lateral colour (Smith, Modern
// Optical Engineering, 4th ed., ch. 3, on chromatic aberration; common
// practice).
func (s System) Chromatic(obj Object, field float64, wavelengths []float64, imageZ float64) (Chromatic, error) {
	if len(wavelengths) == 0 {
		return Chromatic{}, errors.New("no wavelengths given")
	}
	ch := Chromatic{Wavelengths: wavelengths}
	for _, wl := range wavelengths {
		if !(wl > 0) {
			return Chromatic{}, fmt.Errorf("wavelength %g nm must be positive", wl)
		}
		z, _, st := s.Cardinal(wl).Image(obj.Z)
		if st != Solved {
			return Chromatic{}, fmt.Errorf("at %g nm the image is %v", wl, st)
		}
		y, err := s.chiefHeight(obj, field, wl, imageZ)
		if err != nil {
			return Chromatic{}, fmt.Errorf("at %g nm: %w", wl, err)
		}
		ch.Focus, ch.ChiefY = append(ch.Focus, z), append(ch.ChiefY, y)
	}
	ch.FocalShift, ch.LateralColour = spread(ch.Focus), spread(ch.ChiefY)
	return ch, nil
}

func (s System) chiefHeight(obj Object, field, wl, imageZ float64) (float64, error) {
	if field == 0 {
		return 0, nil
	}
	b, err := s.Bundle(obj, field, wl, []PupilPoint{{}})
	if err != nil {
		return 0, err
	}
	p := s.Tracer(wl).Trace(b.Rays[0], imageZ)
	if p.Status != Passed {
		return 0, fmt.Errorf("chief ray: %w", p.Err())
	}
	return p.Image.Y, nil
}

func spread(v []float64) float64 {
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, x := range v {
		lo, hi = math.Min(lo, x), math.Max(hi, x)
	}
	return hi - lo
}
