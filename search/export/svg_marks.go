package export

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
	g := 0.4 * d.fs
	switch strings.TrimSuffix(m.Kind, "′") {
	case "F":
		fmt.Fprintf(&d.b, `<polygon class="glyph-focal" points="%s,%s %s,%s %s,%s %s,%s" fill="%s"/>`+"\n",
			f4(m.Z-g), f4(y), f4(m.Z), f4(y-g), f4(m.Z+g), f4(y), f4(m.Z), f4(y+g), colour)
	case "P":
		d.line("glyph-principal", m.Z, y-2.2*g, m.Z, y+2.2*g, colour, 2.5*d.sw, "")
	default:
		fmt.Fprintf(&d.b, `<circle class="glyph-nodal" cx="%s" cy="%s" r="%s" fill="none" stroke="%s" stroke-width="%s"/>`+"\n",
			f4(m.Z), f4(y), f4(g), colour, f4(d.sw*1.5))
	}
}

// dimY is the height of dimension row r below the axis (SVG y, down).
func (d *svgDoc) dimY(r int) float64 { return d.sc.YMax + (4.4+2.2*float64(r))*d.fs }

// dims draws each distance with extension lines and slanted ticks at its
// ends (architectural terminators), its value in mm above the line; a
// short one gets a short name, or its text beside it.
func (d *svgDoc) dims() {
	for _, dm := range d.sc.Dims {
		y := d.dimY(dm.Row)
		for _, z := range []float64{dm.Z0, dm.Z1} {
			d.line("extension", z, d.sc.YMax+0.3*d.fs, z, y+0.5*d.fs, colourFaint, d.sw/2, "")
			t := 0.35 * d.fs
			d.line("tick", z-t, y+t, z+t, y-t, colourDim, 1.5*d.sw, "")
		}
		fmt.Fprintf(&d.b, `<line class="dim" data-name="%s" data-from="%s" data-to="%s" x1="%s" y1="%s" x2="%s" y2="%s" stroke="%s" stroke-width="%s"/>`+"\n",
			dm.Name, f4(dm.Z0), f4(dm.Z1), f4(dm.Z0), f4(y), f4(dm.Z1), f4(y), colourDim, f4(d.sw))
		d.dimText(dm, y)
	}
}

var shortDimNames = map[string]string{"working distance": "wd", "back clearance": "back", "envelope": "env", "track": "track", "gap": "gap"}

func (d *svgDoc) dimText(dm Dim, y float64) {
	length := math.Abs(dm.Z1 - dm.Z0)
	fits := func(s string) bool { return 0.5*0.8*d.fs*float64(len([]rune(s))) < length }
	label := fmt.Sprintf("%s %.2f", dm.Name, length)
	if !fits(label) {
		label = fmt.Sprintf("%s %.2f", shortDimNames[dm.Name], length)
	}
	x, anchor := (dm.Z0+dm.Z1)/2, "middle"
	if !fits(label) {
		x, anchor = math.Max(dm.Z0, dm.Z1)+0.6*d.fs, "start"
	}
	d.text(x, y-0.35*d.fs, 0.8*d.fs, anchor, colourDim, label)
}

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
