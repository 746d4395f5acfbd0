package plots

import (
	"fmt"
	"math"
	"strings"

	"cardinal/optics"
	"cardinal/search/present"
	"cardinal/search/solution"
)

// PlotOptions say which spots and fans to compute. The zero value plots
// the wavelengths DefaultWavelengths picks, on axis, at 0.7 of the field
// and at the field edge (the field as DefaultField picks it).
type PlotOptions struct {
	// Wavelengths in nm; the first is the reference. Empty: see above.
	Wavelengths []float64
	// Field is the field edge as in DrawOptions; 0 picks the default.
	Field float64
	// Rings is the number of hexapolar rings of a spot; 0 means 12.
	Rings int
}

// A SpotSet is one field point at one wavelength: the spot on the image
// plane and the meridional and sagittal ray fans.
type SpotSet struct {
	RelField   float64 // 0 on axis, 1 at the field edge
	Field      float64 // object height (mm) or field angle (degrees)
	Wavelength float64 // nm
	// X, Y are the ray intersections relative to the reference
	// wavelength's chief ray, in micrometres (microradians of direction
	// for an afocal solution); W their shares of the pupil's area.
	X, Y, W []float64
	// DX, DY are the rays' slopes relative to the reference chief ray's,
	// dx/dz and dy/dz (0 for an afocal solution): how each point moves
	// when the plane moves.
	DX, DY []float64
	// RMS is the RMS radius about the centroid, same unit.
	RMS          float64
	Passed, Lost int
	// Fans: transverse ray error against pupil coordinate (-1..1), in the
	// same unit: Mer* along y for pupil points on the y axis, Sag* along x
	// for pupil points on the x axis. Rays that do not pass are left out.
	MerPupil, MerError, SagPupil, SagError []float64
	// MerSlope and SagSlope are the fans' ray slopes relative to the
	// reference chief ray's (dy/dz, dx/dz): the error dz mm past the image
	// plane is the error plus 1000 dz times the slope, µm.
	MerSlope, SagSlope []float64
}

// Spots holds the spot diagrams and ray fans of a solution.
type Spots struct {
	// Angular is true for an afocal solution: the figures are directions in
	// microradians instead of positions in micrometres.
	Angular bool
	// AtInfinity is true when the fields are angles (object at infinity).
	AtInfinity bool
	// ImageZ is the image plane from the last vertex (NaN when angular, a
	// sentinel the finite guard passes over).
	ImageZ float64 `finite:"-"`
	// Airy is the radius of the Airy disc at the reference wavelength, in
	// the figures' unit (0 where it cannot be found).
	Airy        float64
	Wavelengths []float64
	Fields      []float64 // object heights or field angles, on axis first
	Sets        []SpotSet // by field, then by wavelength
	// BestFocus is the plane of the least on-axis RMS spot at the
	// reference wavelength, mm from the image plane (positive away from
	// the lens); 0 when angular.
	BestFocus float64
	// Verdict is the search's diffraction-limited verdict in words, ""
	// when the search traced no real rays.
	Verdict string
}

// Unit is the unit of the figures.
func (sp Spots) Unit() string {
	if sp.Angular {
		return "µrad"
	}
	return "µm"
}

// DefaultWavelengths is the requirement's wavelength followed by its band
// (search.Requirement.Band) when one was given; else the wavelength alone
// for a laser, or with the F and C lines beside it (the visible band).
func DefaultWavelengths(s solution.Solution) []float64 {
	wl := s.Wavelength()
	switch {
	case len(s.Requirement.Band) > 0:
		out := []float64{wl}
		for _, b := range s.Requirement.Band {
			if math.Abs(b-wl) > 0.05 { // the reference is listed once
				out = append(out, b)
			}
		}
		return out
	case s.Requirement.IsLaser():
		return []float64{wl}
	}
	return []float64{wl, optics.LineF, optics.LineC}
}

// FieldText names field point i with its unit: "on axis", a field angle
// in degrees (object at infinity) or an object height in mm.
func (sp Spots) FieldText(i int) string {
	if i == 0 {
		return "on axis"
	}
	return solution.FieldText(sp.AtInfinity, sp.Fields[i])
}

// NewSpots traces the spots and fans.
func NewSpots(s solution.Solution, o PlotOptions) (Spots, error) {
	wls := o.Wavelengths
	if len(wls) == 0 {
		wls = DefaultWavelengths(s)
	}
	edge, given := solution.DefaultField(s, o.Field)
	sp := Spots{Angular: s.Afocal(), AtInfinity: math.IsInf(s.ObjectZ, -1), ImageZ: s.ImageZ, Wavelengths: wls, Fields: []float64{0, 0.7 * edge, edge}}
	if !given && s.Requirement.IsLaser() { // a laser beam with no field: on axis only, no invented field
		sp.Fields = sp.Fields[:1]
	}
	sys := s.System()
	for i, f := range sp.Fields {
		ref, err := chiefAt(sys, s, f, wls[0])
		if err != nil {
			return Spots{}, err
		}
		for _, wl := range wls {
			set, err := sp.set(sys, s, o, f, wl, ref)
			if err != nil {
				return Spots{}, err
			}
			set.RelField = []float64{0, 0.7, 1}[i]
			sp.Sets = append(sp.Sets, set)
		}
	}
	sp.Airy = sp.airy(sys, s, wls[0])
	sp.BestFocus = sp.bestFocus()
	if q := s.Result.ImageQuality; q != nil {
		limited := "not diffraction limited"
		if q.DiffractionLimited {
			limited = "diffraction limited"
		}
		if why, ok := strings.CutPrefix(q.DiffractionLimitedWhy, "no: "); ok {
			limited += map[string]string{"on axis": " on axis", "field edge": " at the field edge", "colour": " in colour"}[why]
		}
		sp.Verdict = fmt.Sprintf("the search's verdict: %s (worst RMS wavefront error %s waves over the points and wavelengths judged, on one plane %s mm from the image plane; Maréchal's criterion is 0.07)",
			limited, present.Figure(q.WavefrontWorst), present.Fixed(q.VerdictPlane, 3))
	}
	return sp, nil
}

// chiefAt traces the chief ray of a field point at the reference
// wavelength: the origin of the spots and fans.
func chiefAt(sys optics.System, s solution.Solution, field, wl float64) (optics.Path, error) {
	p, err := traceChief(sys, s, field, wl)
	if err != nil {
		return optics.Path{}, fmt.Errorf("spot diagram: %w", err)
	}
	if p.Status != optics.Passed {
		return optics.Path{}, &FieldError{AtInfinity: math.IsInf(s.ObjectZ, -1), Field: field, Stopped: p.Err(),
			Widest: widestChief(sys, s, field, wl)}
	}
	return p, nil
}

// traceChief traces the chief ray of a field point to the spots' plane.
func traceChief(sys optics.System, s solution.Solution, field, wl float64) (optics.Path, error) {
	b, err := sys.Bundle(s.Object(), field, wl, []optics.PupilPoint{{}})
	if err != nil {
		return optics.Path{}, err
	}
	return sys.Tracer(wl).Trace(b.Rays[0], imagePlane(s)), nil
}

// A FieldError is a field point whose chief ray does not pass the layout:
// the field asked for is wider than the layout takes, which is the user's
// choice of field, not a fault.
type FieldError struct {
	AtInfinity bool
	Field      float64 // degrees or mm
	Stopped    error   // where and why the chief ray stopped
	// Widest is about the widest field whose chief ray passes (0: none
	// off axis).
	Widest float64
}

func (e *FieldError) Error() string {
	flag := "--object-height"
	if e.AtInfinity {
		flag = "--field-angle"
	}
	s := fmt.Sprintf("spot diagram: the chief ray at %s does not pass the layout (%v)", solution.FieldText(e.AtInfinity, e.Field), e.Stopped)
	if e.Widest > 0 {
		return s + fmt.Sprintf("; chief rays pass up to about %s: give a smaller %s", solution.FieldText(e.AtInfinity, e.Widest), flag)
	}
	return s + ": give a smaller " + flag
}

// widestChief finds, by bisection between the axis and field, about the
// widest field whose chief ray passes (to 1 % of field); 0 when none does.
func widestChief(sys optics.System, s solution.Solution, field, wl float64) float64 {
	passes := func(f float64) bool {
		p, err := traceChief(sys, s, f, wl)
		return err == nil && p.Status == optics.Passed
	}
	lo, hi := 0.0, field
	if !passes(lo) {
		return 0
	}
	for hi-lo > 0.01*math.Abs(field) {
		if mid := (lo + hi) / 2; passes(mid) {
			lo = mid
		} else {
			hi = mid
		}
	}
	return lo
}

// imagePlane is where the spots are taken: the solution's image plane, or
// just past the last vertex for an afocal one (only directions count).
func imagePlane(s solution.Solution) float64 {
	if s.Afocal() {
		return 0
	}
	return s.ImageZ
}

// coords are a traced ray's figures relative to the reference chief ray:
// micrometres on the image plane, or microradians of direction.
func (sp Spots) coords(p, ref optics.Path) (x, y float64) {
	if sp.Angular {
		return 1e6 * (p.Dir.X/p.Dir.Z - ref.Dir.X/ref.Dir.Z), 1e6 * (p.Dir.Y/p.Dir.Z - ref.Dir.Y/ref.Dir.Z)
	}
	return 1e3 * (p.Image.X - ref.Image.X), 1e3 * (p.Image.Y - ref.Image.Y)
}
