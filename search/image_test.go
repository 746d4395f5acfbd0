package search

import (
	"math"
	"sort"
	"testing"

	"cardinal/optics"
)

// checkImaging images the object plane of r through the assembled system
// (the optics package's matrix conjugate solve, Gerrard and Burch, ch. III)
// and checks that the image falls on the reported image plane with the
// reported magnification.
func checkImaging(t *testing.T, its []Item, r Result, mag float64) {
	t.Helper()
	c := assembled(t, its, r)
	zi, m, st := c.Image(-*r.WorkingDistance)
	if st != optics.Solved {
		t.Fatalf("image status %v", st)
	}
	checkNear(t, "image position", zi, *r.BackClearance, 1e-7, 1e-9)
	checkNear(t, "magnification", m, mag, 1e-9, 1e-9)
	checkNear(t, "track", *r.WorkingDistance+r.Envelope+*r.BackClearance, *r.Track, 1e-9, 1e-12)
}

// Both conjugates of a fixed track for a singlet obey Newton's equation
// x x' = -f^2 (x from F, x' from F', both positive toward the image; Hecht,
// Optics, 5th ed., eq. 5.23 in the form x_o x_i = f^2) and m = -x'/f.
func TestSingletImageNewton(t *testing.T) {
	p := lens("A", 51.7, -51.7, 4, 1.5168, 25)
	its := items(p)
	c := p.System(nil, nil).Cardinal(optics.LineD)
	for _, m := range []float64{-0.5, -2, -1} {
		// The track that gives m exactly: T = (P P') + f (2 - m - 1/m).
		T := c.Length + c.PPrime - c.P + c.EFL*(2-m-1/m)
		req := imageReq(T, m)
		req.GapMin = 0
		req.Elements = 1
		out := mustFind(t, its, req)
		if len(out.Results) != 1 {
			t.Fatalf("m %g: %d results, want 1 (the other conjugate has m = %g)", m, len(out.Results), 1/m)
		}
		r := out.Results[0]
		x := -*r.WorkingDistance - c.F
		xp := *r.BackClearance - c.FPrime
		checkNear(t, "x x'", x*xp, -c.EFL*c.EFL, 1e-9, 1e-9)
		checkNear(t, "m = -x'/f", -xp/c.EFL, m, 1e-12, 1e-9)
		checkImaging(t, its, r, m)
		// The other conjugate of the same track is m' = 1/m.
		req.Mag = 1 / m
		if out := mustFind(t, its, req); len(out.Results) != 1 || !near(*out.Results[0].Magnification, 1/m, 1e-9, 1e-9) {
			t.Errorf("m %g: reciprocal conjugate not found", m)
		}
	}
}

// thinRoots finds, for two thin lenses, every working distance w in (0, T)
// with a layout of magnification m and track T, by scanning the track
// residual and bisecting each sign change: for a given w, lens 1 images at
// s1 = 1/(1/f1 - 1/w) with m1 = -s1/w; lens 2 then needs m2 = m/m1, its
// object at f2 (1 - 1/m2) and its image at -m2 times that (the Gaussian lens
// equation, Hecht, Optics, 5th ed., sec. 5.2.3).
func thinRoots(f1, f2, m, T float64) []float64 {
	res := func(w float64) float64 {
		s1 := 1 / (1/f1 - 1/w)
		m2 := m / (-s1 / w)
		o2 := f2 * (1 - 1/m2)
		return w + (s1 + o2) + (-m2 * o2) - T
	}
	var roots []float64
	const n = 200000
	prev := res(T / n)
	for i := 2; i < n; i++ {
		w := T * float64(i) / n
		v := res(w)
		if prev*v < 0 && !math.IsInf(v, 0) {
			lo, hi := T*float64(i-1)/n, w
			for k := 0; k < 80; k++ {
				mid := (lo + hi) / 2
				if res(lo)*res(mid) <= 0 {
					hi = mid
				} else {
					lo = mid
				}
			}
			if math.Abs(res(lo)) < 1e-6*T {
				roots = append(roots, lo)
			}
		}
		prev = v
	}
	return roots
}

// Thin-lens limit: a pair of nearly thin lenses, solved for track and
// magnification, returns every root the two-thin-lens conjugate equations
// have (found independently by bracketing), at the same working distances.
func TestPairImageThinLimit(t *testing.T) {
	thin := func(name string, f float64) optics.Part {
		if f > 0 {
			return equiconvex(name, f, 0.02, 2)
		}
		return lens(name, f, -f, 0.02, 1.5, 2) // biconcave, thin-lens f
	}
	tests := []struct {
		name   string
		f1, f2 float64
		T, m   float64
	}{
		{"reducing", 100, 80, 500, -0.5},
		{"erect, two roots", 100, 80, 800, 2},
		{"enlarging", 100, 80, 600, -1.2},
		{"negative then positive", -100, 80, 400, -0.5},
		{"positive then negative", 80, -100, 600, -0.3},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			its := items(thin("A", tt.f1), thin("B", tt.f2))
			req := imageReq(tt.T, tt.m)
			req.GapMin = 0
			out := mustFind(t, its, req)
			var ws []float64
			for _, r := range pairsOf(out.Results) {
				if r.Parts[0].Part == "A" && r.Parts[1].Part == "B" {
					ws = append(ws, *r.WorkingDistance)
					checkImaging(t, its, r, tt.m)
				}
			}
			sort.Float64s(ws)
			var want []float64
			for _, w := range thinRoots(tt.f1, tt.f2, tt.m, tt.T) {
				s1 := 1 / (1/tt.f1 - 1/w)
				m2 := tt.m / (-s1 / w)
				o2 := tt.f2 * (1 - 1/m2)
				if s1+o2 >= 0 && -m2*o2 > 0 {
					want = append(want, w)
				}
			}
			if len(ws) != len(want) || len(want) == 0 {
				t.Fatalf("working distances %v, thin-lens roots %v", ws, want)
			}
			for i := range ws {
				checkNear(t, "working distance", ws[i], want[i], 0.05, 0)
			}
		})
	}
}

// The 4f relay (common practice): two identical parts, the object at the
// front focal point of the first, the space between them collimated, the
// image at the back focal point of the second, magnification -1. At the
// exact 4f track the pair is afocal at the solved gap, where the naive
// formulas divide zero by zero; 10 mm longer, the same arrangement holds
// with a 10 mm longer collimated space.
func TestPairImage4f(t *testing.T) {
	p := lens("PCX", 25.8, math.Inf(1), 5.3, 1.5168, 25.4)
	c := p.System(nil, nil).Cardinal(optics.LineD)
	k := 2 * (c.Length + c.FPrime - c.F)
	for _, extra := range []float64{0, 10} {
		its := items(p)
		req := imageReq(k+extra, -1)
		req.GapMin = 0
		out := mustFind(t, its, req)
		pairs := pairsOf(out.Results)
		if len(pairs) < 4 {
			t.Fatalf("extra %g: %d pair results, want the four orientations", extra, len(pairs))
		}
		for _, o := range [][2]bool{{false, false}, {false, true}, {true, false}, {true, true}} {
			ca, cb := c, c
			if o[0] {
				ca = p.Reversed().System(nil, nil).Cardinal(optics.LineD)
			}
			if o[1] {
				cb = p.Reversed().System(nil, nil).Cardinal(optics.LineD)
			}
			found := false
			for _, r := range pairs {
				if r.Parts[0].Reversed != o[0] || r.Parts[1].Reversed != o[1] ||
					!near(*r.WorkingDistance, -ca.F, 1e-6, 0) {
					continue
				}
				found = true
				checkNear(t, "gap", *r.Gap, ca.FPrime-cb.F+extra, 1e-6, 0)
				checkNear(t, "back clearance", *r.BackClearance, cb.FPrime, 1e-6, 0)
				checkImaging(t, its, r, -1)
				if extra == 0 && !assembled(t, its, r).Afocal {
					t.Errorf("orientation %v: not afocal at the 4f track", o)
				}
			}
			if !found {
				t.Errorf("extra %g, orientation %v: no layout with the object at the front focal point", extra, o)
			}
		}
	}
}

// A Keplerian pair f1, f2 at m = -f2/f1 has two layouts on any longer
// track: the object at the front focal point of the first part (any gap),
// and the afocal pair with the object placed to fit the track.
func TestPairImageAfocalRelay(t *testing.T) {
	a := lens("A", 51.7, -51.7, 4, 1.5168, 20)
	b := lens("B", 103.4, -103.4, 3, 1.5168, 20)
	ca := a.System(nil, nil).Cardinal(optics.LineD)
	cb := b.System(nil, nil).Cardinal(optics.LineD)
	m := -cb.EFL / ca.EFL
	k := ca.Length + ca.FPrime - ca.F + cb.Length + cb.FPrime - cb.F
	its := items(a, b)
	req := imageReq(k+40, m)
	req.GapMin = 0
	out := mustFind(t, its, req)
	afocal, focal := 0, 0
	for _, r := range pairsOf(out.Results) {
		if r.Parts[0].Part != "A" || r.Parts[1].Part != "B" {
			continue
		}
		checkImaging(t, its, r, m)
		if assembled(t, its, r).Afocal {
			afocal++
			checkNear(t, "afocal gap", *r.Gap, ca.FPrime-cb.F, 1e-6, 0)
		}
		if near(*r.WorkingDistance, -ca.F, 1e-6, 0) {
			focal++
		}
	}
	if afocal != 1 || focal != 1 {
		t.Errorf("afocal layouts %d, object-at-focus layouts %d; want 1 and 1", afocal, focal)
	}
}
