package search

import (
	"math"
	"testing"

	"cardinal/optics"
)

// sagitta of a sphere of radius r at height h: r - sqrt(r^2 - h^2), signed
// with r (circle geometry; common practice).
func sagitta(r, h float64) float64 {
	return r - math.Copysign(math.Sqrt(r*r-h*h), r)
}

// The edge clearance of facing spheres is the least of the axial gap and
// gap - sag(last of a) + sag(first of b) at the shared clear aperture.
func TestEdgeClearance(t *testing.T) {
	tests := []struct {
		name         string
		r2a, r1b     float64 // facing radii
		semiA, semiB float64
		gap          float64
		want         float64
	}{
		// Convex faces: the vertices are the closest points.
		{"convex to convex", -50, 60, 10, 12, 2, 2},
		// a's last surface concave toward b: its edge comes 50 - sqrt(2400)
		// closer at h = 10.
		{"concave edge", 50, math.Inf(1), 10, 12, 3, 3 - sagitta(50, 10)},
		// b smaller: the shared aperture is b's 6 mm.
		{"meniscus into meniscus", 30, 40, 11, 6, 5, 5 - sagitta(30, 6) + sagitta(40, 6)},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			s := &search{itemData: itemData{surfs: []optics.Surface{{}, optics.Sphere(tt.r2a), optics.Sphere(tt.r1b), {}},
				outer: []outer{{surf: 0}, {surf: 2}}}}
			a := cand{item: 0, semi: tt.semiA}
			b := cand{item: 1, semi: tt.semiB}
			checkNear(t, "edge clearance", s.edgeClearance(&a, &b, tt.gap), tt.want, 1e-12, 1e-12)
			if q := s.quickClearance(&a, &b, tt.gap); q > tt.want+1e-12 {
				t.Errorf("quick clearance %g above the clearance %g", q, tt.want)
			}
		})
	}
}

// A collimated beam of half-height y through nearly thin lenses f1 then
// f2, d apart, meets the second at y (1 - d/f1) (paraxial ray transfer;
// Hecht, Optics, 5th ed., sec. 6.2). The largest height over clear
// semi-aperture is reported with its part.
func TestRayHeightsThin(t *testing.T) {
	its := items(equiconvex("A", 100, 0.3, 10), lens("B", -75, 75, 0.02, 1.5, 4))
	req := focusReq(200)
	req.Beam = 8
	p := prepare(its, req)
	s := newSearch(p, req, limitsOf(req), 0)
	var ia, ib int32 = -1, -1
	for i, c := range p.cands {
		switch p.info(c.item).name {
		case "A":
			ia = int32(i)
		case "B":
			ib = int32(i)
		}
	}
	l := layout{a: ia, b: ib, gap: 40}
	s.rayHeights(&l)
	want := 4 * (1 - 40.0/100) / (0.9 * 4 / 2) // height at B over B's clear semi-aperture
	checkNear(t, "ray height ratio", l.vigRatio, want, 0, 5e-3)
	if l.vigPart != 1 {
		t.Errorf("worst part %d, want 1 (the second)", l.vigPart)
	}
}
