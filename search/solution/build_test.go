package solution_test

import (
	"math"
	"strings"
	"testing"

	"cardinal/search"
	"cardinal/search/present"
	"cardinal/search/solution"
	"cardinal/search/solution/solutiontest"
)

// sphereSag is the sagitta of a spherical surface of radius R at height
// h, s = R - sqrt(R^2 - h^2), signed as R is (the height of a circular
// segment; Machinery's Handbook, "segments of circles", and any optics
// shop handbook; from memory). It is written out here, apart from
// optics.Surface.Sag, as the outside check of the spacer figures.
func sphereSag(r, h float64) float64 {
	if math.IsInf(r, 0) {
		return 0
	}
	return math.Copysign(math.Abs(r)-math.Sqrt(r*r-h*h), r)
}

// The spacer between two parts' rims is the vertex gap less the sag of
// the first part's back face at its rim plus the sag of the next part's
// front face at its rim; the overall length of an image layout is the
// working distance, the envelope and the back clearance.
func TestBuildSpacerFromSags(t *testing.T) {
	es := solutiontest.EntryMap(solutiontest.Entries(t))
	inf := math.Inf(1)
	for _, tt := range []struct {
		name           string
		a, b           string
		revA, revB     bool
		backR, frontR  float64 // the facing radii, as the prescription has them turned
		semiA, semiB   float64
		gap, wd, clear float64
	}{
		// PCX-50 turned: flat first, its R 25.84 face last (R -25.84), into
		// BCC-50 (front R -51.7), diameters 25.4 and 12.7 mm.
		{"convex into concave", "TEST:PCX-50", "TEST:BCC-50", true, false, -25.84, -51.7, 12.7, 6.35, 4, 200, 60},
		// PCX-100 as given (flat face last) into PCX-50 as given (R 25.84 first).
		{"flat into convex", "TEST:PCX-100", "TEST:PCX-50", false, false, inf, 25.84, 12.7, 12.7, 3, 150, 80},
	} {
		t.Run(tt.name, func(t *testing.T) {
			r := search.Result{Rank: 1, Parts: []search.PartUse{
				{Supplier: "TEST", Part: strings.TrimPrefix(tt.a, "TEST:"), Reversed: tt.revA},
				{Supplier: "TEST", Part: strings.TrimPrefix(tt.b, "TEST:"), Reversed: tt.revB}},
				Gap: solutiontest.F64(tt.gap), WorkingDistance: solutiontest.F64(tt.wd), BackClearance: solutiontest.F64(tt.clear)}
			req := search.Defaults()
			req.Kind = search.Image
			s, err := solution.New(req, r, es)
			if err != nil {
				t.Fatal(err)
			}
			b := s.Build()
			want := tt.gap - sphereSag(tt.backR, tt.semiA) + sphereSag(tt.frontR, tt.semiB)
			if len(b.Spacings) != 1 || math.Abs(b.Spacings[0].EdgeMM-want) > 1e-9 {
				t.Fatalf("spacings %+v, want edge spacing %.6f mm", b.Spacings, want)
			}
			if b.Spacings[0].VertexMM != tt.gap {
				t.Errorf("vertex gap %g, want %g", b.Spacings[0].VertexMM, tt.gap)
			}
			env := s.Envelope()
			if math.Abs(b.OverallMM-(tt.wd+env+tt.clear)) > 1e-9 || b.OverallText != "object to image" {
				t.Errorf("overall %g (%s), want %g, object to image", b.OverallMM, b.OverallText, tt.wd+env+tt.clear)
			}
			if b.ObjectToFirstMM == nil || *b.ObjectToFirstMM != tt.wd || b.LastToImageMM == nil || *b.LastToImageMM != tt.clear {
				t.Errorf("object to first %v, last to image %v", b.ObjectToFirstMM, b.LastToImageMM)
			}
			for i, p := range b.Parts {
				sp := s.Parts[i]
				h := sp.Diameter / 2
				// Edge thickness: centre thickness less the front sag plus the
				// back sag at the rim (common practice for a supplier's
				// stated edge thickness).
				edge := sp.Length() - sphereSag(sp.Surfaces[0].Radius, h) + sphereSag(sp.Surfaces[len(sp.Surfaces)-1].Radius, h)
				if math.Abs(p.EdgeMM-edge) > 1e-9 || p.Order != i+1 {
					t.Errorf("part %d: edge %.6f, want %.6f", p.Order, p.EdgeMM, edge)
				}
			}
		})
	}
}

// A focus layout runs from the first vertex to the focal plane; an
// expander from the first to the last vertex; both lack an object plane.
func TestBuildOverallByKind(t *testing.T) {
	for name, req := range solutiontest.Requirements() {
		s := solutiontest.Solve(t, req)[0]
		b := s.Build()
		var want float64
		switch req.Kind {
		case search.Focus:
			want = s.Envelope() + s.ImageZ
		case search.Expand:
			want = s.Envelope()
		case search.Image:
			want = -s.ObjectZ + s.Envelope() + s.ImageZ
			if s.Result.Track != nil && math.Abs(want-*s.Result.Track) > 1e-6 {
				t.Errorf("%s: overall %g against the result's track %g", name, want, *s.Result.Track)
			}
		}
		if math.Abs(b.OverallMM-want) > 1e-9 {
			t.Errorf("%s: overall %g, want %g", name, b.OverallMM, want)
		}
		if (req.Kind == search.Image) != (b.ObjectToFirstMM != nil) || (req.Kind == search.Expand) != (b.LastToImageMM == nil) {
			t.Errorf("%s: object to first %v, last to image %v", name, b.ObjectToFirstMM, b.LastToImageMM)
		}
		lines := b.Lines(solution.SidesOf(req.Kind))
		if !strings.HasPrefix(lines[len(lines)-1], "overall length") {
			t.Errorf("%s: last line %q", name, lines[len(lines)-1])
		}
	}
}

func TestFixedHasNoNegativeZero(t *testing.T) {
	for _, tt := range []struct {
		v    float64
		d    int
		want string
	}{{-0.0001, 2, "0.00"}, {math.Copysign(0, -1), 1, "0.0"}, {-0.006, 2, "-0.01"}, {1.005, 0, "1"}, {-2.5, 1, "-2.5"}} {
		if got := present.Fixed(tt.v, tt.d); got != tt.want {
			t.Errorf("present.Fixed(%g, %d) = %q, want %q", tt.v, tt.d, got, tt.want)
		}
	}
}

// Figures print to three significant digits, without an exponent from
// 1000 up and without a negative zero.
func TestFigure(t *testing.T) {
	for _, tt := range []struct {
		v    float64
		want string
	}{{3012.4, "3012"}, {-0.0004, "-0.0004"}, {math.Copysign(0, -1), "0"}, {12.345, "12.3"}, {0.000123, "0.000123"}} {
		if got := present.Figure(tt.v); got != tt.want {
			t.Errorf("present.Figure(%g) = %q, want %q", tt.v, got, tt.want)
		}
	}
}
