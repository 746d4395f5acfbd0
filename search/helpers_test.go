package search

import (
	"fmt"
	"math"
	"testing"

	"cardinal/catalog/record"
	"cardinal/optics"
)

// near reports whether got is within abs or rel of want.
func near(got, want, abs, rel float64) bool {
	d := math.Abs(got - want)
	return d <= abs || d <= rel*math.Abs(want)
}

func checkNear(t *testing.T, what string, got, want, abs, rel float64) {
	t.Helper()
	if !near(got, want, abs, rel) {
		t.Errorf("%s = %.12g, want %.12g (abs %g, rel %g)", what, got, want, abs, rel)
	}
}

// lens builds a singlet of constant index n in air.
func lens(name string, r1, r2, t, n, diameter float64) optics.Part {
	return optics.Part{Supplier: "TEST", Name: name, Diameter: diameter,
		Surfaces:  []optics.Surface{optics.Sphere(r1), optics.Sphere(r2)},
		Thickness: []float64{t},
		Media:     []optics.Medium{optics.Constant{Label: fmt.Sprintf("n%.4f", n), N: n}}}
}

// equiconvex returns a symmetric biconvex lens of index 1.5 whose thin-lens
// focal length is f: 1/f = (n - 1)(2/R) (lensmaker's equation, Hecht,
// Optics, 5th ed., eq. 5.16).
func equiconvex(name string, f, t, diameter float64) optics.Part {
	r := 2 * 0.5 * f
	return lens(name, r, -r, t, 1.5, diameter)
}

func items(parts ...optics.Part) []Item {
	out := make([]Item, len(parts))
	for i, p := range parts {
		out[i] = Item{Entry: record.Entry{Part: p}}
	}
	return out
}

// assembled is the optics package's own view of a result: the parts in
// order with the solved gap, as one system.
func assembled(t *testing.T, its []Item, r Result) optics.Cardinal {
	t.Helper()
	return resultSystem(its, r).Cardinal(optics.LineD)
}

func focusReq(efl float64) Requirement {
	r := Defaults()
	r.Kind, r.EFL, r.EFLTol, r.Top = Focus, efl, Tolerance{Value: 1, Percent: true}, 0
	return r
}

func imageReq(track, mag float64) Requirement {
	r := Defaults()
	r.Kind, r.Track, r.Mag, r.MagTol, r.Top = Image, track, mag, Tolerance{Value: 1, Percent: true}, 0
	return r
}

func expandReq(e float64) Requirement {
	r := Defaults()
	r.Kind, r.Expansion, r.ExpandTol, r.Top = Expand, e, Tolerance{Value: 1, Percent: true}, 0
	return r
}

// mustFind finds every layout as its own row (Requirement.Arrangements):
// the solver's tests look at layouts; group_test.go at the grouping.
func mustFind(t *testing.T, its []Item, req Requirement) Outcome {
	t.Helper()
	req.Arrangements = true
	out, err := Find(its, req)
	if err != nil {
		t.Fatal(err)
	}
	return out
}

// pairsOf keeps the results with two parts.
func pairsOf(rs []Result) []Result {
	var out []Result
	for _, r := range rs {
		if len(r.Parts) == 2 {
			out = append(out, r)
		}
	}
	return out
}
