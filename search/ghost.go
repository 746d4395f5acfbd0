package search

import (
	"fmt"
	"math"
	"sort"

	"cardinal/optics"
)

// Thresholds of the ghost flags.
const (
	// GhostSurfaceClearance: a ghost focus closer than this to a surface
	// vertex is flagged, mm.
	GhostSurfaceClearance = 1.0
	// GhostLaserFraction: a ghost focus whose distance from the laser's
	// exit aperture is within this fraction of its own distance from the
	// first vertex is flagged.
	GhostLaserFraction = 0.05
)

// A GhostFocus is one real ghost focus of a layout, as a person reads it:
// light reflected once (back toward the laser) or twice (on toward the
// image) that comes to a focus. Positions from the first vertex, positive
// toward the image.
type GhostFocus struct {
	// Surfaces are the reflecting surfaces, numbered 1 up in light order
	// through the whole layout: the later one first for a double
	// reflection.
	Surfaces  []int   `json:"surfaces"`
	Direction string  `json:"direction"` // "back" (toward the laser) or "forward"
	Z         float64 `json:"z_mm"`
	Radius    float64 `json:"radius_um"` // 1/e^2 radius at the focus
	// Reflectance is the product of the reflectances met; Concentration
	// the ghost's peak irradiance over the input beam's peak at the first
	// part (reflectance times the ratio of beam area to ghost area).
	Reflectance   float64 `json:"reflectance"`
	Concentration float64 `json:"concentration"`
	// ReflectanceFrom says where the reflectances come from: "indices"
	// (Fresnel), "coating" (the parts' stated residual reflectance) or
	// "coating and indices" for a double reflection with one of each.
	ReflectanceFrom string `json:"reflectance_from"`
	// Peak is the estimated peak irradiance of the ghost with the
	// requirement's power, W/cm^2: 2 P R / (pi w^2) (the peak of a
	// Gaussian beam of power P R; Siegman, Lasers, 1986, ch. 17); nil
	// without a power.
	Peak  *float64 `json:"peak_w_per_cm2,omitempty"`
	Flags []string `json:"flags,omitempty"`
}

// Flagged tells whether the focus lies where it needs attention.
func (g GhostFocus) Flagged() bool { return len(g.Flags) > 0 }

// Ghosts are the ghost foci of a system for a laser requirement, most
// concentrated first, and the number of ghosts whose reflected beam only
// diverges (a virtual focus, not listed). in is the laser's beam at the
// first vertex (Requirement.InputBeam, or for mode matching the input
// waist at the working distance). Each surface reflects as its part's
// coating states (sys.Reflectances, filled by optics.Assemble), else as
// the Fresnel formula gives from the indices.
func Ghosts(sys optics.System, req Requirement, in optics.GaussianBeam) ([]GhostFocus, int) {
	var out []GhostFocus
	virtual := 0
	for _, g := range sys.Ghosts(in) {
		if !g.Real {
			virtual++
			continue
		}
		f := GhostFocus{Surfaces: g.Surfaces, Direction: "back", Z: g.Z, Radius: 1000 * g.Radius,
			Reflectance: g.Reflectance, Concentration: g.Concentration, ReflectanceFrom: reflectanceFrom(g.Coated)}
		if g.Forward {
			f.Direction = "forward"
		}
		if req.Power > 0 {
			f.Peak = ptr(2 * req.Power * g.Reflectance / (math.Pi * g.Radius * g.Radius) * 100) // W/mm^2 to W/cm^2
		}
		if g.InGlass {
			f.Flags = append(f.Flags, "inside a part")
		}
		if g.Nearest < GhostSurfaceClearance {
			f.Flags = append(f.Flags, fmt.Sprintf("within %g mm of surface %d", GhostSurfaceClearance, g.Surface))
		}
		if d := req.LaserExit; d > 0 && !g.Forward && math.Abs(g.Z+d) <= GhostLaserFraction*math.Abs(g.Z) {
			f.Flags = append(f.Flags, "at the laser's exit")
		}
		out = append(out, f)
	}
	sort.SliceStable(out, func(i, j int) bool { return out[i].Concentration > out[j].Concentration })
	return out, virtual
}

// ghostInput is the laser's beam at the first vertex that ghosts are
// judged with: the requirement's input beam, or for mode matching its
// input waist wd before the first vertex (the layout's working distance).
func (r Requirement) ghostInput(wd float64) optics.GaussianBeam {
	if r.Kind == Match {
		return optics.NewGaussianBeam(r.Lambda(), r.WaistIn, wd, 1)
	}
	return r.InputBeam()
}

// ResultGhosts are every ghost focus of a result of a laser requirement
// (the ones its worst ghost was chosen from), most concentrated first, and
// the number of virtual ones; sys is the result's layout as built
// (optics.Assemble of its parts, turned as the result says, at its gap).
func ResultGhosts(sys optics.System, req Requirement, r Result) ([]GhostFocus, int) {
	wd := 0.0
	if r.WorkingDistance != nil {
		wd = *r.WorkingDistance
	}
	return Ghosts(sys, req, req.ghostInput(wd))
}

// reflectanceFrom names where a ghost's reflectances come from.
func reflectanceFrom(coated []bool) string {
	n := 0
	for _, c := range coated {
		if c {
			n++
		}
	}
	switch n {
	case 0:
		return "indices"
	case len(coated):
		return "coating"
	}
	return "coating and indices"
}

// ghostSummary puts the most concentrated ghost and the number flagged
// into a result's laser figures.
func ghostSummary(f *LaserFigures, gs []GhostFocus) {
	for i := range gs {
		if f.Ghost == nil {
			f.Ghost = &gs[i]
		}
		if gs[i].Flagged() {
			f.GhostsFlagged++
		}
	}
}

// GhostNotes are the lines that go with ghost figures wherever they are
// printed: what they are and are not.
func GhostNotes(req Requirement) []string {
	n := []string{"ghost foci are paraxial Gaussian-beam estimates at normal incidence, each surface reflecting as its part's stated coating says or else as the Fresnel formula gives from the indices, aberrations and transmission losses ignored (so concentrations err high); they do not replace a safety assessment: ask your laser safety officer and follow local rules"}
	if req.LaserExit == 0 {
		n = append(n, "ghosts are not checked against the laser's exit: give --laser-exit (its distance before the first vertex)")
	}
	return n
}
