package search

import (
	"fmt"
	"math"
	"testing"

	"cardinal/optics"
)

// tracedSetups are solved pairs of a focus requirement with a beam and an
// image requirement with an NA, whose results find traced with real
// rays, for each compensator.
func tracedSetups(t *testing.T) []struct {
	name string
	req  Requirement
	r    Result
	su   Setup
} {
	t.Helper()
	var out []struct {
		name string
		req  Requirement
		r    Result
		su   Setup
	}
	its := items(thickPair(0)...)
	for _, comp := range []Compensator{CompensateImage, CompensateGap, CompensateNone} {
		rf := buildFocusReq(1, BuildSettings{SpacingTol: 0.1, Compensator: comp})
		rf.EFL, rf.Beam = 70, 8
		ri := Defaults()
		ri.Kind, ri.Track, ri.Mag, ri.NA = Image, 400, -0.8, 0.02
		ri.Build = BuildSettings{SpacingTol: 0.1, Compensator: comp}
		for _, req := range []Requirement{rf, ri} {
			req.Top = 0
			o, err := Find(its, req)
			if err != nil {
				t.Fatal(err)
			}
			for _, r := range o.Results {
				if len(r.Parts) == 2 && r.ImageQuality != nil {
					out = append(out, struct {
						name string
						req  Requirement
						r    Result
						su   Setup
					}{fmt.Sprintf("%v %s", req.Kind, comp), req, r, setupOf(t, its, r)})
					break
				}
			}
		}
	}
	if len(out) != 6 {
		t.Fatalf("%d traced pairs, want 6", len(out))
	}
	return out
}

func TestNominalSpotIsTheTracedSpot(t *testing.T) {
	// With no departure the build is the result as find traced it: where
	// the builder refocuses, the spot is find's RMS spot at best focus;
	// on a fixed image plane it is the spot on that plane, which the
	// real-ray stage traces on the way (optics.Quality.AxisAtImage).
	for _, c := range tracedSetups(t) {
		t.Run(c.name, func(t *testing.T) {
			m, err := newModel(c.req, c.su)
			if err != nil {
				t.Fatal(err)
			}
			d := make(draw, len(m.params))
			tr := m.eval(d)
			got, ok := m.spot(d, tr)
			if !ok {
				t.Fatal("no ray reached the image")
			}
			want := c.r.ImageQuality.RMSSpot
			if m.comp != CompensateImage {
				var gaps []float64
				if c.r.Gap != nil {
					gaps = []float64{*c.r.Gap}
				}
				q, err := optics.Assemble(nil, nil, c.su.Parts, gaps).Assess(c.req.Conditions(c.su.WorkingDistance, c.su.BackClearance))
				if err != nil {
					t.Fatal(err)
				}
				want = 1000 * q.AxisAtImage.RMS
				if math.Abs(want-c.r.ImageQuality.RMSSpot) < 1e-3*want {
					t.Fatalf("the spot on the image plane (%g um) is the best-focus spot: the test tells nothing", want)
				}
			}
			checkNear(t, "nominal spot (um)", got, want, 1e-9, 1e-9)
		})
	}
}

func TestSpotOfAPerturbedPlanoConvex(t *testing.T) {
	// A thin plano-convex lens, curved side to a collimated beam of small
	// aperture, built 2 % long or short and refocused: its RMS spot at
	// best focus is that of third-order spherical aberration, a/6 with
	// a = S1 / (2 u') the transverse aberration of the marginal ray
	// (Welford, Aberrations of Optical Systems, 1986, ch. 7-8; the a/6 of
	// a uniformly filled pupil is derived in optics' TestSphericalCubeLaw)
	// and S1 from the thin-lens formula in the shape factor B and the
	// conjugate factor C (Welford 1986, the chapter on thin lenses, from
	// memory; optics' TestThinLensSphericalShapeFactor):
	// S1 = y^4 phi^3/4 [ (n/(n-1))^2 + (n+2)/(n(n-1)^2) B^2
	//        + 4(n+1)/(n(n-1)) B C + (3n+2)/n C^2 ],
	// here B = 1 (c2 = 0), C = -1 (object at infinity), and the built
	// lens's power phi = phi0 / (1 + e), its radii scaled together.
	const n, r1, beam = 1.517, 51.7, 4.0
	p := lens("PCX", r1, math.Inf(1), 0.2, n, 6)
	c := p.System(nil, nil).Cardinal(optics.LineD)
	only := optics.Tolerances{EFLPct: 2, Thickness: tiny, Index: tiny}
	su := Setup{Parts: []optics.Part{p}, Tols: []optics.Tolerances{only}, BackClearance: c.FPrime}
	req := buildFocusReq(1, BuildSettings{})
	req.EFL, req.Beam = c.EFL, beam
	m, err := newModel(req, su)
	if err != nil {
		t.Fatal(err)
	}
	if m.params[0].Key != "efl1" {
		t.Fatalf("first parameter %s, want efl1", m.params[0].Key)
	}
	for _, e := range []float64{-2, 0, 2} { // percent
		d := make(draw, len(m.params))
		d[0] = optics.Const(e)
		tr := m.eval(d)
		got, ok := m.spot(d, tr)
		if !ok {
			t.Fatal("no ray reached the image")
		}
		y, phi := beam/2, (n-1)/r1/(1+e/100)
		s1 := y * y * y * y * phi * phi * phi / 4 * (sq(n/(n-1)) + (n+2)/(n*sq(n-1)) - 4*(n+1)/(n*(n-1)) + (3*n+2)/n)
		want := 1000 * s1 / (2 * y * phi) / 6
		checkNear(t, fmt.Sprintf("RMS spot at best focus, e %g %% (um)", e), got, want, 0, 0.005)
	}
}

func TestStudyTracesEveryBuild(t *testing.T) {
	for _, c := range tracedSetups(t)[:2] {
		t.Run(c.name, func(t *testing.T) {
			req := c.req
			req.Build.Trials = 200
			st, err := StudyBuild(req, c.su)
			if err != nil {
				t.Fatal(err)
			}
			if st.SpotBuilds+st.SpotLost != st.Trials-st.Failed || len(st.Spot) != st.SpotBuilds {
				t.Errorf("%d spots and %d lost of %d builds, %d failed", st.SpotBuilds, st.SpotLost, st.Trials, st.Failed)
			}
			if !(st.SpotLow > 0 && st.SpotLow <= st.SpotMedian && st.SpotMedian <= st.SpotHigh) {
				t.Errorf("spot range %g, %g, %g", st.SpotLow, st.SpotMedian, st.SpotHigh)
			}
			if st.SpotHigh <= c.r.ImageQuality.RMSSpot {
				t.Errorf("no build is worse than the nominal %g um: %g", c.r.ImageQuality.RMSSpot, st.SpotHigh)
			}
		})
	}
	req := buildFocusReq(1, BuildSettings{Trials: 100})
	st, err := StudyBuild(req, thinSinglet(optics.Tolerances{}))
	if err != nil {
		t.Fatal(err)
	}
	if st.SpotBuilds != 0 || st.Spot != nil {
		t.Errorf("a requirement without a beam traced %d builds", st.SpotBuilds)
	}
}
