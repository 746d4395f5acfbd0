package plots

import (
	"bytes"
	"fmt"
	"strings"
	"testing"

	"cardinal/search"
	"cardinal/search/solution/solutiontest"
	"cardinal/search/wavecolour"
)

// The plots draw each wavelength in its own colour (wavecolour.Of), the
// colour the layout drawing gives rays of that wavelength
// (TestRaysInTheirWavelengthsColour in package drawing), and write their
// text in Liberation Sans, the report's font (TestReportFontIsThePlots in
// package report).
func TestPlotColoursAndFont(t *testing.T) {
	req := solutiontest.Requirements()["image"]
	s := solutiontest.Solve(t, req)[0]
	wls := []float64{587.5618, 486.1327, 656.2725}
	sp, err := NewSpots(s, PlotOptions{Rings: 4, Wavelengths: wls})
	if err != nil {
		t.Fatal(err)
	}
	img := plotPNG(t, sp, "test")
	count := map[string]int{}
	bounds := img.Bounds()
	for y := bounds.Min.Y; y < bounds.Max.Y; y++ {
		for x := bounds.Min.X; x < bounds.Max.X; x++ {
			r, g, bl, _ := img.At(x, y).RGBA()
			count[fmt.Sprintf("#%02x%02x%02x", r>>8, g>>8, bl>>8)]++
		}
	}
	for _, wl := range wls {
		c := wavecolour.Hex(wavecolour.Of(wl))
		if count[c] < 50 {
			t.Errorf("%g nm: %d pixels of its colour %s in the plot", wl, count[c], c)
		}
	}
	var b bytes.Buffer
	if err := sp.WritePlot(&b, "test", "svg"); err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(b.String(), "Liberation") || !strings.Contains(b.String(), "Sans") {
		t.Error("the SVG plot does not use Liberation Sans")
	}
}

// Every tick label follows one format: fixed decimals as the step needs,
// a true minus sign, zero as 0.
func TestTickLabel(t *testing.T) {
	for _, tt := range []struct {
		v, step float64
		want    string
	}{{-0.8, 0.4, "\u22120.8"}, {0, 0.4, "0"}, {100, 50, "100"}, {-1e-17, 0.2, "0"}, {0.25, 0.05, "0.25"}, {-40, 40, "\u221240"}} {
		if got := tickLabel(tt.v, tt.step); got != tt.want {
			t.Errorf("tickLabel(%g, %g) = %q, want %q", tt.v, tt.step, got, tt.want)
		}
	}
	for _, tc := range [][2]float64{{-1, 1}, {-137, 245}, {0.001, 0.013}} {
		for _, tk := range ticks(tc[0], tc[1]) {
			if tk.Label != "" && (strings.Contains(tk.Label, "e") || strings.HasPrefix(tk.Label, "-")) {
				t.Errorf("range %v: tick label %q", tc, tk.Label)
			}
		}
	}
}

// A laser requirement without a field is plotted on axis only, in the
// grey of its infrared wavelength, named in the key.
func TestPlotLaserOnAxis(t *testing.T) {
	req := solutiontest.Requirements()["focus"]
	req.Wavelength = 1064
	s := solutiontest.Solve(t, req)[0]
	sp, err := NewSpots(s, PlotOptions{Rings: 4})
	if err != nil {
		t.Fatal(err)
	}
	if len(sp.Fields) != 1 || len(sp.Wavelengths) != 1 {
		t.Fatalf("fields %v, wavelengths %v: want on axis at 1064 nm only", sp.Fields, sp.Wavelengths)
	}
	_, names := sp.key()
	if names[0] != "IR 1064 nm (grey)" {
		t.Errorf("key %q", names)
	}
	if req.Kind != search.Focus {
		t.Fatal("the test requirement changed kind")
	}
}
