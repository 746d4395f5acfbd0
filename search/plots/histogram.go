package plots

import (
	"fmt"
	"image/color"
	"io"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"cardinal/search"
	"cardinal/search/finite"
)

// Colours of the build-study histograms: slate bars, the 95 % range in
// dark dashes, the target's tolerance as a pale green band.
var (
	barFill   = color.RGBA{R: 0x5b, G: 0x6e, B: 0x86, A: 0xff}
	barEdge   = color.RGBA{R: 0x2c, G: 0x37, B: 0x45, A: 0xff}
	rangeLine = color.RGBA{R: 0x1a, G: 0x1a, B: 0x1a, A: 0xff}
	tolBand   = color.RGBA{R: 0xd8, G: 0xee, B: 0xd2, A: 0xff}
)

// histBins is the number of bars of each histogram.
const histBins = 30

// WriteStudyPlot draws the build study's two histograms side by side with
// gonum.org/v1/plot: the compensator's move (left) and the target figure
// after compensation (right), each with its 95 % range, the right one over
// the requirement's tolerance band. format is "svg" or "png".
func WriteStudyPlot(w io.Writer, req search.Requirement, st search.Study, title, format string) error {
	if err := finite.Check("the build-study plot", st); err != nil {
		return err
	}
	width, height := 2*panel, panel+8*vg.Millimeter
	c, dc := newPage(width, height, format)
	left, err := studyPanel(st.Adjust, st.AdjustLow, st.AdjustHigh, adjustLabel(st.Compensator), 0, 0)
	if err != nil {
		return err
	}
	name, unit := search.FigureName(req.Kind)
	label := name + " after compensation"
	if unit != "" {
		label += " (" + unit + ")"
	}
	lo, hi := st.FigureRange()
	right, err := studyPanel(st.Figure, lo, hi, label, st.Target-st.Tol, st.Target+st.Tol)
	if err != nil {
		return err
	}
	right.Title.Text = fmt.Sprintf("%.1f %% of builds within tolerance", st.Yield)
	left.Title.Text = title
	for _, p := range []*plot.Plot{left, right} {
		p.Title.TextStyle.Font.Size = vg.Points(9.5)
	}
	tiles := draw.Tiles{Rows: 1, Cols: 2, PadX: 6 * vg.Millimeter, PadY: 2 * vg.Millimeter,
		PadTop: 4 * vg.Millimeter, PadBottom: 2 * vg.Millimeter, PadLeft: 2 * vg.Millimeter, PadRight: 4 * vg.Millimeter}
	if err := checkAxes("the build-study plot", left, right); err != nil {
		return err
	}
	grid := [][]*plot.Plot{{left, right}}
	for i, row := range plot.Align(grid, tiles, dc) {
		for j, cv := range row {
			grid[i][j].Draw(cv)
		}
	}
	return writeCanvas(w, c, "the build-study plot", format)
}

func adjustLabel(c search.Compensator) string {
	switch c {
	case search.CompensateGap:
		return "gap adjustment (mm)"
	case search.CompensateNone:
		return "error left uncompensated (mm)"
	}
	return "focus adjustment (mm)"
}

// studyPanel is one histogram with its 95 % range [lo, hi] dashed and,
// when bandHi > bandLo, a band behind the bars.
func studyPanel(v []float64, lo, hi float64, xLabel string, bandLo, bandHi float64) (*plot.Plot, error) {
	p := plot.New()
	p.X.Label.Text, p.Y.Label.Text = xLabel, "builds"
	h := search.NewHistogram(v, histBins)
	if len(h.Counts) == 0 {
		return p, nil
	}
	top := 0
	bins := make([]plotter.HistogramBin, len(h.Counts))
	for i, n := range h.Counts {
		bins[i] = plotter.HistogramBin{Min: h.Edges[i], Max: h.Edges[i+1], Weight: float64(n)}
		top = max(top, n)
	}
	if bandHi > bandLo {
		band, err := plotter.NewPolygon(plotter.XYs{{X: bandLo, Y: 0}, {X: bandHi, Y: 0},
			{X: bandHi, Y: 1.08 * float64(top)}, {X: bandLo, Y: 1.08 * float64(top)}})
		if err != nil {
			return nil, err
		}
		band.Color, band.LineStyle.Width = tolBand, 0
		p.Add(band)
	}
	hist := &plotter.Histogram{Bins: bins, Width: h.Edges[1] - h.Edges[0], FillColor: barFill}
	hist.LineStyle = draw.LineStyle{Color: barEdge, Width: vg.Points(0.4)}
	p.Add(hist)
	for _, x := range []float64{lo, hi} {
		l, err := plotter.NewLine(plotter.XYs{{X: x, Y: 0}, {X: x, Y: 1.08 * float64(top)}})
		if err != nil {
			return nil, err
		}
		l.Color, l.Width, l.Dashes = rangeLine, vg.Points(1), []vg.Length{vg.Points(4), vg.Points(2)}
		p.Add(l)
	}
	p.Y.Min, p.Y.Max = 0, 1.1*float64(top)
	return p, nil
}
