package catalog

import (
	"cardinal/optics"
)

// Wavelength is the reference wavelength of the stored columns: the d line.
const Wavelength = optics.LineD

// Orientation is what the catalog stores of a part in one orientation at
// the reference wavelength, in air. Front positions are from the first
// vertex, back positions from the last, positive toward the image (the
// convention of package optics).
type Orientation struct {
	Reversed   bool
	Wavelength float64 // nm
	Power      float64 // 1/mm; 0 for an afocal part
	Afocal     bool
	EFL        float64 // mm; 0 for an afocal part
	BFD, FFD   float64 // last vertex to F', first vertex to F
	P, PPrime  float64 // first vertex to P, last vertex to P'
}

// orient computes the stored columns of the part, turned around if
// reversed, straight from the optics core.
func orient(p optics.Part, reversed bool) Orientation {
	if reversed {
		p = p.Reversed()
	}
	c := p.System(nil, nil).Cardinal(Wavelength)
	return Orientation{
		Reversed: reversed, Wavelength: Wavelength,
		Power: c.Power, Afocal: c.Afocal, EFL: c.EFL,
		BFD: c.BFD(), FFD: c.FFD(), P: c.P, PPrime: c.PPrime,
	}
}

// Kinds of part by construction, as stored in parts.kind.
const (
	Singlet   = "singlet"    // one piece of glass
	Cemented  = "cemented"   // several pieces cemented together
	AirSpaced = "air-spaced" // an assembly with air between its elements
)

// kindOf tells how a part is built.
func kindOf(p optics.Part) string {
	for _, m := range p.Media {
		if m != nil && m.Name() == optics.Air.Name() {
			return AirSpaced
		}
	}
	if len(p.Surfaces) <= 2 {
		return Singlet
	}
	return Cemented
}
