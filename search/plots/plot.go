package plots

import (
	"fmt"
	"image/color"
	"io"
	"math"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"
	"gonum.org/v1/plot/vg/vgsvg"

	"cardinal/search/finite"
	"cardinal/search/present"
	"cardinal/search/wavecolour"
)

// Plot sizes: a header, then one row of panels per field point.
const (
	panel   = 2.8 * vg.Inch
	plotDPI = 110
)

// plotFont is the face of every text in the plots: Liberation Sans, the
// report's first font (report.html.tmpl), so that plots and page match.
var plotFont = font.Font{Typeface: "Liberation", Variant: "Sans"}

// Colours of the plots' furniture, our own choice.
var (
	airyFill  = color.RGBA{0xd9, 0xd9, 0xd9, 0xff} // the Airy disc, a pale grey disc under the spot
	gridColor = color.Gray{Y: 0xe4}
	noteColor = color.Gray{Y: 0x30}
)

// newPage is a white page of the given size to draw on, "png" (at
// plotDPI) or "svg".
func newPage(width, height vg.Length, format string) (vg.CanvasWriterTo, draw.Canvas) {
	var c vg.CanvasWriterTo
	switch format {
	case "png":
		c = vgimg.PngCanvas{Canvas: vgimg.NewWith(vgimg.UseWH(width, height), vgimg.UseDPI(plotDPI))}
	case "svg":
		c = vgsvg.New(width, height)
	default:
		panic(fmt.Sprintf("plots: plot format %q: want png or svg", format))
	}
	dc := draw.New(c)
	dc.SetColor(color.White)
	dc.Fill(dc.Rectangle.Path())
	return c, dc
}

// WritePlot draws the page of spot figures, as "png" or "svg", with
// gonum.org/v1/plot. The page is laid out for a builder: a header with
// the key, best focus and the search's verdict, then one row per field
// point: the spot at best focus on its Airy disc, with its RMS radius
// against the Airy radius written on it; the RMS radius through focus
// about best focus, one line per wavelength; and the transverse ray error
// across the pupil, meridional solid and sagittal dashed. An afocal
// solution has no focus: its rows show the output directions and the
// direction errors. Each wavelength is drawn in its own colour
// (wavecolour.Of), every tick label in one number format (tickLabel).
func (sp Spots) WritePlot(w io.Writer, title, format string) error {
	if err := finite.Check("the spot plot", sp); err != nil {
		return err
	}
	cols := 3
	if sp.Angular {
		cols = 2
	}
	rows := len(sp.Fields)
	width := 3 * panel
	head := sp.newHeader(title, width)
	height := vg.Length(rows)*panel + head.height
	c, dc := newPage(width, height, format)
	grid := make([][]*plot.Plot, rows)
	notes := make([][][]string, rows)
	for i := range grid {
		var err error
		if grid[i], notes[i], err = sp.row(i); err != nil {
			return err
		}
		if err := checkAxes("the spot plot", grid[i]...); err != nil {
			return err
		}
	}
	tiles := draw.Tiles{Rows: rows, Cols: cols, PadX: vg.Millimeter * 6, PadY: vg.Millimeter * 5,
		PadTop: head.height, PadBottom: vg.Millimeter * 2, PadLeft: vg.Millimeter * 2, PadRight: vg.Millimeter * 4}
	for i, row := range plot.Align(grid, tiles, dc) {
		for j, cv := range row {
			grid[i][j].Draw(cv)
			writeOn(grid[i][j].DataCanvas(cv), notes[i][j])
		}
	}
	head.draw(dc, height)
	return writeCanvas(w, c, "the spot plot", format)
}

// row makes the panels of field point i, with the words written on each.
func (sp Spots) row(i int) ([]*plot.Plot, [][]string, error) {
	spot, spotNote, err := sp.spotPanel(i)
	if err != nil {
		return nil, nil, err
	}
	errs, err := sp.errorPanel(i)
	if err != nil {
		return nil, nil, err
	}
	errNote := []string{"solid: meridional (y)", "dashed: sagittal (x)"}
	if sp.Angular {
		return []*plot.Plot{spot, errs}, [][]string{spotNote, errNote}, nil
	}
	focus, err := sp.focusPanel(i)
	if err != nil {
		return nil, nil, err
	}
	focusNote := []string{"0: best focus", "dashed: Airy radius"}
	return []*plot.Plot{spot, focus, errs}, [][]string{spotNote, focusNote, errNote}, nil
}

// newPanel is a plot in the page's fonts and tick format.
func newPanel(title, x, y string) *plot.Plot {
	p := plot.New()
	p.Title.Text, p.X.Label.Text, p.Y.Label.Text = title, x, y
	p.Title.TextStyle.Font = font.From(plotFont, 9.5)
	p.Title.Padding = vg.Points(4)
	for _, a := range []*plot.Axis{&p.X, &p.Y} {
		a.Label.TextStyle.Font = font.From(plotFont, 9)
		a.Tick.Label.Font = font.From(plotFont, 8.5)
		a.Tick.Marker = plot.TickerFunc(ticks)
		a.Color, a.Tick.Color = noteColor, noteColor
	}
	g := plotter.NewGrid()
	g.Vertical.Color, g.Horizontal.Color = gridColor, gridColor
	p.Add(g)
	return p
}

// spotPanel is field point i's spot at best focus (directions for an
// afocal solution), each wavelength in its colour, over the Airy disc,
// with the RMS radius against the Airy radius written on it.
func (sp Spots) spotPanel(i int) (*plot.Plot, []string, error) {
	u := sp.Unit()
	where := "at best focus"
	if sp.Angular {
		where = "output directions"
	}
	p := newPanel(sp.FieldText(i)+": spot "+where, "x ("+u+")", "y ("+u+")")
	n := len(sp.Wavelengths)
	var cx, cy float64
	for j := n - 1; j >= 0; j-- { // the reference wavelength drawn last, on top
		k := i*n + j
		x, y := sp.shifted(k, sp.BestFocus)
		if j == n-1 {
			x0, y0 := sp.shifted(i*n, sp.BestFocus)
			cx, cy = centroidOf(x0, y0, sp.Sets[i*n].W)
			if sp.Airy > 0 {
				disc, err := plotter.NewPolygon(circlePoints(cx, cy, sp.Airy))
				if err != nil {
					return nil, nil, err
				}
				disc.Color, disc.LineStyle.Width = airyFill, 0
				p.Add(disc)
			}
		}
		pts := make(plotter.XYs, len(x))
		for m := range x {
			pts[m] = plotter.XY{X: x[m], Y: y[m]}
		}
		sc, err := plotter.NewScatter(pts)
		if err != nil {
			return nil, nil, err
		}
		sc.GlyphStyle = wavelengthGlyph(sp.Wavelengths[j])
		p.Add(sc)
	}
	if sp.Airy > 0 { // the disc's rim on top, so that a spot smaller than it shows it
		rim, err := plotter.NewLine(append(circlePoints(cx, cy, sp.Airy), circlePoints(cx, cy, sp.Airy)[0]))
		if err != nil {
			return nil, nil, err
		}
		rim.Color, rim.Width = color.Gray{Y: 0x55}, vg.Points(0.8)
		p.Add(rim)
	}
	square(p)
	lines := []string{spotNote(sp, i*n)}
	if i == 0 && sp.Verdict != "" {
		lines = append(lines, strings.SplitN(strings.TrimPrefix(sp.Verdict, "the search's verdict: "), " (", 2)[0])
	}
	return p, lines, nil
}

// spotNote is what the spot panel says of set k: its RMS radius at best
// focus against the Airy radius, with the rays lost, or that no ray
// reached the image.
func spotNote(sp Spots, k int) string {
	set := sp.Sets[k]
	if !set.Reached() {
		return "no ray reached the image"
	}
	rms := sp.RMSAt(k, sp.BestFocus)
	note := fmt.Sprintf("RMS %s %s", present.Figure(rms), sp.Unit())
	if sp.Airy > 0 {
		note += fmt.Sprintf(" = %s× Airy", present.Figure(rms/sp.Airy))
	}
	if set.Lost > 0 {
		note += fmt.Sprintf(" (%d of %d rays)", set.Passed, set.Passed+set.Lost)
	}
	return note
}

// focusPanel is field point i's RMS radius through focus, one line per
// wavelength, against the Airy radius, about the page's best focus.
func (sp Spots) focusPanel(i int) (*plot.Plot, error) {
	p := newPanel("RMS spot radius through focus", "from best focus (mm)", "RMS radius (µm)")
	n := len(sp.Wavelengths)
	top := 0.0
	for j := n - 1; j >= 0; j-- { // the reference wavelength drawn last, on top
		if !sp.Sets[i*n+j].Reached() {
			continue // no spot: no curve, rather than one along zero
		}
		dz, rms := sp.ThroughFocus(i*n + j)
		xy := make(plotter.XYs, len(dz))
		for m := range dz {
			xy[m] = plotter.XY{X: dz[m], Y: rms[m]}
			top = math.Max(top, rms[m])
		}
		l, err := plotter.NewLine(xy)
		if err != nil {
			return nil, err
		}
		l.Color, l.Width = wavecolour.Of(sp.Wavelengths[j]), vg.Points(1.6)
		p.Add(l)
	}
	r := sp.FocusRange()
	if sp.Airy > 0 {
		airy, err := plotter.NewLine(plotter.XYs{{X: -r, Y: sp.Airy}, {X: r, Y: sp.Airy}})
		if err != nil {
			return nil, err
		}
		airy.Color, airy.Width, airy.Dashes = color.Gray{Y: 0x70}, vg.Points(1), []vg.Length{vg.Points(5), vg.Points(3)}
		p.Add(airy)
	}
	p.X.Min, p.X.Max, p.Y.Min, p.Y.Max = -r, r, 0, math.Max(top, 1.2*sp.Airy)*1.25
	return p, nil
}

// errorPanel is field point i's transverse ray error across the pupil:
// meridional (error in y along the pupil's y axis) solid, sagittal (error
// in x along its x axis) dashed, one colour per wavelength, at best focus
// (moved there along each ray), relative to the reference chief ray.
func (sp Spots) errorPanel(i int) (*plot.Plot, error) {
	u := sp.Unit()
	p := newPanel("ray error across the pupil", "pupil coordinate (relative)", "ray error ("+u+")")
	n := len(sp.Wavelengths)
	for j := n - 1; j >= 0; j-- {
		s := sp.Sets[i*n+j]
		for _, f := range []struct {
			x, y, slope []float64
			dashed      bool
		}{{s.MerPupil, s.MerError, s.MerSlope, false}, {s.SagPupil, s.SagError, s.SagSlope, true}} {
			if len(f.x) == 0 {
				continue
			}
			xy := make(plotter.XYs, len(f.x))
			for m := range f.x {
				xy[m] = plotter.XY{X: f.x[m], Y: f.y[m] + 1000*sp.BestFocus*f.slope[m]}
			}
			l, err := plotter.NewLine(xy)
			if err != nil {
				return nil, err
			}
			l.Color, l.Width = wavecolour.Of(sp.Wavelengths[j]), vg.Points(1.4)
			if f.dashed {
				l.Dashes = []vg.Length{vg.Points(4), vg.Points(2.5)}
			}
			p.Add(l)
		}
	}
	p.X.Min, p.X.Max = -1, 1
	pad := 0.3 * (p.Y.Max - p.Y.Min) // room for the words at the top
	p.Y.Max += pad
	return p, nil
}

// writeOn writes lines of text inside a panel's data area, top left.
func writeOn(dc draw.Canvas, lines []string) {
	sty := text.Style{Font: font.From(plotFont, 8.5), Color: noteColor, XAlign: draw.XLeft, YAlign: draw.YTop, Handler: plot.DefaultTextHandler}
	pitch := sty.Font.Size * lineSpacing
	for k, l := range lines {
		dc.FillText(sty, vg.Point{X: dc.Min.X + vg.Points(5), Y: dc.Max.Y - vg.Points(4) - vg.Length(k)*pitch}, l)
	}
}

// wavelengthGlyph is how a wavelength's spot points are drawn: a small
// filled dot in its colour; an ultraviolet or infrared wavelength, drawn
// grey, gets a cross (UV) or a ring (IR) so that its grey is marked.
func wavelengthGlyph(nm float64) draw.GlyphStyle {
	g := draw.GlyphStyle{Color: wavecolour.Of(nm), Radius: vg.Points(1.3), Shape: draw.CircleGlyph{}}
	switch {
	case nm < wavecolour.VisibleLo:
		g.Shape, g.Radius = draw.CrossGlyph{}, vg.Points(1.8)
	case nm > wavecolour.VisibleHi:
		g.Shape, g.Radius = draw.RingGlyph{}, vg.Points(1.6)
	}
	return g
}

// ticks are gonum's default tick positions with labels in one number
// format (tickLabel).
func ticks(min, max float64) []plot.Tick {
	ts := plot.DefaultTicks{}.Ticks(min, max)
	var step float64
	var prev *float64
	for i := range ts {
		if ts[i].Label == "" {
			continue
		}
		if prev != nil && step == 0 {
			step = ts[i].Value - *prev
		}
		prev = &ts[i].Value
	}
	for i := range ts {
		if ts[i].Label != "" {
			ts[i].Label = tickLabel(ts[i].Value, step)
		}
	}
	return ts
}

// tickLabel is the plots' one number format: fixed point with as many
// decimals as the step between labelled ticks needs, a true minus sign,
// and zero as 0.
func tickLabel(v, step float64) string {
	dec := 0
	if step > 0 && step < 1 {
		dec = int(math.Ceil(-math.Log10(step) - 1e-9))
	}
	s := present.Fixed(v, dec)
	if strings.Trim(s, "0.") == "" {
		return "0"
	}
	return strings.Replace(s, "-", "\u2212", 1)
}

// circlePoints is a circle of radius r about (cx, cy).
func circlePoints(cx, cy, r float64) plotter.XYs {
	pts := make(plotter.XYs, 72)
	for i := range pts {
		a := 2 * math.Pi * float64(i) / 72
		pts[i] = plotter.XY{X: cx + r*math.Cos(a), Y: cy + r*math.Sin(a)}
	}
	return pts
}

// centroidOf is the weighted centroid of points.
func centroidOf(x, y, w []float64) (float64, float64) {
	var sw, sx, sy float64
	for i := range x {
		sw, sx, sy = sw+w[i], sx+w[i]*x[i], sy+w[i]*y[i]
	}
	if sw == 0 {
		return 0, 0
	}
	return sx / sw, sy / sw
}

// square gives the spot plot equal ranges on both axes, so that a round
// spot looks round in a square panel, with room for the words on it.
func square(p *plot.Plot) {
	cx, cy := (p.X.Min+p.X.Max)/2, (p.Y.Min+p.Y.Max)/2
	r := 0.55 * math.Max(math.Max(p.X.Max-p.X.Min, p.Y.Max-p.Y.Min), 1e-3)
	p.X.Min, p.X.Max, p.Y.Min, p.Y.Max = cx-r, cx+r, cy-0.7*r, cy+1.3*r
}
