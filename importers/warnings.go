package importers

import (
	"fmt"
	"math"

	"cardinal/catalog/record"
	"cardinal/optics"
)

// Tolerances for stated values. A stock lens's focal length is usually held
// to +-1 % (common practice), and edge thickness to about +-0.1 mm.
const (
	FocalTolerance = 0.01 // fraction
	EdgeTolerance  = 0.1  // mm
)

// ComputedWarnings compares the values a supplier states for an entry (EFL,
// BFD, edge thickness) with those its prescription gives, in air at the
// stated wavelength, and returns a sentence for each that differs by more
// than the tolerances: this catches typing errors in supplier data. It also
// warns when a glass is used outside the range of its dispersion formula.
// The catalog calls it again after a glass changes. e.Part must be valid
// (optics.Part.Validate returns nil).
func ComputedWarnings(e record.Entry) []string {
	var w []string
	wl := e.StatedWavelength
	if wl == 0 {
		wl = DefaultStatedWavelength
	}
	if e.StatedEFL != 0 || e.StatedBFD != 0 {
		sys := e.Part.System(nil, nil)
		for _, r := range sys.RangeWarnings(wl) {
			w = append(w, "stated_wavelength: "+r)
		}
		w = append(w, focalWarnings(e, sys.Cardinal(wl), wl)...)
	}
	if e.StatedEdge != 0 {
		if et, err := e.Part.EdgeThickness(); err != nil {
			w = append(w, fmt.Sprintf("edge_thickness: cannot be computed: %v", err))
		} else if d := et - e.StatedEdge; math.Abs(d) > EdgeTolerance {
			w = append(w, fmt.Sprintf("edge_thickness: stated %s mm, but the prescription gives %s mm at the %s mm diameter (%+.3f mm, more than the %.1f mm tolerance)",
				describe(e.StatedEdge), describe(et), describe(e.Part.Diameter), d, EdgeTolerance))
		}
	}
	return w
}

// focalWarnings compares stated EFL and BFD. The BFD is held to 1 % of the
// larger of itself and the EFL: a stated BFD near zero would otherwise be
// judged to micrometres, while a 1 % error in focal length moves the focal
// point by 1 % of the EFL.
func focalWarnings(e record.Entry, c optics.Cardinal, wl float64) []string {
	var w []string
	if c.Afocal {
		if e.StatedEFL != 0 || e.StatedBFD != 0 {
			w = append(w, fmt.Sprintf("efl: the prescription is afocal at %s nm, but an EFL or BFD is stated", describe(wl)))
		}
		return w
	}
	if s := e.StatedEFL; s != 0 && math.Abs(c.EFL-s) > FocalTolerance*math.Abs(s) {
		w = append(w, fmt.Sprintf("efl: stated %s mm, but the prescription gives %s mm at %s nm (%.2g %% off, more than the 1 %% stock tolerance)",
			describe(s), describe(c.EFL), describe(wl), 100*math.Abs(c.EFL-s)/math.Abs(s)))
	}
	scale := math.Max(math.Abs(e.StatedBFD), math.Abs(c.EFL))
	if s := e.StatedBFD; s != 0 && math.Abs(c.BFD()-s) > FocalTolerance*scale {
		w = append(w, fmt.Sprintf("bfd: stated %s mm, but the prescription gives %s mm at %s nm (off by %.3g mm, more than 1 %% of the focal length)",
			describe(s), describe(c.BFD()), describe(wl), math.Abs(c.BFD()-s)))
	}
	return w
}
