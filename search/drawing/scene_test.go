package drawing

import (
	"math"
	"testing"

	"cardinal/search"
	"cardinal/search/solution"
	"cardinal/search/solution/solutiontest"
)

// The drawn rays are real rays: every point lies on its surface's real sag,
// and at each surface the segments before and after obey Snell's law
// n sin I = n' sin I' about the surface normal (exact, not paraxial; Born
// and Wolf, Principles of Optics, 7th ed., sec. 1.5). The rays are
// meridional, so the check is in the (z, y) plane.
func TestSceneRaysObeySnell(t *testing.T) {
	for kind, req := range solutiontest.Requirements() {
		t.Run(kind, func(t *testing.T) {
			s := solutiontest.Solve(t, req)[0]
			sc, err := NewScene(s, DrawOptions{})
			if err != nil {
				t.Fatal(err)
			}
			sys := s.System()
			n := sys.Indices(sc.Wavelength)
			for _, r := range sc.Rays {
				if r.Surface >= 0 {
					t.Fatalf("%s ray stopped at surface %d: %v", r.Name, r.Surface+1, r.Status)
				}
				if len(r.Points) != len(sys.Surfaces)+2 {
					t.Fatalf("%s ray has %d points, want %d", r.Name, len(r.Points), len(sys.Surfaces)+2)
				}
				for k, surf := range sys.Surfaces {
					q := r.Points[k+1]
					sag, _ := surf.Sag(math.Abs(q[1]))
					if d := q[0] - sc.Vertices[k] - sag; math.Abs(d) > 1e-9 {
						t.Errorf("%s ray: point %v is %.2g mm off surface %d", r.Name, q, d, k+1)
					}
					c := surf.Curvature()
					normal := unit2([2]float64{1 - c*(q[0]-sc.Vertices[k]), -c * q[1]}) // sphere normal (z, y)
					in := unit2(sub2(q, r.Points[k]))
					out := unit2(sub2(r.Points[k+2], q))
					sinI, sinIp := cross2(normal, in), cross2(normal, out)
					if math.Abs(n[k]*sinI-n[k+1]*sinIp) > 1e-9 {
						t.Errorf("%s ray at surface %d: n sin I = %.12f, n' sin I' = %.12f", r.Name, k+1, n[k]*sinI, n[k+1]*sinIp)
					}
				}
			}
		})
	}
}

func sub2(a, b [2]float64) [2]float64 { return [2]float64{a[0] - b[0], a[1] - b[1]} }
func cross2(a, b [2]float64) float64  { return a[0]*b[1] - a[1]*b[0] }
func unit2(a [2]float64) [2]float64 {
	l := math.Hypot(a[0], a[1])
	return [2]float64{a[0] / l, a[1] / l}
}

// The system's cardinal points marked on the drawing obey Newton's
// equation with the solution's object and image planes: x x' = f f',
// with x and x' measured from F and F', f = P to F and f' = P' to F', and
// magnification m = -f / x (Hecht, Optics, 5th ed., sec. 5.2.3). For a
// focus requirement the focal plane is F'.
func TestSceneMarksObeyNewton(t *testing.T) {
	for kind, req := range solutiontest.Requirements() {
		if kind == "expand" {
			continue
		}
		for _, s := range solutiontest.Solve(t, req) {
			t.Run(kind+" "+solution.DescribeParts(s.Result.Parts), func(t *testing.T) {
				sc, err := NewScene(s, DrawOptions{})
				if err != nil {
					t.Fatal(err)
				}
				z := map[string]float64{}
				for _, m := range append(sc.Marks, sc.OffDrawing...) {
					if m.Part == 0 {
						z[m.Kind] = m.Z
					}
				}
				if len(z) != 4 {
					t.Fatalf("system marks %v, want F, P, P′, F′", z)
				}
				if req.Kind == search.Focus {
					if math.Abs(z["F′"]-sc.ImageZ) > 1e-9 {
						t.Errorf("F′ at %.6f, focal plane at %.6f", z["F′"], sc.ImageZ)
					}
					return
				}
				x, xp := sc.ObjectZ-z["F"], sc.ImageZ-z["F′"]
				f, fp := z["F"]-z["P"], z["F′"]-z["P′"]
				if math.Abs(x*xp-f*fp) > 1e-9*math.Abs(f*fp) {
					t.Errorf("x x' = %.9g, f f' = %.9g", x*xp, f*fp)
				}
				if m := -f / x; math.Abs(m-*s.Result.Magnification) > 1e-9 {
					t.Errorf("m = -f/x = %.9f, the result says %.9f", m, *s.Result.Magnification)
				}
			})
		}
	}
}

// The default field is said to be chosen for illustration; one given is
// drawn as given.
func TestSceneField(t *testing.T) {
	req := solutiontest.Requirements()["focus"]
	s := solutiontest.Solve(t, req)[0]
	sc, err := NewScene(s, DrawOptions{Field: 2})
	if err != nil {
		t.Fatal(err)
	}
	if sc.Field != 2 || !sc.FieldGiven {
		t.Errorf("field %v given %v", sc.Field, sc.FieldGiven)
	}
	// The chief ray of a 2 degree field leaves the first vertex (the stop)
	// at 2 degrees to the axis.
	chief := sc.Rays[2]
	d := sub2(chief.Points[1], chief.Points[0])
	if got := math.Atan2(d[1], d[0]) * 180 / math.Pi; chief.Name != "chief" || math.Abs(got-2) > 1e-9 {
		t.Errorf("%s ray at %.9f degrees, want 2", chief.Name, got)
	}
	sc, err = NewScene(s, DrawOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if sc.FieldGiven || !(sc.Field > 0) {
		t.Errorf("default field %v given %v", sc.Field, sc.FieldGiven)
	}
}

// A part re-imported with another prescription since the search shows up
// in Verify.
func TestSolutionVerify(t *testing.T) {
	req := solutiontest.Requirements()["focus"]
	s := solutiontest.Solve(t, req)[0]
	if d := s.Verify(); len(d) != 0 {
		t.Fatalf("fresh solution differs: %v", d)
	}
	es := solutiontest.EntryMap(solutiontest.Entries(t))
	id := s.Result.Parts[0].ID()
	e := es[id]
	e.Part.Thickness = append([]float64{e.Part.Thickness[0] + 1}, e.Part.Thickness[1:]...)
	es[id] = e
	changed, err := solution.New(req, s.Result, es)
	if err != nil {
		t.Fatal(err)
	}
	if d := changed.Verify(); len(d) == 0 {
		t.Error("a thicker part went unnoticed")
	}
}

// The chief ray's field: the one asked, else the requirement's own (object
// height for a finite object, field angle for an object at infinity),
// else one chosen for illustration.
func TestDefaultField(t *testing.T) {
	focus, image := solutiontest.Requirements()["focus"], solutiontest.Requirements()["image"]
	fs, is := solutiontest.Solve(t, focus)[0], solutiontest.Solve(t, image)[0]
	withAngle := fs
	withAngle.Requirement.FieldAngle = 1.5
	for _, tc := range []struct {
		name      string
		s         solution.Solution
		asked     float64
		want      float64 // 0: chosen, any positive value
		wantGiven bool
	}{
		{"asked", fs, 2, 2, true},
		{"focus with a field angle", withAngle, 0, 1.5, true},
		{"asked beats the requirement", withAngle, 0.5, 0.5, true},
		{"focus without one", fs, 0, 0, false},
		{"image: the object height", is, 0, image.ObjectHeight, true},
	} {
		t.Run(tc.name, func(t *testing.T) {
			got, given := solution.DefaultField(tc.s, tc.asked)
			if given != tc.wantGiven || (tc.want != 0 && got != tc.want) || !(got > 0) {
				t.Errorf("field %v given %v, want %v given %v", got, given, tc.want, tc.wantGiven)
			}
		})
	}
}
