package export

import (
	"fmt"

	"cardinal/search"
)

// spotText is the RMS spot on axis, and at the field edge where given, in
// µm at best focus; "–" where the result was not traced.
func spotText(r search.Result) string {
	q := r.ImageQuality
	if q == nil {
		return "–"
	}
	s := fmt.Sprintf("%.1f", q.RMSSpot)
	if q.RMSSpotEdge != nil {
		s += fmt.Sprintf(" / %.1f", *q.RMSSpotEdge)
	}
	return s
}

func airyText(r search.Result) string {
	if r.ImageQuality == nil {
		return "–"
	}
	return fmt.Sprintf("%.1f", r.AiryRadius)
}

// limitedText is the Marechal verdict, yes or no.
func limitedText(r search.Result) string {
	if r.ImageQuality == nil {
		return "–"
	}
	return yesNo(r.DiffractionLimited)
}

func shiftText(r search.Result) string {
	if r.ImageQuality == nil || r.FocalShift == nil {
		return "–"
	}
	return fmt.Sprintf("%.0f", *r.FocalShift)
}

func yesNo(b bool) string {
	if b {
		return "yes"
	}
	return "no"
}

// rankingNote says what the ranking used, as search.Weights and the
// real-ray stage (search/score.go, search/quality.go) do it: a first-order
// score, then for a requirement with an aperture the image quality of the
// first-order survivors.
func rankingNote(req search.Requirement, qc search.QualityShown) string {
	first := "Lower score ranks first. The first-order score adds the error against the tolerance, the envelope over a reference length, a step per extra part, the price and the pieces not in the drawer, from paraxial figures at the parts' real principal points."
	switch {
	case req.Kind == search.Expand:
		return first + " Beam expanders are afocal and are ranked on first order only: no real rays were traced to rank them."
	case !req.TracesRays():
		return first + " The ranking is first order only: no aperture was given (a beam for a focus, an NA for an image), so image quality was not judged."
	}
	s := first + fmt.Sprintf(" The survivors of that ranking, more than the number kept, were then traced with real rays at %s nm and re-ranked with a sharpness term added: the RMS spot against the Airy radius", num(req.Lambda()))
	if qc.Colour {
		s += " and the blur of the focal shift over the band"
	}
	s += "."
	if qc.Any {
		s += " The spot figures in this table are RMS radii at best focus, on axis"
		if qc.Edge {
			s += " and at the field edge on the same plane"
		}
		s += "; diffraction limited means at most 0.07 waves RMS of wavefront error (Maréchal's criterion); the spot diagrams below are taken on the solver's image plane, so they can be larger."
	}
	return s
}
