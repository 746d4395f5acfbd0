package search

import (
	"fmt"
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
	out := Outcome{Requirement: req, Candidates: len(p.cands), Evaluated: s.evaluated, Solved: s.solved}
	ls := s.sorted()
	met, traced := len(ls), 0
	var js []judgement
	if req.TracesRays() {
		if err := s.fetchJudged(p, ls); err != nil {
			return Outcome{}, err
		}
		ls, js, traced = s.judge(p, ls)
	}
	for k := range ls {
		r := s.result(p, &ls[k], k+1)
		if js != nil {
			js[k].apply(&r, s.sc.w)
		}
		out.Results = append(out.Results, r)
	}
	out.Notes = notes(p, req)
	if met > 0 {
		out.Notes = append(out.Notes, qualityNotes(req, traced, met, js)...)
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
