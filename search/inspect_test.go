package search

import (
	"math"
	"strings"
	"testing"

	"cardinal/catalog/record"
	"cardinal/optics"
)

// biconvex is a thick equi-convex singlet of glass code 517642, whose nd
// is 1.517 by definition of the code (common practice).
func biconvex(t *testing.T, r, d float64) record.Entry {
	t.Helper()
	g, err := optics.GlassCode("517642")
	if err != nil {
		t.Fatal(err)
	}
	return record.Entry{Part: optics.Part{Supplier: "T", Name: "DCX", Diameter: 25.4,
		Surfaces: []optics.Surface{optics.Sphere(r), optics.Sphere(-r)}, Thickness: []float64{d}, Media: []optics.Medium{g}}}
}

// The first-order figures of a thick lens in air against the thick-lens
// equations (E. Hecht, Optics, 5th ed., eq. 6.2 for the focal length,
// eqs. 6.3 and 6.4 for the principal planes): 1/f = (n-1)[1/R1 - 1/R2 +
// (n-1)d/(n R1 R2)], h1 = -f(n-1)d/(n R2), h2 = -f(n-1)d/(n R1), so that
// BFD = f + h2 and FFD = -(f - h1).
func TestInspectThickLens(t *testing.T) {
	const r1, r2, d, n = 50.0, -50.0, 6.0, 1.517
	f := 1 / ((n - 1) * (1/r1 - 1/r2 + (n-1)*d/(n*r1*r2)))
	bfd := f - f*(n-1)*d/(n*r1)
	ffd := -(f + f*(n-1)*d/(n*r2))
	for _, rev := range []bool{false, true} {
		got := Inspect(biconvex(t, r1, d), InspectSetting{Reverse: rev})
		for _, c := range []struct {
			name      string
			got, want float64
		}{
			{"EFL", *got.EFLMm, f},
			{"BFD", *got.BFDMm, bfd},
			{"FFD", *got.FFDMm, ffd},
			// In air the nodal points lie on the principal points (Hecht,
			// Optics, 5th ed., sec. 6.1); for an equi-convex lens they sit
			// symmetrically.
			{"N - P", *got.NodalMm - *got.PrincipalMm, 0},
			{"P + P'", *got.PrincipalMm + *got.PrincipalPrimeMm, 0},
			{"length", got.LengthMm, d},
		} {
			if math.Abs(c.got-c.want) > 1e-9*math.Max(1, math.Abs(c.want)) {
				t.Errorf("reversed %v: %s = %.12g, want %.12g", rev, c.name, c.got, c.want)
			}
		}
		if got.Reversed != rev || got.WavelengthNm != optics.LineD || got.ImageQuality != nil || got.RaySetting != "" {
			t.Errorf("reversed %v: %+v", rev, got)
		}
	}
}

// With an NA and no object distance, the object sits at the -1x conjugate:
// Newton's equation x x' = f f' with m = -x/f = -1 puts it at x = f before
// F, so at F - f from the first vertex, and its image at F' + f' (Hecht,
// Optics, 5th ed., sec. 5.2.3), each twice the focal length from its
// principal point.
func TestRayConditionsMinusOne(t *testing.T) {
	e := biconvex(t, 50, 6)
	c := e.Part.System(nil, nil).Cardinal(optics.LineD)
	cond, text, err := RaySetting{NA: 0.05}.Conditions(c, optics.LineD)
	if err != nil {
		t.Fatal(err)
	}
	if got, want := cond.Object.Z, c.F-c.EFL; math.Abs(got-want) > 1e-9 {
		t.Errorf("object at %.9f mm, want F - f = %.9f mm", got, want)
	}
	if got, want := cond.Object.Z, c.P-2*c.EFL; math.Abs(got-want) > 1e-9 {
		t.Errorf("object at %.9f mm, want P - 2f = %.9f mm", got, want)
	}
	zi, m, _ := c.Image(cond.Object.Z)
	if want := c.FPrime + c.EFL; math.Abs(zi-want) > 1e-9 || math.Abs(m+1) > 1e-12 {
		t.Errorf("image at %.9f mm, m %.12g; want F' + f' = %.9f mm, m = -1", zi, m, want)
	}
	for _, w := range []string{"(the -1x conjugate)", "image plane"} {
		if !strings.Contains(text, w) {
			t.Errorf("setting %q lacks %q", text, w)
		}
	}
	// An object given inside the focal length has a virtual image: no real
	// focus to judge (the Gaussian lens formula, Hecht, Optics, 5th ed.,
	// sec. 5.2.3).
	if _, _, err := (RaySetting{NA: 0.05, ObjectDistance: 0.5 * c.EFL}).Conditions(c, optics.LineD); err == nil || !strings.Contains(err.Error(), "not real") {
		t.Errorf("object inside f: error %v, want a virtual image refused", err)
	}
}

// A real-ray inspection traces the part and keeps the figures; one that
// cannot (an afocal window) says why.
func TestInspectRays(t *testing.T) {
	got := Inspect(biconvex(t, 50, 6), InspectSetting{Rays: RaySetting{Beam: 5}})
	if got.ImageQuality == nil || !strings.HasPrefix(got.RaySetting, "real rays: 5 mm collimated beam") {
		t.Fatalf("not traced: %q %v", got.RaySetting, got.Warnings)
	}
	// The Airy radius of a focus at f-number N = f/D is 1.22 lambda N (Born
	// and Wolf, Principles of Optics, 7th ed., sec. 8.5.2); the real
	// marginal ray's NA differs from D/2f by under 1 % at f/10.
	want := 1.22 * optics.LineD * 1e-3 * *got.EFLMm / 5
	if math.Abs(got.AiryRadius-want) > 0.01*want {
		t.Errorf("Airy radius %.4f um, want 1.22 lambda N = %.4f um within 1%%", got.AiryRadius, want)
	}
	window := biconvex(t, math.Inf(1), 3)
	w := Inspect(window, InspectSetting{Rays: RaySetting{Beam: 5}})
	if w.ImageQuality != nil || w.EFLMm != nil || !strings.Contains(strings.Join(w.Warnings, ";"), "real rays not traced: an afocal part") {
		t.Errorf("window: %+v", w)
	}
}

// The laser rule is Requirement.IsLaser's: a power, or a wavelength
// outside the visible 400-700 nm (common practice); nothing traced, no
// laser.
func TestRaySettingIsLaser(t *testing.T) {
	for _, tc := range []struct {
		name string
		s    RaySetting
		wl   float64
		want bool
	}{
		{"visible beam", RaySetting{Beam: 5}, 587.6, false},
		{"visible beam with a power", RaySetting{Beam: 5, Power: 1}, 587.6, true},
		{"infrared object", RaySetting{NA: 0.02}, 1064, true},
		{"ultraviolet beam", RaySetting{Beam: 5}, 355, true},
		{"nothing traced", RaySetting{}, 1064, false},
	} {
		t.Run(tc.name, func(t *testing.T) {
			if got := tc.s.IsLaser(tc.wl); got != tc.want {
				t.Errorf("IsLaser = %v, want %v", got, tc.want)
			}
			req := Requirement{Kind: Focus, Beam: tc.s.Beam, Power: tc.s.Power, Wavelength: tc.wl}
			if tc.s.Traces() && req.IsLaser() != tc.want {
				t.Errorf("Requirement.IsLaser = %v, the rule differs", req.IsLaser())
			}
		})
	}
}
