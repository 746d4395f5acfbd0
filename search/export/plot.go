package export

import (
	"fmt"
	"image/color"
	"io"
	"math"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/plotutil"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"
	"gonum.org/v1/plot/vg/vgsvg"
)

// Plot sizes: a header, then one row of three square panels per field
// point.
const (
	panel   = 2.8 * vg.Inch
	plotDPI = 110
)

// WritePlot draws the spot diagrams (left) and the meridional and
// sagittal ray fans (middle, right), one row per field point, every
// wavelength in its own colour, with gonum.org/v1/plot, as "png" or "svg".
func (sp Spots) WritePlot(w io.Writer, title, format string) error {
	rows := len(sp.Fields)
	width := 3 * panel
	head := sp.newHeader(title, width)
	height := vg.Length(rows)*panel + head.height
	var c vg.CanvasWriterTo
	switch format {
	case "png":
		c = vgimg.PngCanvas{Canvas: vgimg.NewWith(vgimg.UseWH(width, height), vgimg.UseDPI(plotDPI))}
	case "svg":
		c = vgsvg.New(width, height)
	default:
		panic(fmt.Sprintf("export: plot format %q: want png or svg", format))
	}
	dc := draw.New(c)
	dc.SetColor(color.White)
	dc.Fill(dc.Rectangle.Path())
	grid := make([][]*plot.Plot, rows)
	for i := range grid {
		var err error
		if grid[i], err = sp.row(i); err != nil {
			return err
		}
	}
	tiles := draw.Tiles{Rows: rows, Cols: 3, PadX: vg.Millimeter * 4, PadY: vg.Millimeter * 4,
		PadTop: head.height, PadBottom: vg.Millimeter * 2, PadLeft: vg.Millimeter * 2, PadRight: vg.Millimeter * 4}
	for i, row := range plot.Align(grid, tiles, dc) {
		for j, cv := range row {
			grid[i][j].Draw(cv)
		}
	}
	head.draw(dc, height)
	_, err := c.WriteTo(w)
	return err
}

// row makes the three plots of field point i.
func (sp Spots) row(i int) ([]*plot.Plot, error) {
	sets := sp.Sets[i*len(sp.Wavelengths) : (i+1)*len(sp.Wavelengths)]
	spot, mer, sag := plot.New(), plot.New(), plot.New()
	u := sp.Unit()
	spot.Title.Text = sp.fieldName(i) + " · RMS " + rmsList(sets) + " " + u
	mer.Title.Text, sag.Title.Text = "meridional ray fan", "sagittal ray fan"
	for _, p := range []*plot.Plot{spot, mer, sag} {
		p.Title.TextStyle.Font.Size = vg.Points(9.5)
	}
	spot.X.Label.Text, spot.Y.Label.Text = "x ("+u+")", "y ("+u+")"
	mer.X.Label.Text, mer.Y.Label.Text = "pupil y (relative)", "error in y ("+u+")"
	sag.X.Label.Text, sag.Y.Label.Text = "pupil x (relative)", "error in x ("+u+")"
	for k, s := range sets {
		if err := sp.addSet(spot, mer, sag, s, k); err != nil {
			return nil, err
		}
	}
	if sp.Airy > 0 {
		airy, err := plotter.NewLine(circle(sets[0], sp.Airy))
		if err != nil {
			return nil, err
		}
		airy.Color, airy.Dashes = color.Gray{Y: 90}, []vg.Length{vg.Points(3), vg.Points(2)}
		spot.Add(airy)
	}
	square(spot)
	for _, p := range []*plot.Plot{mer, sag} {
		p.X.Min, p.X.Max = -1, 1
		p.Add(plotter.NewGrid())
	}
	return []*plot.Plot{spot, mer, sag}, nil
}

// addSet plots one wavelength's spot and fans.
func (sp Spots) addSet(spot, mer, sag *plot.Plot, s SpotSet, k int) error {
	col := plotutil.Color(k)
	pts := make(plotter.XYs, len(s.X))
	for i := range s.X {
		pts[i] = plotter.XY{X: s.X[i], Y: s.Y[i]}
	}
	sc, err := plotter.NewScatter(pts)
	if err != nil {
		return err
	}
	sc.GlyphStyle.Color, sc.GlyphStyle.Shape, sc.GlyphStyle.Radius = col, plotutil.Shape(k), vg.Points(1.4)
	spot.Add(sc)
	for _, f := range []struct {
		p    *plot.Plot
		x, y []float64
	}{{mer, s.MerPupil, s.MerError}, {sag, s.SagPupil, s.SagError}} {
		xy := make(plotter.XYs, len(f.x))
		for i := range f.x {
			xy[i] = plotter.XY{X: f.x[i], Y: f.y[i]}
		}
		if len(xy) == 0 {
			continue
		}
		l, err := plotter.NewLine(xy)
		if err != nil {
			return err
		}
		l.Color, l.Width = col, vg.Points(1.2)
		f.p.Add(l)
	}
	return nil
}

// fieldName is the short name of field point i for a panel's title, with
// its unit.
func (sp Spots) fieldName(i int) string {
	switch {
	case i == 0:
		return "axis"
	case sp.AtInfinity:
		return fmt.Sprintf("%.3g° field", sp.Fields[i])
	}
	return fmt.Sprintf("%.3g mm field", sp.Fields[i])
}

// circle is the Airy circle about the reference wavelength's centroid.
func circle(s SpotSet, r float64) plotter.XYs {
	cx, cy := centroid(s)
	pts := make(plotter.XYs, 73)
	for i := range pts {
		a := 2 * math.Pi * float64(i) / 72
		pts[i] = plotter.XY{X: cx + r*math.Cos(a), Y: cy + r*math.Sin(a)}
	}
	return pts
}

func centroid(s SpotSet) (float64, float64) {
	var sw, sx, sy float64
	for i := range s.X {
		sw, sx, sy = sw+s.W[i], sx+s.W[i]*s.X[i], sy+s.W[i]*s.Y[i]
	}
	if sw == 0 {
		return 0, 0
	}
	return sx / sw, sy / sw
}

// square gives the spot plot equal ranges on both axes, so that a round
// spot looks round in a square panel.
func square(p *plot.Plot) {
	cx, cy := (p.X.Min+p.X.Max)/2, (p.Y.Min+p.Y.Max)/2
	r := 0.55 * math.Max(math.Max(p.X.Max-p.X.Min, p.Y.Max-p.Y.Min), 1e-3)
	p.X.Min, p.X.Max, p.Y.Min, p.Y.Max = cx-r, cx+r, cy-r, cy+r
}

// rmsList lists the RMS radii of the wavelengths, in their order.
func rmsList(sets []SpotSet) string {
	s := make([]string, len(sets))
	for i, set := range sets {
		s[i] = fmt.Sprintf("%.3g", set.RMS)
	}
	return strings.Join(s, " | ")
}
