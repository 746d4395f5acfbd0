package search

import (
	"fmt"
	"math"
	"math/rand/v2"
	"testing"

	"cardinal/catalog/synth"
	"cardinal/optics"
)

// cardOf is the optics package's cardinal points of a part at a
// wavelength, in air.
func cardOf(p optics.Part, wl float64) optics.Cardinal {
	return p.System(nil, nil).Cardinal(wl)
}

func TestLaserFocusWaist(t *testing.T) {
	// S. A. Self, Appl. Opt. 22, 658 (1983), eqs. (9) and (11), applied
	// between the principal planes of a thick lens (exact in air, Gerrard
	// and Burch, ch. III): a collimated beam of 1/e^2 diameter D (waist at
	// the first vertex, s = P before the front principal plane) is brought
	// to a waist at s'' behind the back principal plane, of radius m w0.
	// The 1 mm beam at 1064 nm has zR = 738 mm, comparable to the
	// 400 mm focal length: its waist lies well before the paraxial focus.
	for _, tc := range []struct {
		name        string
		f, beam, m2 float64
	}{{"zR comparable to f", 400, 1, 1}, {"zR large against f", 100, 6, 1}, {"M^2 1.5", 200, 3, 1.5}} {
		t.Run(tc.name, func(t *testing.T) {
			p := equiconvex("L", tc.f, 4, 25)
			req := focusReq(cardOf(p, 1064).EFL)
			req.Wavelength, req.Beam, req.M2, req.Elements = 1064, tc.beam, tc.m2, 1
			out := mustFind(t, items(p), req)
			if len(out.Results) != 1 || out.Results[0].Gaussian == nil {
				t.Fatalf("results %+v", out.Results)
			}
			g := out.Results[0].Gaussian
			c := cardOf(p, 1064)
			w0 := tc.beam / 2
			zr := math.Pi * w0 * w0 / (tc.m2 * 1064e-6) // embedded Gaussian (Siegman 1990)
			s, f := c.P, c.EFL
			sPP := 1 / (1/f - 1/(s+zr*zr/(s-f)))
			m := 1 / math.Sqrt(sq(1-s/f)+sq(zr/f))
			checkNear(t, "waist from the last vertex", g.WaistAt, c.PPrime+sPP, 1e-6, 1e-9)
			checkNear(t, "waist radius um", g.WaistRadius, 1000*m*w0, 0, 1e-9)
			checkNear(t, "shift from the paraxial focus", *g.WaistShift, g.WaistAt-*out.Results[0].BackClearance, 1e-9, 0)
			// Rayleigh range of the focused beam pi w^2 / (M^2 lambda).
			checkNear(t, "Rayleigh range", g.RayleighRange, math.Pi*sq(m*w0)/(tc.m2*1064e-6), 0, 1e-9)
			if tc.name == "zR comparable to f" && !(*g.WaistShift < -50) {
				t.Errorf("waist shift %g mm: the waist should lie well before the paraxial focus", *g.WaistShift)
			}
			if g.SpotLimit == "" {
				t.Errorf("no verdict on what limits the spot")
			}
		})
	}
}

func sq(x float64) float64 { return x * x }

func TestLaserExpanderCollimation(t *testing.T) {
	// A Keplerian pair with a small input waist w1 at the first lens: the
	// thin-lens ABCD result (Siegman, Lasers, 1986, ch. 20; Self 1983,
	// eqs. (9) and (11)) puts the intermediate waist at
	// p = f1 + m^2 (s - f1) with Rayleigh range zm = m^2 z1,
	// m^2 = 1 / ((1 - s/f1)^2 + (z1/f1)^2), and the second lens puts the
	// output waist v behind it when the intermediate waist lies x before
	// it with x + zm^2 / (x - f2) = F = 1 / (1/f2 - 1/v) (Self's eq. (9)),
	// x^2 - (f2 + F) x + zm^2 + F f2 = 0; for v = 0 (collimated at the
	// lens) the beam's radius of curvature x + zm^2 / x equals f2. The
	// principal planes then lie p + x apart, not f1 + f2. The output
	// divergence is lambda / (pi w0) (Siegman 1986, ch. 17).
	a, b := equiconvex("A", 20, 3, 12.5), equiconvex("B", 100, 4, 25)
	ca, cb := cardOf(a, 632.8), cardOf(b, 632.8)
	req := expandReq(cb.EFL / ca.EFL)
	req.Wavelength, req.Laser, req.Beam, req.Top = 632.8, true, 0.1, 0
	req.WaistOutAt = 5 // mm beyond the last vertex
	out := mustFind(t, items(a, b), req)
	var r *Result
	for i := range out.Results {
		if len(out.Results[i].Parts) == 2 && out.Results[i].Parts[0].Part == "A" && out.Results[i].Parts[1].Part == "B" {
			r = &out.Results[i]
		}
	}
	if r == nil || r.Gaussian == nil {
		t.Fatalf("no A then B expander among %s", brief(out.Results))
	}
	f1, f2 := ca.EFL, cb.EFL
	w1 := 0.05
	z1 := math.Pi * w1 * w1 / 632.8e-6
	// The input waist sits at the first vertex, P_a before the front
	// principal plane (Self's s = P).
	s := ca.P
	m2 := 1 / (sq(1-s/f1) + sq(z1/f1))
	p := f1 + m2*(s-f1)
	zm := m2 * z1
	v := req.WaistOutAt - cb.PPrime // from B's back principal plane
	F := 1 / (1/f2 - 1/v)
	x := ((f2 + F) + math.Sqrt(sq(f2+F)-4*(zm*zm+F*f2))) / 2
	gap := p + x - cb.P + ca.PPrime
	checkNear(t, "collimating gap", *r.Gap, gap, 1e-6, 0)
	afocal := f1 + f2 - cb.P + ca.PPrime
	checkNear(t, "afocal gap", *r.Gaussian.AfocalGap, afocal, 1e-6, 0)
	if math.Abs(*r.Gap-afocal) < 0.05 {
		t.Errorf("the collimating gap %g should differ from the afocal %g for a small beam", *r.Gap, afocal)
	}
	checkNear(t, "output waist where asked", r.Gaussian.WaistAt, req.WaistOutAt, 1e-6, 0)
	w0 := r.Gaussian.WaistRadius / 1000
	checkNear(t, "divergence lambda/(pi w0)", *r.Gaussian.Divergence, 1000*632.8e-6/(math.Pi*w0), 0, 1e-9)
	// The output waist is the thin-lens result m2' zm with the second
	// lens at x from the intermediate waist (Self 1983, eq. (11)).
	mb := 1 / (sq(1-x/f2) + sq(zm/f2))
	checkNear(t, "output waist", w0, math.Sqrt(mb*zm*632.8e-6/math.Pi), 0, 1e-6)
	if r.Gaussian.WavefrontRMS == nil || r.Gaussian.DivergenceRatio == nil || *r.Gaussian.DivergenceRatio < 1 {
		t.Errorf("wavefront %v, divergence ratio %v", r.Gaussian.WavefrontRMS, r.Gaussian.DivergenceRatio)
	}
}

func matchReq(w1, w2, track float64) Requirement {
	r := Defaults()
	r.Kind, r.WaistIn, r.WaistOut, r.Track, r.Wavelength, r.Top = Match, w1, w2, track, 1064, 0
	return r
}

func TestMatchSingles(t *testing.T) {
	// Kogelnik and Li, Appl. Opt. 5, 1550 (1966), sec. VI: a lens f >= f0
	// has two placements, d1 = f +- (w1/w2) sqrt(f^2 - f0^2) from the
	// input waist and d2 = f +- (w2/w1) sqrt(f^2 - f0^2) to the output
	// waist, measured from the principal planes of a thick lens.
	p := equiconvex("L", 100, 4, 25)
	// w1 = 0.2, w2 = 0.15 at 1064 nm: f0 = 88.6 mm, both placements
	// real for f = 100 mm.
	req := matchReq(0.2, 0.15, 0)
	req.Elements = 1
	out := mustFind(t, items(p), req)
	c := cardOf(p, 1064)
	f0 := math.Pi * 0.2 * 0.15 / 1064e-6
	r := math.Sqrt(c.EFL*c.EFL - f0*f0)
	k := 0.2 / 0.15
	want := map[float64]float64{c.EFL + k*r - c.P: c.EFL + r/k + c.PPrime, c.EFL - k*r - c.P: c.EFL - r/k + c.PPrime}
	found := 0
	for _, res := range out.Results {
		bc, ok := want[0]
		for wd, b := range want {
			if math.Abs(*res.WorkingDistance-wd) < 1e-6 {
				bc, ok = b, true
			}
		}
		if !ok {
			t.Errorf("unexpected placement wd %g", *res.WorkingDistance)
			continue
		}
		found++
		checkNear(t, "back clearance", *res.BackClearance, bc, 1e-6, 0)
		checkNear(t, "coupling", *res.Gaussian.Coupling, 1, 1e-9, 0)
		checkNear(t, "waist produced um", res.Gaussian.WaistRadius, 150, 1e-6, 0)
		if res.Gaussian.CouplingTol == nil || !(*res.Gaussian.CouplingTol > 0) {
			t.Errorf("no coupling tolerance")
		}
	}
	if found != 2 {
		t.Errorf("found %d placements, want 2", found)
	}
}

func TestMatchSingleOnTrack(t *testing.T) {
	// On the track of a Kogelnik-Li placement the best placement couples
	// fully (Kogelnik and Li 1966); on a longer track less than fully, with
	// a coupling the formula of optics.Coupling gives for the placement.
	p := equiconvex("L", 100, 4, 25)
	c := cardOf(p, 1064)
	pl := optics.ModeMatchPlacements(0.2, 0.15, 1064, c.EFL)[0]
	track := pl.D1 + pl.D2 + c.Length + c.PPrime - c.P
	req := matchReq(0.2, 0.15, track)
	req.Elements = 1
	out := mustFind(t, items(p), req)
	if len(out.Results) == 0 {
		t.Fatalf("no result; why %v", out.Why)
	}
	checkNear(t, "best coupling on the matched track", *out.Results[0].Gaussian.Coupling, 1, 1e-7, 0)
	checkNear(t, "working distance", *out.Results[0].WorkingDistance, pl.D1-c.P, 1e-3, 0)
	req.Track, req.CouplingMin = track+200, 0.01
	out = mustFind(t, items(p), req)
	if len(out.Results) == 0 || *out.Results[0].Gaussian.Coupling > 0.999 {
		t.Fatalf("a longer track should lower the coupling: %s", brief(out.Results))
	}
}

// bruteMatch scans working distance and gap on a fixed track for layouts
// of a then b that couple nearly fully, refining each local maximum of the
// grid by coordinate golden sections: the outside check of matchRoots.
func bruteMatch(t *testing.T, a, b optics.Part, req Requirement) [][2]float64 {
	ma, mb := cardOf(a, req.Lambda()).Matrix, cardOf(b, req.Lambda()).Matrix
	room := req.Track - a.Length() - b.Length()
	eta := func(wd, gap float64) float64 {
		bc := room - wd - gap
		if wd <= 0 || gap < 0 || bc <= 0 {
			return 0
		}
		in := optics.NewGaussianBeam(req.Lambda(), req.WaistIn, wd, 1)
		outB := in.Through(ma.Then(optics.Transfer(gap, 1)).Then(mb), 1).Propagate(bc)
		return optics.Coupling(outB, optics.NewGaussianBeam(req.Lambda(), req.WaistOut, 0, 1))
	}
	const n = 300
	h := room / n
	grid := make([][]float64, n+1)
	for i := range grid {
		grid[i] = make([]float64, n+1)
		for j := range grid[i] {
			grid[i][j] = eta(float64(i)*h, float64(j)*h)
		}
	}
	var found [][2]float64
	for i := 1; i < n; i++ {
		for j := 1; j < n; j++ {
			v := grid[i][j]
			if v < 0.5 || v < grid[i-1][j] || v < grid[i+1][j] || v < grid[i][j-1] || v < grid[i][j+1] ||
				v < grid[i-1][j-1] || v < grid[i+1][j+1] || v < grid[i-1][j+1] || v < grid[i+1][j-1] {
				continue
			}
			wd, gap := float64(i)*h, float64(j)*h
			for k := 0; k < 40; k++ {
				wd = goldenMax(func(x float64) float64 { return eta(x, gap) }, wd-h, wd+h)
				gap = goldenMax(func(x float64) float64 { return eta(wd, x) }, gap-h, gap+h)
			}
			if eta(wd, gap) > 0.9999 {
				found = append(found, [2]float64{wd, gap})
			}
		}
	}
	return found
}

func TestMatchPairsAgainstScan(t *testing.T) {
	if testing.Short() {
		t.Skip("brute-force scan")
	}
	for _, tc := range []struct {
		name          string
		fa, fb        float64
		w1, w2, track float64
	}{
		{"reduce a waist", 60, 40, 0.5, 0.05, 260},
		{"enlarge a waist", 40, 100, 0.05, 0.3, 400},
	} {
		t.Run(tc.name, func(t *testing.T) {
			a, b := equiconvex("A", tc.fa, 4, 12.5), equiconvex("B", tc.fb, 4, 12.5)
			for _, p := range []optics.Part{a, b} {
				if err := p.Validate(); err != nil {
					t.Fatal(err)
				}
			}
			req := matchReq(tc.w1, tc.w2, tc.track)
			req.GapMin = 0
			req.Arrangements = true // every layout its own row, as the scan finds them
			out, err := FindExhaustive(items(a, b), req)
			if err != nil {
				t.Fatal(err)
			}
			var solved [][2]float64
			for _, r := range out.Results {
				if len(r.Parts) == 2 && r.Parts[0].Part == "A" && r.Parts[1].Part == "B" {
					solved = append(solved, [2]float64{*r.WorkingDistance, *r.Gap})
				}
			}
			scan := bruteMatch(t, a, b, req)
			if len(scan) == 0 {
				t.Fatal("the scan finds no layout: choose another case")
			}
			for _, s := range scan {
				if !hasNear(solved, s, 0.05) {
					t.Errorf("scan layout wd %.3f gap %.3f not among the solver's %v", s[0], s[1], solved)
				}
			}
			for _, s := range solved {
				if !hasNear(scan, s, 0.05) {
					t.Errorf("solver layout wd %.3f gap %.3f not found by the scan %v", s[0], s[1], scan)
				}
			}
		})
	}
}

func hasNear(set [][2]float64, p [2]float64, tol float64) bool {
	for _, q := range set {
		if math.Abs(q[0]-p[0]) < tol && math.Abs(q[1]-p[1]) < tol {
			return true
		}
	}
	return false
}

// The pruned search equals the exhaustive one for mode matching, with and
// without a track, on random synthetic catalogs and on the demo.
func TestMatchPrunedEqualsExhaustive(t *testing.T) {
	cases := 10
	if testing.Short() {
		cases = 4
	}
	rng := rand.New(rand.NewPCG(3, 4))
	nonEmpty := 0
	for k := 0; k < cases; k++ {
		its := Items(synth.Catalog(uint64(100+k), 20+rng.IntN(40)), nil)
		req := matchReq(0.05+rng.Float64()*1, 0.02+rng.Float64()*0.5, 0)
		if rng.IntN(2) == 0 {
			req.Track = 100 + rng.Float64()*500
		}
		req.CouplingMin = 0.5 + rng.Float64()*0.49
		req.Top = []int{0, 3, 10}[rng.IntN(3)]
		req.GapMin = rng.Float64()
		if rng.IntN(2) == 0 {
			req.LengthMax = 30 + rng.Float64()*200
		}
		t.Run(fmt.Sprintf("case %d track %.0f", k, req.Track), func(t *testing.T) {
			if len(samePruned(t, its, req).Results) > 0 {
				nonEmpty++
			}
		})
	}
	t.Logf("%d of %d cases have results", nonEmpty, cases)
	if nonEmpty < cases/4 {
		t.Errorf("only %d of %d cases have results", nonEmpty, cases)
	}
}
