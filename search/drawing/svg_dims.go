package drawing

import (
	"fmt"
	"math"

	"cardinal/search/present"
)

// A dimLabel is where a dimension and its label are drawn: its row below
// the parts, and its label's text, anchor point and extent along z.
type dimLabel struct {
	Dim
	text   string
	x      float64 // anchor
	anchor string  // "start", "middle" or "end"
	below  bool    // the label sits under the line instead of above it
	x0, x1 float64 // the label's extent, as wide as wrapping allows for
}

var shortDimNames = map[string]string{"working distance": "wd", "back clearance": "back", "envelope": "env", "track": "track", "gap": "gap"}

// placeDims chooses for each dimension a row and a place for its label so
// that no two labels overlap and each lies between left and right. Lines
// of one row do not overlap. A label goes on its line when it fits there,
// else beside its line (clear of the row's other lines) or under it, else
// its dimension moves to a row of its own further down. A label's width
// is taken as wide as the legend's wrapping allows (advance per
// character), more than a sans-serif font needs;
// TestSVGDimensionLabelsApart checks the result in a browser.
func (d *svgDoc) placeDims(left, right float64) {
	d.dimLabels = nil
	for _, dm := range d.sc.Dims { // rows first: lines of one row apart
		for d.lineClash(dm) {
			dm.Row++
		}
		d.dimLabels = append(d.dimLabels, dimLabel{Dim: dm})
	}
	placed := make([]bool, len(d.dimLabels))
	for _, inside := range []bool{true, false} { // labels on their lines first
		for i := range d.dimLabels {
			if placed[i] {
				continue
			}
			if l, ok := d.fitLabel(d.dimLabels[i].Dim, left, right, inside, placed); ok {
				d.dimLabels[i], placed[i] = l, true
			}
		}
	}
	for i := range d.dimLabels {
		if placed[i] {
			continue
		}
		d.dimLabels[i].Row = d.lastDimRow() + 1 // a row of its own
		l, ok := d.fitLabel(d.dimLabels[i].Dim, left, right, false, placed)
		if !ok {
			panic(fmt.Sprintf("drawing: no place for the label of %s", d.dimLabels[i].Name))
		}
		d.dimLabels[i], placed[i] = l, true
	}
}

// lineClash tells whether a dimension's line would overlap a line already
// in its row.
func (d *svgDoc) lineClash(dm Dim) bool {
	lo, hi := math.Min(dm.Z0, dm.Z1), math.Max(dm.Z0, dm.Z1)
	for _, p := range d.dimLabels {
		plo, phi := math.Min(p.Z0, p.Z1), math.Max(p.Z0, p.Z1)
		if p.Row == dm.Row && lo < phi-1e-9 && plo < hi-1e-9 {
			return true
		}
	}
	return false
}

// fitLabel tries the places for a dimension's label in turn, in its row:
// on its line only when inside, else beside or under it.
func (d *svgDoc) fitLabel(dm Dim, left, right float64, inside bool, placed []bool) (dimLabel, bool) {
	length := math.Abs(dm.Z1 - dm.Z0)
	lo, hi := math.Min(dm.Z0, dm.Z1), math.Max(dm.Z0, dm.Z1)
	size := 0.8 * d.fs
	gap := 0.6 * d.fs
	long, short := fmt.Sprintf("%s %s", dm.Name, present.Fixed(length, 2)), fmt.Sprintf("%s %s", shortDimNames[dm.Name], present.Fixed(length, 2))
	width := func(s string) float64 { return float64(len([]rune(s))) * advance * size }
	var tries []dimLabel
	if inside {
		for _, s := range []string{long, short} {
			if width(s) < length {
				tries = append(tries, dimLabel{Dim: dm, text: s, x: (lo + hi) / 2, anchor: "middle"})
			}
		}
	}
	for _, below := range []bool{false, true} {
		if inside {
			break
		}
		for _, s := range []string{long, short} {
			if width(s) < length || below {
				tries = append(tries, dimLabel{Dim: dm, text: s, x: (lo + hi) / 2, anchor: "middle", below: below})
			}
		}
		for _, s := range []string{long, short} {
			tries = append(tries, dimLabel{Dim: dm, text: s, x: hi + gap, anchor: "start", below: below},
				dimLabel{Dim: dm, text: s, x: lo - gap, anchor: "end", below: below})
		}
	}
	for _, l := range tries {
		w := width(l.text)
		switch l.anchor {
		case "middle":
			l.x0, l.x1 = l.x-w/2, l.x+w/2
		case "start":
			l.x0, l.x1 = l.x, l.x+w
		default:
			l.x0, l.x1 = l.x-w, l.x
		}
		if l.x0 >= left && l.x1 <= right && d.labelFree(l, placed) {
			return l, true
		}
	}
	return dimLabel{}, false
}

// labelFree tells whether a label keeps clear of the labels placed in its
// row, and of the row's other lines when it sits beside its own line.
func (d *svgDoc) labelFree(l dimLabel, placed []bool) bool {
	margin := 0.5 * d.fs
	for i, p := range d.dimLabels {
		if p.Row != l.Row || p.Dim == l.Dim {
			continue
		}
		if placed[i] && p.below == l.below && l.x0 < p.x1+margin && p.x0 < l.x1+margin {
			return false
		}
		lo, hi := math.Min(p.Z0, p.Z1), math.Max(p.Z0, p.Z1)
		if !l.below && l.anchor != "middle" && l.x0 < hi && lo < l.x1 {
			return false // a label beside its line does not sit on another's
		}
	}
	return true
}

// lastDimRow is the lowest row the dimensions use.
func (d *svgDoc) lastDimRow() int {
	r := 0
	for _, l := range d.dimLabels {
		r = max(r, l.Row)
	}
	return r
}

// dims draws each distance with extension lines and slanted ticks at its
// ends (architectural terminators), its value in mm by its line, where
// placeDims put it.
func (d *svgDoc) dims() {
	for _, dm := range d.dimLabels {
		y := d.dimY(dm.Row)
		for _, z := range []float64{dm.Z0, dm.Z1} {
			d.line("extension", z, d.sc.YMax+0.3*d.fs, z, y+0.5*d.fs, colourFaint, d.sw/2, "")
			t := 0.35 * d.fs
			d.line("tick", z-t, y+t, z+t, y-t, colourDim, 1.5*d.sw, "")
		}
		fmt.Fprintf(&d.b, `<line class="dim" data-name="%s" data-from="%s" data-to="%s" x1="%s" y1="%s" x2="%s" y2="%s" stroke="%s" stroke-width="%s"/>`+"\n",
			dm.Name, f4(dm.Z0), f4(dm.Z1), f4(dm.Z0), f4(y), f4(dm.Z1), f4(y), colourDim, f4(d.sw))
		ty := y - 0.35*d.fs
		if dm.below {
			ty = y + 1.0*d.fs
		}
		fmt.Fprintf(&d.b, `<text class="dim-label" data-name="%s" x="%s" y="%s" font-size="%s" text-anchor="%s" fill="%s">%s</text>`+"\n",
			dm.Name, f4(dm.x), f4(ty), f4(0.8*d.fs), dm.anchor, colourDim, escapeXML(dm.text))
	}
}
