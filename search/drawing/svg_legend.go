package drawing

import (
	"fmt"
	"math"
	"sort"
	"strings"

	"cardinal/search"
	"cardinal/search/present"
	"cardinal/search/solution"
	"cardinal/search/wavecolour"
)

// A legendLine is one line of the drawing's legend: a sample (a ray's
// line, a mark's glyph, or nothing) and its words.
type legendLine struct {
	sample string // "marginal", "chief", "rim", "part", "system", "caution" (words in colour, no sample), "build" (no sample), "ghost", ""
	text   string
}

// legend says what each colour and glyph means, which field the chief ray
// is drawn for, and anything the drawing cannot show.
func (d *svgDoc) legend() []legendLine {
	sc := d.sc
	field := fmt.Sprintf("object height %.3g mm", sc.Field)
	if math.IsInf(sc.ObjectZ, -1) {
		field = fmt.Sprintf("field angle %.3g°", sc.Field)
	}
	if !sc.FieldGiven {
		field += ", chosen for illustration"
	}
	ls := []legendLine{{"marginal", fmt.Sprintf("marginal rays of the axial point: real rays traced at %s", wavelengthWords(sc.Wavelength))}}
	if e := sc.Envelope; e != nil {
		ls = append(ls, legendLine{"envelope", fmt.Sprintf("laser beam: 1/e² envelope of a Gaussian beam (TEM00, M² = 1) of %s mm diameter, its waist at the first vertex, carried by the ABCD law", present.RawText(sc.Solution.Requirement.Beam))})
		if !math.IsNaN(e.WaistZ) {
			radius := present.Figure(1000*e.Waist) + " µm"
			if e.Waist >= 0.1 {
				radius = present.Fixed(e.Waist, 3) + " mm"
			}
			ls = append(ls, legendLine{"", fmt.Sprintf("output waist: 1/e² radius %s at z = %s mm", radius, present.Fixed(e.WaistZ, 2))})
		}
	}
	if sc.Beam {
		ls = append(ls, legendLine{"", "no field point: the requirement is a laser beam on axis (give --field for a chief ray)"})
	} else {
		ls = append(ls, legendLine{"chief", "chief ray of the field point (" + field + ")"}, legendLine{"rim", "rim rays of the field point"})
	}
	ls = append(ls, legendLine{"part", "cardinal points of each part (subscript: part number, in light order): ◆ focal point F, F′; | principal plane P, P′"})
	if sc.Solution.Afocal() {
		ls = append(ls, legendLine{"", "the system is afocal: it has no focal or principal points of its own"})
	} else {
		ls = append(ls, legendLine{"system", "cardinal points of the whole system, below the axis"})
	}
	ls = append(ls, legendLine{"", "in air the nodal points N, N′ coincide with the principal points P, P′"})
	ls = append(ls, d.ghostLegend()...)
	if off := offDrawing(sc.OffDrawing); off != "" {
		ls = append(ls, legendLine{"", "off the drawing: " + off})
	}
	for _, r := range sc.Rays {
		if r.Surface >= 0 {
			ls = append(ls, legendLine{"", fmt.Sprintf("× a %s ray stops at surface %d: %v", r.Name, r.Surface+1, r.Status)})
		}
	}
	ls = append(ls, legendLine{"", "z from the first vertex; lengths in mm"})
	sides := solution.SidesOf(sc.Solution.Requirement.Kind)
	for i, l := range sc.Solution.Build().Lines(sides) {
		if i == 0 {
			l = "to build, in light order (parts numbered on the drawing): " + l
		}
		ls = append(ls, legendLine{"build", l})
	}
	for _, c := range solution.Cautions(sc.Solution.Requirement, sc.Solution.Result) {
		ls = append(ls, legendLine{"caution", "laser caution: " + c})
	}
	return ls
}

// legendRows wraps the legend's lines to n characters; a line's sample
// goes with its first row only.
func (d *svgDoc) legendRows(n int) []legendLine {
	var rows []legendLine
	for _, l := range d.legend() {
		for i, t := range wrapText(l.text, n) {
			sample := l.sample
			if i > 0 && sample != "caution" {
				sample = ""
			}
			rows = append(rows, legendLine{sample, t})
		}
	}
	return rows
}

// wavelengthWords names a wavelength for the legend, saying that an
// ultraviolet or infrared one is drawn grey.
func wavelengthWords(nm float64) string {
	if wavecolour.Visible(nm) {
		return present.RawText(nm) + " nm, drawn in its colour"
	}
	band := "infrared"
	if nm < wavecolour.VisibleLo {
		band = "ultraviolet"
	}
	return fmt.Sprintf("%s nm (%s, drawn grey)", present.RawText(nm), band)
}

// offDrawing lists the cardinal points too far away to draw.
func offDrawing(ms []Mark) string {
	ms = append([]Mark(nil), ms...)
	sort.SliceStable(ms, func(i, j int) bool { return ms[i].Part < ms[j].Part })
	s := make([]string, len(ms))
	for i, m := range ms {
		s[i] = fmt.Sprintf("%s at z = %.1f mm", markLabel(m), m.Z)
	}
	return strings.Join(s, ", ")
}

// writeLegend draws the legend's rows from (x, y) down.
func (d *svgDoc) writeLegend(rows []legendLine, x, y float64) {
	x += d.fs
	for i, l := range rows {
		yy := y + float64(i)*1.5*d.fs
		s := 2.2 * d.fs
		switch l.sample {
		case "marginal", "chief", "rim":
			colour, extra := d.rayStyle(l.sample)
			d.line("legend", x, yy, x+s, yy, colour, 1.3*d.sw, extra)
		case "envelope":
			colour := wavecolour.Hex(wavecolour.Of(d.sc.Wavelength))
			fmt.Fprintf(&d.b, `<rect x="%s" y="%s" width="%s" height="%s" fill="%s" fill-opacity="0.18" stroke="%s" stroke-width="%s"/>`+"\n",
				f4(x), f4(yy-0.4*d.fs), f4(s), f4(0.8*d.fs), colour, colour, f4(d.sw/2))
		case "part", "system":
			colour := colourPart
			if l.sample == "system" {
				colour = colourSystem
			}
			d.glyph(Mark{Kind: "F", Z: x + 0.5*d.fs}, colour, yy)
			fmt.Fprintf(&d.b, `<rect x="%s" y="%s" width="%s" height="%s" fill="%s"/>`+"\n", f4(x+1.3*d.fs), f4(yy-0.6*d.fs), f4(d.sw*2.5), f4(1.2*d.fs), colour)
		}
		if l.sample == "ghost" {
			d.ghostGlyph(GhostMark{GhostFocus: search.GhostFocus{Direction: "forward", Z: x + 0.5*d.fs}}, yy, 0.5*d.fs)
			d.ghostGlyph(GhostMark{GhostFocus: search.GhostFocus{Direction: "back", Z: x + 1.6*d.fs}}, yy, 0.5*d.fs)
		}
		colour := "#000000"
		if l.sample == "caution" {
			colour = colourCaution
		}
		d.text(x+s+0.8*d.fs, yy+0.3*d.fs, legendSize*d.fs, "start", colour, l.text)
	}
}
