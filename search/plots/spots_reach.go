package plots

import (
	"fmt"

	"cardinal/search/present"
)

// Reached tells whether any ray of the set reached the image plane. When
// none did the set has no spot: its RMS radius is not a figure, and every
// output (the RMS lines of draw, the plots, the report) says that no ray
// reached the image instead of a radius of zero.
func (s SpotSet) Reached() bool { return s.Passed > 0 }

// Summary says the set's RMS spot radius on the image plane in words, with
// how many rays it rests on: "no ray reached the image (all 468 rays
// stopped)" when none did, the count of the lost ones when some were.
func (s SpotSet) Summary(unit string) string {
	total := s.Passed + s.Lost
	switch {
	case !s.Reached():
		return fmt.Sprintf("no ray reached the image (all %d rays stopped)", total)
	case s.Lost > 0:
		return fmt.Sprintf("RMS spot radius %s %s from the %d of %d rays that reached the image (%d lost)", present.Figure(s.RMS), unit, s.Passed, total, s.Lost)
	}
	return fmt.Sprintf("RMS spot radius %s %s (%d rays, none lost)", present.Figure(s.RMS), unit, total)
}

// Cell is the set's RMS spot radius for a table of figures: the number,
// "(N of T rays)" after it when some were lost, or "no ray reached the
// image".
func (s SpotSet) Cell() string {
	switch {
	case !s.Reached():
		return "no ray reached the image"
	case s.Lost > 0:
		return fmt.Sprintf("%s (%d of %d rays)", present.Figure(s.RMS), s.Passed, s.Passed+s.Lost)
	}
	return present.Figure(s.RMS)
}
