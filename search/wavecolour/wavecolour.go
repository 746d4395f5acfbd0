package wavecolour

import (
	"fmt"
	"image/color"
	"math"
)

// The visible band as the colours of the drawings and plots treat it, nm:
// the span of the CIE 1931 colour-matching functions that the
// approximation below follows (common practice: 380 to 780 nm).
const (
	VisibleLo = 380.0
	VisibleHi = 780.0
)

// hueLo and hueHi bound the wavelength whose hue is drawn: the spectral
// locus of the CIE 1931 chromaticity diagram hardly moves beyond 650 nm
// (x near 0.73) or below 400 nm (x near 0.17), while the fit's tails
// drift from it there (CIE 15:2004, spectral chromaticity coordinates;
// from memory), so those wavelengths take the hue of the bound.
const (
	hueLo = 400.0
	hueHi = 650.0
)

// cieXYZ is the CIE 1931 2° standard observer's colour-matching functions
// x̄, ȳ, z̄ at a wavelength in nm, from the multi-lobe piecewise-Gaussian
// fit of C. Wyman, P.-P. Sloan and P. Shirley, "Simple Analytic
// Approximations to the CIE XYZ Color Matching Functions", Journal of
// Computer Graphics Techniques 2(2), 1-11 (2013), eq. 2 and table 1.
func cieXYZ(nm float64) (x, y, z float64) {
	// g is the piecewise Gaussian of the fit: width s1 below the mean mu,
	// s2 above it.
	g := func(mu, s1, s2 float64) float64 {
		s := s1
		if nm >= mu {
			s = s2
		}
		t := (nm - mu) / s
		return math.Exp(-0.5 * t * t)
	}
	x = 1.056*g(599.8, 37.9, 31.0) + 0.362*g(442.0, 16.0, 26.7) - 0.065*g(501.1, 20.4, 26.2)
	y = 0.821*g(568.8, 46.9, 40.5) + 0.286*g(530.9, 16.3, 31.1)
	z = 1.217*g(437.0, 11.8, 36.0) + 0.681*g(459.0, 26.0, 13.8)
	return x, y, z
}

// linearSRGB turns CIE XYZ into linear sRGB with the matrix of IEC
// 61966-2-1:1999 (sRGB, D65 white).
func linearSRGB(x, y, z float64) (r, g, b float64) {
	r = 3.2406*x - 1.5372*y - 0.4986*z
	g = -0.9689*x + 1.8758*y + 0.0415*z
	b = 0.0557*x - 0.2040*y + 1.0570*z
	return r, g, b
}

// encodeSRGB is the sRGB transfer function of IEC 61966-2-1:1999: linear
// light 0..1 to the encoded value 0..1.
func encodeSRGB(c float64) float64 {
	c = math.Max(0, math.Min(1, c))
	if c <= 0.0031308 {
		return 12.92 * c
	}
	return 1.055*math.Pow(c, 1/2.4) - 0.055
}

// maxInk is the largest relative luminance (0.2126 R + 0.7152 G +
// 0.0722 B of linear sRGB, IEC 61966-2-1) a wavelength's colour is drawn
// with, so that yellow and green lines stay legible on white paper: a
// brighter colour keeps its hue and is darkened to it (our choice).
const maxInk = 0.3

// Of is the colour that light of a wavelength is drawn with in every plot
// and drawing. A visible wavelength (380-780 nm) gets its own hue: its CIE
// 1931 colour (cieXYZ) in sRGB, brought into the sRGB gamut by clipping
// the negative primaries (the spectral colours lie outside it), at full
// strength, darkened where needed to at most maxInk luminance. An
// ultraviolet or infrared wavelength gets a grey, darker the further it
// lies from the visible band (UV darker than IR at the same distance),
// and Visible tells the keys to name it.
func Of(nm float64) color.RGBA {
	if !Visible(nm) {
		level := invisibleGrey(nm)
		v := uint8(math.Round(255 * level))
		return color.RGBA{v, v, v, 255}
	}
	r, g, b := linearSRGB(cieXYZ(math.Max(hueLo, math.Min(hueHi, nm))))
	r, g, b = math.Max(r, 0), math.Max(g, 0), math.Max(b, 0) // clip into the gamut
	top := math.Max(r, math.Max(g, b))
	r, g, b = r/top, g/top, b/top
	if lum := 0.2126*r + 0.7152*g + 0.0722*b; lum > maxInk {
		k := maxInk / lum
		r, g, b = k*r, k*g, k*b
	}
	return color.RGBA{uint8(math.Round(255 * encodeSRGB(r))), uint8(math.Round(255 * encodeSRGB(g))), uint8(math.Round(255 * encodeSRGB(b))), 255}
}

// invisibleGrey is the grey level (0 black, 1 white) of an ultraviolet or
// infrared wavelength: 0.55 (IR) or 0.35 (UV) next to the visible band,
// less by up to 0.3 an octave or more away (at least 0.2), so that several
// such wavelengths differ.
func invisibleGrey(nm float64) float64 {
	octaves := math.Abs(math.Log2(nm / VisibleHi))
	base := 0.55
	if nm < VisibleLo {
		octaves, base = math.Abs(math.Log2(VisibleLo/nm)), 0.35
	}
	return math.Max(0.2, base-0.3*math.Min(octaves, 1))
}

// Visible tells whether a wavelength in nm lies in the visible band
// (380-780 nm), where it is drawn in its own colour.
func Visible(nm float64) bool { return nm >= VisibleLo && nm <= VisibleHi }

// Name names a wavelength for a key: "587.6 nm", or
// "UV 355 nm" and "IR 1064 nm" outside the visible band, whose grey
// colour does not say it.
func Name(nm float64) string {
	s := fmt.Sprintf("%.1f nm", nm)
	if math.Abs(nm-math.Round(nm)) < 0.05 {
		s = fmt.Sprintf("%.0f nm", nm)
	}
	switch {
	case nm < VisibleLo:
		return "UV " + s + " (grey)"
	case nm > VisibleHi:
		return "IR " + s + " (grey)"
	}
	return s
}

// Hex writes a colour as #rrggbb for SVG.
func Hex(c color.RGBA) string { return fmt.Sprintf("#%02x%02x%02x", c.R, c.G, c.B) }
