package search

import (
	"fmt"
	"math"
	"sort"
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
	s := newSearch(p, req, limitsOf(req), survivors(req))
	if prune {
		s.pruned()
	} else {
		s.exhaustive()
	}
	out := Outcome{Requirement: req, Candidates: len(p.cands), Evaluated: s.evaluated, Solved: s.solved,
		Met: s.met, MetExact: !s.full()}
	ls := s.sorted()
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
	for k := range ls {
		r := s.result(p, &ls[k], k+1)
		if js != nil {
			js[k].apply(&r, s.sc.w)
		}
		if req.Gaussian() {
			var c *collimation
			if cs != nil {
				c = &cs[k]
			}
			s.laserResult(p, &ls[k], &r, c)
		}
		out.Results = append(out.Results, r)
	}
	var err error
	if out.Results, err = s.studyBuilds(p, ls, out.Results); err != nil {
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
	if len(out.Results) == 0 {
		out.Why = s.why(p)
		out.Misses = nearMisses(p, req, prune)
	}
	if out.Results == nil {
		out.Results = []Result{}
	}
	return out, nil
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

// maxStudied bounds the build study when every result is asked for (--top
// 0): the best this many are studied, the rest keep their order after them
// without build figures.
const maxStudied = 100

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
	st := rs[:n]
	sort.SliceStable(st, func(i, j int) bool {
		if st[i].Meets != st[j].Meets {
			return st[i].Meets
		}
		return st[i].Score < st[j].Score
	})
	if len(rs) > s.req.Shown() {
		rs = rs[:s.req.Shown()]
	}
	for k := range rs {
		rs[k].Rank = k + 1
	}
	return rs, nil
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
