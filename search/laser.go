package search

import (
	"fmt"
	"math"

	"cardinal/optics"
)

// DefaultCouplingMin is the least power coupling a mode-matching layout
// must reach when none is given.
const DefaultCouplingMin = 0.95

// Gaussian tells whether the search treats the input as a Gaussian beam: a
// laser requirement (IsLaser) that focuses or expands a beam given by
// --beam or --waist-in, and every mode-matching requirement. Image
// requirements stay incoherent.
func (r Requirement) Gaussian() bool {
	switch r.Kind {
	case Match:
		return true
	case Focus, Expand:
		return r.IsLaser() && (r.Beam > 0 || r.WaistIn > 0)
	}
	return false
}

// Quality is M^2, 1 when not given.
func (r Requirement) Quality() float64 {
	if r.M2 == 0 {
		return 1
	}
	return r.M2
}

// MinCoupling is the coupling a mode-matching layout must reach.
func (r Requirement) MinCoupling() float64 {
	if r.CouplingMin == 0 {
		return DefaultCouplingMin
	}
	return r.CouplingMin
}

// InputBeam is the laser's beam at the first vertex, in air, as an
// embedded Gaussian of quality M^2: a waist of radius WaistIn lying
// WaistInAt before the first vertex, or, without WaistIn, a collimated
// beam of 1/e^2 diameter Beam with its waist at the first vertex.
func (r Requirement) InputBeam() optics.GaussianBeam { return r.inputBeamIn(1) }

// inputBeamIn is InputBeam in a medium of index n.
func (r Requirement) inputBeamIn(n float64) optics.GaussianBeam {
	if r.WaistIn > 0 {
		return optics.NewEmbeddedBeam(r.Lambda(), r.WaistIn, r.WaistInAt, n, r.Quality())
	}
	return optics.NewEmbeddedBeam(r.Lambda(), r.Beam/2, 0, n, r.Quality())
}

// BeamDiameter is the diameter of the beam at the first part that ray
// heights and real rays use: Beam, or for a Gaussian input given by its
// waist the 1/e^2 diameter it has at the first vertex.
func (r Requirement) BeamDiameter() float64 {
	if r.Beam > 0 || r.WaistIn <= 0 || r.Kind == Match || r.Kind == Image {
		return r.Beam
	}
	return 2 * r.InputBeam().Radius()
}

func (r Requirement) validateLaser(ps *problems) {
	if r.WaistInAt != 0 && r.WaistIn == 0 {
		ps.add("{waist_in_at_mm} places the input waist: give its radius with {waist_in_mm} too")
	}
	if r.Kind == Image {
		r.notFor(Image, ps, named{"waist_in_mm", r.WaistIn}, named{"m2", r.M2}, named{"waist_out_at_mm", r.WaistOutAt})
		return
	}
	if r.WaistOutAt != 0 && r.Kind != Expand {
		ps.add("{waist_out_at_mm} applies to an expand requirement only")
	}
	if r.Kind != Match && r.WaistIn > 0 && r.Beam > 0 {
		ps.add("give the input beam once: {beam_mm} (1/e^2 diameter, waist at the first part) or {waist_in_mm} with {waist_in_at_mm}")
	}
	if r.Kind == Expand && r.WaistOutAt != 0 && !r.Gaussian() {
		ps.add("{waist_out_at_mm} needs a laser beam: give {beam_mm} or {waist_in_mm} with {laser}, {power_w} or a laser wavelength")
	}
	if r.Kind != Match {
		r.notFor(r.Kind, ps, named{"waist_out_mm", r.WaistOut}, named{"coupling_min", r.CouplingMin})
	}
}

func (r Requirement) validateMatch(ps *problems) {
	switch {
	case r.WaistIn <= 0:
		ps.add("mode matching needs the input waist radius ({waist_in_mm}, 1/e^2, mm)")
	case r.WaistOut <= 0:
		ps.add("mode matching needs the output waist radius ({waist_out_mm}, 1/e^2, mm)")
	}
	if r.CouplingMin != 0 && !(r.CouplingMin > 0 && r.CouplingMin <= 1) {
		ps.add("the coupling minimum {coupling_min} must lie in (0, 1], not %g", r.CouplingMin)
	}
	if r.Quality() != 1 {
		ps.add("mode matching couples a single-mode (TEM00) beam: {m2} M^2 must be 1, not %g", r.M2)
	}
	if r.WaistInAt != 0 {
		ps.add("mode matching solves where the input waist lies: drop {waist_in_at_mm} (the working distance is from the input waist)")
	}
	if r.Track > 0 && r.WDMin+r.BFDMin >= r.Track {
		ps.add("the working distance minimum {working_distance_min_mm} %g mm and back clearance minimum {back_clearance_min_mm} %g mm leave nothing of the %g mm track", r.WDMin, r.BFDMin, r.Track)
	}
	r.notFor(Match, ps, named{"efl_mm", r.EFL}, named{"magnification", r.Mag}, named{"expansion", r.Expansion},
		named{"na", r.NA}, named{"object_height_mm", r.ObjectHeight}, named{"field_angle_deg", r.FieldAngle},
		named{"beam_mm", r.Beam})
	if r.Form != AnyForm {
		ps.add("{form} applies to an expand requirement only")
	}
	if len(r.Band) > 0 {
		ps.add("{band_nm} does not apply to mode matching: a laser is one wavelength")
	}
}

// LaserFigures are the Gaussian-beam figures of one result of a laser
// requirement. Lengths in the unit their JSON key names; a nil figure does
// not apply to the kind.
type LaserFigures struct {
	// WaistRadius is the output waist's 1/e^2 radius (the focused spot,
	// the expanded beam, or the beam produced for mode matching), um.
	WaistRadius float64 `json:"waist_radius_um"`
	// WaistAt is where that waist lies from the last vertex, mm.
	WaistAt float64 `json:"waist_at_mm"`
	// RayleighRange is the output beam's Rayleigh range, mm: the depth of
	// focus of a focused beam.
	RayleighRange float64 `json:"rayleigh_range_mm"`
	// WaistShift is focus only: the waist minus the paraxial focus, mm,
	// negative when the waist lies before it (Self's focal shift).
	WaistShift *float64 `json:"waist_shift_mm,omitempty"`
	// SpotLimit is focus only, with real rays: "aberration" when the RMS
	// spot exceeds the RMS radius of the Gaussian waist (w / sqrt 2),
	// else "waist".
	SpotLimit string `json:"spot_limited_by,omitempty"`
	// Divergence is expand only: the far-field half-angle of the output
	// beam, mrad; DivergenceLimit the diffraction limit M^2 lambda /
	// (pi w0) of a beam of that waist; DivergenceRatio the estimated
	// divergence with the expander's aberration over that limit.
	Divergence      *float64 `json:"divergence_mrad,omitempty"`
	DivergenceRatio *float64 `json:"divergence_ratio,omitempty"`
	// WavefrontRMS is expand only: the real-ray wavefront error at the
	// collimating gap, defocus removed, waves.
	WavefrontRMS *float64 `json:"wavefront_rms_waves,omitempty"`
	// AfocalGap is expand only: the first-order afocal gap, mm, against
	// the collimating gap the result uses.
	AfocalGap *float64 `json:"afocal_gap_mm,omitempty"`
	// Coupling is match only: the power coupling into the target mode;
	// CouplingTol how far the adjustable spacing (the gap of a pair, the
	// part's position for a single) may move before it drops by 1 %, mm.
	Coupling    *float64 `json:"coupling,omitempty"`
	CouplingTol *float64 `json:"coupling_tol_mm,omitempty"`
	// Ghost is the most concentrated ghost focus, and Ghosts how many are
	// flagged (see GhostFocus).
	Ghost         *GhostFocus `json:"worst_ghost,omitempty"`
	GhostsFlagged int         `json:"ghosts_flagged"`
}

// outFigures fills the figures every kind shares from the output beam at
// the last vertex.
func outFigures(out optics.GaussianBeam) LaserFigures {
	return LaserFigures{WaistRadius: 1000 * out.WaistRadius(), WaistAt: -out.WaistDistance(),
		RayleighRange: out.RayleighRange()}
}

// layoutMatrix is the reduced matrix of the layout in air, first to last
// vertex.
func (s *search) layoutMatrix(l *layout) optics.Mat2 {
	if l.pair() {
		return pairMatrix(&s.c[l.a], &s.c[l.b], l.gap)
	}
	return s.c[l.a].m
}

// focusFigures are the Gaussian figures of a focusing layout: the waist
// the ABCD law puts behind it against its paraxial focus (the back
// clearance).
func (s *search) focusFigures(l *layout) LaserFigures {
	out := s.req.InputBeam().Through(s.layoutMatrix(l), 1)
	f := outFigures(out)
	f.WaistShift = ptr(f.WaistAt - l.bc)
	return f
}

// gaussianRMS is the RMS radius of the Gaussian intensity profile of 1/e^2
// radius w: w / sqrt 2 (the second moment of exp(-2 r^2 / w^2); Siegman,
// Lasers, 1986, ch. 17).
func gaussianRMS(w float64) float64 { return w / math.Sqrt2 }

// spotLimit names what dominates a focused laser spot.
func spotLimit(rmsSpotUM, waistUM float64) string {
	if rmsSpotUM > gaussianRMS(waistUM) {
		return "aberration"
	}
	return "waist"
}

// laserReason is the few words a laser result adds to its reason.
func (f *LaserFigures) reason(kind Kind) string {
	switch kind {
	case Focus:
		return fmt.Sprintf(", waist %.3g µm", f.WaistRadius)
	case Expand:
		if f.DivergenceRatio != nil {
			return fmt.Sprintf(", divergence %.2gx the limit", *f.DivergenceRatio)
		}
	}
	return ""
}

// laserResult adds the Gaussian figures and the ghosts to a result of a
// laser requirement: the focused waist (focus), the collimation figures
// (expand, from the collimation stage), the mode-matching figures (match),
// and for every kind the most concentrated ghost.
func (s *search) laserResult(p *prepared, l *layout, r *Result, c *collimation) {
	var f LaserFigures
	switch s.req.Kind {
	case Focus:
		f = s.focusFigures(l)
		if r.ImageQuality != nil {
			f.SpotLimit = spotLimit(worstSpot(r.ImageQuality), f.WaistRadius)
		}
	case Expand:
		if c != nil {
			f = c.fig
			r.Score += s.sc.w.Quality * c.term
		}
	case Match:
		f = s.matchFigures(l)
	}
	gs, _ := Ghosts(s.system(p, l), s.req, s.req.ghostInput(l.wd))
	ghostSummary(&f, gs)
	r.Gaussian = &f
	r.Reason += f.reason(s.req.Kind)
}
