package main

import (
	"fmt"
	"io"
	"strings"

	"github.com/spf13/cobra"

	"cardinal/search/finite"
	"cardinal/search/present"
	"cardinal/search/purchase"
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

func runRequest(o *requestOptions) error {
	p, err := loadPicked(o.env, o.db, o.Search, o.Picks)
	if err != nil {
		return err
	}
	sv := p.Search
	rq, err := purchase.BuildRequest(sv.ID, sv.Requirement, p.Results, o.Qty, p.Stock())
	if err != nil {
		return usageErrorf("%v", err)
	}
	sols, err := rebuild(o.env, p)
	if err != nil {
		return err
	}
	rq.AddBuilds(sols)
	w, err := openOutput(o.env, o.Output, o.Force)
	if err != nil {
		return err
	}
	if err := writeRequest(o.env, w, o.Format, rq); err != nil {
		discardOutput(w, o.Output)
		return err
	}
	return closeOutput(o.env, w, o.Output, fmt.Sprintf("purchase request for search %d", sv.ID))
}

// writeRequest writes the request in a format: JSON as the Request value,
// CSV through the injection-safe writer, table and md with the notes
// (requirement, spacings, cautions) above the table.
func writeRequest(e *env, w io.Writer, format string, rq purchase.Request) error {
	if err := finite.Check("the purchase request", rq); err != nil {
		return err
	}
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
		} else if e.width() > 0 {
			line = strings.ReplaceAll(present.Wrap(line, e.width()-2), "\n", "\n  ")
		}
		if _, err := fmt.Fprintln(w, line); err != nil {
			return err
		}
	}
	fmt.Fprintln(w)
	return render(e, w, outputFlags{Format: format}, rq.Table(), nil)
}
