package synth

import (
	"math"
	"reflect"
	"testing"

	"cardinal/catalog/record"
	"cardinal/optics"
)

func TestCatalogDeterministic(t *testing.T) {
	a, b := Catalog(7, 300), Catalog(7, 300)
	if !reflect.DeepEqual(a, b) {
		t.Error("two catalogs from seed 7 differ")
	}
	if c := Catalog(8, 300); reflect.DeepEqual(a, c) {
		t.Error("seeds 7 and 8 give the same catalog")
	}
	if len(Catalog(1, 0)) != 0 {
		t.Error("Catalog(1, 0) is not empty")
	}
}

func TestCatalogParts(t *testing.T) {
	n := 5000
	if testing.Short() {
		n = 1000
	}
	entries := Catalog(1, n)
	if len(entries) != n {
		t.Fatalf("Catalog(1, %d) has %d entries", n, len(entries))
	}
	seen := map[string]bool{}
	kinds := map[string]int{}
	for _, e := range entries {
		id := e.Part.ID()
		if seen[id] {
			t.Errorf("%s appears twice", id)
		}
		seen[id] = true
		kinds[kindOf(e.Part)]++
		checkEntry(t, e)
		// Design promises 0.2 %: the radii are solved for the nominal EFL
		// and only their rounding moves it.
		if c := e.Part.System(nil, nil).Cardinal(optics.LineD); math.Abs(c.EFL/e.StatedEFL-1) > 2e-3 {
			t.Errorf("%s: EFL %.4f mm is more than 0.2 %% from the nominal %g mm", id, c.EFL, e.StatedEFL)
		}
	}
	for _, k := range []string{"plano-convex", "biconvex", "meniscus", "plano-concave", "biconcave", "achromat"} {
		if kinds[k] == 0 {
			t.Errorf("no %s among %d parts (%v)", k, n, kinds)
		}
	}
}

// kindOf classifies a part by its radii alone, independently of how the
// generator labels it (common practice: signs of the curvatures).
func kindOf(p optics.Part) string {
	if len(p.Surfaces) == 3 {
		return "achromat"
	}
	c1, c2 := p.Surfaces[0].Curvature(), p.Surfaces[1].Curvature()
	switch {
	case c1 == 0 || c2 == 0:
		if c1 > 0 || c2 < 0 {
			return "plano-convex"
		}
		return "plano-concave"
	case c1 > 0 && c2 < 0:
		return "biconvex"
	case c1 < 0 && c2 > 0:
		return "biconcave"
	}
	return "meniscus"
}

// checkEntry holds an entry to what its supplier states: the part
// validates, and the EFL, BFD and edge thickness computed by optics agree
// with the stated ones within the stock tolerances the reader applies
// (1 % in focal length, 0.1 mm in edge; common practice).
func checkEntry(t *testing.T, e record.Entry) {
	t.Helper()
	p := e.Part
	if err := p.Validate(); err != nil {
		t.Errorf("%s: %v", p.ID(), err)
		return
	}
	c := p.System(nil, nil).Cardinal(587.6)
	if math.Abs(c.EFL-e.StatedEFL) > 0.01*math.Abs(e.StatedEFL) {
		t.Errorf("%s: EFL %.4f mm, stated %g mm", p.ID(), c.EFL, e.StatedEFL)
	}
	if a := math.Abs(e.StatedEFL); a < 10 || a > 1000 {
		t.Errorf("%s: stated EFL %g mm outside 10-1000 mm", p.ID(), e.StatedEFL)
	}
	if math.Abs(c.BFD()-e.StatedBFD) > 0.01*math.Abs(e.StatedBFD) {
		t.Errorf("%s: BFD %.4f mm, stated %g mm", p.ID(), c.BFD(), e.StatedBFD)
	}
	edge, _ := p.EdgeThickness()
	if math.Abs(edge-e.StatedEdge) > 0.1 {
		t.Errorf("%s: edge %.3f mm, stated %g mm", p.ID(), edge, e.StatedEdge)
	}
	if !(e.Price > 0) || e.Currency != Currency || e.Part.Description == "" {
		t.Errorf("%s: price %g %q, description %q", p.ID(), e.Price, e.Currency, e.Part.Description)
	}
}

func TestSuffix(t *testing.T) {
	want := []string{"", "-A1", "-A2", "-A3", "-R2", "-A1-R2"}
	for v, w := range want {
		if got := suffix(v); got != w {
			t.Errorf("suffix(%d) = %q, want %q", v, got, w)
		}
	}
}

// TestCatalogNamesUniqueLarge checks part numbers at the largest benchmark
// size, where most prescriptions come in several variants.
func TestCatalogNamesUniqueLarge(t *testing.T) {
	if testing.Short() {
		t.Skip("50,000 parts")
	}
	seen := map[string]bool{}
	for _, e := range Catalog(3, 50000) {
		if id := e.Part.ID(); seen[id] {
			t.Fatalf("%s appears twice", id)
		} else {
			seen[id] = true
		}
	}
}
