package search

import (
	"fmt"
	"math"
	"sort"
	"sync/atomic"
	"time"
)

// An Outcome is what a search found, and what a person needs to read it.
type Outcome struct {
	Requirement Requirement `json:"requirement"`
	// Results meet every constraint, best first, at most Top of them.
	Results []Result `json:"results"`
	// Misses are the nearest misses, filled only when nothing meets.
	Misses []Result `json:"misses,omitempty"`
	// Why says in words why nothing meets (empty when something does).
	Why []string `json:"why,omitempty"`
	// Notes are lines for the reader: no aperture check, wavelength
	// warnings, parts set aside.
	Notes []string `json:"notes,omitempty"`
	// Candidates is the number of parts in their orientations searched;
	// Evaluated the number of ordered pairs solved; Solved the layouts that
	// reached the first-order target.
	Candidates int `json:"candidates"`
	Evaluated  int `json:"evaluated"`
	Solved     int `json:"solved"`
	// Met is how many layouts meet every check when MetExact; otherwise
	// the kept list filled up, the bound it set pruned the rest, and Met is
	// only known to be at least the number kept (and is not reported, as
	// it depends on the order the workers ran in).
	Met      int  `json:"-"`
	MetExact bool `json:"-"`
}

// Find runs the pruned search. The requirement is validated first.
func Find(items []Item, req Requirement) (Outcome, error) {
	return run(items, req, true)
}

// FindExhaustive solves every part and every ordered pair: the reference
// the pruned search is tested against, and the baseline of the benchmarks.
func FindExhaustive(items []Item, req Requirement) (Outcome, error) {
	return run(items, req, false)
}

func run(items []Item, req Requirement, prune bool) (Outcome, error) {
	if err := req.Validate(); err != nil {
		return Outcome{}, err
	}
	return runPrepared(prepare(items, req), req, prune)
}

// runPrepared searches the prepared candidates.
func runPrepared(p *prepared, req Requirement, prune bool) (Outcome, error) {
	class := twinClasses(p, p.cands)
	s, ls, exact := firstOrderGroups(p, req, prune, class)
	p.forest = forest{} // the real-ray stage need not hold the trees
	out := Outcome{Requirement: req, Candidates: len(p.cands), Evaluated: s.evaluated, Solved: s.solved,
		Met: s.met, MetExact: exact}
	met, traced := len(ls), 0
	var js []judgement
	if req.TracesRays() || req.Gaussian() {
		n := len(ls)
		if !req.Gaussian() {
			n = min(n, maxTraced)
		}
		if err := s.fetchParts(p, ls[:n]); err != nil {
			return Outcome{}, err
		}
	}
	var cs []collimation
	switch {
	case req.TracesRays():
		ls, js, traced = s.judge(p, ls)
	case req.collimates():
		ls, cs = s.collimate(p, ls)
	}
	gs := s.groups(class, ls)
	if req.Arrangements {
		gs = make([][]int, len(ls))
		for i := range ls {
			gs[i] = []int{i}
		}
	}
	// Every row kept goes to the build study, which orders the first
	// maxStudied again and then keeps the top N (studyBuilds).
	rows := make([]layout, len(gs))
	var rowJ []judgement
	for k, g := range gs {
		rows[k] = ls[g[0]]
		r := s.result(p, &ls[g[0]], k+1)
		if js != nil {
			js[g[0]].apply(&r, s.sc.w)
			rowJ = append(rowJ, js[g[0]])
		}
		s.laserOf(p, ls, cs, g[0], &r)
		others := make([]layout, 0, len(g)-1)
		r.OtherArrangements = len(g) - 1
		for n, i := range g[1:] {
			others = append(others, ls[i])
			if n >= arrangementsListed {
				continue
			}
			a := s.result(p, &ls[i], k+1)
			a.Arrangement = n + 1
			if js != nil {
				js[i].apply(&a, s.sc.w)
			}
			s.laserOf(p, ls, cs, i, &a)
			r.Arrangements = append(r.Arrangements, a)
		}
		r.Alternatives = s.alternatives(p, class, &ls[g[0]], others)
		out.Results = append(out.Results, r)
	}
	js = rowJ
	var err error
	if out.Results, err = s.studyBuilds(p, rows, out.Results); err != nil {
		return Outcome{}, err
	}
	out.Notes = notes(p, req)
	if met > 0 {
		out.Notes = append(out.Notes, qualityNotes(req, traced, met, js)...)
	}
	if req.Gaussian() && len(out.Results) > 0 {
		out.Notes = append(out.Notes, GhostNotes(req)...)
	}
	if n := shownNote(out); n != "" {
		out.Notes = append(out.Notes, n)
	}
	if n := arrangementsNote(out.Results); n != "" {
		out.Notes = append(out.Notes, n)
	}
	if len(out.Results) == 0 {
		out.Why = s.why(p)
		out.Misses = nearMisses(p, req, prune)
	}
	if out.Results == nil {
		out.Results = []Result{}
	}
	return out, nil
}

// laserOf adds the Gaussian-beam figures of layout k to r when the
// requirement treats the input as a laser beam.
func (s *search) laserOf(p *prepared, ls []layout, cs []collimation, k int, r *Result) {
	if !s.req.Gaussian() {
		return
	}
	var c *collimation
	if cs != nil {
		c = &cs[k]
	}
	s.laserResult(p, &ls[k], r, c)
}

// firstOrderGroups runs the first-order search until it keeps layouts of
// at least survivors(req) distinct part sets (twins as one; group.go), or
// all that meet, widening the number kept fourfold at a time (up to 256
// times); it returns the search, the kept layouts of the first
// survivors(req) part sets, best first, and whether the search kept every
// layout that meets (so that its count of them is exact).
//
// The layouts a search keeps are the best of all by the ranking order,
// which is total (better), so the first k of a search that keeps more are
// what a search keeping k keeps: one search keeping 16 times as many
// answers for the first three widths, and each further search for the
// next one.
func firstOrderGroups(p *prepared, req Requirement, prune bool, class []int32) (*search, []layout, bool) {
	want := survivors(req)
	if !req.TracesRays() {
		// The build study reorders the first maxStudied rows whatever N
		// is, so --top N keeps that many rows for it: its N rows are then
		// the first N of the full list (group_test.go).
		want = max(want, min(maxStudied, MaxShown))
	}
	keep := want
	if req.Arrangements {
		s := newSearch(p, req, limitsOf(req), keep)
		if prune {
			s.pruned()
		} else {
			s.exhaustive()
		}
		return s, s.sorted(), !s.full()
	}
	run := min(16*keep, 256*want)
	for {
		s := newSearch(p, req, limitsOf(req), run)
		if prune {
			s.pruned()
		} else {
			s.exhaustive()
		}
		all := s.sorted()
		for ; capped(keep) <= capped(run); keep *= 4 {
			ls := all[:min(capped(keep), len(all))]
			if keep == 0 || len(ls) < keep || keep >= 256*want || s.countGroups(class, ls) >= want {
				if want > 0 {
					var kept []layout
					for i, g := range s.groups(class, ls) {
						if i == want {
							break
						}
						for _, k := range g {
							kept = append(kept, ls[k])
						}
					}
					sortLayouts(s, kept)
					ls = kept
				}
				return s, ls, len(all) < capped(keep)
			}
		}
		run = keep
	}
}

// capped is the number of layouts a search asked to keep k keeps
// (newSearch).
func capped(k int) int {
	if k < 1 || k > MaxShown {
		return MaxShown
	}
	return k
}

// sortLayouts puts layouts in the ranking order.
func sortLayouts(s *search, ls []layout) {
	sort.Slice(ls, func(i, j int) bool { return s.better(&ls[i], &ls[j]) })
}

// nearMisses runs the search again with looser limits and returns its best
// layouts, each with the checks of the real requirement.
func nearMisses(p *prepared, req Requirement, prune bool) []Result {
	const keep = 5
	s := newSearch(p, req, looser(req), keep)
	s.misses = true
	if prune {
		s.pruned()
	} else {
		s.exhaustive()
	}
	var out []Result
	for k, l := range s.sorted() {
		out = append(out, s.result(p, &l, k+1))
	}
	return out
}

// notes are the lines printed with every outcome.
func notes(p *prepared, req Requirement) []string {
	var n []string
	if !req.ChecksAperture() {
		n = append(n, "clear apertures not checked: give --beam, --na or --object-height to check ray heights")
	} else if req.Kind == Image {
		n = append(n, "ray heights checked with the aperture stop at the first part")
	}
	n = append(n, p.warnings...)
	reasons := make([]string, 0, len(p.skipped))
	for r := range p.skipped {
		reasons = append(reasons, r)
	}
	sort.Strings(reasons)
	for _, r := range reasons {
		n = append(n, fmt.Sprintf("%d %s set aside: %s", p.skipped[r], plural(p.skipped[r], "part", "parts"), r))
	}
	return n
}

// arrangementsListed bounds the other arrangements kept under a row in
// full (Result.Arrangements, best first); Result.OtherArrangements counts
// them all. A variable only so that tests can list every one. Catalogs with many twins (a part sold with several coatings)
// give hundreds of arrangements of one set of parts, each as long as a
// row: listing them all made the saved search and the JSON megabytes long
// for ten rows, and --arrangements lists every one as its own row.
var arrangementsListed = 20

// maxStudied bounds the build study when every result is asked for (--top
// 0): the best this many are studied, the rest keep their order after them
// without build figures.
const maxStudied = 100

// studyWall adds up the wall time, ns, that studyBuilds spends on the
// study (reading the studied parts' prescriptions, the builds, the spots
// of the shown rows, the new order): what find would not spend without
// it, read by BenchmarkFindStudyAdded.
var studyWall atomic.Int64

// studyBuilds simulates the build of every ranked result (study.go), adds
// the yield and spread terms to the scores, orders the results again and
// keeps the requirement's top N.
func (s *search) studyBuilds(p *prepared, ls []layout, rs []Result) ([]Result, error) {
	if len(rs) == 0 || s.req.Kind == Match {
		// Mode matching is judged by its coupling and the spacing
		// tolerance of a 1 % drop (match.go), not by a build study of
		// a first-order target.
		return rs, nil
	}
	if s.req.noBuildStudy {
		return s.keepShown(rs), nil
	}
	defer func(t0 time.Time) { studyWall.Add(int64(time.Since(t0))) }(time.Now())
	n := min(len(ls), maxStudied)
	if err := s.fetchParts(p, ls[:n]); err != nil {
		return nil, err
	}
	sus := make([]Setup, n)
	for k := range sus {
		sus[k] = s.setup(p, &ls[k])
	}
	sts := studyAll(s.req, sus)
	tolPct := 100 * s.tol / math.Abs(target(s.req))
	for k := range rs {
		if k >= n || sts[k] == nil {
			continue
		}
		b := sts[k].BuildFigures
		rs[k].Build = &b
		rs[k].Score += s.sc.w.buildTerm(b, tolPct)
		if b.Yield < 90 {
			rs[k].Reason += fmt.Sprintf(", %.0f%% of builds meet", b.Yield)
		}
	}
	// Only the studied results are ordered again: the rest follow them
	// (maxStudied is below maxTraced, so every studied result was traced
	// where rays are traced, and traced results keep coming first).
	order := make([]int, n)
	for k := range order {
		order[k] = k
	}
	sort.SliceStable(order, func(i, j int) bool {
		a, b := &rs[order[i]], &rs[order[j]]
		if a.Meets != b.Meets {
			return a.Meets
		}
		return a.Score < b.Score
	})
	sorted := make([]Result, n)
	for k, i := range order {
		sorted[k] = rs[i]
	}
	copy(rs, sorted)
	rs = s.keepShown(rs)
	s.shownSpots(rs, sus, order)
	return rs, nil
}

// keepShown keeps the requirement's top N results and numbers them.
func (s *search) keepShown(rs []Result) []Result {
	if len(rs) > s.req.Shown() {
		rs = rs[:s.req.Shown()]
	}
	for k := range rs {
		rs[k].Rank = k + 1
		for i := range rs[k].Arrangements {
			rs[k].Arrangements[i].Rank = k + 1
		}
	}
	return rs
}

// maxSpotRows bounds the rows find traces builds for: the default top 10
// (--top 0 shows every result; the rest go without spot figures).
const maxSpotRows = 10

// shownSpots adds the spot figures of a cheap real-ray trace of the first
// builds (spot.go) to the first maxSpotRows shown rows that real rays
// judged; order[k] is the setup of studied row k.
func (s *search) shownSpots(rs []Result, sus []Setup, order []int) {
	if !s.req.TracesRays() {
		return
	}
	var pick []Setup
	var rows []int
	for k := range rs[:min(len(rs), maxSpotRows)] {
		if k < len(order) && rs[k].Build != nil && rs[k].ImageQuality != nil {
			pick, rows = append(pick, sus[order[k]]), append(rows, k)
		}
	}
	for i, st := range findSpots(s.req, pick) {
		if st == nil {
			continue
		}
		b := *rs[rows[i]].Build
		b.SpotBuilds, b.SpotLow, b.SpotMedian, b.SpotHigh, b.SpotLost = st.SpotBuilds, st.SpotLow, st.SpotMedian, st.SpotHigh, st.SpotLost
		rs[rows[i]].Build = &b
	}
}

// setup is a layout as it is built: its parts turned as used, their stated
// tolerances and the solved distances.
func (s *search) setup(p *prepared, l *layout) Setup {
	su := Setup{Gap: l.gap, WorkingDistance: zeroNaN(l.wd), BackClearance: zeroNaN(l.bc)}
	idx := []int32{l.a}
	if l.pair() {
		idx = append(idx, l.b)
	} else {
		su.Gap = 0
	}
	for _, ci := range idx {
		c := &s.c[ci]
		part := p.full(c.item)
		if c.rev {
			part = part.Reversed()
		}
		su.Parts = append(su.Parts, part)
		su.Tols = append(su.Tols, p.tols(c.item))
	}
	return su
}

func zeroNaN(v float64) float64 {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return 0
	}
	return v
}

// arrangementsNote explains the "+N" beside a row whose parts also meet
// in other arrangements, when some row has them.
func arrangementsNote(rs []Result) string {
	listed := ""
	for _, r := range rs {
		if r.OtherArrangements > arrangementsListed {
			listed = fmt.Sprintf("; JSON and saved searches keep the best %d of them under each row", arrangementsListed)
		}
	}
	for _, r := range rs {
		if r.OtherArrangements > 0 {
			return "+N beside a row: the same parts also meet the requirement in N other arrangements (order, orientation or solved spacing); --arrangements lists each as its own row" + listed
		}
	}
	return ""
}

// shownNote says, when the list shown may not be every layout that
// meets, how many met (when that is known), how many are shown and how to
// see more or narrow the requirement.
func shownNote(out Outcome) string {
	shown := len(out.Results)
	if shown == 0 || out.MetExact && out.Met <= shown {
		return ""
	}
	more := fmt.Sprintf("--top shows more (at most %d); ", MaxShown)
	if out.Requirement.Shown() >= MaxShown {
		more = ""
	}
	how := more + "a tighter tolerance, --envelope-max, --diameter-max or --supplier narrows the requirement"
	if out.MetExact {
		return fmt.Sprintf("%d shown of the %d layouts that meet the requirement: %s", shown, out.Met, how)
	}
	return fmt.Sprintf("the best %d shown; more layouts may meet the requirement (the search stops counting once the best are certain): %s", shown, how)
}
