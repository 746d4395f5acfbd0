package report

import (
	"fmt"
	"math"
	"sort"
	"strings"

	"cardinal/search"
	"cardinal/search/drawing"
	"cardinal/search/plots"
	"cardinal/search/present"
	"cardinal/search/solution"
)

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
	s := first + fmt.Sprintf(" The survivors of that ranking, more than the number kept, were then traced with real rays at %s nm and re-ranked with a sharpness term added: the RMS spot against the Airy radius", present.RawText(req.Lambda()))
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

// A figureRow is one real-ray figure of a result as the report lists it:
// a label with its unit, and the value as text.
type figureRow struct{ Label, Value string }

// figureLabels are the labels, with units, of the figures the search
// stores (search.ImageQuality.Figures), in the order the report lists
// them.
var figureLabels = []struct{ key, label string }{
	{"rms_spot_um", "RMS spot radius on axis, at best focus (µm)"},
	{"rms_spot_edge_um", "RMS spot radius at the field edge, same plane (µm)"},
	{"airy_radius_um", "Airy disc radius (µm)"},
	{"wavefront_rms_waves", "RMS wavefront error on axis (waves)"},
	{"focal_shift_um", "focal shift over the band (µm)"},
	{"best_focus_shift_mm", "best focus from the solver's image plane (mm, positive away from the lens)"},
}

// qualityFigures lists a result's real-ray figures with human labels:
// the known ones in order, then any other the search adds, labelled from
// its key ("xyz_um" as "xyz (µm)"), then the diffraction-limited verdict.
// Nothing when the result was not traced.
func qualityFigures(r search.Result) []figureRow {
	if r.ImageQuality == nil {
		return nil
	}
	var rows []figureRow
	seen := map[string]bool{}
	for _, f := range figureLabels {
		if v, ok := r.Quality[f.key]; ok {
			rows = append(rows, figureRow{f.label, present.Figure(v)})
			seen[f.key] = true
		}
	}
	var rest []string
	for k := range r.Quality {
		if !seen[k] {
			rest = append(rest, k)
		}
	}
	sort.Strings(rest)
	for _, k := range rest {
		rows = append(rows, figureRow{keyLabel(k), present.Figure(r.Quality[k])})
	}
	return append(rows, figureRow{"diffraction limited (at most 0.07 waves RMS, Maréchal's criterion, at every field point and wavelength on one shared plane)", present.Limited(r.ImageQuality).Text})
}

// keyLabel turns a snake_case key with a unit suffix into words with the
// unit in brackets: "edge_gap_mm" is "edge gap (mm)".
func keyLabel(k string) string {
	units := map[string]string{"mm": "mm", "um": "µm", "nm": "nm", "waves": "waves", "pct": "%", "deg": "°"}
	parts := strings.Split(k, "_")
	if u, ok := units[parts[len(parts)-1]]; ok && len(parts) > 1 {
		return strings.Join(parts[:len(parts)-1], " ") + " (" + u + ")"
	}
	return strings.Join(parts, " ")
}

// commonField chooses one field for the drawings and plots of every pick
// of a report, so that their spots compare: the one asked, else the
// requirement's, else the smallest of the fields DefaultField would choose
// for each pick (for illustration). A laser requirement without a field
// is drawn as its beam and plotted on axis. It says which in words.
func commonField(picks []solution.Solution, d drawing.DrawOptions, p plots.PlotOptions) (drawing.DrawOptions, plots.PlotOptions, string) {
	if len(picks) == 0 {
		return d, p, ""
	}
	s := picks[0]
	atInfinity := math.IsInf(s.ObjectZ, -1)
	if d.Field != 0 || p.Field != 0 {
		f := d.Field
		if f == 0 {
			f = p.Field
		}
		d.Field, p.Field = f, f
		return d, p, "Every drawing and spot diagram below is for " + solution.FieldText(atInfinity, f) + ", as asked."
	}
	if f, given := solution.DefaultField(s, 0); given {
		return d, p, "Every drawing and spot diagram below is for " + solution.FieldText(atInfinity, f) + ", the requirement's field."
	}
	if s.Requirement.IsLaser() {
		return d, p, "The requirement is a laser beam with no field: the drawings show the beam's envelope and the spot diagrams are on axis."
	}
	f := math.Inf(1)
	for _, s := range picks {
		g, _ := solution.DefaultField(s, 0)
		f = math.Min(f, g)
	}
	d.Field, p.Field, d.Illustrative = f, f, true
	return d, p, "The search gave no field: every drawing and spot diagram below is for " + solution.FieldText(atInfinity, f) +
		", chosen for illustration (the smallest of the fields each solution would be drawn with alone) and the same for all, so that their spots compare."
}
