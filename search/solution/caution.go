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

// Cautions returns the cautions for a requirement and the results shown:
// the laser cautions when it mentions a laser (search.Requirement.IsLaser:
// a power given, or a wavelength outside 400-700 nm), and the
// internal-focus caution for an expander when a result shown is Keplerian
// (with no results given, when the requirement allows that form). A
// requirement with no laser gets none. These are the program's one text of
// the laser cautions: every command prints them from here.
func Cautions(r search.Requirement, shown ...search.Result) []string {
	if !r.IsLaser() {
		return nil
	}
	c := LaserCautions()
	if r.Kind == search.Expand && keplerianShown(r, shown) {
		c = append(c, KeplerianCaution)
	}
	return c
}

func keplerianShown(r search.Requirement, shown []search.Result) bool {
	if len(shown) == 0 {
		return r.Form != search.Galilean
	}
	for _, s := range shown {
		if s.Form == search.Keplerian {
			return true
		}
	}
	return false
}

// Results returns the results of solutions, in their order.
func Results(ss []Solution) []search.Result {
	rs := make([]search.Result, len(ss))
	for i, s := range ss {
		rs[i] = s.Result
	}
	return rs
}
