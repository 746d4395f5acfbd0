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

// roundRadius gives the radius of curvature c to four significant figures,
// as a drawing states it (0.001 mm below 10 mm, 0.01 mm below 100 mm, ...);
// a flat is +Inf.
func roundRadius(c float64) float64 {
	if c == 0 {
		return math.Inf(1)
	}
	r := 1 / c
	return roundTo(r, math.Pow(10, math.Floor(math.Log10(math.Abs(r)))-3))
}
