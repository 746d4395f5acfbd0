package drawing

import (
	"fmt"
	"math"
	"sort"
	"strconv"
	"strings"

	"cardinal/search/present"
)

// colourGhost is the colour of the ghost-focus marks, our own choice.
const colourGhost = "#d9480f"

// A ghostLabel is a ghost mark's label as placed: its row above the
// cardinal points' labels, its centre and its extent along z.
type ghostLabel struct {
	GhostMark
	text   string
	row    int
	x      float64
	x0, x1 float64
}

// ghostLabelText is a ghost's label: G and its number in the list of all
// ghosts (the report's).
func ghostLabelText(m GhostMark) string { return "G" + strconv.Itoa(m.Number) }

// placeGhosts chooses a row for each ghost label so that no two labels of
// a row come closer than half a font size, each label centred over its
// mark but kept between left and right; labels are as wide as the legend's
// wrapping allows for (advance per character, more than a sans-serif font
// needs). The rows lie above the parts' cardinal-point labels, under the
// title, which moves up to make room (ghostBand).
func (d *svgDoc) placeGhosts(left, right float64) {
	ms := append([]GhostMark(nil), d.sc.Ghosts...)
	sort.SliceStable(ms, func(i, j int) bool { return ms[i].Z < ms[j].Z })
	size := ghostLabelSize * d.fs
	margin := 0.5 * d.fs
	var rows [][]ghostLabel
	d.ghostLabels = nil
	for _, m := range ms {
		l := ghostLabel{GhostMark: m, text: ghostLabelText(m)}
		w := float64(len([]rune(l.text))) * advance * size
		l.x = math.Min(math.Max(m.Z, left+w/2), right-w/2)
		l.x0, l.x1 = l.x-w/2, l.x+w/2
		for l.row = 0; l.row < len(rows); l.row++ {
			free := true
			for _, p := range rows[l.row] {
				free = free && (l.x0 >= p.x1+margin || p.x0 >= l.x1+margin)
			}
			if free {
				break
			}
		}
		if l.row == len(rows) {
			rows = append(rows, nil)
		}
		rows[l.row] = append(rows[l.row], l)
		d.ghostLabels = append(d.ghostLabels, l)
	}
	d.ghostRows = len(rows)
}

// ghostLabelSize is the ghost labels' font size, in font sizes.
const ghostLabelSize = 0.85

// ghostBand is the height the ghost labels take above the cardinal
// points' labels, mm: nothing without ghosts.
func (d *svgDoc) ghostBand() float64 {
	if d.ghostRows == 0 {
		return 0
	}
	return (0.9 + 1.1*float64(d.ghostRows)) * d.fs
}

// ghostRowY is the baseline of ghost-label row r, above the axis (SVG y).
func (d *svgDoc) ghostRowY(r int) float64 { return -(d.sc.YMax + (4.0+1.1*float64(r))*d.fs) }

// ghosts draws each ghost mark on the axis with a dashed leader up to its
// label: an open triangle pointing the way the ghost's light travels
// (left, back toward the laser, for a single reflection; right, on toward
// the image, for a double one).
func (d *svgDoc) ghosts() {
	for _, l := range d.ghostLabels {
		g := 1.3 * d.markSize(false)
		d.ghostGlyph(l.GhostMark, 0, g)
		y := d.ghostRowY(l.row)
		d.line("ghost-leader", l.Z, -1.2*g, l.Z, y+0.3*d.fs, colourGhost, d.sw/2,
			fmt.Sprintf(` stroke-dasharray="%s %s" stroke-opacity="0.7"`, f4(d.sw*4), f4(d.sw*3)))
		fmt.Fprintf(&d.b, `<text class="ghost-label" data-z="%s" data-surfaces="%s" data-direction="%s" x="%s" y="%s" font-size="%s" text-anchor="middle" fill="%s">%s</text>`+"\n",
			f4(l.Z), surfaceList(l.Surfaces), l.Direction, f4(l.x), f4(y), f4(ghostLabelSize*d.fs), colourGhost, escapeXML(l.text))
	}
}

// ghostGlyph draws a ghost's triangle, of half-size g, centred at (Z, y).
func (d *svgDoc) ghostGlyph(m GhostMark, y, g float64) {
	dir := 1.0
	if m.Direction == "back" {
		dir = -1
	}
	fmt.Fprintf(&d.b, `<polygon class="ghost-mark" data-z="%s" data-surfaces="%s" points="%s,%s %s,%s %s,%s" fill="#ffffff" stroke="%s" stroke-width="%s"/>`+"\n",
		f4(m.Z), surfaceList(m.Surfaces), f4(m.Z+dir*g), f4(y), f4(m.Z-dir*g), f4(y-g), f4(m.Z-dir*g), f4(y+g),
		colourGhost, f4(math.Min(1.5*d.sw, 0.3*g)))
}

func surfaceList(s []int) string {
	t := make([]string, len(s))
	for i, k := range s {
		t[i] = strconv.Itoa(k)
	}
	return strings.Join(t, ",")
}

// ghostLegend says what the ghost marks are, and lists each marked ghost
// (and those too far away to draw) with its path, place and flags.
func (d *svgDoc) ghostLegend() []legendLine {
	sc := d.sc
	if len(sc.Ghosts)+len(sc.OffGhosts) == 0 {
		return nil
	}
	ls := []legendLine{{"ghost", "ghost foci, Gn numbered as in the report: laser light reflected at lens surfaces that comes to a focus, the triangle pointing the way it goes (left: reflected once, back toward the laser; right: reflected twice, on toward the image); surfaces numbered 1 up in light order through the layout; marked where flagged, and the most concentrated. Paraxial estimates: they do not replace a safety assessment; ask your laser safety officer and follow local rules"}}
	for _, m := range append(append([]GhostMark(nil), sc.Ghosts...), sc.OffGhosts...) {
		where := ""
		for _, o := range sc.OffGhosts {
			if o.Number == m.Number {
				where = " (off the drawing)"
			}
		}
		s := fmt.Sprintf("%s: reflected at %s, going %s, focus at z = %s mm%s, %sx the beam's peak irradiance", ghostLabelText(m),
			present.GhostPath(m.GhostFocus), m.Direction, present.Fixed(m.Z, 2), where, present.Fixed(m.Concentration, 0))
		if m.Peak != nil {
			s += fmt.Sprintf(", about %s W/cm² at its peak", present.Fixed(*m.Peak, 0))
		}
		if len(m.Flags) > 0 {
			s += "; " + strings.Join(m.Flags, ", ")
		}
		ls = append(ls, legendLine{"", s})
	}
	return ls
}
