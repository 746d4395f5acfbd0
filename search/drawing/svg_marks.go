package drawing

import (
	"fmt"
	"math"
	"sort"
	"strings"
)

// subscripts are the digits written under a part's cardinal points.
var subscripts = []rune("₀₁₂₃₄₅₆₇₈₉")

// markLabel is F, P′, ... with the part's number as a subscript; the
// system's points carry none.
func markLabel(m Mark) string {
	if m.Part == 0 {
		return m.Kind
	}
	var b strings.Builder
	b.WriteString(m.Kind)
	for _, c := range fmt.Sprint(m.Part) {
		b.WriteRune(subscripts[c-'0'])
	}
	return b.String()
}

// marks draws the cardinal points on the axis: a diamond for a focal
// point, a short bar across the axis for a principal point, a ring for a
// nodal point. The parts' labels sit above the parts, the system's below,
// each on a dotted leader, in two staggered rows.
func (d *svgDoc) marks() {
	sorted := append([]Mark(nil), d.sc.Marks...)
	sort.SliceStable(sorted, func(i, j int) bool { return sorted[i].Z < sorted[j].Z })
	row := map[bool]int{}
	for _, m := range sorted {
		colour, side := colourPart, -1.0
		if m.Part == 0 {
			colour, side = colourSystem, 1.0
		}
		d.glyph(m, colour, 0)
		r := row[m.Part == 0]
		row[m.Part == 0]++
		y := side * (d.sc.YMax + (1.6+1.1*float64(r%2))*d.fs)
		d.line("leader", m.Z, 0, m.Z, y-side*0.9*d.fs, colour, d.sw/2, fmt.Sprintf(` stroke-dasharray="%s %s" stroke-opacity="0.6"`, f4(d.sw*2), f4(d.sw*3)))
		fmt.Fprintf(&d.b, `<text class="mark" data-kind="%s" data-part="%d" data-z="%s" x="%s" y="%s" font-size="%s" text-anchor="middle" fill="%s">%s</text>`+"\n",
			m.Kind, m.Part, f4(m.Z), f4(m.Z), f4(y), f4(0.85*d.fs), colour, escapeXML(markLabel(m)))
	}
}

func (d *svgDoc) glyph(m Mark, colour string, y float64) {
	g := d.markSize(y != 0)
	switch strings.TrimSuffix(m.Kind, "′") {
	case "F":
		fmt.Fprintf(&d.b, `<polygon class="glyph-focal" points="%s,%s %s,%s %s,%s %s,%s" fill="%s"/>`+"\n",
			f4(m.Z-g), f4(y), f4(m.Z), f4(y-g), f4(m.Z+g), f4(y), f4(m.Z), f4(y+g), colour)
	case "P":
		d.line("glyph-principal", m.Z, y-2.2*g, m.Z, y+2.2*g, colour, math.Min(2.5*d.sw, 0.4*g), ` stroke-opacity="0.8"`)
	default:
		fmt.Fprintf(&d.b, `<circle class="glyph-nodal" cx="%s" cy="%s" r="%s" fill="none" stroke="%s" stroke-width="%s"/>`+"\n",
			f4(m.Z), f4(y), f4(g), colour, f4(math.Min(1.5*d.sw, 0.3*g)))
	}
}

// markSize is the half-size of a cardinal point's glyph: 0.4 of the font
// size, but no more than 0.15 of the smallest part's semi-diameter on
// the drawing, so that the marks of small parts on a long track leave the
// parts visible; in the legend (inLegend) always the font's.
func (d *svgDoc) markSize(inLegend bool) float64 {
	g := 0.4 * d.fs
	if inLegend {
		return g
	}
	for _, p := range d.sc.Solution.Parts {
		g = math.Min(g, 0.15*p.Diameter/2)
	}
	return g
}

// dimY is the height of dimension row r below the axis (SVG y, down).
func (d *svgDoc) dimY(r int) float64 { return d.sc.YMax + (4.4+2.8*float64(r))*d.fs }

// scaleBar draws a bar of a round length, about a fifth of the drawing.
func (d *svgDoc) scaleBar(x, y float64) {
	width := d.sc.XMax - d.sc.XMin
	l := 1.0
	for _, c := range []float64{1, 2, 5, 10, 20, 50, 100, 200, 500, 1000} {
		if c <= width/5 {
			l = c
		}
	}
	x += d.fs
	d.line("scale-bar", x, y, x+l, y, "#000000", 3*d.sw, "")
	d.text(x+l+0.5*d.fs, y+0.3*d.fs, 0.8*d.fs, "start", "#000000", fmt.Sprintf("%g mm (drawn to scale: 1 unit = 1 mm)", l))
}
