package solution

import (
	"fmt"
	"math"
)

// DefaultField picks the chief ray's field when none is asked: the
// requirement's object height (finite object) or field angle (object at
// infinity), or one that keeps the chief ray near 0.3 of the smallest
// clear semi-aperture (for illustration; given is false then). The field
// is an object height in mm for a finite object, an angle in degrees for
// an object at infinity.
func DefaultField(s Solution, asked float64) (field float64, given bool) {
	atInfinity := math.IsInf(s.ObjectZ, -1)
	switch {
	case asked != 0:
		return asked, true
	case !atInfinity && s.Requirement.ObjectHeight > 0:
		return s.Requirement.ObjectHeight, true
	case atInfinity && s.Requirement.FieldAngle > 0:
		return s.Requirement.FieldAngle, true
	}
	a := math.Inf(1)
	for _, p := range s.Parts {
		a = math.Min(a, p.Aperture()/2)
	}
	if !atInfinity {
		return 0.3 * a, false
	}
	reach := s.Envelope()
	if c := s.System().Cardinal(s.Wavelength()); !c.Afocal {
		reach = math.Max(reach, math.Abs(c.EFL))
	}
	return math.Atan(0.3*a/reach) * 180 / math.Pi, false
}

// FieldText names a field with its unit: an angle in degrees for an object
// at infinity, else an object height in mm.
func FieldText(atInfinity bool, field float64) string {
	if atInfinity {
		return fmt.Sprintf("field angle %.4g°", field)
	}
	return fmt.Sprintf("object height %.4g mm", field)
}
