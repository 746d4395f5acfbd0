package search

import (
	"fmt"
	"math"
	"sort"
	"strings"

	"cardinal/optics"
)

// ImageQuality holds the real-ray figures of one result at the
// requirement's wavelength, on the image plane the solver chose (the
// paraxial image). Lengths in the unit their JSON key names.
type ImageQuality struct {
	// RMSSpot is the RMS spot radius on axis at best focus, um.
	RMSSpot float64 `json:"rms_spot_um"`
	// RMSSpotEdge is the RMS spot radius of the field edge on the same
	// plane, um; nil when no field is given.
	RMSSpotEdge *float64 `json:"rms_spot_edge_um,omitempty"`
	// AiryRadius is 1.22 lambda / (2 NA'), um (optics.AiryRadius).
	AiryRadius float64 `json:"airy_radius_um"`
	// WavefrontRMS is the on-axis RMS wavefront error against the best
	// reference sphere, waves.
	WavefrontRMS float64 `json:"wavefront_rms_waves"`
	// DiffractionLimited is true when every field point judged (the axis,
	// and the field edge when given) at every wavelength judged (the
	// requirement's and each of the band's) has an RMS wavefront error of
	// 0.07 waves or less (Marechal's criterion, common practice;
	// optics.MarechalRMS) on one image plane shared by all of them: the
	// plane that makes the worst of them least (optics.Verdict).
	DiffractionLimited bool `json:"diffraction_limited"`
	// DiffractionLimitedWhy says which fails first: "yes", "no: on axis"
	// (the axis at the requirement's wavelength, even at its own best
	// focus), "no: field edge" (axis and edge at that wavelength share no
	// plane within the criterion), "no: colour" (the band's wavelengths
	// do not).
	DiffractionLimitedWhy string `json:"diffraction_limited_why"`
	// WavefrontWorst is the largest RMS wavefront error, waves, over every
	// field point and wavelength on the common plane, and VerdictPlane
	// that plane from the image plane, mm, positive away from the lens.
	WavefrontWorst float64 `json:"wavefront_worst_rms_waves"`
	VerdictPlane   float64 `json:"verdict_plane_mm"`
	// WavefrontBand is the RMS wavefront error at each wavelength judged,
	// the worse of the field points, on the common plane; only with a
	// band.
	WavefrontBand []BandWavefront `json:"wavefront_band,omitempty"`
	// FocalShift is the spread of the paraxial focus over the band, um;
	// nil without a band of two or more wavelengths.
	FocalShift *float64 `json:"focal_shift_um,omitempty"`
	// BestFocusShift is the best focus on axis from the image plane, mm,
	// positive away from the lens.
	BestFocusShift float64 `json:"best_focus_shift_mm"`
}

// NewImageQuality takes the figures of an optics.Quality (lengths in mm)
// into a result's (um where the key says so). The edge spot is kept only
// when field is true, the focal shift only for a band of two or more
// wavelengths.
func NewImageQuality(q optics.Quality, field bool, band []float64) ImageQuality {
	iq := ImageQuality{RMSSpot: 1000 * q.Axis.RMS, AiryRadius: 1000 * q.AiryRadius,
		WavefrontRMS: q.Wavefront.RMS, DiffractionLimited: q.DiffractionLimited, BestFocusShift: q.BestFocusShift,
		DiffractionLimitedWhy: q.Verdict.Why, WavefrontWorst: q.Verdict.Worst, VerdictPlane: q.Verdict.PlaneZ - q.ImageZ}
	if len(band) > 0 {
		iq.WavefrontBand = bandWavefronts(q.Verdict.Judged)
	}
	if field {
		iq.RMSSpotEdge = ptr(1000 * q.Edge.RMS)
	}
	if len(band) > 1 {
		iq.FocalShift = ptr(1000 * q.Colour.FocalShift)
	}
	return iq
}

// BandWavefront is the RMS wavefront error at one wavelength, the worse of
// the field points judged, on the verdict's common plane.
type BandWavefront struct {
	Wavelength float64 `json:"wavelength_nm"`
	RMS        float64 `json:"rms_waves"`
}

// bandWavefronts takes the worse field point of each wavelength, in the
// order judged.
func bandWavefronts(js []optics.Judged) []BandWavefront {
	var out []BandWavefront
	at := map[float64]int{}
	for _, j := range js {
		k, ok := at[j.Wavelength]
		if !ok {
			at[j.Wavelength] = len(out)
			out = append(out, BandWavefront{Wavelength: j.Wavelength, RMS: j.RMS})
			continue
		}
		out[k].RMS = math.Max(out[k].RMS, j.RMS)
	}
	return out
}

// ColourBlur is the RMS blur radius, um, that the focal shift over the
// band leaves on the plane midway between the extreme foci: there each
// extreme colour's cone, of marginal slope tan U', fills a disc of radius
// (shift / 2) tan U', and a uniformly filled disc of radius r has RMS
// radius r / sqrt 2 (geometry, derived here; the blur-circle estimate of
// longitudinal colour as in Smith, Modern Optical Engineering, 4th ed.,
// sec. 5.3, from memory). sin U' = NA' comes from the Airy radius,
// NA' = 0.61 lambda / A. 0 without a focal shift.
func (q ImageQuality) ColourBlur(wavelengthNm float64) float64 {
	if q.FocalShift == nil {
		return 0
	}
	na := math.Min(0.61*wavelengthNm*1e-3/q.AiryRadius, 0.999) // Born and Wolf, Principles of Optics, 7th ed., ch. 8
	return *q.FocalShift * math.Tan(math.Asin(na)) / (2 * math.Sqrt2)
}

// Sharpness is the quality term of the ranking score (see Weights): the
// mean over the field points judged (on axis, and the field edge when
// given) of log2(blur / A), where the blur sqrt(A^2 + s^2 + c^2) adds the
// Airy radius A, the RMS spot s and the colour blur c in quadrature (an
// approximation of common practice for independent blurs). 0 means a
// perfect image; each doubling of the blur adds 1.
func (q ImageQuality) Sharpness(wavelengthNm float64) float64 {
	return q.SharpnessAgainst(q.AiryRadius, wavelengthNm)
}

// SharpnessAgainst is Sharpness with a reference blur a (um) in place of
// the Airy radius: for a laser, the RMS radius of the Gaussian waist
// (laser.go), so that a laser spot is judged against the waist it can
// reach rather than the Airy disc of a uniformly filled pupil.
func (q ImageQuality) SharpnessAgainst(a, wavelengthNm float64) float64 {
	c := q.ColourBlur(wavelengthNm)
	spots := []float64{q.RMSSpot}
	if q.RMSSpotEdge != nil {
		spots = append(spots, *q.RMSSpotEdge)
	}
	sum := 0.0
	for _, s := range spots {
		sum += math.Log2(math.Sqrt(a*a+s*s+c*c) / a)
	}
	return sum / float64(len(spots))
}

// Figures are the numeric figures by their JSON key, for pages that list
// them (the diffraction-limited verdict is a yes or no, not a figure).
func (q ImageQuality) Figures() map[string]float64 {
	m := map[string]float64{"rms_spot_um": q.RMSSpot, "airy_radius_um": q.AiryRadius,
		"wavefront_rms_waves": q.WavefrontRMS, "best_focus_shift_mm": q.BestFocusShift}
	if q.RMSSpotEdge != nil {
		m["rms_spot_edge_um"] = *q.RMSSpotEdge
	}
	if q.FocalShift != nil {
		m["focal_shift_um"] = *q.FocalShift
	}
	return m
}

// TracesRays tells whether the real-ray stage judges the results: a focus
// requirement with a beam or an image requirement with an NA. An expander
// is afocal and is ranked on first order only.
func (r Requirement) TracesRays() bool {
	return (r.Kind == Focus || r.Kind == Image) && (r.BeamDiameter() > 0 || r.NA > 0)
}

// survivors is how many layouts the first-order search keeps: the top N
// and, when real rays are traced, a margin (3N, at least 30) so that image
// quality can reorder them; never more than MaxShown.
func survivors(r Requirement) int {
	if r.Prefer == PreferRobust && !r.TracesRays() {
		return min(max(3*r.Shown(), 30), MaxShown) // the build study reorders them (find.go)
	}
	if !r.TracesRays() && !r.collimates() {
		return r.Shown()
	}
	return min(max(3*r.Shown(), 30), MaxShown)
}

// Conditions are the real-ray conditions of the requirement for a layout
// with working distance wd (image) and back clearance bc, mm: an object at
// infinity with the beam (focus, field angle in degrees) or at the working
// distance with the NA (image, field the object height), the stop at the
// first surface as the first-order search assumes, the image plane where
// the solver put it.
func (r Requirement) Conditions(wd, bc float64) optics.Conditions {
	c := optics.Conditions{Reference: r.Lambda(), Band: r.Band, ImageZ: bc, FixedImage: true}
	switch r.Kind {
	case Focus:
		c.Object = optics.Object{Z: math.Inf(-1), Aperture: optics.Aperture{Beam: r.BeamDiameter()}}
		c.Field = r.FieldAngle
	case Image:
		c.Object = optics.Object{Z: -wd, Aperture: optics.Aperture{NA: r.NA}}
		c.Field = r.ObjectHeight
	}
	return c
}

// judgement is the real-ray verdict on one layout.
type judgement struct {
	q        *ImageQuality // nil when the layout was not traced or could not be
	term     float64       // Sharpness (against the Gaussian waist for a laser)
	ref      string        // what the spot is judged against: "Airy" or "waist"
	warnings []string
	err      error // why the rays could not be traced
}

// maxTraced bounds the real-ray stage when every result is asked for
// (--top 0): the best this many first-order layouts are traced, the rest
// follow them ranked on first order only, so that a loose requirement on a
// large catalog does not trace tens of thousands of layouts.
const maxTraced = 1000

// judge traces the layouts, best first-order first and at most maxTraced
// (in parallel, each result in its own slot so the outcome does not depend
// on timing) and orders them by the full score; grouping then keeps the
// requirement's top N rows. Layouts not traced come last, by their first-order order. It
// returns how many were traced.
func (s *search) judge(p *prepared, ls []layout) ([]layout, []judgement, int) {
	js := make([]judgement, len(ls))
	n := min(len(ls), maxTraced)
	copy(js, s.assessAll(p, ls[:n]))
	idx := make([]int, len(ls))
	for i := range idx {
		idx[i] = i
	}
	sort.SliceStable(idx, func(a, b int) bool { return s.judgedBefore(&ls[idx[a]], &ls[idx[b]], &js[idx[a]], &js[idx[b]]) })
	outL, outJ := make([]layout, len(idx)), make([]judgement, len(idx))
	for k, i := range idx {
		outL[k], outJ[k] = ls[i], js[i]
	}
	return outL, outJ, n
}

// judgedBefore orders judged layouts: traced before untraced, then the
// full score, then the first-order order (which breaks every tie).
func (s *search) judgedBefore(x, y *layout, jx, jy *judgement) bool {
	if (jx.q != nil) != (jy.q != nil) {
		return jx.q != nil
	}
	if tx, ty := x.score+s.sc.w.Quality*jx.term, y.score+s.sc.w.Quality*jy.term; tx != ty {
		return tx < ty
	}
	return s.better(x, y)
}

// verdictOf is the judgement of layout l from its real-ray figures q
// under conditions c (or the error of tracing it).
func (s *search) verdictOf(l *layout, c optics.Conditions, q optics.Quality, err error) judgement {
	if err != nil {
		return judgement{err: err}
	}
	iq := NewImageQuality(q, c.Field != 0, c.Band)
	if s.req.Gaussian() && s.req.Kind == Focus {
		ref := gaussianRMS(s.focusFigures(l).WaistRadius)
		return judgement{q: &iq, term: iq.SharpnessAgainst(ref, c.Reference), ref: "waist", warnings: q.Warnings}
	}
	return judgement{q: &iq, term: iq.Sharpness(c.Reference), ref: "Airy", warnings: q.Warnings}
}

// system is the layout as one optical system in air.
func (s *search) system(p *prepared, l *layout) optics.System {
	parts := []optics.Part{s.part(p, l.a)}
	var gaps []float64
	if l.pair() {
		parts = append(parts, s.part(p, l.b))
		gaps = []float64{l.gap}
	}
	return optics.Assemble(nil, nil, parts, gaps)
}

// part is candidate i's part, turned as the candidate is.
func (s *search) part(p *prepared, i int32) optics.Part {
	c := &s.c[i]
	part := p.full(c.item)
	if c.rev {
		part = part.Reversed()
	}
	return part
}

// apply puts the verdict into the result: the figures, the full score and
// a word on sharpness in the reason.
func (j judgement) apply(r *Result, w Weights) {
	switch {
	case j.err != nil:
		r.Reason += ", real rays failed (see notes)"
		return
	case j.q == nil:
		r.Reason += ", not traced"
		return
	}
	r.ImageQuality, r.Quality = j.q, j.q.Figures()
	r.Score += w.Quality * j.term
	switch worst := worstSpot(j.q); {
	case j.q.DiffractionLimited:
		r.Reason += ", diffraction limited"
	case j.ref == "waist":
		r.Reason += ", aberration dominates the waist"
	default:
		r.Reason += fmt.Sprintf(", spot %.2gx Airy, not diffraction limited (%s)", worst/j.q.AiryRadius, strings.TrimPrefix(j.q.DiffractionLimitedWhy, "no: "))
	}
}

// worstSpot is the larger of the axis and edge RMS spots.
func worstSpot(q *ImageQuality) float64 {
	if q.RMSSpotEdge != nil {
		return math.Max(q.RMSSpot, *q.RMSSpotEdge)
	}
	return q.RMSSpot
}

// qualityNotes are the lines the real-ray stage adds to the outcome: what
// was traced or why nothing was, the lack of a colour figure, and each
// result's ray losses and failures by rank.
func qualityNotes(req Requirement, traced, met int, js []judgement) []string {
	switch {
	case req.collimates():
		return []string{fmt.Sprintf("laser expanders: the gap collimates the Gaussian beam (output waist %s mm beyond the last part); real rays at that gap give the wavefront error, and the ranking weighs the estimated divergence against the diffraction limit of the output beam", formatG(req.WaistOutAt))}
	case req.Kind == Expand:
		return []string{"expanders are ranked on first order only: real rays are not traced through afocal systems"}
	case req.Kind == Match:
		return nil
	case !req.TracesRays():
		return []string{"image quality not judged: give --beam (focus) or --na (image) to trace real rays"}
	}
	n := []string{fmt.Sprintf("real rays traced at %s nm through the %d best first-order %s; ranked by image quality too",
		formatG(req.Lambda()), traced, plural(traced, "layout", "layouts"))}
	if req.Gaussian() {
		n[0] += " (for a laser, the RMS spot against the RMS radius of the Gaussian waist, w/sqrt 2)"
	}
	if traced < met {
		n = append(n, fmt.Sprintf("the next %d layouts that meet were not traced (at most %d are): they rank after the traced ones, on first order only", met-traced, maxTraced))
	}
	if req.IsLaser() && len(req.Band) == 0 {
		n = append(n, fmt.Sprintf("a laser is one wavelength: spots and the verdict use %s nm alone (give --band to judge more)", formatG(req.Lambda())))
	} else if len(req.Band) < 2 {
		n = append(n, "no colour figure: the wavelength alone gives none; give --band (e.g. 486.1,587.6,656.3) for the focal shift")
	}
	n = append(n, "diffraction limited: every field point at every wavelength judged within 0.07 waves RMS on one image plane shared by all, the one that makes the worst least")
	for k, j := range js {
		if j.err != nil {
			n = append(n, fmt.Sprintf("result %d: real rays not traced: %v", k+1, j.err))
		}
		for _, w := range j.warnings {
			n = append(n, fmt.Sprintf("result %d: %s", k+1, w))
		}
	}
	return n
}

func formatG(v float64) string { return fmt.Sprintf("%g", v) }

// QualityShown says which real-ray figures a list of results carries, so
// that a table shows their columns: Any when some result was traced, Edge
// when one has a field-edge spot, Colour when one has a focal shift.
type QualityShown struct{ Any, Edge, Colour bool }

// ShownQuality looks through the results for the figures they carry.
func ShownQuality(rs []Result) QualityShown {
	var qs QualityShown
	for _, r := range rs {
		if q := r.ImageQuality; q != nil {
			qs.Any = true
			qs.Edge = qs.Edge || q.RMSSpotEdge != nil
			qs.Colour = qs.Colour || q.FocalShift != nil
		}
	}
	return qs
}
