package drawing

import (
	"fmt"
	"math"
	"strings"
	"testing"

	"cardinal/catalog/record"
	"cardinal/optics"
	"cardinal/search"
	"cardinal/search/solution"
	"cardinal/search/solution/solutiontest"
)

// biconvexLaser is a biconvex singlet (R1 = 50, R2 = -50, t = 5 mm,
// n = 1.517) focusing a collimated 632.8 nm beam of 4 mm diameter, the
// laser's exit 10 mm before it: the case of optics'
// TestGhostBiconvexSecondSurface.
func biconvexLaser(t *testing.T) solution.Solution {
	t.Helper()
	p := optics.Part{Supplier: "TEST", Name: "BCX", Diameter: 25, Thickness: []float64{5},
		Surfaces: []optics.Surface{optics.Sphere(50), optics.Sphere(-50)}, Media: []optics.Medium{optics.Constant{Label: "n1.517", N: 1.517}}}
	es := []record.Entry{{Part: p}}
	req := search.Defaults()
	req.Kind, req.EFL, req.Beam, req.Wavelength, req.Power, req.LaserExit = search.Focus, p.System(nil, nil).Cardinal(632.8).EFL, 4, 632.8, 1, 10
	out, err := search.Find(search.Items(es, nil), req)
	if err != nil || len(out.Results) == 0 {
		t.Fatalf("no result: %v %v", err, out.Why)
	}
	s, err := solution.New(req, out.Results[0], solutiontest.EntryMap(es))
	if err != nil {
		t.Fatal(err)
	}
	return s
}

// The drawing marks the single-reflection ghost of the biconvex singlet's
// second surface where the hand computation with reflection matrices puts
// it, 9.644 mm before the first vertex (Siegman, Lasers, 1986, ch. 15;
// worked in optics' TestGhostBiconvexSecondSurface), pointing back toward
// the laser; its label and the legend name it, with the cautions.
func TestSVGGhostMarkAtTheGhost(t *testing.T) {
	s := biconvexLaser(t)
	_, b := drawBytes(t, s, DrawOptions{})
	root := parseSVG(t, b)
	var found bool
	for _, m := range root.find("ghost-mark") {
		if m.attr("data-surfaces") != "2" {
			continue
		}
		found = true
		var xs []float64
		for _, pt := range strings.Fields(m.attr("points")) {
			var x, y float64
			if _, err := fmt.Sscanf(pt, "%g,%g", &x, &y); err != nil {
				t.Fatal(err)
			}
			xs = append(xs, x)
		}
		lo, hi := math.Min(xs[0], math.Min(xs[1], xs[2])), math.Max(xs[0], math.Max(xs[1], xs[2]))
		if c := (lo + hi) / 2; math.Abs(c+9.644) > 0.002 {
			t.Errorf("ghost mark centred at z = %g mm, want -9.644", c)
		}
		if xs[0] != lo {
			t.Errorf("the mark of a ghost going back should point left (toward the laser): %v", xs)
		}
	}
	if !found {
		t.Fatalf("no mark of the surface-2 ghost:\n%s", b)
	}
	labels := root.find("ghost-label")
	if len(labels) == 0 || math.Abs(labels[0].num(t, "data-z")+9.644) > 0.002 {
		t.Errorf("ghost labels %+v", labels)
	}
	for _, want := range []string{"G1: reflected at surface 2, going back, focus at z = -9.64 mm", "at the laser's exit", "do not replace a safety assessment", "laser safety officer"} {
		if !strings.Contains(strings.ReplaceAll(string(b), "&#39;", "'"), want) {
			t.Errorf("the drawing lacks %q", want)
		}
	}
}

// No laser, no ghost marks: an image requirement for incoherent light.
func TestSVGNoGhostsWithoutALaser(t *testing.T) {
	for _, s := range solutiontest.Solve(t, solutiontest.Requirements()["image"]) {
		sc, b := drawBytes(t, s, DrawOptions{})
		if len(sc.Ghosts)+len(sc.OffGhosts) > 0 || strings.Contains(string(b), "ghost-mark") {
			t.Errorf("%v: ghost marks without a laser", s.Result.Parts)
		}
	}
}

// The drawing marks exactly the flagged ghosts and the most concentrated,
// numbered as search.ResultGhosts lists them.
func TestSceneGhostsAreTheFlagged(t *testing.T) {
	req := solutiontest.Requirements()["focus"]
	req.LaserExit = 25
	for _, s := range solutiontest.Solve(t, req) {
		sc, _ := drawBytes(t, s, DrawOptions{})
		gs, _ := search.ResultGhosts(s.System(), s.Requirement, s.Result)
		marked := map[int]bool{}
		for _, m := range append(append([]GhostMark(nil), sc.Ghosts...), sc.OffGhosts...) {
			marked[m.Number] = true
			if g := gs[m.Number-1]; g.Z != m.Z || len(g.Surfaces) != len(m.Surfaces) {
				t.Errorf("%v: G%d is %+v, the list's %+v", s.Result.Parts, m.Number, m.GhostFocus, g)
			}
		}
		for i, g := range gs {
			if want := i == 0 || g.Flagged(); marked[i+1] != want {
				t.Errorf("%v: ghost %d (flags %v) marked %v", s.Result.Parts, i+1, g.Flags, marked[i+1])
			}
		}
	}
}
