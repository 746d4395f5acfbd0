package main

import (
	"context"
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"slices"

	"cardinal/catalog"
	"cardinal/search/saved"
	"cardinal/search/solution"
)

// keptDemoPath is where the demo catalog is kept beside where the user's
// catalog is or would be (demo-VERSION.db): searches run on it live there.
func keptDemoPath(loc catalogLocation) string {
	return filepath.Join(filepath.Dir(loc.Path), "demo-"+catalog.DemoVersion()+".db")
}

// isKeptDemo tells whether path is the demo catalog kept in a file.
func isKeptDemo(path string) bool {
	return filepath.Base(path) == "demo-"+catalog.DemoVersion()+".db"
}

// A shelf is the book of saved searches a reference points into, with the
// catalog it lives in; Demo when that is the demo catalog.
type shelf struct {
	*saved.Book
	st   *catalog.Store
	Demo bool
}

func (s *shelf) Close() error { return s.st.Close() }

// openShelf opens the catalog a reference to a saved search points into:
// the user's catalog (the demo catalog when there is none yet) or, for
// demo:N once the user has a catalog, the demo catalog kept beside it.
func openShelf(e *env, db string, ref saved.Ref) (*shelf, error) {
	loc, err := locateCatalog(db, e)
	if err != nil {
		return nil, err
	}
	ok, err := loc.exists()
	if err != nil {
		return nil, err
	}
	if ref.Demo && ok {
		st, err := openKeptDemo(loc)
		if err != nil {
			return nil, err
		}
		if st == nil {
			return nil, notFoundErrorf("no search %s: no search has been run on the demo catalog here (%s does not exist)", ref, keptDemoPath(loc))
		}
		return &shelf{Book: saved.New(st), st: st, Demo: true}, nil
	}
	st, err := e.stores().Read(db)
	if err != nil {
		return nil, err
	}
	return &shelf{Book: saved.New(st), st: st, Demo: !ok}, nil
}

// openKeptDemo opens the kept demo catalog beside the user's, nil when
// there is none (it is never built for this: it would hold no searches).
func openKeptDemo(loc catalogLocation) (*catalog.Store, error) {
	path := keptDemoPath(loc)
	if _, err := os.Stat(path); err != nil {
		return nil, nil
	}
	st, err := catalog.Open(path)
	return st, catalogError(err)
}

// loadSearch opens the shelf a reference points into and loads the saved
// search; the caller closes the shelf.
func loadSearch(e *env, db, refText string) (*shelf, *saved.Search, error) {
	ref, err := saved.ParseRef(refText)
	if err != nil {
		return nil, nil, savedError(err)
	}
	sh, err := openShelf(e, db, ref)
	if err != nil {
		return nil, nil, err
	}
	s, err := sh.Load(context.Background(), ref)
	if err != nil {
		sh.Close()
		return nil, nil, savedLookupError(e, db, ref, err)
	}
	return sh, s, nil
}

// loadPicked loads a saved search and picks its results by rank with their
// parts and the drawer, from the catalog the search ran on.
func loadPicked(e *env, db, ref string, ranks []int) (*saved.Picked, error) {
	sh, s, err := loadSearch(e, db, ref)
	if err != nil {
		return nil, err
	}
	defer sh.Close()
	p, err := sh.Pick(context.Background(), s, ranks)
	return p, savedError(err)
}

// loadSolutions loads the picked results rebuilt as solutions and writes
// the cautions their requirement calls for: what draw and report start
// from.
func loadSolutions(e *env, db, ref string, ranks []int) (*saved.Picked, []solution.Solution, error) {
	p, err := loadPicked(e, db, ref, ranks)
	if err != nil {
		return nil, nil, err
	}
	sols, err := rebuild(e, p)
	if err != nil {
		return nil, nil, err
	}
	writeCautions(e, p.Search.Requirement, solution.Results(sols)...)
	return p, sols, nil
}

// rebuild turns the picks into solutions and warns on stderr about any the
// catalog has changed since the search.
func rebuild(e *env, p *saved.Picked) ([]solution.Solution, error) {
	sols, changes, err := p.Rebuild()
	if err != nil {
		return nil, savedError(err)
	}
	for _, c := range changes {
		notef(e, "warning: search %d, %s (the catalog changed since the search)\n", p.Search.ID, c)
	}
	return sols, nil
}

// savedError maps the errors of saved searches to exit codes: a search or
// part that is not there is not found, a reference or rank that cannot be
// one is a usage error.
func savedError(err error) error {
	var nf *saved.NotFoundError
	var mp *saved.MissingPartError
	var pe *saved.PickError
	var re *saved.RefError
	var cre *catalog.RefError
	switch {
	case err == nil:
		return nil
	case errors.As(err, &nf), errors.As(err, &mp):
		return &cmdError{exitNotFound, err}
	case errors.As(err, &pe):
		return usageErrorf("--pick %d: %v ('cardinal searches show %d' lists them)", pe.Rank, err, pe.ID)
	case errors.As(err, &re), errors.As(err, &cre):
		return &cmdError{exitUsage, err}
	}
	return catalogError(err)
}

// savedLookupError says what to do when a saved search is not there: run a
// search first, or, once the user has a catalog of their own, reach the
// searches run on the demo catalog as demo:N.
func savedLookupError(e *env, db string, ref saved.Ref, err error) error {
	var nf *saved.NotFoundError
	if !errors.As(err, &nf) {
		return savedError(err)
	}
	hint := "run 'cardinal find ...' first (a search run on the demo catalog is saved in it, until you import your own); 'cardinal searches list' lists the saved ones"
	if n := demoSearchCount(e, db); !ref.Demo && n > 0 {
		hint = fmt.Sprintf("the %d searches run on the demo catalog before you imported your own are reached as demo:NUMBER (see 'cardinal searches list')", n)
	}
	return notFoundErrorf("%v: %s", err, hint)
}

// demoSearchCount is how many searches the kept demo catalog holds beside
// the user's catalog; 0 when the user has none or there is no kept demo.
func demoSearchCount(e *env, db string) int {
	loc, err := locateCatalog(db, e)
	if err != nil {
		return 0
	}
	if ok, _ := loc.exists(); !ok {
		return 0
	}
	st, err := openKeptDemo(loc)
	if err != nil || st == nil {
		return 0
	}
	defer st.Close()
	list, err := saved.New(st).List(context.Background())
	if err != nil {
		return 0
	}
	return len(list)
}

// checkPicks checks the --pick list: at least one rank, positive, no
// repeats; one only when single.
func checkPicks(picks []int, single bool) error {
	switch {
	case len(picks) == 0:
		return usageErrorf("say which results to use with --pick, e.g. --pick 1 (the ranks that find printed)")
	case single && len(picks) > 1:
		return usageErrorf("--pick %v: this command draws one result at a time", picks)
	}
	for i, p := range picks {
		if p < 1 {
			return usageErrorf("--pick %d: ranks start at 1", p)
		}
		if slices.Contains(picks[:i], p) {
			return usageErrorf("--pick lists %d twice", p)
		}
	}
	return nil
}
