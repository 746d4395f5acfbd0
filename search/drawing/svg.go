package drawing

import (
	"bytes"
	"encoding/xml"
	"fmt"
	"io"
	"math"
	"strings"

	"cardinal/search/finite"
	"cardinal/search/present"
	"cardinal/search/solution"
	"cardinal/search/wavecolour"
)

// Colours and sizes of the drawing, our own choice; rays are drawn in the
// colour of their wavelength (wavecolour.Of).
const (
	colourGlass    = "#cfe3f3"
	colourSurface  = "#1d3b57"
	colourPart     = "#0b7a75" // cardinal points of the parts, above the axis
	colourSystem   = "#a3247a" // cardinal points of the system, below the axis
	colourDim      = "#333333"
	colourFaint    = "#8a8a8a"
	colourCaution  = "#8a2f0b"
	profileSamples = 41 // points per surface profile; odd, so that the vertex is one
)

// svgDoc builds the drawing in user units of millimetres, y up in the
// optics and down in SVG (svg y = -y).
type svgDoc struct {
	b  bytes.Buffer
	sc *Scene
	fs float64 // font size, mm
	sw float64 // stroke width, mm
	// dimLabels are the dimensions as placed (placeDims).
	dimLabels []dimLabel
	// ghostLabels are the ghost marks' labels as placed, in ghostRows
	// rows (placeGhosts).
	ghostLabels []ghostLabel
	ghostRows   int
}

// WriteSVG writes the scene as a self-contained SVG drawing to scale: one
// user unit is one millimetre, so a vertex at z is drawn at x = z and the
// optical axis is y = 0. The SVG has no ids, scripts, style sheets or
// external references, so that several can sit in one HTML page.
func (sc *Scene) WriteSVG(w io.Writer, o DrawOptions) error {
	if err := finite.Check("the drawing", sc); err != nil {
		return err
	}
	d := &svgDoc{sc: sc, fs: fontSize(*sc)}
	d.sw = d.fs / 14
	x0, x1 := d.extent()
	d.placeGhosts(x0+0.2*d.fs, x1-0.2*d.fs)
	title := wrapText(d.title(o), runesIn(x1-x0-2*d.fs, titleSize*d.fs))
	legend := d.legendRows(runesIn(x1-x0-legendIndent*d.fs-d.fs, legendSize*d.fs))
	top := sc.YMax + (5+1.4*float64(len(title)-1))*d.fs + d.ghostBand()
	d.placeDims(x0+0.2*d.fs, x1-0.2*d.fs)
	last := d.dimY(max(d.lastDimRow(), 2))
	bottom := last + 2.5*d.fs + float64(len(legend))*1.5*d.fs
	scale, note := printScale(x1 - x0)
	fmt.Fprintf(&d.b, `<svg xmlns="http://www.w3.org/2000/svg" class="cardinal-layout" viewBox="%s %s %s %s" width="%smm" height="%smm" font-family="'Liberation Sans', 'DejaVu Sans', Arial, sans-serif" data-units="mm" data-print-scale="%s">`+"\n",
		f4(x0), f4(-top), f4(x1-x0), f4(top+bottom), f4((x1-x0)/scale), f4((top+bottom)/scale), note)
	fmt.Fprintf(&d.b, `<rect x="%s" y="%s" width="%s" height="%s" fill="#ffffff"/>`+"\n", f4(x0), f4(-top), f4(x1-x0), f4(top+bottom))
	for i, l := range title {
		d.text(x0+d.fs, -top+(1.5+1.4*float64(i))*d.fs, titleSize*d.fs, "start", "#000000", l)
	}
	d.line("axis", x0, 0, x1, 0, colourFaint, d.sw, fmt.Sprintf(` stroke-dasharray="%s %s %s %s"`, f4(3*d.fs), f4(d.fs/2), f4(d.fs/2), f4(d.fs/2)))
	d.parts()
	d.partTags()
	d.planes()
	d.envelope()
	d.rays()
	d.marks()
	d.ghosts()
	d.dims()
	d.scaleBar(x0, last+1.5*d.fs)
	d.writeLegend(legend, x0, last+3.2*d.fs)
	d.b.WriteString("</svg>\n")
	if err := finite.Attributes("the drawing", d.b.Bytes()); err != nil {
		return err // a number worked out while drawing, such as a label's place
	}
	_, err := w.Write(d.b.Bytes())
	return err
}

// fontSize is the drawing's font size in mm: a sixtieth of its length,
// between 1.2 and 8 mm.
func fontSize(sc Scene) float64 { return math.Min(math.Max((sc.XMax-sc.XMin)/60, 1.2), 8) }

// extent is the drawing's left and right edge: a margin beyond the scene,
// and wide enough for a legend line of minLegendRunes characters.
func (d *svgDoc) extent() (x0, x1 float64) {
	x0 = d.sc.XMin - 3*d.fs
	return x0, math.Max(d.sc.XMax+4*d.fs, x0+legendIndent*d.fs+minLegendRunes*advance*legendSize*d.fs+d.fs)
}

// printScale chooses the scale at which the drawing prints no wider than
// 180 mm (an A4 page's width inside its margins), from the usual
// drawing scales (ISO 5455): 2:1, 1:1, 1:2, 1:5, 1:10, 1:20, 1:50.
func printScale(width float64) (float64, string) {
	for _, s := range []struct {
		k    float64
		name string
	}{{0.5, "2:1"}, {1, "1:1"}, {2, "1:2"}, {5, "1:5"}, {10, "1:10"}, {20, "1:20"}} {
		if width/s.k <= 180 && (s.k >= 1 || width/s.k >= 60) {
			return s.k, s.name
		}
	}
	return 50, "1:50"
}

func (d *svgDoc) title(o DrawOptions) string {
	if o.Title != "" {
		return o.Title
	}
	s := d.sc.Solution
	return fmt.Sprintf("%s, %s requirement, %s nm", solution.DescribeParts(s.Result.Parts), s.Requirement.Kind, present.RawText(d.sc.Wavelength))
}

// parts draws each glass element filled, then every surface's profile
// from its real sag across the part's full diameter.
func (d *svgDoc) parts() {
	sc := d.sc
	for i, p := range sc.Solution.Parts {
		k0 := sc.PartSurfaces[i]
		h := p.Diameter / 2
		for j, m := range p.Media {
			if m.Name() == "air" {
				continue
			}
			front := d.profile(p.Surfaces[j], sc.Vertices[k0+j], h, false)
			back := d.profile(p.Surfaces[j+1], sc.Vertices[k0+j+1], h, true)
			fmt.Fprintf(&d.b, `<path class="element" data-part="%d" d="M%sL%sZ" fill="%s" stroke="none"/>`+"\n", i+1, front, back, colourGlass)
		}
		for j, s := range p.Surfaces {
			k := k0 + j
			fmt.Fprintf(&d.b, `<path class="surface" data-part="%d" data-surface="%d" d="M%s" fill="none" stroke="%s" stroke-width="%s"/>`+"\n",
				i+1, k+1, d.profile(s, sc.Vertices[k], h, false), colourSurface, f4(2*d.sw))
		}
		for _, y := range []float64{-h, h} { // the part's edge, between its outer surfaces
			z0, _ := p.Surfaces[0].Sag(h)
			z1, _ := p.Surfaces[len(p.Surfaces)-1].Sag(h)
			d.line("edge", sc.Vertices[k0]+z0, -y, sc.Vertices[k0+len(p.Surfaces)-1]+z1, -y, colourSurface, d.sw, "")
		}
	}
}

// partTags number the parts in light order above each one, as the build
// sheet in the legend numbers them.
func (d *svgDoc) partTags() {
	sc := d.sc
	for i, p := range sc.Solution.Parts {
		z := (sc.Vertices[sc.PartSurfaces[i]] + sc.Vertices[sc.PartSurfaces[i]+len(p.Surfaces)-1]) / 2
		fmt.Fprintf(&d.b, `<text class="part-tag" data-part="%d" x="%s" y="%s" font-size="%s" font-weight="bold" text-anchor="middle" fill="%s">%d</text>`+"\n",
			i+1, f4(z), f4(-p.Diameter/2-0.4*d.fs), f4(0.9*d.fs), colourSurface, i+1)
	}
}

// profile lists the points of a surface with its vertex at z, from
// height -h to h (or h to -h), as "x,y x,y ..." in SVG coordinates.
func (d *svgDoc) profile(s surfaceSag, z, h float64, downward bool) string {
	pts := make([]string, profileSamples)
	for i := range pts {
		y := -h + 2*h*float64(i)/float64(profileSamples-1)
		if i == profileSamples/2 {
			y = 0
		}
		if downward {
			y = -y
		}
		sag, _ := s.Sag(math.Abs(y))
		pts[i] = f4(z+sag) + "," + f4(-y)
	}
	return strings.Join(pts, " L")
}

// surfaceSag is what a profile needs of a surface.
type surfaceSag interface {
	Sag(h float64) (float64, bool)
}

// planes draws the object plane (or says the object is at infinity) and
// the image or focal plane.
func (d *svgDoc) planes() {
	sc := d.sc
	y := sc.YMax + 0.5*d.fs
	dash := fmt.Sprintf(` stroke-dasharray="%s %s"`, f4(d.fs), f4(d.fs/2))
	if math.IsInf(sc.ObjectZ, -1) {
		d.text(sc.XMin, -y-0.3*d.fs, 0.8*d.fs, "start", colourDim, "object at infinity")
	} else {
		d.line("object-plane", sc.ObjectZ, -y, sc.ObjectZ, y, colourDim, 1.5*d.sw, dash)
		d.text(sc.ObjectZ, -y-0.3*d.fs, 0.8*d.fs, "middle", colourDim, "object")
	}
	if math.IsNaN(sc.ImageZ) {
		d.text(sc.XMax, -y-0.3*d.fs, 0.8*d.fs, "end", colourDim, "collimated output")
		return
	}
	name := "image"
	if math.IsInf(sc.ObjectZ, -1) {
		name = "focal plane"
	}
	d.line("image-plane", sc.ImageZ, -y, sc.ImageZ, y, colourDim, 1.5*d.sw, dash)
	d.text(sc.ImageZ, -y-0.3*d.fs, 0.8*d.fs, "middle", colourDim, name)
}

// rayStyle is how a ray of a kind is drawn: all in the colour of the
// wavelength, the marginal rays solid, the chief ray in long dashes, the
// rim rays in short dashes and fainter.
func (d *svgDoc) rayStyle(name string) (colour, extra string) {
	colour = wavecolour.Hex(wavecolour.Of(d.sc.Wavelength))
	switch name {
	case "chief":
		extra = fmt.Sprintf(` stroke-dasharray="%s %s"`, f4(1.6*d.fs), f4(d.fs/2))
	case "rim":
		extra = fmt.Sprintf(` stroke-dasharray="%s %s" stroke-opacity="0.6"`, f4(d.fs/3), f4(d.fs/3))
	}
	return colour, extra
}

// envelope draws a laser beam's 1/e² envelope as a pale band in the
// wavelength's colour, edged with thin lines.
func (d *svgDoc) envelope() {
	e := d.sc.Envelope
	if e == nil {
		return
	}
	top := make([]string, len(e.Points))
	bottom := make([]string, len(e.Points))
	for i, p := range e.Points {
		top[i] = f4(p[0]) + "," + f4(-p[1])
		bottom[len(e.Points)-1-i] = f4(p[0]) + "," + f4(p[1])
	}
	colour := wavecolour.Hex(wavecolour.Of(d.sc.Wavelength))
	fmt.Fprintf(&d.b, `<polygon class="beam-envelope" points="%s %s" fill="%s" fill-opacity="0.18" stroke="%s" stroke-width="%s" stroke-opacity="0.8"/>`+"\n",
		strings.Join(top, " "), strings.Join(bottom, " "), colour, colour, f4(d.sw/2))
}

// rays draws each real ray as a polyline; a ray that stopped ends in a
// small cross.
func (d *svgDoc) rays() {
	for _, r := range d.sc.Rays {
		colour, extra := d.rayStyle(r.Name)
		pts := make([]string, len(r.Points))
		for i, p := range r.Points {
			pts[i] = f4(p[0]) + "," + f4(-p[1])
		}
		fmt.Fprintf(&d.b, `<polyline class="ray ray-%s" data-status="%s" points="%s" fill="none" stroke="%s" stroke-width="%s"%s/>`+"\n",
			r.Name, r.Status, strings.Join(pts, " "), colour, f4(1.3*d.sw), extra)
		if len(r.Points) > 0 && r.Surface >= 0 {
			last := r.Points[len(r.Points)-1]
			d.cross(last[0], -last[1], colour)
		}
	}
}

func (d *svgDoc) cross(x, y float64, colour string) {
	g := 0.4 * d.fs
	d.line("stopped", x-g, y-g, x+g, y+g, colour, 2*d.sw, "")
	d.line("stopped", x-g, y+g, x+g, y-g, colour, 2*d.sw, "")
}

func (d *svgDoc) line(class string, x1, y1, x2, y2 float64, colour string, width float64, extra string) {
	fmt.Fprintf(&d.b, `<line class="%s" x1="%s" y1="%s" x2="%s" y2="%s" stroke="%s" stroke-width="%s"%s/>`+"\n",
		class, f4(x1), f4(y1), f4(x2), f4(y2), colour, f4(width), extra)
}

func (d *svgDoc) text(x, y, size float64, anchor, colour, s string) {
	fmt.Fprintf(&d.b, `<text x="%s" y="%s" font-size="%s" text-anchor="%s" fill="%s">%s</text>`+"\n",
		f4(x), f4(y), f4(size), anchor, colour, escapeXML(s))
}

// f4 prints a coordinate in mm to 0.1 micrometre.
func f4(v float64) string {
	s := fmt.Sprintf("%.4f", v)
	if s == "-0.0000" {
		return "0.0000"
	}
	return s
}

// escapeXML escapes text for an SVG or HTML text node or attribute.
func escapeXML(s string) string {
	var b strings.Builder
	xml.EscapeText(&b, []byte(s)) // writes to a strings.Builder, which cannot fail
	return b.String()
}
