package main

import (
	"bytes"
	"encoding/json"
	"fmt"
	"path/filepath"
	"strings"

	"github.com/spf13/cobra"

	"cardinal/search"
	"cardinal/search/plots"
	"cardinal/search/present"
	"cardinal/search/solution"
)

// toleranceOptions are the flags of `cardinal tolerance`.
type toleranceOptions struct {
	env          *env
	db           string
	Search       string
	Picks        []int
	Trials       int
	SpacingTol   float64
	Distribution string
	Compensator  string
	Seed         uint64
	Plot         string
	Force        bool
	Bins         string
	out          outputFlags

	set        func(string) bool // whether a flag was given
	plotFormat string
}

func newToleranceCmd(e *env, run func(*toleranceOptions) error) *cobra.Command {
	o := &toleranceOptions{env: e}
	cmd := &cobra.Command{
		Use:   "tolerance SEARCH --pick N",
		Short: "Will it build? The tolerance study of one result of a saved search",
		Long: `Simulate building one result of a saved search (its number, or "last") from
real stock parts many times over: each build draws every part's focal length
(its radii scaled together), centre thickness and index within the part's
tolerances (the catalog's defaults where the part states none: 1 %, 0.1 mm,
0.001), and every air gap, the working distance and the image plane's
placement within --spacing-tol. After assembly the builder adjusts a
compensator, solved exactly for each build with the ray-transfer matrices:

  image  the image plane moves to the focus (the default for focus and image)
  gap    the second part moves until the focus lies on the fixed image plane,
         or, for an expander, until the beam is collimated (its default)
  none   nothing moves; the range printed is the error left

It prints the travel the compensator needs in 95 % of builds, the target
figure's 95 % spread after compensation, the yield (the share of builds that
meet the requirement's tolerance), the sensitivity of the target figure and
of the compensator to each tolerance (derivatives of the matrices, most
important first) and histograms of both. The random numbers are seeded: the
same command gives the same figures, and with the search's own settings the
same figures find printed. --plot writes the histograms as SVG or PNG.`,
		Example: `  cardinal tolerance last --pick 1
  cardinal tolerance last --pick 1 --trials 20000 --spacing-tol 0.05 --compensator gap
  cardinal tolerance 17 --pick 2 --distribution normal --plot builds.svg --format json`,
		Args: cobra.ExactArgs(1),
		RunE: func(c *cobra.Command, args []string) error {
			o.db, o.Search = dbFlag(c), args[0]
			o.set = func(name string) bool { return c.Flags().Changed(name) }
			if err := o.validate(); err != nil {
				return err
			}
			return run(o)
		},
	}
	f := cmd.Flags()
	f.IntSliceVar(&o.Picks, "pick", nil, "rank of the result to study (required)")
	f.IntVar(&o.Trials, "trials", search.DefaultTrials, "number of simulated builds")
	f.Float64Var(&o.SpacingTol, "spacing-tol", search.DefaultSpacingTol, "tolerance of every air gap, the working distance and the image plane, mm (default: the search's)")
	f.StringVar(&o.Distribution, "distribution", "", "how values spread within a tolerance: uniform (default) or normal (the tolerance at two standard deviations)")
	f.StringVar(&o.Compensator, "compensator", "", "what the builder adjusts: image, gap or none (default: image; gap for an expander)")
	f.Uint64Var(&o.Seed, "seed", 0, "seed of the random numbers (default: the search's)")
	f.StringVar(&o.Plot, "plot", "", "write the histograms to this .svg or .png file")
	f.BoolVar(&o.Force, "force", false, "overwrite the plot file if it exists")
	f.StringVar(&o.Bins, "bins", "", "print only one histogram's bins as rows, in any --format: adjust, figure or spot")
	addOutputFlags(f, &o.out, false)
	return cmd
}

func (o *toleranceOptions) validate() error {
	if err := checkFormat(o.out.Format); err != nil {
		return err
	}
	if err := checkPicks(o.Picks, true); err != nil {
		return usageErrorf("%v", strings.Replace(err.Error(), "draws", "studies", 1))
	}
	if o.Trials < 10 || o.Trials > 1_000_000 {
		return usageErrorf("--trials %d: give 10 to 1000000 simulated builds", o.Trials)
	}
	if !(o.SpacingTol >= 0) || o.SpacingTol > 100 {
		return usageErrorf("--spacing-tol %g: give a tolerance from 0 to 100 mm", o.SpacingTol)
	}
	switch o.Distribution {
	case "", "uniform", "normal":
	default:
		return usageErrorf("--distribution %q: use uniform or normal", o.Distribution)
	}
	switch o.Compensator {
	case "", "image", "gap", "none":
	default:
		return usageErrorf("--compensator %q: use image, gap or none", o.Compensator)
	}
	switch o.Bins {
	case "", "adjust", "figure", "spot":
	default:
		return usageErrorf("--bins %q: use adjust, figure or spot", o.Bins)
	}
	switch ext := strings.ToLower(filepath.Ext(o.Plot)); {
	case o.Plot == "":
	case ext == ".svg" || ext == ".png":
		o.plotFormat = ext[1:]
	default:
		return usageErrorf("--plot %s: name the file .svg or .png", o.Plot)
	}
	return nil
}

// settings are the search's build settings with the flags given laid
// over them; a search saved before build studies existed takes the
// defaults.
func (o *toleranceOptions) settings(saved search.BuildSettings) search.BuildSettings {
	b := saved
	if b == (search.BuildSettings{}) {
		b.SpacingTol = search.DefaultSpacingTol
	}
	if o.set("spacing-tol") {
		b.SpacingTol = o.SpacingTol
	}
	if o.set("distribution") {
		b.Distribution = search.Distribution(strings.Replace(o.Distribution, "uniform", "", 1))
	}
	if o.set("compensator") {
		b.Compensator = search.Compensator(o.Compensator)
	}
	if o.set("seed") {
		b.Seed = o.Seed
	}
	b.Trials = o.Trials
	if !o.set("trials") && saved.Trials > 0 {
		b.Trials = saved.Trials
	}
	return b
}

// toleranceOutput is the JSON document of a study.
type toleranceOutput struct {
	Search int64                `json:"search"`
	Rank   int                  `json:"rank"`
	Parts  []search.PartUse     `json:"parts"`
	Build  search.BuildSettings `json:"build"`
	Figure string               `json:"figure"`
	Unit   string               `json:"unit,omitempty"`
	Study  search.Study         `json:"study"`
	// Histograms are the study's histograms by name with unit
	// (adjust_mm, efl_mm, magnification, expansion, spot_um), each a list
	// of bins: their edges and the builds in them.
	Histograms  map[string]json.RawMessage `json:"histograms"`
	Cautions    []string                   `json:"cautions,omitempty"`
	Requirement search.Requirement         `json:"requirement"`
}

// histogramBins is the number of bins of the printed histograms.
const histogramBins = 15

func runTolerance(o *toleranceOptions) error {
	e := o.env
	sv, sols, err := loadSolutions(e, o.db, o.Search, o.Picks)
	if err != nil {
		return err
	}
	s := sols[0]
	req := sv.Search.Requirement
	req.Build = o.settings(req.Build)
	st, err := search.StudyBuild(req, s.Setup())
	if err != nil {
		return usageErrorf("search %d, result %d: %v", sv.Search.ID, s.Result.Rank, err)
	}
	name, unit := search.FigureName(req.Kind)
	title := fmt.Sprintf("Search %d, result %d: %s", sv.Search.ID, s.Result.Rank, solution.DescribeParts(s.Result.Parts))
	if o.Plot != "" {
		if err := writeStudyPlot(o, req, st, title); err != nil {
			return err
		}
	}
	hists := present.StudyHistograms(req, st, histogramBins)
	if o.Bins != "" {
		return renderBins(o, hists)
	}
	doc := toleranceOutput{Search: sv.Search.ID, Rank: s.Result.Rank, Parts: s.Result.Parts, Build: req.Build,
		Figure: name, Unit: unit, Study: st, Requirement: req, Cautions: solution.Cautions(req, s.Result),
		Histograms: map[string]json.RawMessage{}}
	for _, h := range hists {
		if doc.Histograms[h.Key], err = jsonRows(h.Table); err != nil {
			return err
		}
	}
	switch o.out.Format {
	case "json":
		return render(e, e.Out, o.out, present.Table{}, doc)
	case "csv":
		return render(e, e.Out, o.out, present.Sensitivities(req, st), nil)
	}
	if o.out.Format == "md" {
		fmt.Fprintf(e.Out, "## %s\n\n", title)
	} else {
		fmt.Fprintln(e.Out, title)
	}
	blocks := []struct {
		head string
		t    present.Table
	}{
		{"Build study", present.StudySummary(req, st)},
		{"Sensitivities (most important first)", present.Sensitivities(req, st)},
	}
	for _, h := range hists {
		blocks = append(blocks, struct {
			head string
			t    present.Table
		}{h.Title, h.Table})
	}
	for _, b := range blocks {
		if o.out.Format == "md" {
			fmt.Fprintf(e.Out, "\n### %s\n\n", b.head)
		} else {
			fmt.Fprintf(e.Out, "\n%s\n", b.head)
		}
		if err := render(e, e.Out, o.out, b.t, nil); err != nil {
			return err
		}
	}
	return nil
}

// renderBins prints the bins of the one histogram --bins names, in the
// chosen format: rows of the bin's edges and its builds.
func renderBins(o *toleranceOptions, hists []present.StudyHistogram) error {
	i := map[string]int{"adjust": 0, "figure": 1, "spot": 2}[o.Bins]
	if i >= len(hists) {
		return usageErrorf("--bins spot: this search traces no real rays, so its builds have no spot; find traces them with --beam (focus) or --na (image)")
	}
	return render(o.env, o.env.Out, o.out, hists[i].Table, nil)
}

// jsonRows is a table's rows as JSON objects, its data columns only.
func jsonRows(t present.Table) (json.RawMessage, error) {
	t, err := t.Select(nil, true, true)
	if err != nil {
		return nil, err
	}
	var b bytes.Buffer
	if err := present.WriteJSON(&b, t); err != nil {
		return nil, err
	}
	return b.Bytes(), nil
}

// writeStudyPlot writes the histograms to the --plot file.
func writeStudyPlot(o *toleranceOptions, req search.Requirement, st search.Study, title string) error {
	w, err := openOutput(o.env, o.Plot, o.Force)
	if err != nil {
		return err
	}
	if err := plots.WriteStudyPlot(w, req, st, title, o.plotFormat); err != nil {
		discardOutput(w, o.Plot)
		return err
	}
	return closeOutput(o.env, w, o.Plot, "the histograms of the build study")
}
