package solution_test

import (
	"testing"

	"cardinal/search/solution"
	"cardinal/search/solution/solutiontest"
)

// New refuses a result it cannot rebuild.
func TestNewErrors(t *testing.T) {
	req := solutiontest.Requirements()["image"]
	s := solutiontest.Solve(t, req)[0]
	es := solutiontest.EntryMap(solutiontest.Entries(t))
	r := s.Result
	r.Gap = nil
	if _, err := solution.New(req, r, es); err == nil {
		t.Error("a pair without a gap was accepted")
	}
	delete(es, s.Result.Parts[0].ID())
	if _, err := solution.New(req, s.Result, es); err == nil {
		t.Error("a missing part was accepted")
	}
}
