package solution

import "cardinal/search"

// laserCautions are the plain-words cautions that go with any output about
// a requirement that mentions a laser.
var laserCautions = []string{
	"Focused laser beams, and ghost foci from light reflected at lens surfaces, can burn skin, eyes and parts; a ghost focus may lie behind you or inside another part.",
	"Check each part's coating and laser damage threshold for your beam's wavelength, power and pulse length before you use it.",
	"Follow the laser safety rules that apply where you work and your laser safety officer; they take precedence over anything this program says.",
}

// LaserCautions returns the laser cautions, a new slice on each call.
func LaserCautions() []string { return append([]string(nil), laserCautions...) }

// KeplerianCaution is added for a beam expander that may have an internal
// focus.
const KeplerianCaution = "A Keplerian expander brings the beam to a focus between its parts: mind the damage threshold and air breakdown there."

// Cautions returns the cautions for a requirement: the laser cautions when
// it mentions a laser (search.Requirement.IsLaser: a power given, or a
// wavelength outside 400-700 nm), and the internal-focus caution for an
// expander that may be Keplerian. A requirement with no laser gets none.
// These are the program's one text of the laser cautions: every command
// prints them from here.
func Cautions(r search.Requirement) []string {
	if !r.IsLaser() {
		return nil
	}
	c := LaserCautions()
	if r.Kind == search.Expand && r.Form != search.Galilean {
		c = append(c, KeplerianCaution)
	}
	return c
}
