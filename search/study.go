package search

import (
	"cmp"
	"encoding/binary"
	"hash/fnv"
	"math"
	"math/rand/v2"
	"runtime"
	"slices"
	"sync"

	"cardinal/optics"
)

// BuildFigures sum up the simulated builds of one result: what find shows
// in every row. Percentages are of the target; lengths in mm.
type BuildFigures struct {
	// Compensator is what moved in each build (image, gap or none).
	Compensator Compensator `json:"compensator"`
	// AdjustLow and AdjustHigh bound the compensator's move in 95 % of the
	// builds (2.5th and 97.5th percentiles), mm: the travel the mount must
	// allow. With no compensator, the error left (defocus, or the gap
	// change an expander would need).
	AdjustLow  float64 `json:"adjust_low_mm"`
	AdjustHigh float64 `json:"adjust_high_mm"`
	// SpreadLow and SpreadHigh bound the target figure after compensation
	// in 95 % of the builds, in percent from the target.
	SpreadLow  float64 `json:"spread_low_pct"`
	SpreadHigh float64 `json:"spread_high_pct"`
	// Yield is the share of builds whose target figure meets the
	// requirement's tolerance after compensation, percent.
	Yield  float64 `json:"yield_pct"`
	Trials int     `json:"trials"`
	// Dominant names the tolerance that moves the target figure most (or,
	// where the compensator absorbs them all, the compensator).
	Dominant string `json:"dominant"`
	// SpotBuilds is how many compensated builds were traced with real rays
	// for the spot figures (spot.go): every build in the tolerance
	// command, the first FindSpotBuilds of the shown rows in find, none
	// when the requirement traces no rays. SpotLow, SpotMedian and
	// SpotHigh are the 2.5th, 50th and 97.5th percentiles of their on-axis
	// RMS spot radius at the compensated focus, um; SpotLost counts the
	// traced builds no ray of which reached the image.
	SpotBuilds int     `json:"spot_builds,omitempty"`
	SpotLow    float64 `json:"spot_low_um,omitempty"`
	SpotMedian float64 `json:"spot_median_um,omitempty"`
	SpotHigh   float64 `json:"spot_high_um,omitempty"`
	SpotLost   int     `json:"spot_lost,omitempty"`
}

// A Sensitivity is the derivative of the target figure and of the
// compensator's move with respect to one toleranced quantity, from the
// ray-transfer matrices carried with their derivatives (optics.Dual).
type Sensitivity struct {
	Param
	// Target is the derivative of the target figure per unit of the
	// parameter (per percent for a focal length or radius, per mm for a
	// thickness or spacing, per unit of index).
	Target float64 `json:"d_target_per_unit"`
	// Adjust is the derivative of the compensator's move, mm per unit.
	Adjust float64 `json:"d_adjust_mm_per_unit"`
	// TargetAtTol and AdjustAtTol are the changes at the tolerance:
	// |derivative| x tolerance (target in its own unit, adjust in mm).
	TargetAtTol float64 `json:"target_change_at_tol"`
	AdjustAtTol float64 `json:"adjust_mm_at_tol"`
}

// A Study is the whole simulation of one result's build.
type Study struct {
	BuildFigures
	// Target and Tol are the requirement's target and absolute tolerance.
	Target float64 `json:"target"`
	Tol    float64 `json:"target_tol"`
	// Sensitivities, most important first (see rank).
	Sensitivities []Sensitivity `json:"sensitivities"`
	// LinearTargetSD and LinearAdjustSD are the standard deviations that
	// linear propagation of the sensitivities predicts (root sum of
	// squares of derivative x standard deviation of each tolerance).
	LinearTargetSD float64 `json:"linear_target_sd"`
	LinearAdjustSD float64 `json:"linear_adjust_sd_mm"`
	// TargetSD and AdjustSD are the standard deviations of the builds.
	TargetSD float64 `json:"target_sd"`
	AdjustSD float64 `json:"adjust_sd_mm"`
	// Failed counts the builds whose compensator had no solution.
	Failed int `json:"failed"`
	// Adjust and Figure hold each solved build's compensator move (mm) and
	// target figure, in trial order.
	Adjust []float64 `json:"-"`
	Figure []float64 `json:"-"`
	// Spot holds the RMS spot of each traced build, um (spot.go).
	Spot []float64 `json:"-"`
}

// StudyBuild simulates the build of one result of the requirement with the
// requirement's build settings, and computes its sensitivities. Where the
// requirement traces real rays, every compensated build is traced for its
// spot (spot.go).
func StudyBuild(req Requirement, su Setup) (Study, error) {
	m, err := newModel(req, su)
	if err != nil {
		return Study{}, err
	}
	st := m.study(req.Build, streamOf(su))
	m.spots(req.Build, streamOf(su), -1, &st)
	return st, nil
}

// studyFirstOrder is StudyBuild without the real rays: what find runs
// for every result it ranks.
func studyFirstOrder(req Requirement, su Setup) (Study, error) {
	m, err := newModel(req, su)
	if err != nil {
		return Study{}, err
	}
	return m.study(req.Build, streamOf(su)), nil
}

// streamOf picks the random stream of a setup from its parts and their
// turning, so that the same result gets the same builds in find and in
// the tolerance command, whatever its rank.
func streamOf(su Setup) uint64 {
	h := fnv.New64a()
	for _, p := range su.Parts {
		h.Write([]byte(p.ID()))
		h.Write([]byte{0})
		if len(p.Surfaces) > 0 {
			h.Write(binary.LittleEndian.AppendUint64(nil, math.Float64bits(p.Surfaces[0].Curvature())))
		}
	}
	return h.Sum64()
}

func (m *model) study(b BuildSettings, stream uint64) Study {
	st := Study{Target: m.target, Tol: m.tol}
	st.Sensitivities = m.sensitivities(b.Distribution)
	sd := sdFactor(b.Distribution)
	for _, s := range st.Sensitivities {
		st.LinearTargetSD = math.Hypot(st.LinearTargetSD, s.Target*s.Tol*sd)
		st.LinearAdjustSD = math.Hypot(st.LinearAdjustSD, s.Adjust*s.Tol*sd)
	}
	n := b.trials()
	rng := rand.New(rand.NewPCG(b.Seed, stream))
	v := make([]float64, len(m.params))
	met := 0
	st.Adjust, st.Figure = make([]float64, 0, n), make([]float64, 0, n)
	for i := 0; i < n; i++ {
		t, ok := m.buildValue(rng, b.Distribution, v)
		if !ok {
			st.Failed++
			continue
		}
		st.Adjust = append(st.Adjust, t.adjust.V)
		st.Figure = append(st.Figure, t.figure.V)
		if math.Abs(t.figure.V-m.target) <= m.tol*(1+1e-12) {
			met++
		}
	}
	st.Compensator, st.Trials = m.comp, n
	st.Yield = 100 * float64(met) / float64(n)
	if len(st.Adjust) > 0 {
		scratch := make([]float64, 0, 64)
		st.AdjustLow, st.AdjustHigh = percentilesIn(scratch, st.Adjust, 2.5, 97.5)
		lo, hi := percentilesIn(scratch, st.Figure, 2.5, 97.5)
		st.SpreadLow, st.SpreadHigh = m.pct(lo), m.pct(hi)
		st.AdjustSD, st.TargetSD = stdDev(st.Adjust), stdDev(st.Figure)
	}
	st.Dominant = dominant(st.Sensitivities, m.tol)
	return st
}

// FigureRange is the target figure's 95 % range after compensation in
// the figure's own unit, low to high.
func (st Study) FigureRange() (lo, hi float64) {
	a, b := st.Target*(1+st.SpreadLow/100), st.Target*(1+st.SpreadHigh/100)
	return min(a, b), max(a, b)
}

// pct is a figure's departure from the target in percent of the target.
func (m *model) pct(v float64) float64 { return 100 * (v - m.target) / math.Abs(m.target) }

// unitDraw is one draw of a tolerance of 1: uniform on [-1, 1], or normal
// with standard deviation 1/2 (the tolerance at two standard deviations).
func unitDraw(rng *rand.Rand, d Distribution) float64 {
	if d == Normal {
		return 0.5 * rng.NormFloat64()
	}
	return 2*rng.Float64() - 1
}

// sdFactor is the standard deviation of unitDraw: 1/sqrt(3) for the
// uniform distribution on [-1, 1] (the variance of a uniform distribution
// of width w is w^2/12; JCGM 100:2008, Guide to the Expression of
// Uncertainty in Measurement, sec. 4.3.7), 1/2 for the normal.
func sdFactor(d Distribution) float64 {
	if d == Normal {
		return 0.5
	}
	return 1 / math.Sqrt(3)
}

// sensitivities differentiates the compensated build with respect to each
// parameter at the nominal build, one parameter at a time, and orders them
// by importance.
func (m *model) sensitivities(dist Distribution) []Sensitivity {
	d := make(draw, len(m.params))
	out := make([]Sensitivity, 0, len(m.params))
	for j, p := range m.params {
		clear(d)
		d[j] = optics.Var(0)
		t := m.eval(d)
		s := Sensitivity{Param: p}
		if t.ok {
			s.Target, s.Adjust = finite(t.figure.D), finite(t.adjust.D)
		}
		s.TargetAtTol, s.AdjustAtTol = math.Abs(s.Target)*p.Tol, math.Abs(s.Adjust)*p.Tol
		out = append(out, s)
	}
	rank(out, m.tol)
	return out
}

func finite(v float64) float64 {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return 0
	}
	return v
}

// rank orders sensitivities by the change of the target figure at the
// tolerance, then by the compensator's move at the tolerance (what the
// compensator absorbs still needs travel), then by key.
func rank(ss []Sensitivity, tol float64) {
	small := 1e-9 * math.Max(tol, 1e-300)
	slices.SortStableFunc(ss, func(a, b Sensitivity) int {
		ta, tb := a.TargetAtTol, b.TargetAtTol
		if ta < small {
			ta = 0
		}
		if tb < small {
			tb = 0
		}
		if c := cmp.Compare(tb, ta); c != 0 {
			return c
		}
		return cmp.Compare(b.AdjustAtTol, a.AdjustAtTol)
	})
}

// dominant names the most important tolerance.
func dominant(ss []Sensitivity, tol float64) string {
	if len(ss) == 0 || ss[0].TargetAtTol == 0 && ss[0].AdjustAtTol == 0 {
		return ""
	}
	return ss[0].Name
}

// percentiles are the p-th percentiles of v (0-100), by linear
// interpolation between order statistics (definition 7 of R. J. Hyndman
// and Y. Fan, The American Statistician 50, 361, 1996). v is not changed.
func percentiles(v []float64, ps ...float64) (lo, hi float64) {
	return percentilesIn(nil, v, ps...)
}

// percentilesIn is percentiles with scratch space s (any length): the
// two order statistics each percentile needs are found among the few
// values in its tail (orderPair), not by sorting; they are the very values
// a sort would put at those places.
func percentilesIn(s, v []float64, ps ...float64) (lo, hi float64) {
	q := func(p float64) float64 {
		h := (float64(len(v)) - 1) * p / 100
		i := int(math.Floor(h))
		a, b := orderPair(v, min(i, len(v)-1), s)
		if i+1 >= len(v) {
			return b
		}
		return a + (h-float64(i))*(b-a)
	}
	return q(ps[0]), q(ps[1])
}

// orderPair is the k-th and (k+1)-th smallest values of v (from 0; both
// the largest when k is the last place). It keeps the k+2 smallest values
// (or, when fewer, the len(v)-k largest, by the same on -v: negation is
// exact) in a heap in h, so it passes over v once and sorts nothing
// (J. W. J. Williams, Algorithm 232: Heapsort, Communications of the ACM
// 7, 347, 1964, for the heap).
func orderPair(v []float64, k int, h []float64) (a, b float64) {
	n := len(v)
	if k >= n-1 {
		m := v[0]
		for _, x := range v {
			m = max(m, x)
		}
		return m, m
	}
	if k+2 <= n-k {
		return smallestPair(v, k, h, false)
	}
	// With t the values of -v in order, t[i] = -(the (n-1-i)-th of v),
	// so the k-th and (k+1)-th of v are -t[n-1-k] and -t[n-2-k].
	x, y := smallestPair(v, n-2-k, h, true)
	return -y, -x
}

// smallestPair is the k-th and (k+1)-th smallest of v (of -v when neg),
// k+1 below len(v), from a heap of the k+2 smallest whose root is the
// largest of them.
func smallestPair(v []float64, k int, h []float64, neg bool) (a, b float64) {
	m := k + 2
	h = h[:0]
	for _, x := range v {
		if neg {
			x = -x
		}
		switch {
		case len(h) < m:
			h = append(h, x)
			for c := len(h) - 1; c > 0 && h[(c-1)/2] < h[c]; c = (c - 1) / 2 {
				h[c], h[(c-1)/2] = h[(c-1)/2], h[c]
			}
		case x < h[0]:
			h[0] = x
			siftDown(h)
		}
	}
	// h[0] is the (k+1)-th smallest; the k-th is the larger of its
	// children (the heap has m >= 2 values).
	a = h[1]
	if len(h) > 2 {
		a = max(a, h[2])
	}
	return a, h[0]
}

// siftDown restores the heap order (each value no smaller than its
// children) after the root changed.
func siftDown(h []float64) {
	for i := 0; ; {
		c := 2*i + 1
		if c >= len(h) {
			return
		}
		if c+1 < len(h) && h[c] < h[c+1] {
			c++
		}
		if h[c] <= h[i] {
			return
		}
		h[i], h[c] = h[c], h[i]
		i = c
	}
}

// stdDev is the sample standard deviation (n - 1 in the denominator).
func stdDev(v []float64) float64 {
	if len(v) < 2 {
		return 0
	}
	mean := 0.0
	for _, x := range v {
		mean += x
	}
	mean /= float64(len(v))
	ss := 0.0
	for _, x := range v {
		ss += (x - mean) * (x - mean)
	}
	return math.Sqrt(ss / float64(len(v)-1))
}

// studyAll studies the setups in parallel, each in its own slot.
func studyAll(req Requirement, sus []Setup) []*Study {
	out := make([]*Study, len(sus))
	inParallel(len(sus), func(i int) {
		if st, err := studyFirstOrder(req, sus[i]); err == nil {
			out[i] = &st
		}
	})
	return out
}

// inParallel calls f(i) for every i below n on up to four goroutines, the
// i spread evenly among them; each call writes only its own slot.
func inParallel(n int, f func(i int)) {
	workers := min(runtime.GOMAXPROCS(0), 4)
	var wg sync.WaitGroup
	for k := 0; k < workers; k++ {
		wg.Add(1)
		go func(k int) {
			defer wg.Done()
			for i := k; i < n; i += workers {
				f(i)
			}
		}(k)
	}
	wg.Wait()
}

// A Histogram counts values in bins of equal width: Edges has one more
// entry than Counts.
type Histogram struct {
	Edges  []float64 `json:"edges"`
	Counts []int     `json:"counts"`
}

// NewHistogram bins the values into n bins spanning their range (one bin
// of width 1e-9 around a single value when they are all equal).
func NewHistogram(v []float64, n int) Histogram {
	if len(v) == 0 || n < 1 {
		return Histogram{}
	}
	lo, hi := slices.Min(v), slices.Max(v)
	if hi-lo <= 1e-12*math.Max(1, math.Abs(lo)) {
		lo, hi, n = lo-5e-10, hi+5e-10, 1
	}
	h := Histogram{Edges: make([]float64, n+1), Counts: make([]int, n)}
	w := (hi - lo) / float64(n)
	for i := range h.Edges {
		h.Edges[i] = lo + float64(i)*w
	}
	h.Edges[n] = hi
	for _, x := range v {
		k := min(int((x-lo)/w), n-1)
		h.Counts[max(k, 0)]++
	}
	return h
}

// FigureName is what the target figure of a requirement is called, with
// its unit ("" for a ratio).
func FigureName(k Kind) (name, unit string) {
	switch k {
	case Focus:
		return "EFL", "mm"
	case Image:
		return "magnification", ""
	}
	return "expansion", ""
}
