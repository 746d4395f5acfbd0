package synth

import "cardinal/importers"

// DemoGlasses returns the user glasses of the demo scenario, an example for
// `cardinal glass import`: a crystal with a published dispersion formula
// and a melt of crown glass described, as a user might, by the nd and Vd of
// its (invented) melt sheet.
func DemoGlasses() []importers.Glass {
	return []importers.Glass{
		{Name: "mgf2-o", Formula: "sellmeier",
			// M. J. Dodge, "Refractive properties of magnesium fluoride",
			// Appl. Opt. 23, 1980-1985 (1984); ordinary ray, 0.2-7 um
			// (coefficients from memory, checked in the tests against the
			// handbook index no = 1.378 at the d line).
			Coefficients: []float64{0.48755108, 0.04338408 * 0.04338408,
				0.39875031, 0.09461442 * 0.09461442, 2.3120353, 23.793604 * 23.793604},
			MinNm: 200, MaxNm: 7000,
			Source: "M. J. Dodge, Appl. Opt. 23, 1980 (1984), ordinary ray"},
		{Name: "melt-7a", Formula: "abbe", Coefficients: []float64{1.5172, 64.1},
			Source: "invented demo melt sheet: nd 1.5172, vd 64.1"},
	}
}
