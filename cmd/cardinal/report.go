package main

import (
	"fmt"

	"github.com/spf13/cobra"

	"cardinal/search/drawing"
	"cardinal/search/plots"
	"cardinal/search/purchase"
	"cardinal/search/report"
)

// reportOptions are the flags of `cardinal report`.
type reportOptions struct {
	env    *env
	db     string
	Search string
	Picks  []int
	Qty    int
	Output string
	Force  bool
	field  fieldFlags
	Band   []float64
}

func newReportCmd(e *env, run func(*reportOptions) error) *cobra.Command {
	o := &reportOptions{env: e}
	cmd := &cobra.Command{
		Use:   "report SEARCH --pick N[,N...] -o FILE.html",
		Short: "One self-contained printable HTML report of chosen results",
		Long: `Write one HTML page about chosen results of a saved search (its number, or
"last"): the requirement, the ranked results (with their real-ray figures
where the search traced them, and a note on what the ranking used), for each
chosen result its build table, to-scale layout drawing, spot figures with
their RMS figures, its build study (as 'cardinal tolerance' prints it, with the
histograms), then the purchase request and the cautions. The page is self-contained (styles
inline, drawings as inline SVG, plots as embedded PNG): it fetches nothing, so
it can be mailed, archived with a lab notebook or printed.`,
		Example: `  cardinal report last --pick 1,2 -o report.html
  cardinal report 17 --pick 1 --quantity 3 -o relay.html --force`,
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
	f.IntSliceVar(&o.Picks, "pick", nil, "ranks of the results to detail, e.g. 1,2 (required)")
	f.IntVar(&o.Qty, "systems", 1, "number of systems to build of each picked solution, for the request")
	f.StringVarP(&o.Output, "output", "o", "", "HTML file to write; standard output if absent")
	f.BoolVar(&o.Force, "force", false, "overwrite the output file if it exists")
	addFieldFlags(f, &o.field)
	f.Float64SliceVar(&o.Band, "band", nil, "wavelengths in nm for the spot diagrams, the first the reference (default as for draw --spot)")
	return cmd
}

func (o *reportOptions) validate() error {
	if o.Qty < 1 {
		return usageErrorf("--systems %d: give the number of systems, 1 or more", o.Qty)
	}
	return checkPicks(o.Picks, false)
}

func runReport(o *reportOptions) error {
	e := o.env
	p, sols, err := loadSolutions(e, o.db, o.Search, o.Picks)
	if err != nil {
		return err
	}
	sv := p.Search
	field, err := o.field.value(sv.Requirement)
	if err != nil {
		return err
	}
	rq, err := purchase.BuildRequest(sv.ID, sv.Requirement, p.Results, o.Qty, p.Stock())
	if err != nil {
		return usageErrorf("%v", err)
	}
	rq.AddBuilds(sols)
	in := report.ReportInput{Search: sv.ID, SearchedAt: sv.At, GeneratedAt: e.Now(), Requirement: sv.Requirement,
		Results: sv.Results, Picks: sols, Request: rq,
		Draw: drawing.DrawOptions{Field: field}, Plot: plots.PlotOptions{Field: field, Wavelengths: o.Band}}
	w, err := openOutput(e, o.Output, o.Force)
	if err != nil {
		return err
	}
	if err := report.WriteReport(w, in); err != nil {
		discardOutput(w, o.Output)
		return fmt.Errorf("search %d: %w", sv.ID, err)
	}
	return closeOutput(e, w, o.Output, fmt.Sprintf("the report on search %d", sv.ID))
}
