package solution_test

import (
	"math"
	"strings"
	"testing"

	"cardinal/optics"
	"cardinal/search"
	"cardinal/search/solution"
)

// shapeParts are one part of each shape the demo catalog holds, written
// for this test (plano-convex, plano-concave, biconvex, biconcave,
// meniscus, an aspheric plano-convex, a cemented doublet). They are
// inputs, not check values: each check reads the geometry of the part.
func shapeParts(t *testing.T) map[string]optics.Part {
	t.Helper()
	glass := func(code string) optics.Medium {
		m, err := optics.GlassCode(code)
		if err != nil {
			t.Fatal(err)
		}
		return m
	}
	crown, flint := glass("517642"), glass("620364")
	inf := math.Inf(1)
	part := func(name string, radii, thick []float64, media ...optics.Medium) optics.Part {
		p := optics.Part{Supplier: "TEST", Name: name, Diameter: 25.4, Thickness: thick, Media: media}
		for _, r := range radii {
			p.Surfaces = append(p.Surfaces, optics.Sphere(r))
		}
		if err := p.Validate(); err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		return p
	}
	asph := part("ASPH", []float64{20, inf}, []float64{6}, crown)
	asph.Surfaces[0].Conic = -0.6
	return map[string]optics.Part{
		"plano-convex":   part("PCX", []float64{25.84, inf}, []float64{5.3}, crown),
		"plano-concave":  part("PCV", []float64{-25.84, inf}, []float64{3}, crown),
		"biconvex":       part("BCX", []float64{60, -120}, []float64{5}, crown),
		"biconcave":      part("BCV", []float64{-60, 120}, []float64{3}, crown),
		"meniscus":       part("MEN", []float64{32.1, 80.13}, []float64{5}, crown),
		"aspheric":       asph,
		"cemented":       part("ACH", []float64{60.46, -35.06, -138.46}, []float64{6, 2.5}, crown, flint),
		"symmetric":      part("SYM", []float64{76.78, -76.78}, []float64{4.5}, crown),
		"cemented-flint": part("ACH-R", []float64{60.46, -35.06, -138.46}, []float64{6, 2.5}, crown, flint).Reversed(),
	}
}

// faceFromSag names an outer face from where its rim lies against its
// vertex: the first face is convex toward the light when its rim lies
// behind its vertex (sag > 0), the last face when its rim lies in front
// of it (sag < 0); light travels in +z (the sign convention of
// optics/doc.go; Hecht, Optics, 5th ed., ch. 5, sign convention for
// spherical surfaces). The sag is taken at the rim, independently of the
// radius's sign that Orientation reads.
func faceFromSag(s optics.Surface, h float64, first bool) string {
	z, _ := s.Sag(h)
	if !first {
		z = -z
	}
	switch {
	case math.Abs(z) < 1e-12:
		return "flat"
	case z > 0:
		return "convex"
	}
	return "concave"
}

// The orientation words name the face that the prescription puts first,
// for every part shape, as given and turned around.
func TestOrientationNamesTheFirstFace(t *testing.T) {
	sides := solution.SidesOf(search.Image)
	for name, p0 := range shapeParts(t) {
		for _, rev := range []bool{false, true} {
			p := p0
			if rev {
				p = p0.Reversed()
			}
			t.Run(name+map[bool]string{false: "", true: "/reversed"}[rev], func(t *testing.T) {
				got := solution.Orientation(p, sides)
				h := p.Diameter / 2
				first := faceFromSag(p.Surfaces[0], h, true)
				last := faceFromSag(p.Surfaces[len(p.Surfaces)-1], h, false)
				switch {
				case name == "symmetric":
					if !strings.HasPrefix(got, "either side toward the object") {
						t.Errorf("%q: a symmetric part goes either way round", got)
					}
				case strings.HasPrefix(name, "cemented"):
					// The crown is the element of higher Abbe number: in a
					// six-digit glass code the last three digits are 10 Vd
					// (common practice), so 517642 (Vd 64.2) is the crown
					// against 620364 (Vd 36.4).
					crownFirst := p.Media[0].Name() == "517642"
					want := map[bool]string{true: "crown side first: the ", false: "flint side first: the "}[crownFirst] + first
					if !strings.HasPrefix(got, want) || !strings.Contains(got, "toward the object") {
						t.Errorf("%q, want it to start %q and face the object", got, want)
					}
				case first == last && first != "flat":
					// The stronger curve has the deeper sag at the same
					// height: s = R - sqrt(R^2 - h^2) grows as |R| shrinks.
					za, _ := p.Surfaces[0].Sag(h)
					zb, _ := p.Surfaces[1].Sag(h)
					want := "the weaker curve toward the object (bi" + first
					if math.Abs(za) > math.Abs(zb) {
						want = "the stronger curve toward the object (bi" + first
					}
					if !strings.HasPrefix(got, want) {
						t.Errorf("%q, want it to start %q", got, want)
					}
				default:
					if !strings.HasPrefix(got, first) || !strings.Contains(got, "toward the object, "+last) || !strings.HasSuffix(got, "toward the image") {
						t.Errorf("%q, want %s first toward the object and %s toward the image", got, first, last)
					}
				}
				if p.Surfaces[0].IsAsphere() != strings.Contains(strings.SplitN(got, "toward", 2)[0], "aspheric") {
					t.Errorf("%q: the first face is aspheric: %v", got, p.Surfaces[0].IsAsphere())
				}
			})
		}
	}
}

// Each requirement kind names its sides in its own words.
func TestSidesOf(t *testing.T) {
	for _, tt := range []struct {
		kind          search.Kind
		before, after string
	}{
		{search.Image, "object", "image"},
		{search.Focus, "beam", "focus"},
		{search.Expand, "incoming beam", "outgoing beam"},
	} {
		if got := solution.SidesOf(tt.kind); got.Before != tt.before || got.After != tt.after {
			t.Errorf("%s: %+v", tt.kind, got)
		}
	}
}
