package optics

import (
	"math"
	"testing"
)

func TestBuiltinIndices(t *testing.T) {
	g := BuiltinGlasses()
	cases := []struct {
		glass      string
		wavelength float64
		want, tol  float64
		source     string
	}{
		// Malitson, JOSA 55, 1205 (1965), table of measured indices.
		{"fused-silica", LineF, 1.46313, 1e-5, "Malitson 1965"},
		{"fused-silica", LineD, 1.45846, 1e-5, "Malitson 1965"},
		{"fused-silica", LineC, 1.45637, 1e-5, "Malitson 1965"},
		// CaF2 nd about 1.4338 (handbook value, from memory).
		{"CaF2", LineD, 1.4338, 2e-4, "from memory"},
		// Sapphire ordinary ray no about 1.768 at the d line (handbook value, from memory).
		{"sapphire", LineD, 1.768, 1e-3, "from memory"},
		// Water at room temperature, nd = 1.333: common practice.
		{"water", LineD, 1.333, 1e-3, "common practice"},
	}
	for _, c := range cases {
		t.Run(c.glass, func(t *testing.T) {
			m, err := g.Lookup(c.glass)
			if err != nil {
				t.Fatal(err)
			}
			checkNear(t, c.source, m.Index(c.wavelength), c.want, c.tol, 0)
		})
	}
}

func TestWaterOffReference(t *testing.T) {
	// Water at 20 degrees C: nF = 1.3371 and nC = 1.3312 (handbook values,
	// from memory); the built-in fit is made from nd and Vd only.
	w, _ := BuiltinGlasses().Lookup("water")
	checkNear(t, "water nF", w.Index(LineF), 1.3371, 5e-4, 0)
	checkNear(t, "water nC", w.Index(LineC), 1.3312, 5e-4, 0)
}

func TestGlassCode(t *testing.T) {
	// The definition of the six-digit code and of the Abbe number
	// Vd = (nd - 1)/(nF - nC) (ISO 7944; common practice).
	for _, code := range []string{"517642", "755276", "620364", "847238", "458678"} {
		m, err := GlassCode(code)
		if err != nil {
			t.Fatal(err)
		}
		nd := 1 + float64(atoi(code[:3]))/1000
		vd := float64(atoi(code[3:])) / 10
		checkNear(t, code+" nd", m.Index(LineD), nd, 1e-12, 0)
		checkNear(t, code+" Vd", (m.Index(LineD)-1)/(m.Index(LineF)-m.Index(LineC)), vd, 0, 1e-12)
		if !(m.Index(LineF) > m.Index(LineC)) {
			t.Errorf("%s: normal dispersion expected", code)
		}
	}
	for _, bad := range []string{"51764", "51764x", "000642", "517000"} {
		if _, err := GlassCode(bad); err == nil {
			t.Errorf("GlassCode(%q) should fail", bad)
		}
	}
}

func atoi(s string) int {
	n := 0
	for _, r := range s {
		n = 10*n + int(r-'0')
	}
	return n
}

func TestLookup(t *testing.T) {
	g := BuiltinGlasses()
	for _, name := range []string{"AIR", "Fused-Silica", "517642", " caf2 "} {
		if _, err := g.Lookup(name); err != nil {
			t.Errorf("Lookup(%q): %v", name, err)
		}
	}
	if _, err := g.Lookup("unobtainium"); err == nil {
		t.Error("unknown glass should fail")
	}
	var zero GlassTable
	if m, err := zero.Lookup("517642"); err != nil || math.Abs(m.Index(LineD)-1.517) > 1e-12 {
		t.Errorf("zero table should know glass codes: %v", err)
	}
}

func TestRangeWarning(t *testing.T) {
	fs, _ := BuiltinGlasses().Lookup("fused-silica")
	if w := RangeWarning(fs, 1064); w != "" {
		t.Errorf("1064 nm is inside Malitson's range: %s", w)
	}
	if w := RangeWarning(fs, 10600); w == "" {
		t.Error("10.6 um is outside Malitson's range")
	}
	if w := RangeWarning(Air, 10600); w != "" {
		t.Error("air has no range")
	}
}
