package wavecolour

import (
	"math"
	"strings"
	"testing"
)

// The fit of the colour-matching functions against the CIE 1931 2°
// standard observer's tabulated values (CIE 15:2004, table of the 1931
// colour-matching functions; values from memory, to 4 decimals). Wyman,
// Sloan and Shirley (JCGT 2(2), 2013) report the multi-lobe fit within a
// few hundredths of the table; 0.03 is allowed.
func TestCIEFit(t *testing.T) {
	for _, tt := range []struct{ nm, x, y, z float64 }{
		{450, 0.3362, 0.0380, 1.7721},
		{500, 0.0049, 0.3230, 0.2720},
		{555, 0.5121, 1.0000, 0.0057},
		{600, 1.0622, 0.6310, 0.0008},
		{650, 0.2835, 0.1070, 0.0000},
	} {
		x, y, z := cieXYZ(tt.nm)
		if math.Abs(x-tt.x) > 0.03 || math.Abs(y-tt.y) > 0.03 || math.Abs(z-tt.z) > 0.03 {
			t.Errorf("%g nm: (%.4f, %.4f, %.4f), want (%.4f, %.4f, %.4f)", tt.nm, x, y, z, tt.x, tt.y, tt.z)
		}
	}
}

// The D65 white point, X 0.9505, Y 1, Z 1.0890 (CIE 15:2004; from
// memory), is linear sRGB (1, 1, 1) under the matrix of IEC 61966-2-1.
func TestSRGBWhite(t *testing.T) {
	r, g, b := linearSRGB(0.9505, 1, 1.0890)
	for _, c := range []float64{r, g, b} {
		if math.Abs(c-1) > 0.002 {
			t.Errorf("D65 white is (%.4f, %.4f, %.4f), want (1, 1, 1)", r, g, b)
			break
		}
	}
	// The transfer function's two pieces meet at 0.0031308 (IEC 61966-2-1).
	if lo, hi := 12.92*0.0031308, 1.055*math.Pow(0.0031308, 1/2.4)-0.055; math.Abs(lo-hi) > 1e-4 {
		t.Errorf("the sRGB transfer pieces differ at the joint: %g, %g", lo, hi)
	}
}

// Each visible wavelength is drawn in the hue it has (the spectral hues,
// common practice: red at 656 nm, orange-yellow at 588 nm, green at
// 530 nm, blue at 460 nm, violet at 405 nm), legible on white (no channel
// near white), and UV and IR in named greys.
func TestWavelengthColour(t *testing.T) {
	for _, tt := range []struct {
		nm   float64
		hue  string
		want func(r, g, b float64) bool
	}{
		{656.3, "red", func(r, g, b float64) bool { return r > 2*g && r > 2*b }},
		{587.6, "orange-yellow", func(r, g, b float64) bool { return r >= g && g > 2*b }},
		{530, "green", func(r, g, b float64) bool { return g > r && g > b }},
		{460, "blue", func(r, g, b float64) bool { return b > r && b > g }},
		{405, "violet", func(r, g, b float64) bool { return b > r && r > g }},
	} {
		c := Of(tt.nm)
		r, g, b := float64(c.R), float64(c.G), float64(c.B)
		if !tt.want(r, g, b) {
			t.Errorf("%g nm is %s, not %s", tt.nm, Hex(c), tt.hue)
		}
		if lum := 0.2126*r + 0.7152*g + 0.0722*b; lum > 200 {
			t.Errorf("%g nm is %s: too light for white paper", tt.nm, Hex(c))
		}
		if strings.Contains(Name(tt.nm), "grey") {
			t.Errorf("%g nm is named %q", tt.nm, Name(tt.nm))
		}
	}
	for _, tt := range []struct {
		nm   float64
		name string
	}{{355, "UV 355 nm (grey)"}, {1064, "IR 1064 nm (grey)"}, {1550, "IR 1550 nm (grey)"}, {10600, "IR 10600 nm (grey)"}} {
		c := Of(tt.nm)
		if c.R != c.G || c.G != c.B {
			t.Errorf("%g nm is %s, not a grey", tt.nm, Hex(c))
		}
		if got := Name(tt.nm); got != tt.name {
			t.Errorf("%g nm is named %q, want %q", tt.nm, got, tt.name)
		}
	}
	if Of(1064) == Of(1550) {
		t.Error("two infrared wavelengths an octave apart get the same grey")
	}
}
