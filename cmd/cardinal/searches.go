package main

import (
	"context"
	"fmt"
	"strings"
	"unicode"
	"unicode/utf8"

	"github.com/spf13/cobra"

	"cardinal/search"
	"cardinal/search/present"
	"cardinal/search/saved"
	"cardinal/search/solution"
)

// newSearchesCmd is `cardinal searches` and its subcommands.
func newSearchesCmd(e *env) *cobra.Command {
	cmd := &cobra.Command{
		Use:   "searches",
		Short: "List saved searches, show one again, note or remove one",
		Long: `Every 'cardinal find' run is saved with a number. These commands list the saved
searches, print one again exactly as find printed it (without searching),
give one a short note, or remove one.

A search is named by its number or "last". Searches run on the built-in demo
catalog are kept with it; once you import a catalog of your own, new searches
are saved there and the demo ones stay reachable as demo:NUMBER (demo:last),
in every command that takes a search (request, draw, report, searches).`,
	}
	cmd.AddCommand(newSearchesListCmd(e, runSearchesList), newSearchesShowCmd(e, runSearchesShow),
		newSearchesNoteCmd(e, runSearchesNote), newSearchesRemoveCmd(e, runSearchesRemove))
	return cmd
}

// searchesListOptions are the flags of `searches list`.
type searchesListOptions struct {
	env *env
	db  string
	out outputFlags
}

func newSearchesListCmd(e *env, run func(*searchesListOptions) error) *cobra.Command {
	o := &searchesListOptions{env: e}
	cmd := &cobra.Command{
		Use:   "list",
		Short: "List the saved searches: number, date, kind, requirement, results, catalog, note",
		Long: `List the saved searches, oldest first: the number to use in request, draw,
report and 'searches show', when the search ran (UTC), its kind, the
requirement in words, how many results it kept, the catalog it ran on ("yours"
or "demo") and its note. Once you have a catalog of your own, the searches run
on the demo catalog before are listed after yours as demo:NUMBER.`,
		Example: `  cardinal searches list
  cardinal searches list --format json`,
		Args: cobra.NoArgs,
		RunE: func(c *cobra.Command, _ []string) error {
			o.db = dbFlag(c)
			if err := checkFormat(o.out.Format); err != nil {
				return err
			}
			return run(o)
		},
	}
	addOutputFlags(cmd.Flags(), &o.out, false)
	return cmd
}

// A searchRow is one saved search in `searches list`.
type searchRow struct {
	Search      string             `json:"search"` // as typed: 3 or demo:3
	Number      int64              `json:"number"`
	CreatedAt   string             `json:"created_at"` // RFC 3339, UTC
	Kind        search.Kind        `json:"kind"`
	Words       string             `json:"requirement_text"`
	Requirement search.Requirement `json:"requirement"`
	Results     int                `json:"result_count"`
	Catalog     string             `json:"catalog"` // yours or demo
	CatalogFile string             `json:"catalog_file"`
	Note        string             `json:"note"`
}

func runSearchesList(o *searchesListOptions) error {
	e := o.env
	ctx := context.Background()
	sh, err := openShelf(e, o.db, saved.Ref{})
	if err != nil {
		return err
	}
	rows, err := shelfRows(ctx, sh, false)
	sh.Close()
	if err != nil {
		return err
	}
	if !sh.Demo { // the user's catalog: the demo searches follow, as demo:N
		demo, err := demoRows(ctx, e, o.db)
		if err != nil {
			return err
		}
		if len(demo) > 0 {
			notef(e, "searches run on the demo catalog before you imported your own are kept in %s: use them as demo:NUMBER\n", demo[0].CatalogFile)
		}
		rows = append(rows, demo...)
	}
	if len(rows) == 0 {
		notef(e, "no saved searches yet: every 'cardinal find' run is saved with a number\n")
		if o.out.Format != "json" {
			return nil
		}
	}
	if rows == nil {
		rows = []searchRow{}
	}
	return render(e, e.Out, o.out, searchTable(rows), rows)
}

// shelfRows lists the searches of one shelf; prefixed names them demo:N.
func shelfRows(ctx context.Context, sh *shelf, prefixed bool) ([]searchRow, error) {
	list, err := sh.List(ctx)
	if err != nil {
		return nil, savedError(err)
	}
	cat := "yours"
	if sh.Demo {
		cat = "demo"
	}
	rows := make([]searchRow, len(list))
	for i, s := range list {
		ref := saved.Ref{Demo: prefixed, ID: s.ID}
		rows[i] = searchRow{Search: ref.String(), Number: s.ID, CreatedAt: s.At.UTC().Format("2006-01-02T15:04:05Z"),
			Kind: s.Requirement.Kind, Words: solution.DescribeRequirement(s.Requirement), Requirement: s.Requirement,
			Results: s.Count, Catalog: cat, CatalogFile: sh.Path(), Note: s.Note}
	}
	return rows, nil
}

// demoRows lists the searches kept with the demo catalog beside the user's.
func demoRows(ctx context.Context, e *env, db string) ([]searchRow, error) {
	loc, err := locateCatalog(db, e)
	if err != nil {
		return nil, err
	}
	st, err := openKeptDemo(loc)
	if err != nil || st == nil {
		return nil, err
	}
	sh := &shelf{Book: saved.New(st), st: st, Demo: true}
	defer sh.Close()
	return shelfRows(ctx, sh, true)
}

// searchTable is the list as one table for every format: the date to the
// minute for people, in full (RFC 3339) for programs.
func searchTable(rows []searchRow) present.Table {
	t := present.Table{Columns: []present.Column{
		{Key: "search", Label: "search"},
		{Key: "created_at", Label: "date", Unit: "UTC"},
		{Key: "kind", Label: "kind"},
		{Key: "requirement_text", Label: "requirement", Note: true},
		{Key: "result_count", Label: "results"},
		{Key: "catalog", Label: "catalog"},
		{Key: "note", Label: "note", Note: true},
	}}
	for _, r := range rows {
		date := strings.Replace(r.CreatedAt, "T", " ", 1)[:16]
		t.Add(present.Text(r.Search), present.Cell{Text: date, Raw: r.CreatedAt}, present.Text(string(r.Kind)),
			present.Text(r.Words), present.Int(r.Results), present.Text(r.Catalog), present.Text(r.Note))
	}
	return t
}

// searchesShowOptions are the flags of `searches show`.
type searchesShowOptions struct {
	env    *env
	db     string
	Search string
	out    outputFlags
}

func newSearchesShowCmd(e *env, run func(*searchesShowOptions) error) *cobra.Command {
	o := &searchesShowOptions{env: e}
	cmd := &cobra.Command{
		Use:   "show SEARCH",
		Short: "Print a saved search again exactly as find printed it, without searching",
		Long: `Print a saved search (its number, "last" or demo:NUMBER) again exactly as
'cardinal find' printed it, in any --format (with --columns and --wide as
find takes them), without searching: the results
as they were then, even if the catalog has changed since. Standard error
says when the search ran and what it asked, then its notes and cautions as
find gave them. A search that met nothing shows why and its nearest misses,
with find's exit code 4.`,
		Example: `  cardinal searches show last
  cardinal searches show 3 --format csv > search-3.csv
  cardinal searches show demo:1 --format json`,
		Args: cobra.ExactArgs(1),
		RunE: func(c *cobra.Command, args []string) error {
			o.db, o.Search = dbFlag(c), args[0]
			if err := checkFormat(o.out.Format); err != nil {
				return err
			}
			return run(o)
		},
	}
	addOutputFlags(cmd.Flags(), &o.out, true)
	return cmd
}

func runSearchesShow(o *searchesShowOptions) error {
	e := o.env
	sh, s, err := loadSearch(e, o.db, o.Search)
	if err != nil {
		return err
	}
	sh.Close()
	where := "your catalog"
	if sh.Demo {
		where = "the demo catalog"
	}
	notef(e, "search %d, run %s on %s: %s\n", s.ID, s.At.UTC().Format("2006-01-02 15:04 UTC"), where, solution.DescribeRequirement(s.Requirement))
	if s.Note != "" {
		notef(e, "note: %s\n", s.Note)
	}
	return writeFind(e, o.out, *s)
}

// searchesNoteOptions are the arguments of `searches note`.
type searchesNoteOptions struct {
	env    *env
	db     string
	Search string
	Note   string
	Clear  bool
}

// maxNote is the longest note, in characters: a note labels a search in a
// list, it is not a lab notebook.
const maxNote = 200

func newSearchesNoteCmd(e *env, run func(*searchesNoteOptions) error) *cobra.Command {
	o := &searchesNoteOptions{env: e}
	cmd := &cobra.Command{
		Use:   "note SEARCH TEXT...",
		Short: "Give a saved search a short note (--clear removes it)",
		Long: fmt.Sprintf(`Give a saved search (its number, "last" or demo:NUMBER) a short note of up
to %d characters on one line, shown by 'searches list' and 'searches show'.
A new note replaces the old one; --clear removes it.`, maxNote),
		Example: `  cardinal searches note 3 relay for the bench camera, cheapest that fits
  cardinal searches note 3 --clear`,
		Args: cobra.MinimumNArgs(1),
		RunE: func(c *cobra.Command, args []string) error {
			o.db, o.Search, o.Note = dbFlag(c), args[0], strings.TrimSpace(strings.Join(args[1:], " "))
			if err := o.validate(); err != nil {
				return err
			}
			return run(o)
		},
	}
	cmd.Flags().BoolVar(&o.Clear, "clear", false, "remove the note")
	return cmd
}

func (o *searchesNoteOptions) validate() error {
	switch n := utf8.RuneCountInString(o.Note); {
	case o.Clear && n > 0:
		return usageErrorf("give a note or --clear, not both")
	case !o.Clear && n == 0:
		return usageErrorf("give the note after the search number, e.g. 'cardinal searches note %s relay for the camera', or --clear", o.Search)
	case n > maxNote:
		return usageErrorf("the note has %d characters: keep it to %d", n, maxNote)
	case strings.IndexFunc(o.Note, unicode.IsControl) >= 0:
		return usageErrorf("keep the note to one line of text (no tabs or line breaks)")
	}
	return nil
}

func runSearchesNote(o *searchesNoteOptions) error {
	ref, sh, err := openShelfFor(o.env, o.db, o.Search)
	if err != nil {
		return err
	}
	defer sh.Close()
	id, err := sh.Annotate(context.Background(), ref, o.Note)
	if err != nil {
		return savedLookupError(o.env, o.db, ref, err)
	}
	if o.Clear {
		notef(o.env, "removed the note of search %s\n", saved.Ref{Demo: ref.Demo, ID: id})
	} else {
		notef(o.env, "noted search %s: %s\n", saved.Ref{Demo: ref.Demo, ID: id}, o.Note)
	}
	return nil
}

// searchesRemoveOptions are the arguments of `searches remove`.
type searchesRemoveOptions struct {
	env      *env
	db       string
	Searches []string
}

func newSearchesRemoveCmd(e *env, run func(*searchesRemoveOptions) error) *cobra.Command {
	o := &searchesRemoveOptions{env: e}
	return &cobra.Command{
		Use:   "remove SEARCH...",
		Short: "Remove saved searches (their numbers are not given again)",
		Long: `Remove saved searches (numbers, "last" or demo:NUMBER). A removed search's
number is never given to another search, so a script or note that names it
cannot reach a different one.`,
		Example: `  cardinal searches remove 3 4
  cardinal searches remove demo:last`,
		Args: cobra.MinimumNArgs(1),
		RunE: func(c *cobra.Command, args []string) error {
			o.db, o.Searches = dbFlag(c), args
			for _, a := range args {
				if _, err := saved.ParseRef(a); err != nil {
					return savedError(err)
				}
			}
			return run(o)
		},
	}
}

func runSearchesRemove(o *searchesRemoveOptions) error {
	for _, a := range o.Searches {
		ref, sh, err := openShelfFor(o.env, o.db, a)
		if err != nil {
			return err
		}
		id, err := sh.Remove(context.Background(), ref)
		sh.Close()
		if err != nil {
			return savedLookupError(o.env, o.db, ref, err)
		}
		notef(o.env, "removed search %s\n", saved.Ref{Demo: ref.Demo, ID: id})
	}
	return nil
}

// openShelfFor parses a reference and opens the shelf it points into.
func openShelfFor(e *env, db, refText string) (saved.Ref, *shelf, error) {
	ref, err := saved.ParseRef(refText)
	if err != nil {
		return ref, nil, savedError(err)
	}
	sh, err := openShelf(e, db, ref)
	return ref, sh, err
}
