package search

import (
	"math"
	"testing"

	"cardinal/optics"
)

// tiny stands for a tolerance of practically nothing: a part that states 0
// takes the catalog's default, so tests that want one tolerance alone set
// the others to this.
const tiny = 1e-12

// focusReq is a focus requirement at 100 mm with the given tolerance and
// build settings.
func buildFocusReq(tolPct float64, b BuildSettings) Requirement {
	r := Defaults()
	r.Kind, r.EFL, r.EFLTol = Focus, 100, Tolerance{Value: tolPct, Percent: true}
	r.Build = b
	return r
}

// thinSinglet is a symmetric biconvex lens of f = 100 mm, 1 um thick: a
// thin lens whose focus lies f beyond it.
func thinSinglet(tol optics.Tolerances) Setup {
	p := equiconvex("THIN", 100, 1e-3, 25)
	c := p.System(nil, nil).Cardinal(optics.LineD)
	return Setup{Parts: []optics.Part{p}, Tols: []optics.Tolerances{tol}, BackClearance: c.FPrime}
}

func TestAdjustRangeOfAThinLens(t *testing.T) {
	if testing.Short() {
		t.Skip("100,000 simulated builds")
	}
	only := optics.Tolerances{EFLPct: 1, Thickness: tiny, Index: tiny}
	for _, c := range []struct {
		name string
		dist Distribution
		// want is the 97.5th percentile of the focal-length error, in mm
		// of f = 100 mm: the focus of a thin lens moves by the error
		// itself. Uniform on +-1 %: 0.95 % (the p-quantile of a uniform
		// distribution on [-a, a] is a (2p - 1)); normal of sigma 0.5 %:
		// 1.96 sigma = 0.98 % (standard normal 97.5 % point 1.959964,
		// M. Abramowitz and I. A. Stegun, Handbook of Mathematical
		// Functions, 1964, table 26.5). se is the standard error of a
		// sample quantile, sqrt(p (1-p) / n) / density (H. Cramer,
		// Mathematical Methods of Statistics, Princeton 1946, sec. 28.5),
		// at n = 100,000.
		want, se float64
	}{
		{"uniform", Uniform, 0.95, math.Sqrt(0.025*0.975/1e5) / (1 / 2.0)},
		{"normal", Normal, 0.98, math.Sqrt(0.025*0.975/1e5) / (math.Exp(-1.96*1.96/2) / math.Sqrt(2*math.Pi) / 0.5)},
	} {
		t.Run(c.name, func(t *testing.T) {
			st, err := StudyBuild(buildFocusReq(1, BuildSettings{Distribution: c.dist, Trials: 100000, Seed: 7}), thinSinglet(only))
			if err != nil {
				t.Fatal(err)
			}
			if st.Compensator != CompensateImage {
				t.Errorf("compensator %q, want image (refocus) by default", st.Compensator)
			}
			checkNear(t, "high end of the adjustment", st.AdjustHigh, c.want, 4*c.se, 0)
			checkNear(t, "low end of the adjustment", st.AdjustLow, -c.want, 4*c.se, 0)
			// The EFL after refocusing is the part's own: the same spread,
			// in percent of the target.
			checkNear(t, "high end of the EFL spread (%)", st.SpreadHigh, c.want, 4*c.se, 0)
		})
	}
}

func TestYieldOfASingleLens(t *testing.T) {
	// EFL uniform within +-1 % and a requirement of +-0.5 %: the share of a
	// uniform distribution on [-1, 1] that falls in [-0.5, 0.5] is 0.5
	// (closed form); the standard error of a share p over n builds is
	// sqrt(p (1 - p) / n) (binomial distribution).
	n := 20000
	if testing.Short() {
		n = 4000
	}
	only := optics.Tolerances{EFLPct: 1, Thickness: tiny, Index: tiny}
	st, err := StudyBuild(buildFocusReq(0.5, BuildSettings{Trials: n, Seed: 3}), thinSinglet(only))
	if err != nil {
		t.Fatal(err)
	}
	se := 100 * math.Sqrt(0.25/float64(n))
	checkNear(t, "yield (%)", st.Yield, 50, 4*se, 0)
	if st.Dominant != "focal length of part 1" {
		t.Errorf("dominant tolerance %q, want the focal length", st.Dominant)
	}
}

// thickPair is two thick biconvex lenses of 100 and 150 mm a gap apart.
func thickPair(gap float64) []optics.Part {
	return []optics.Part{equiconvex("A", 100, 6, 25), equiconvex("B", 150, 5, 25)}
}

func TestGapSensitivityIsGullstrands(t *testing.T) {
	// The power of two parts e apart (principal point to principal point)
	// is phi = phi1 + phi2 - e phi1 phi2 (Gullstrand's equation; Hecht,
	// Optics, 5th ed., sec. 6.2), and a change of the vertex gap is a change
	// of e, so d phi / d gap = -phi1 phi2. The matrix product carried with
	// its derivative must give the same.
	for _, gap := range []float64{5, 40, 120} {
		ps := thickPair(gap)
		a := optics.NewLens(ps[0], optics.LineD, optics.DefaultTolerances)
		b := optics.NewLens(ps[1], optics.LineD, optics.DefaultTolerances)
		ma, _ := a.Matrix(optics.Departure{})
		mb, _ := b.Matrix(optics.Departure{})
		m := ma.Then(optics.DTransfer(optics.Var(gap), optics.Const(1))).Then(mb)
		checkNear(t, "d phi / d gap", -m.C.D, -a.Power*b.Power, 1e-15, 1e-12)

		// The same through the build model: d EFL / d gap = -(1/phi^2) d phi/d gap.
		req := buildFocusReq(1, BuildSettings{SpacingTol: 0.1})
		req.EFL = 1 / (-m.C.V)
		bc := m.A.V / (-m.C.V)
		st, err := StudyBuild(req, Setup{Parts: ps, Tols: make([]optics.Tolerances, 2), Gap: gap, BackClearance: bc})
		if err != nil {
			t.Fatal(err)
		}
		for _, s := range st.Sensitivities {
			if s.Key == "gap" {
				phi := -m.C.V
				checkNear(t, "d EFL / d gap", s.Target, a.Power*b.Power/(phi*phi), 1e-15, 1e-9)
			}
		}
	}
}

func TestSensitivitiesMatchFiniteDifferences(t *testing.T) {
	// Every analytic derivative against a central difference of the model
	// itself (STYLE.md: derivatives are checked against finite differences).
	for _, c := range setups(t) {
		t.Run(c.name, func(t *testing.T) {
			m, err := newModel(c.req, c.su)
			if err != nil {
				t.Fatal(err)
			}
			ss := m.sensitivities(Uniform)
			for _, s := range ss {
				j := -1
				for k, p := range m.params {
					if p.Key == s.Key {
						j = k
					}
				}
				h := 1e-4 * s.Tol
				if h == 0 {
					continue
				}
				at := func(x float64) trial {
					d := make(draw, len(m.params))
					d[j] = optics.Const(x)
					return m.eval(d)
				}
				hi, lo := at(h), at(-h)
				if !hi.ok || !lo.ok {
					t.Fatalf("%s: the compensator has no solution near the nominal build", s.Key)
				}
				fd := (hi.figure.V - lo.figure.V) / (2 * h)
				fa := (hi.adjust.V - lo.adjust.V) / (2 * h)
				checkNear(t, s.Key+" d target", s.Target, fd, 1e-9*math.Abs(m.target), 1e-5)
				checkNear(t, s.Key+" d adjust", s.Adjust, fa, 1e-9, 1e-5)
			}
		})
	}
}

type setupCase struct {
	name string
	req  Requirement
	su   Setup
}

// setups are solved results of each kind and compensator, the distances
// from the search itself.
func setups(t *testing.T) []setupCase {
	t.Helper()
	var out []setupCase
	ps := thickPair(0)
	its := items(ps...)
	for _, comp := range []Compensator{CompensateImage, CompensateGap, CompensateNone} {
		req := buildFocusReq(1, BuildSettings{SpacingTol: 0.1, Compensator: comp})
		req.EFL = 70
		out = append(out, setupCase{"focus " + string(comp), req, solvedSetup(t, its, req)})

		ri := Defaults()
		ri.Kind, ri.Track, ri.Mag = Image, 400, -0.8
		ri.Build = BuildSettings{SpacingTol: 0.1, Compensator: comp}
		out = append(out, setupCase{"image " + string(comp), ri, solvedSetup(t, its, ri)})
	}
	neg := lens("NEG", -60, 60, 3, 1.5, 25)
	for _, comp := range []Compensator{CompensateGap, CompensateNone} {
		re := Defaults()
		re.Kind, re.Expansion, re.ExpandTol = Expand, 2.5, Tolerance{Value: 5, Percent: true}
		re.Build = BuildSettings{SpacingTol: 0.1, Compensator: comp}
		out = append(out, setupCase{"expand " + string(comp), re, solvedSetup(t, items(neg, ps[1]), re)})
	}
	return out
}

// solvedSetup runs the search and returns its best pair as a setup.
func solvedSetup(t *testing.T, its []Item, req Requirement) Setup {
	t.Helper()
	req.Top = 0
	out, err := Find(its, req)
	if err != nil {
		t.Fatal(err)
	}
	for _, r := range out.Results {
		if len(r.Parts) == 2 {
			return setupOf(t, its, r)
		}
	}
	t.Fatalf("no pair meets %+v", req)
	return Setup{}
}

func setupOf(t *testing.T, its []Item, r Result) Setup {
	t.Helper()
	su := Setup{Gap: deref(r.Gap), WorkingDistance: deref(r.WorkingDistance), BackClearance: deref(r.BackClearance)}
	for _, u := range r.Parts {
		for _, it := range its {
			if it.Entry.Part.ID() == u.ID() {
				p := it.Entry.Part
				if u.Reversed {
					p = p.Reversed()
				}
				su.Parts = append(su.Parts, p)
				su.Tols = append(su.Tols, it.Entry.Tolerances)
			}
		}
	}
	return su
}

func deref(p *float64) float64 {
	if p == nil {
		return 0
	}
	return *p
}

func TestNominalBuildIsTheResult(t *testing.T) {
	// With no departure the compensator does not move and the figure is
	// the one the solver reached through optics.Cardinal.
	for _, c := range setups(t) {
		t.Run(c.name, func(t *testing.T) {
			m, err := newModel(c.req, c.su)
			if err != nil {
				t.Fatal(err)
			}
			tr := m.eval(make(draw, len(m.params)))
			if !tr.ok {
				t.Fatal("no solution at the nominal build")
			}
			checkNear(t, "adjustment", tr.adjust.V, 0, 1e-9, 0)
			checkNear(t, "figure", tr.figure.V, m.target, 1e-9, m.tol/math.Abs(m.target))
		})
	}
}

func TestMonteCarloAgreesWithLinearPropagation(t *testing.T) {
	if testing.Short() {
		t.Skip("20,000 simulated builds per setup")
	}
	// For small tolerances the spread of the builds is the root sum of
	// squares of sensitivity x standard deviation of each tolerance: the
	// standard method of statistical tolerancing (D. G. Koch, "A
	// statistical approach to lens tolerancing", Proc. SPIE 147, 1978,
	// from memory; W. J. Smith, Modern Optical Engineering, 4th ed.,
	// McGraw-Hill 2008, the tolerancing chapter, from memory; the law of
	// propagation of uncertainty, JCGM 100:2008, eq. (10)). The standard
	// error of a sample standard deviation is about sigma / sqrt(2 (n-1))
	// for a near-normal sum; 4 of them, plus 1 % for what linearity leaves.
	const n = 20000
	small := optics.Tolerances{EFLPct: 0.05, Thickness: 0.005, Index: 5e-5, RadiusPct: 0.02}
	for _, c := range setups(t) {
		for _, dist := range []Distribution{Uniform, Normal} {
			t.Run(c.name+" "+string(dist), func(t *testing.T) {
				req := c.req
				req.Build.SpacingTol, req.Build.Distribution, req.Build.Trials = 0.005, dist, n
				su := c.su
				su.Tols = []optics.Tolerances{small, small}
				st, err := StudyBuild(req, su)
				if err != nil {
					t.Fatal(err)
				}
				if st.Failed > 0 {
					t.Fatalf("%d builds without a solution", st.Failed)
				}
				rel := 4/math.Sqrt(2*(n-1)) + 0.01
				checkNear(t, "target SD", st.TargetSD, st.LinearTargetSD, 1e-12, rel)
				checkNear(t, "adjustment SD", st.AdjustSD, st.LinearAdjustSD, 1e-9, rel)
			})
		}
	}
}

func TestSeedRepeats(t *testing.T) {
	req := buildFocusReq(1, BuildSettings{SpacingTol: 0.1, Trials: 500, Seed: 42})
	a, _ := StudyBuild(req, thinSinglet(optics.Tolerances{}))
	b, _ := StudyBuild(req, thinSinglet(optics.Tolerances{}))
	if a.AdjustLow != b.AdjustLow || a.Yield != b.Yield {
		t.Errorf("the same seed gave %v and %v", a.BuildFigures, b.BuildFigures)
	}
	req.Build.Seed = 43
	c, _ := StudyBuild(req, thinSinglet(optics.Tolerances{}))
	if c.AdjustLow == a.AdjustLow {
		t.Errorf("another seed gave the same builds")
	}
}
