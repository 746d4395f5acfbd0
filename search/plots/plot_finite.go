package plots

import (
	"bytes"
	"fmt"
	"io"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"

	"cardinal/search/finite"
)

// checkAxes refuses a plot whose axis ranges are not finite (worked out
// from the data, so a NaN that slipped into the figures shows here), naming
// the panel by its title.
func checkAxes(what string, ps ...*plot.Plot) error {
	for _, p := range ps {
		ranges := [4]float64{p.X.Min, p.X.Max, p.Y.Min, p.Y.Max}
		if err := finite.Check(what, ranges); err != nil {
			return fmt.Errorf("%w (the axis range of the panel %q: x %g to %g, y %g to %g)", err, p.Title.Text, p.X.Min, p.X.Max, p.Y.Min, p.Y.Max)
		}
	}
	return nil
}

// writeCanvas writes a finished plot. An SVG is written to memory first
// and refused if any attribute holds NaN or an infinity (a PNG's pixels
// carry no numbers; its data and axes were checked before drawing).
func writeCanvas(w io.Writer, c vg.CanvasWriterTo, what, format string) error {
	if format != "svg" {
		_, err := c.WriteTo(w)
		return err
	}
	var b bytes.Buffer
	if _, err := c.WriteTo(&b); err != nil {
		return err
	}
	if err := finite.Attributes(what, b.Bytes()); err != nil {
		return err
	}
	_, err := w.Write(b.Bytes())
	return err
}
