package synth

import (
	"math"

	"cardinal/optics"
)

// part turns the solved layout into a prescription with rounded radii.
func (l *layout) part(s Spec) optics.Part {
	surf := make([]optics.Surface, len(l.c))
	for i, c := range l.c {
		surf[i] = optics.Surface{Radius: roundRadius(c * l.scale)}
	}
	return optics.Part{Diameter: s.Diameter, ClearAperture: s.ClearAperture,
		Surfaces: surf, Thickness: l.t, Media: l.media}
}

// roundRadius gives the radius of curvature c rounded as a drawing states
// it: 0.01 mm below 100 mm, 0.1 mm below 1000 mm, else 1 mm; a flat is +Inf.
func roundRadius(c float64) float64 {
	if c == 0 {
		return math.Inf(1)
	}
	r := 1 / c
	switch a := math.Abs(r); {
	case a < 100:
		return roundTo(r, 0.01)
	case a < 1000:
		return roundTo(r, 0.1)
	default:
		return roundTo(r, 1)
	}
}
