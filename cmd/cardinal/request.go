package main

import (
	"cardinal/search/present"

	"context"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"slices"
	"time"

	"github.com/spf13/cobra"

	"cardinal/catalog"
	"cardinal/importers"
	"cardinal/search"
	"cardinal/search/export"
)

// requestOptions are the flags of `cardinal request`.
type requestOptions struct {
	env    *env
	db     string
	Search string
	Picks  []int
	Qty    int
	Format string
	Output string
	Force  bool
}

func newRequestCmd(e *env, run func(*requestOptions) error) *cobra.Command {
	o := &requestOptions{env: e}
	cmd := &cobra.Command{
		Use:   "request SEARCH --pick N[,N...]",
		Short: "Purchase request for chosen results of a saved search",
		Long: `Turn chosen results of a saved search (its number, or "last") into a purchase
request: the parts grouped by supplier, how many the systems need (a pair that
uses the same part twice needs two per system), how many the drawer holds and
where, how many to order, unit price, line total, supplier subtotal and grand
total per currency (amounts in different currencies are listed apart, never
summed). The requirement and each solution's spacings go with it.

CSV output is safe to open in a spreadsheet: a text cell that begins with
= + - @, a tab or a carriage return gets a leading single quote, while numbers
stay numbers.`,
		Example: `  cardinal request last --pick 1,3 --quantity 2 --format csv > request.csv
  cardinal request 17 --pick 2 --format md
  cardinal request last --pick 1 --format json -o request.json`,
		Args: cobra.ExactArgs(1),
		RunE: func(c *cobra.Command, args []string) error {
			o.db, o.Search = dbFlag(c), args[0]
			if err := o.validate(); err != nil {
				return err
			}
			return run(o)
		},
	}
	f := cmd.Flags()
	f.SetNormalizeFunc(formerFlagNames) // --quantity, the former name of --systems
	f.IntSliceVar(&o.Picks, "pick", nil, "ranks of the results to buy for, e.g. 1,3 (required)")
	f.IntVar(&o.Qty, "systems", 1, "number of systems to build of each picked solution")
	f.StringVar(&o.Format, "format", "table", "output format: table, json, csv or md")
	f.StringVarP(&o.Output, "output", "o", "", "write to this file instead of standard output")
	f.BoolVar(&o.Force, "force", false, "overwrite the output file if it exists")
	return cmd
}

func (o *requestOptions) validate() error {
	if err := checkFormat(o.Format); err != nil {
		return err
	}
	if o.Qty < 1 {
		return usageErrorf("--systems %d: give the number of systems, 1 or more", o.Qty)
	}
	return checkPicks(o.Picks, false)
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

func runRequest(o *requestOptions) error {
	sv, err := loadSaved(o.env, o.db, o.Search, o.Picks)
	if err != nil {
		return err
	}
	rq, err := export.BuildRequest(sv.ID, sv.Req, sv.Picks, o.Qty, sv.stock())
	if err != nil {
		return usageErrorf("%v", err)
	}
	sols, err := sv.solutions(o.env)
	if err != nil {
		return err
	}
	rq.AddBuilds(sols)
	w, err := openOutput(o.env, o.Output, o.Force)
	if err != nil {
		return err
	}
	if err := writeRequest(o.env, w, o.Format, rq); err != nil {
		w.Close()
		return err
	}
	return closeOutput(o.env, w, o.Output, fmt.Sprintf("purchase request for search %d", sv.ID))
}

// writeRequest writes the request in a format: JSON as the Request value,
// CSV through the injection-safe writer, table and md with the notes
// (requirement, spacings, cautions) above the table.
func writeRequest(e *env, w io.Writer, format string, rq export.Request) error {
	switch format {
	case "json":
		return render(e, w, outputFlags{Format: format}, present.Table{}, rq)
	case "csv":
		return rq.WriteCSV(w)
	}
	for _, n := range rq.Notes() {
		line := n[0] + ": " + n[1]
		if format == "md" {
			line = "- **" + n[0] + "**: " + n[1]
		}
		if _, err := fmt.Fprintln(w, line); err != nil {
			return err
		}
	}
	fmt.Fprintln(w)
	return render(e, w, outputFlags{Format: format}, textTable(export.RequestHeader, rq.Rows()), nil)
}

// savedSearch is a saved search with the picked results and what the
// catalog holds of their parts.
type savedSearch struct {
	ID      int64
	At      time.Time // when the search ran
	Req     search.Requirement
	Results []search.Result
	Picks   []search.Result // in the order asked
	Entries map[string]importers.Entry
	Drawer  map[string]importers.DrawerItem
}

// loadSolutions loads the saved search with its picked results rebuilt as
// solutions from the catalog, and writes the cautions its requirement
// calls for: what draw and report start from.
func loadSolutions(e *env, db, ref string, picks []int) (*savedSearch, []export.Solution, error) {
	sv, err := loadSaved(e, db, ref, picks)
	if err != nil {
		return nil, nil, err
	}
	sols, err := sv.solutions(e)
	if err != nil {
		return nil, nil, err
	}
	writeCautions(e, sv.Req)
	return sv, sols, nil
}

// loadSaved reads the saved search ref, picks its results by rank and
// reads their parts and the drawer from the catalog.
func loadSaved(e *env, db, ref string, picks []int) (*savedSearch, error) {
	st, err := openForRead(db, e)
	if err != nil {
		return nil, err
	}
	defer st.Close()
	ctx := context.Background()
	ss, err := st.LoadSearch(ctx, ref)
	var nf *catalog.NotFoundError
	if errors.As(err, &nf) {
		return nil, notFoundErrorf("no saved search %q in %s: run 'cardinal find ...' first (a search run on the demo catalog is saved in it, until you import your own)", ref, st.Path())
	}
	if err != nil {
		return nil, catalogError(err)
	}
	sv := &savedSearch{ID: ss.ID, At: ss.At, Entries: map[string]importers.Entry{}}
	if err := json.Unmarshal(ss.Requirement, &sv.Req); err != nil {
		return nil, fmt.Errorf("saved search %d: requirement: %w", ss.ID, err)
	}
	if err := json.Unmarshal(ss.Results, &sv.Results); err != nil {
		return nil, fmt.Errorf("saved search %d: results: %w", ss.ID, err)
	}
	if err := sv.pick(picks); err != nil {
		return nil, err
	}
	if err := sv.readParts(ctx, st); err != nil {
		return nil, err
	}
	return sv, nil
}

// pick selects the results by rank.
func (sv *savedSearch) pick(picks []int) error {
	for _, p := range picks {
		i := slices.IndexFunc(sv.Results, func(r search.Result) bool { return r.Rank == p })
		if i < 0 {
			return usageErrorf("search %d has %d results: --pick %d is not one of them (see 'cardinal find' output)", sv.ID, len(sv.Results), p)
		}
		sv.Picks = append(sv.Picks, sv.Results[i])
	}
	return nil
}

// readParts reads the picked parts and the drawer from the catalog.
func (sv *savedSearch) readParts(ctx context.Context, st *catalog.Store) error {
	for _, r := range sv.Picks {
		for _, u := range r.Parts {
			if _, ok := sv.Entries[u.ID()]; ok {
				continue
			}
			en, err := st.Part(ctx, u.ID())
			var nf *catalog.NotFoundError
			if errors.As(err, &nf) {
				return notFoundErrorf("part %s of search %d is no longer in the catalog", u.ID(), sv.ID)
			}
			if err != nil {
				return catalogError(err)
			}
			sv.Entries[u.ID()] = en
		}
	}
	var err error
	sv.Drawer, err = st.Drawer(ctx)
	return catalogError(err)
}

// stock pairs each picked part with its drawer row.
func (sv *savedSearch) stock() map[string]export.Stock {
	m := map[string]export.Stock{}
	for id, en := range sv.Entries {
		d := sv.Drawer[id]
		m[id] = export.Stock{Entry: en, InDrawer: d.Quantity, Location: d.Location}
	}
	return m
}

// solutions rebuilds the picks as optical systems and warns on stderr about
// any that the catalog has changed since the search.
func (sv *savedSearch) solutions(e *env) ([]export.Solution, error) {
	var out []export.Solution
	for _, r := range sv.Picks {
		s, err := export.NewSolution(sv.Req, r, sv.Entries)
		if err != nil {
			return nil, fmt.Errorf("search %d: %w", sv.ID, err)
		}
		for _, d := range s.Verify() {
			notef(e, "warning: search %d, %s (the catalog changed since the search)\n", sv.ID, d)
		}
		out = append(out, s)
	}
	return out, nil
}

// openOutput opens the -o file, refusing to replace one that exists
// unless forced; no file means standard output.
func openOutput(e *env, path string, force bool) (io.WriteCloser, error) {
	if path == "" || path == "-" {
		return nopCloser{e.Out}, nil
	}
	flags := os.O_WRONLY | os.O_CREATE | os.O_EXCL
	if force {
		flags = os.O_WRONLY | os.O_CREATE | os.O_TRUNC
	}
	f, err := os.OpenFile(path, flags, 0o644)
	switch {
	case errors.Is(err, fs.ErrExist):
		return nil, usageErrorf("%s exists: add --force to replace it, or choose another name", path)
	case err != nil:
		return nil, usageErrorf("cannot write %s: %v", path, err)
	}
	return f, nil
}

// closeOutput closes the output and, for a file, says what was written.
func closeOutput(e *env, w io.WriteCloser, path, what string) error {
	if err := w.Close(); err != nil {
		return fmt.Errorf("%s: %w", path, err)
	}
	if path != "" && path != "-" {
		notef(e, "wrote %s to %s\n", what, path)
	}
	return nil
}

type nopCloser struct{ io.Writer }

func (nopCloser) Close() error { return nil }
