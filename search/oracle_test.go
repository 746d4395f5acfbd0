package search

import (
	"fmt"
	"math"
	"math/rand/v2"
	"sort"
	"strings"
	"testing"

	"cardinal/catalog/synth"
	"cardinal/optics"
)

// This file is an independent oracle for the solver: it shares no solver
// code (no candidate preparation, no Gullstrand spacing, no Newton
// quadratic, no pruning, no scoring). For every part in each orientation it
// takes the reduced ray-transfer matrix from package optics; for every
// ordered pair it scans the vertex gap finely, brackets every sign change of
// the target error and refines it by bisection, then applies the checks of
// the requirement with its own arithmetic. The set of layouts that meet the
// requirement must be the set the search returns with --top 0.
//
// Matrix relations used (unimodular reduced matrices in air, M = [A B; C D]
// from first to last vertex; Gerrard and Burch, Introduction to Matrix
// Methods in Optics, 1975, ch. II): power -C, EFL -1/C, back focal distance
// -A/C; an object w before the first vertex is imaged z = -(A w + B)/(C w +
// D) after the last, where the full matrix's B vanishes, with magnification
// A + z C = 1/(C w + D) (det M = 1). So at each gap the working distance
// that gives magnification m is w = (1/m - D)/C, and the image problem is a
// scan of the track error over the gap; each root found is checked again on
// the assembled matrix (B = 0, A = m).

// oracleCand is one part in one orientation.
type oracleCand struct {
	id          string
	rev         bool
	m           optics.Mat2
	length      float64
	semi        float64
	first, last optics.Surface // outer surfaces as the light meets them
}

func (c oracleCand) key() string {
	if c.rev {
		return c.id + " reversed"
	}
	return c.id
}

// oracleLayout is a layout the oracle found: its parts, where it sits (the
// gap of a pair, the working distance of an image singlet) and how far it
// is from the nearest limit (mm, or the tolerance's unit for the target);
// a layout within 1e-6 of a limit may fall either way in floating point.
type oracleLayout struct {
	key    string
	pos    float64
	margin float64
}

func oracleCands(its []Item, req Requirement) []oracleCand {
	lambda := req.Wavelength
	if lambda == 0 {
		lambda = optics.LineD
	}
	var out []oracleCand
	for _, it := range its {
		p := it.Entry.Part
		if p.Validate() != nil {
			continue
		}
		orients := []bool{false}
		if !p.Symmetric() {
			orients = append(orients, true)
		}
		for _, rev := range orients {
			q := p
			if rev {
				q = p.Reversed()
			}
			c := q.System(nil, nil).Cardinal(lambda)
			if c.Afocal {
				continue
			}
			out = append(out, oracleCand{id: p.ID(), rev: rev, m: c.Matrix, length: c.Length, semi: q.Aperture() / 2,
				first: q.Surfaces[0], last: q.Surfaces[len(q.Surfaces)-1]})
		}
	}
	return out
}

// zeros returns every zero of f on [lo, hi]: n equal intervals bracket
// each sign change, refined by bisection; where |f| dips between samples
// without a change of sign, a golden-section search for the dip's bottom
// looks for a pair of zeros hidden inside one interval.
func zeros(f func(float64) float64, lo, hi float64, n int) []float64 {
	var out []float64
	var buf [2 * 1025]float64
	if n > 1024 {
		panic("search: oracle scan of more than 1024 intervals")
	}
	xs, fs := buf[:n+1], buf[1025:1025+n+1]
	for i := range xs {
		xs[i] = lo + (hi-lo)*float64(i)/float64(n)
		fs[i] = f(xs[i])
	}
	for i := 0; i < n; i++ {
		a, b, fa, fb := xs[i], xs[i+1], fs[i], fs[i+1]
		switch {
		case fa == 0:
			out = append(out, a)
		case fa*fb < 0:
			out = append(out, bisect(f, a, b, fa))
		case i > 0 && fa*fs[i-1] > 0 && fa*fb > 0 && math.Abs(fa) < math.Abs(fs[i-1]) && math.Abs(fa) < math.Abs(fb):
			// |f| has a dip around a: look for its bottom on [x(i-1), b].
			x := golden(func(x float64) float64 { return f(x) * sign(fa) }, xs[i-1], b)
			if fx := f(x); fx*fa < 0 {
				out = append(out, bisect(f, xs[i-1], x, fs[i-1]), bisect(f, x, b, fx))
			}
		}
	}
	if fs[n] == 0 {
		out = append(out, xs[n])
	}
	return out
}

// zerosBetween is zeros on each stretch of [lo, hi] between the poles of
// f, so that a zero next to a pole (where f runs off to infinity and back
// with the other sign) is bracketed too.
func zerosBetween(f func(float64) float64, poles []float64, lo, hi float64, n int) []float64 {
	var out []float64
	edges := []float64{lo}
	for _, p := range poles {
		if p > lo && p < hi {
			d := 1e-9 * (1 + math.Abs(p))
			edges = append(edges, p-d, p+d)
		}
	}
	edges = append(edges, hi)
	for k := 0; k+1 < len(edges); k += 2 {
		if edges[k+1] > edges[k] {
			out = append(out, zeros(f, edges[k], edges[k+1], n)...)
		}
	}
	return out
}

func sign(v float64) float64 {
	if v < 0 {
		return -1
	}
	return 1
}

// bisect halves [a, b] around the sign change (fa is f(a)) until the
// interval stops shrinking in floating point.
func bisect(f func(float64) float64, a, b, fa float64) float64 {
	for range 200 {
		m := (a + b) / 2
		if m == a || m == b {
			break
		}
		fm := f(m)
		if fm == 0 {
			return m
		}
		if fm*fa < 0 {
			b = m
		} else {
			a, fa = m, fm
		}
	}
	return (a + b) / 2
}

// golden finds a minimum of f on [a, b] by golden-section search.
func golden(f func(float64) float64, a, b float64) float64 {
	const r = 0.6180339887498949 // (sqrt 5 - 1) / 2
	c, d := b-r*(b-a), a+r*(b-a)
	fc, fd := f(c), f(d)
	for range 100 {
		if fc < fd {
			b, d, fd = d, c, fc
			c = b - r*(b-a)
			fc = f(c)
		} else {
			a, c, fc = c, d, fd
			d = a + r*(b-a)
			fd = f(d)
		}
	}
	return (a + b) / 2
}

// pairAt is the matrix of a, the gap, then b.
func pairAt(a, b *oracleCand, gap float64) optics.Mat2 {
	return a.m.Then(optics.Transfer(gap, 1)).Then(b.m)
}

// pairLine is the pair's matrix as a function of the gap, which enters
// linearly: M(g) = Mb (I + g N) Ma = M0 + g M1 with N = [0 1; 0 0], so
// that a scan costs four multiply-adds a sample.
type pairLine struct{ m0, m1 optics.Mat2 }

func lineOf(a, b *oracleCand) pairLine {
	m0 := pairAt(a, b, 0)
	m1 := pairAt(a, b, 1)
	return pairLine{m0, optics.Mat2{A: m1.A - m0.A, B: m1.B - m0.B, C: m1.C - m0.C, D: m1.D - m0.D}}
}

func (p pairLine) at(g float64) optics.Mat2 {
	return optics.Mat2{A: p.m0.A + g*p.m1.A, B: p.m0.B + g*p.m1.B, C: p.m0.C + g*p.m1.C, D: p.m0.D + g*p.m1.D}
}

// clearance is the least axial distance between a's last and b's first
// surface over the heights both clear apertures share (64 heights).
func clearance(a, b *oracleCand, gap float64) float64 {
	h := math.Min(a.semi, b.semi)
	least := gap
	for i := 1; i <= 64; i++ {
		y := h * float64(i) / 64
		za, _ := a.last.Sag(y)
		zb, _ := b.first.Sag(y)
		least = math.Min(least, gap-za+zb)
	}
	return least
}

// oracleTol is the requirement's first-order tolerance in the target's unit.
func oracleTol(t Tolerance, target float64) float64 {
	if t.Percent {
		return t.Value / 100 * math.Abs(target)
	}
	return t.Value
}

// oracle lists every layout of one or two parts that meets the requirement
// (no beam, NA or field: the aperture check is not the oracle's).
func oracle(its []Item, req Requirement, samples int) []oracleLayout {
	cs := oracleCands(its, req)
	var out []oracleLayout
	lengthMax := math.Inf(1)
	if req.LengthMax > 0 {
		lengthMax = req.LengthMax
	}
	emit := func(key string, pos float64, margins ...float64) {
		least := math.Inf(1)
		for _, m := range margins {
			least = math.Min(least, m)
		}
		if least > -1e-6 {
			out = append(out, oracleLayout{key, pos, least})
		}
	}
	for i := range cs {
		a := &cs[i]
		out = append(out, oracleSinglet(a, req, lengthMax, samples)...)
		if req.Elements == 1 {
			continue
		}
		for j := range cs {
			b := &cs[j]
			gmax := lengthMax - a.length - b.length
			if req.Kind == Image {
				gmax = math.Min(gmax, req.Track-a.length-b.length)
			}
			if !(gmax > 0) {
				continue
			}
			key := a.key() + " + " + b.key()
			line := lineOf(a, b)
			common := func(gap float64) []float64 {
				return []float64{clearance(a, b, gap) - req.GapMin, lengthMax - (a.length + gap + b.length)}
			}
			switch req.Kind {
			case Focus:
				efl := func(g float64) float64 { return -1/line.at(g).C - req.EFL }
				for _, g := range zerosBetween(efl, afocalAt(line, gmax), 0, gmax, samples) {
					m := pairAt(a, b, g)
					if math.Abs(-1/m.C-req.EFL) > 1e-6*req.EFL { // a pole, not a root
						continue
					}
					emit(key, g, append(common(g), -m.A/m.C-req.BFDMin)...)
				}
			case Image:
				track := func(g float64) float64 { return trackError(line.at(g), a.length+g+b.length, req) }
				for _, g := range zerosBetween(track, afocalAt(line, gmax), 0, gmax, samples) {
					m := pairAt(a, b, g)
					w, z, ok := imageAt(m, req)
					if !ok || math.Abs(w+a.length+g+b.length+z-req.Track) > 1e-6*req.Track {
						continue
					}
					emit(key, g, append(common(g), w-req.WDMin, z-req.BFDMin, w, z)...)
				}
			case Expand:
				pa, pb := -a.m.C, -b.m.C
				if pa < 0 && pb < 0 {
					continue
				}
				form := Keplerian
				if pa < 0 || pb < 0 {
					form = Galilean
				}
				for _, g := range afocalAt(line, gmax) {
					m := pairAt(a, b, g)
					ms := append(common(g), oracleTol(req.ExpandTol, req.Expansion)-math.Abs(math.Abs(m.A)-req.Expansion))
					if req.Form != AnyForm && req.Form != form {
						ms = append(ms, -1)
					}
					emit(key, g, ms...)
				}
			}
		}
	}
	return out
}

// afocalAt lists the gaps in [0, gmax] where the pair has no power (the
// poles of the focal length and of the working distance).
func afocalAt(p pairLine, gmax float64) []float64 {
	return zeros(func(g float64) float64 { return p.at(g).C }, 0, gmax, 16)
}

// imageAt is the working distance that gives the requirement's
// magnification with the system m, and the image distance after it;
// ok is false where there is none.
func imageAt(m optics.Mat2, req Requirement) (w, z float64, ok bool) {
	if m.C == 0 {
		return 0, 0, false
	}
	w = (1/req.Mag - m.D) / m.C
	z = -(m.A*w + m.B) / (m.C*w + m.D)
	full := optics.Transfer(w, 1).Then(m).Then(optics.Transfer(z, 1))
	ok = !math.IsNaN(z) && !math.IsInf(z, 0) && math.Abs(full.B) < 1e-6*(1+math.Abs(w)+math.Abs(z))
	return w, z, ok
}

// trackError is object-to-image length minus the track, with the object
// where the magnification is met; NaN where no such object exists.
func trackError(m optics.Mat2, length float64, req Requirement) float64 {
	w := (1/req.Mag - m.D) / m.C
	z := -(m.A*w + m.B) * req.Mag // the denominator C w + D is 1/m
	return w + length + z - req.Track
}

// oracleSinglet lists the single-part layouts of a that meet the
// requirement: its own EFL, or both conjugates of the track.
func oracleSinglet(a *oracleCand, req Requirement, lengthMax float64, samples int) []oracleLayout {
	var out []oracleLayout
	emit := func(pos float64, margins ...float64) {
		least := math.Inf(1)
		for _, m := range margins {
			least = math.Min(least, m)
		}
		if least > -1e-6 {
			out = append(out, oracleLayout{a.key(), pos, least})
		}
	}
	m := a.m
	switch req.Kind {
	case Focus:
		emit(0, oracleTol(req.EFLTol, req.EFL)-math.Abs(-1/m.C-req.EFL), -m.A/m.C-req.BFDMin, lengthMax-a.length)
	case Image:
		track := func(w float64) float64 {
			z := -(m.A*w + m.B) / (m.C*w + m.D)
			return w + a.length + z - req.Track
		}
		for _, w := range zeros(track, 0, req.Track-a.length, 1024) {
			z := -(m.A*w + m.B) / (m.C*w + m.D)
			if math.Abs(track(w)) > 1e-6*req.Track || !(z > 0) || !(w > 0) {
				continue
			}
			mag := 1 / (m.C*w + m.D)
			emit(w, oracleTol(req.MagTol, req.Mag)-math.Abs(mag-req.Mag), w-req.WDMin, z-req.BFDMin, lengthMax-a.length)
		}
	}
	return out
}

// searchLayouts are the layouts the search returns that meet every check,
// keyed as the oracle keys them.
func searchLayouts(rs []Result) []oracleLayout {
	var out []oracleLayout
	for _, r := range rs {
		if !r.Meets {
			continue
		}
		var names []string
		for _, u := range r.Parts {
			n := u.ID()
			if u.Reversed {
				n += " reversed"
			}
			names = append(names, n)
		}
		pos := 0.0
		switch {
		case r.Gap != nil:
			pos = *r.Gap
		case r.WorkingDistance != nil:
			pos = *r.WorkingDistance
		}
		out = append(out, oracleLayout{key: strings.Join(names, " + "), pos: pos})
	}
	return out
}

// compareOracle fails unless every clear layout of the oracle is among the
// search's and every layout of the search is among the oracle's (within
// 1e-6 mm of position); layouts within 1e-6 of a limit may be on either
// side.
func compareOracle(t *testing.T, its []Item, req Requirement, samples int) int {
	t.Helper()
	req.Top = 0
	req.Arrangements = true // every layout its own row, as the oracle lists them
	out, err := Find(its, req)
	if err != nil {
		t.Fatal(err)
	}
	got := searchLayouts(out.Results)
	want := oracle(its, req, samples)
	if len(want) >= MaxShown {
		t.Fatalf("%s: the oracle finds %d layouts, past the %d a search keeps: tighten the requirement", req.Kind, len(want), MaxShown)
	}
	var missing, extra []string
	for _, w := range unmatched(want, got) {
		if w.margin > 1e-6 {
			missing = append(missing, fmt.Sprintf("%s at %.6f mm", w.key, w.pos))
		}
	}
	for _, g := range unmatched(got, want) {
		extra = append(extra, fmt.Sprintf("%s at %.6f mm", g.key, g.pos))
	}
	sort.Strings(missing)
	sort.Strings(extra)
	if len(missing) > 0 || len(extra) > 0 {
		t.Errorf("%s: the search has %d layouts, the oracle %d\nmissing from the search (%d): %s\nnot found by the oracle (%d): %s",
			req.Kind, len(got), len(want), len(missing), head(missing), len(extra), head(extra))
	}
	return len(got)
}

// unmatched lists the layouts of xs that ys lacks: none of the same parts
// within 1e-6 mm (and 1e-6 relative) of its position.
func unmatched(xs, ys []oracleLayout) []oracleLayout {
	at := map[string][]float64{}
	for _, y := range ys {
		at[y.key] = append(at[y.key], y.pos)
	}
	for _, ps := range at {
		sort.Float64s(ps)
	}
	var out []oracleLayout
	for _, x := range xs {
		ps := at[x.key]
		tol := 1e-6 * (1 + math.Abs(x.pos))
		i := sort.SearchFloat64s(ps, x.pos-tol)
		if i == len(ps) || ps[i] > x.pos+tol {
			out = append(out, x)
		}
	}
	return out
}

func head(s []string) string {
	if len(s) > 8 {
		return strings.Join(s[:8], "; ") + "; ..."
	}
	return strings.Join(s, "; ")
}

// oracleRequirements are a focus, an image and an expander with the limits
// that bound the gap scan (an envelope maximum, or the track).
func oracleRequirements() map[string]Requirement {
	focus := focusReq(75)
	focus.BFDMin, focus.LengthMax, focus.GapMin = 40, 12, 1
	img := imageReq(300, -0.36)
	img.MagTol = Tolerance{Value: 2, Percent: true}
	img.WDMin, img.BFDMin, img.LengthMax = 60, 40, 12
	exp := expandReq(5)
	exp.ExpandTol, exp.LengthMax = Tolerance{Value: 2, Percent: true}, 150
	return map[string]Requirement{"focus": focus, "image": img, "expand": exp}
}

// The search finds exactly the layouts the oracle finds on the demo
// catalog (the image case, the slowest, not under -short; TestOracleRandom
// keeps an image case there).
func TestOracleDemo(t *testing.T) {
	its := demoItems(t)
	for name, req := range oracleRequirements() {
		t.Run(name, func(t *testing.T) {
			if name == "image" && testing.Short() {
				t.Skip("slow; runs without -short")
			}
			if n := compareOracle(t, its, req, 200); n < 10 {
				t.Errorf("only %d layouts: the comparison proves little", n)
			}
		})
	}
}

// The same on random synthetic catalogs of a few hundred parts with random
// requirements; one image case of a smaller catalog under -short.
func TestOracleRandom(t *testing.T) {
	cases, parts := 6, 300
	if testing.Short() {
		cases, parts = 1, 100
	}
	rng := rand.New(rand.NewPCG(3, 4))
	for k := range cases {
		entries := synth.Catalog(uint64(100+k), parts)
		its := Items(entries, nil)
		req := Defaults()
		switch (k + 1) % 3 {
		case 0:
			req.Kind, req.EFL, req.EFLTol = Focus, 30+rng.Float64()*200, Tolerance{Value: 1, Percent: true}
			req.BFDMin = rng.Float64() * 30
			req.LengthMax = 8 + rng.Float64()*10
		case 1:
			req.Kind, req.Track, req.MagTol = Image, 150+rng.Float64()*500, Tolerance{Value: 2, Percent: true}
			req.Mag = -(0.1 + rng.Float64()*3)
			if rng.IntN(4) == 0 {
				req.Mag = -req.Mag
			}
			req.WDMin, req.BFDMin = req.Track/6+rng.Float64()*req.Track/6, req.Track/6+rng.Float64()*req.Track/6
			req.LengthMax = 10 + rng.Float64()*20
		case 2:
			req.Kind, req.Expansion, req.ExpandTol = Expand, 0.3+rng.Float64()*8, Tolerance{Value: 3, Percent: true}
			req.Form = []Form{AnyForm, Keplerian, Galilean}[rng.IntN(3)]
			req.LengthMax = 40 + rng.Float64()*300
		}
		req.GapMin = rng.Float64() * 2
		req.Wavelength = []float64{587.5618, 632.8, 1064}[rng.IntN(3)]
		if err := req.Validate(); err != nil {
			t.Fatalf("case %d: %v", k, err)
		}
		t.Run(fmt.Sprintf("case %d %s", k, req.Kind), func(t *testing.T) {
			if n := compareOracle(t, its, req, 200); n < 10 {
				t.Errorf("only %d layouts: the comparison proves little", n)
			} else {
				t.Logf("%d layouts", n)
			}
		})
	}
}
