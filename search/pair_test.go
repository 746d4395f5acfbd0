package search

import (
	"math"
	"testing"

	"cardinal/optics"
)

// A pair solved for an EFL, assembled by the optics package with the solved
// gap, has that EFL and a back focal distance equal to the reported back
// clearance: Gullstrand's equation phi = phi1 + phi2 - e phi1 phi2 (Hecht,
// Optics, 5th ed., ch. 6) checked against the reduced-matrix product
// (Gerrard and Burch, ch. III).
func TestPairFocusGullstrand(t *testing.T) {
	its := items(lens("A", 60, -200, 6, 1.6, 25), lens("B", -80, 300, 3, 1.5, 25))
	req := focusReq(90)
	req.GapMin = 0
	out := mustFind(t, its, req)
	pairs := pairsOf(out.Results)
	if len(pairs) == 0 {
		t.Fatalf("no pair found: %v", out.Why)
	}
	for _, r := range pairs {
		t.Run(r.Parts[0].ID()+r.Parts[1].ID(), func(t *testing.T) {
			c := assembled(t, its, r)
			checkNear(t, "EFL", c.EFL, 90, 1e-9, 1e-12)
			checkNear(t, "back clearance", *r.BackClearance, c.BFD(), 1e-9, 1e-12)
			checkNear(t, "reported EFL", *r.EFL, 90, 1e-9, 1e-12)
		})
	}
}

// Thin-lens limit: with thickness and curvature small against the focal
// lengths, the pair's EFL and BFD at the solved separation d match the
// two-thin-lens formulas f = f1 f2 / (f1 + f2 - d) and BFD = f (f1 - d) / f1
// (Hecht, Optics, 5th ed., sec. 5.2.3; Smith, Modern Optical Engineering,
// 4th ed., ch. 4).
func TestPairFocusThinLimit(t *testing.T) {
	a := equiconvex("A", 100, 0.02, 2)
	b := lens("B", -150, 150, 0.02, 1.5, 2) // thin-lens f = -150
	its := items(a, b)
	req := focusReq(180)
	req.GapMin = 0
	out := mustFind(t, its, req)
	found := false
	for _, r := range pairsOf(out.Results) {
		if r.Parts[0].Part != "A" || r.Parts[1].Part != "B" {
			continue
		}
		found = true
		f1, f2, d := 100.0, -150.0, *r.Gap
		f := f1 * f2 / (f1 + f2 - d)
		checkNear(t, "thin-lens EFL", 180, f, 0, 2e-3)
		checkNear(t, "thin-lens BFD", *r.BackClearance, f*(f1-d)/f1, 0, 2e-3)
	}
	if !found {
		t.Fatalf("A then B not found; results %d, why %v", len(out.Results), out.Why)
	}
}

// Expanders: Keplerian (two positive parts) and Galilean (negative then
// positive) made afocal, expansion -f2/f1 and principal points f1 + f2
// apart (common practice).
func TestPairExpander(t *testing.T) {
	tests := []struct {
		name   string
		f1, f2 float64
		form   Form
	}{
		{"keplerian 5x", 40, 200, Keplerian},
		{"galilean 5x", -40, 200, Galilean},
		{"keplerian reducer", 200, 50, Keplerian},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			a := lens("A", 2*0.5*tt.f1, -2*0.5*tt.f1, 3, 1.5, 12)
			b := lens("B", 2*0.5*tt.f2, -2*0.5*tt.f2, 6, 1.5, 30)
			if tt.f1 < 0 {
				a = lens("A", 2*0.5*tt.f1, -2*0.5*tt.f1, 2, 1.5, 12)
			}
			its := items(a, b)
			req := expandReq(math.Abs(tt.f2 / tt.f1))
			req.ExpandTol = Tolerance{Value: 5, Percent: true}
			req.GapMin = 0
			out := mustFind(t, its, req)
			var r *Result
			for k := range out.Results {
				if out.Results[k].Parts[0].Part == "A" && out.Results[k].Parts[1].Part == "B" {
					r = &out.Results[k]
				}
			}
			if r == nil {
				t.Fatalf("A then B not found: %v", out.Why)
			}
			c := assembled(t, its, *r)
			if !c.Afocal {
				t.Fatalf("pair not afocal: power %g", c.Power)
			}
			ca := a.System(nil, nil).Cardinal(optics.LineD)
			cb := b.System(nil, nil).Cardinal(optics.LineD)
			checkNear(t, "expansion", *r.Expansion, math.Abs(cb.EFL/ca.EFL), 1e-9, 1e-9)
			checkNear(t, "lateral magnification", c.LateralMagnification, -cb.EFL/ca.EFL, 1e-9, 1e-9)
			sep := *r.Gap - ca.PPrime + cb.P // back principal point of A to front one of B
			checkNear(t, "principal-point separation", sep, ca.EFL+cb.EFL, 1e-9, 1e-9)
			if r.Form != tt.form {
				t.Errorf("form %q, want %q", r.Form, tt.form)
			}
		})
	}
}
