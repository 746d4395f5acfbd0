package plots

import (
	"bytes"
	"encoding/xml"
	"errors"
	"image"
	"image/png"
	"math"
	"slices"
	"strings"
	"testing"

	"cardinal/optics"
	"cardinal/search"
	"cardinal/search/solution"
	"cardinal/search/solution/solutiontest"
)

// On axis a rotationally symmetric system gives odd ray fans, e(-p) =
// -e(p), and the same fan in both sections (common practice; Welford,
// Aberrations of Optical Systems, 1986, ch. 7).
func TestSpotFansOnAxisAreOddAndAlike(t *testing.T) {
	for kind, req := range solutiontest.Requirements() {
		t.Run(kind, func(t *testing.T) {
			sp, err := NewSpots(solutiontest.Solve(t, req)[0], PlotOptions{Rings: 4})
			if err != nil {
				t.Fatal(err)
			}
			for _, set := range sp.Sets[:len(sp.Wavelengths)] {
				n := len(set.MerError)
				if n != fanSamples || len(set.SagError) != n {
					t.Fatalf("%g nm: %d and %d fan rays passed, want %d", set.Wavelength, n, len(set.SagError), fanSamples)
				}
				scale := math.Max(math.Abs(set.MerError[0]), 1e-3)
				for i := range n {
					if d := set.MerError[i] + set.MerError[n-1-i]; math.Abs(d) > 1e-9*scale {
						t.Errorf("%g nm: meridional fan not odd at pupil %g: %g", set.Wavelength, set.MerPupil[i], d)
					}
					if d := set.MerError[i] - set.SagError[i]; math.Abs(d) > 1e-9*scale {
						t.Errorf("%g nm: fans differ on axis at pupil %g: %g", set.Wavelength, set.MerPupil[i], d)
					}
				}
			}
		})
	}
}

// At the paraxial focus of a slow beam the transverse ray error on axis is
// third order in the pupil coordinate: e(1) / e(0.5) = 8 (Seidel
// spherical aberration; Welford, Aberrations of Optical Systems, 1986,
// ch. 7). A 2 mm beam at 75 mm is slow enough for 1 %.
func TestSpotFanIsThirdOrderForASlowBeam(t *testing.T) {
	req := solutiontest.Requirements()["focus"]
	req.Beam = 2
	sp, err := NewSpots(solutiontest.Solve(t, req)[0], PlotOptions{Rings: 2, Wavelengths: []float64{587.5618}})
	if err != nil {
		t.Fatal(err)
	}
	set := sp.Sets[0]
	var e1, eHalf float64
	for i, p := range set.MerPupil {
		switch {
		case math.Abs(p-1) < 1e-12:
			e1 = set.MerError[i]
		case math.Abs(p-0.5) < 1e-12:
			eHalf = set.MerError[i]
		}
	}
	if r := e1 / eHalf; math.Abs(r-8) > 0.08 {
		t.Errorf("e(1)/e(0.5) = %.4f (e(1) = %.4g µm), want 8 within 1 %%", r, e1)
	}
}

// The RMS radius plotted is the one the optics package finds for the same
// bundle on the same plane.
func TestSpotRMSMatchesOptics(t *testing.T) {
	req := solutiontest.Requirements()["image"]
	s := solutiontest.Solve(t, req)[0]
	sp, err := NewSpots(s, PlotOptions{Rings: 6, Wavelengths: []float64{587.5618}})
	if err != nil {
		t.Fatal(err)
	}
	sys := s.System()
	for i, set := range sp.Sets {
		b, err := sys.Bundle(s.Object(), sp.Fields[i], set.Wavelength, optics.Hexapolar(6))
		if err != nil {
			t.Fatal(err)
		}
		want := 1e3 * sys.Tracer(set.Wavelength).TraceBundle(b, s.ImageZ).SpotAt(s.ImageZ).RMS
		if math.Abs(set.RMS-want) > 1e-9*want {
			t.Errorf("field %g: RMS %.9g µm, optics %.9g µm", sp.Fields[i], set.RMS, want)
		}
	}
}

// The plots come out as a PNG that decodes, with something drawn on it, and
// as an SVG that parses.
func TestWritePlot(t *testing.T) {
	for kind, req := range solutiontest.Requirements() {
		if kind == "image" && testing.Short() {
			continue
		}
		t.Run(kind, func(t *testing.T) {
			sp, err := NewSpots(solutiontest.Solve(t, req)[0], PlotOptions{Rings: 4})
			if err != nil {
				t.Fatal(err)
			}
			img := plotPNG(t, sp, "test")
			if w := img.Bounds().Dx(); w != int(math.Round(3*2.8*plotDPI)) {
				t.Errorf("width %d px", w)
			}
			if f := solutiontest.InkFraction(img); f < 0.01 {
				t.Errorf("only %.4f of the plot is drawn on", f)
			}
			var b bytes.Buffer
			if err := sp.WritePlot(&b, "test", "svg"); err != nil {
				t.Fatal(err)
			}
			var root struct{ XMLName xml.Name }
			if err := xml.Unmarshal(b.Bytes(), &root); err != nil {
				t.Fatalf("the SVG plot does not parse: %v", err)
			}
		})
	}
}

// The plots' wavelengths: the requirement's first, then its band, or the
// F and C lines (Fraunhofer lines, common practice) in the visible.
func TestDefaultWavelengths(t *testing.T) {
	for _, tc := range []struct {
		name string
		req  search.Requirement
		want []float64
	}{
		{"visible, no laser", search.Requirement{Kind: search.Image}, []float64{optics.LineD, optics.LineF, optics.LineC}},
		{"laser", search.Requirement{Kind: search.Focus, Beam: 2, Power: 0.1}, []float64{optics.LineD}},
		{"visible laser by the switch", search.Requirement{Kind: search.Expand, Beam: 2, Wavelength: 632.8, Laser: true}, []float64{632.8}},
		{"visible, the switch not given", search.Requirement{Kind: search.Expand, Beam: 2, Wavelength: 632.8}, []float64{632.8, optics.LineF, optics.LineC}},
		{"band holding the reference", search.Requirement{Kind: search.Focus, Band: []float64{486.1, 587.6, 656.3}}, []float64{optics.LineD, 486.1, 656.3}},
		{"laser with a band", search.Requirement{Kind: search.Focus, Wavelength: 1064, Power: 1, Band: []float64{1030, 1064, 1090}}, []float64{1064, 1030, 1090}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			if got := DefaultWavelengths(solution.Solution{Requirement: tc.req}); !slices.Equal(got, tc.want) {
				t.Errorf("%v, want %v", got, tc.want)
			}
		})
	}
}

// A field point is named with its unit: degrees for an object at
// infinity, mm of object height for a finite object.
func TestFieldText(t *testing.T) {
	angles := Spots{AtInfinity: true, Fields: []float64{0, 0.7, 1}}
	heights := Spots{Fields: []float64{0, 3.5, 5}}
	for _, tc := range []struct {
		name string
		sp   Spots
		i    int
		want string
	}{
		{"axis", angles, 0, "on axis"},
		{"angle", angles, 1, "field angle 0.7°"},
		{"height", heights, 2, "object height 5 mm"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			if got := tc.sp.FieldText(tc.i); got != tc.want {
				t.Errorf("%q, want %q", got, tc.want)
			}
		})
	}
}

// A field wider than the layout passes is the user's choice, said as a
// FieldError naming about the widest field that passes: a spot diagram at
// that field is drawn, and one 2 % of the asked field wider is refused.
func TestSpotsFieldTooWide(t *testing.T) {
	s := solutiontest.Solve(t, solutiontest.Requirements()["focus"])[0]
	const asked = 80.0 // degrees: no stock layout passes a chief ray this steep
	_, err := NewSpots(s, PlotOptions{Rings: 2, Field: asked})
	var fe *FieldError
	if !errors.As(err, &fe) {
		t.Fatalf("err = %v, want a *FieldError", err)
	}
	if !strings.Contains(fe.Error(), "--field-angle") || fe.Widest <= 0 || fe.Widest >= asked {
		t.Fatalf("FieldError %q, widest %g", fe.Error(), fe.Widest)
	}
	if _, err := NewSpots(s, PlotOptions{Rings: 2, Field: fe.Widest}); err != nil {
		t.Errorf("at the widest field said to pass, %g°: %v", fe.Widest, err)
	}
	if _, err := NewSpots(s, PlotOptions{Rings: 2, Field: fe.Widest + 0.02*asked}); !errors.As(err, &fe) {
		t.Errorf("2 %% wider than the widest said to pass: err = %v, want a *FieldError", err)
	}
}

// plotPNG writes the spot figure as PNG and decodes it.
func plotPNG(t *testing.T, sp Spots, title string) image.Image {
	t.Helper()
	var b bytes.Buffer
	if err := sp.WritePlot(&b, title, "png"); err != nil {
		t.Fatal(err)
	}
	img, err := png.Decode(&b)
	if err != nil {
		t.Fatal(err)
	}
	return img
}
