package main

import (
	"fmt"
	"path/filepath"
	"strings"

	"github.com/spf13/cobra"

	"cardinal/search/drawing"
	"cardinal/search/plots"
	"cardinal/search/solution"
)

// drawOptions are the flags of `cardinal draw`.
type drawOptions struct {
	env    *env
	db     string
	Search string
	Picks  []int
	Output string
	Force  bool
	Spot   bool
	field  fieldFlags
	Band   []float64

	format string // svg or png
}

func newDrawCmd(e *env, run func(*drawOptions) error) *cobra.Command {
	o := &drawOptions{env: e}
	cmd := &cobra.Command{
		Use:   "draw SEARCH --pick N -o FILE",
		Short: "To-scale layout drawing, or the spot figures, of a saved result",
		Long: `Draw one result of a saved search (its number, or "last").

Without --spot: an SVG layout drawn to scale (1 unit = 1 mm) from the parts'
real surface shapes and diameters, with the object plane, the image or focal
plane, real marginal and chief rays traced through the parts, the cardinal
points of each part (above the axis) and of the whole system (below), and the
working distance, gap, back clearance, envelope and track dimensioned.

With --spot: one row per field point (on axis, at 0.7 of the field and at the
field edge; a laser search without a field on axis only): the spot at best
focus on its Airy disc with its RMS radius written on it, the RMS spot radius
through focus, and the ray error across the pupil; each wavelength in its own
colour (ultraviolet and infrared in named greys), as PNG or SVG (chosen by the
-o file's extension; SVG on standard output).

The field is --field (object height in mm for a finite object, field angle in
degrees for an object at infinity), else the search's --object-height or
--field-angle; without any a small field is chosen and the drawing says so.
The RMS spot radius of each field point and wavelength is printed on stderr.`,
		Example: `  cardinal draw last --pick 1 -o layout.svg
  cardinal draw last --pick 1 --spot -o spot.png
  cardinal draw 17 --pick 2 --spot --band 486.1,587.6,656.3 -o spot.svg`,
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
	f.IntSliceVar(&o.Picks, "pick", nil, "rank of the result to draw (required)")
	f.StringVarP(&o.Output, "output", "o", "", "file to write (.svg, or .png with --spot); standard output if absent")
	f.BoolVar(&o.Force, "force", false, "overwrite the output file if it exists")
	f.BoolVar(&o.Spot, "spot", false, "spot figures (spot at best focus, through focus, ray errors) instead of the layout")
	addFieldFlags(f, &o.field)
	f.Float64SliceVar(&o.Band, "band", nil, "wavelengths in nm for --spot, the first the reference (default: the search's wavelength and band; without a band F and C beside it in the visible)")
	return cmd
}

func (o *drawOptions) validate() error {
	if err := checkPicks(o.Picks, true); err != nil {
		return err
	}
	ext := strings.ToLower(filepath.Ext(o.Output))
	switch {
	case o.Output == "" || o.Output == "-" || ext == ".svg":
		o.format = "svg"
	case ext == ".png" && o.Spot:
		o.format = "png"
	case ext == ".png":
		return usageErrorf("-o %s: the layout drawing is SVG; name the file .svg (--spot plots can be .png)", o.Output)
	default:
		return usageErrorf("-o %s: name the file .svg or, with --spot, .png", o.Output)
	}
	if len(o.Band) > 0 && !o.Spot {
		return usageErrorf("--band applies to --spot plots only")
	}
	return nil
}

func runDraw(o *drawOptions) error {
	e := o.env
	p, sols, err := loadSolutions(e, o.db, o.Search, o.Picks)
	if err != nil {
		return err
	}
	sv := p.Search
	s := sols[0]
	field, err := o.field.value(sv.Requirement)
	if err != nil {
		return err
	}
	title := fmt.Sprintf("Search %d, solution %d: %s", sv.ID, s.Result.Rank, solution.DescribeParts(s.Result.Parts))
	if o.Spot {
		return drawSpots(o, s, field, title)
	}
	sc, err := drawing.NewScene(s, drawing.DrawOptions{Field: field})
	if err != nil {
		return fmt.Errorf("search %d, solution %d: %w", sv.ID, s.Result.Rank, err)
	}
	w, err := openOutput(e, o.Output, o.Force)
	if err != nil {
		return err
	}
	if err := sc.WriteSVG(w, drawing.DrawOptions{Field: field, Title: title}); err != nil {
		discardOutput(w, o.Output)
		return err
	}
	return closeOutput(e, w, o.Output, fmt.Sprintf("the layout of solution %d of search %d", s.Result.Rank, sv.ID))
}

// drawSpots writes the spot and fan plots and prints the RMS radii.
func drawSpots(o *drawOptions, s solution.Solution, field float64, title string) error {
	e := o.env
	sp, err := plots.NewSpots(s, plots.PlotOptions{Wavelengths: o.Band, Field: field})
	if err != nil {
		return fmt.Errorf("%s: %w", title, err)
	}
	w, err := openOutput(e, o.Output, o.Force)
	if err != nil {
		return err
	}
	if err := sp.WritePlot(w, title+": spots at best focus, through focus, and ray errors", o.format); err != nil {
		discardOutput(w, o.Output)
		return err
	}
	for k, set := range sp.Sets {
		notef(e, "%s, %.1f nm: %s\n", sp.FieldText(k/len(sp.Wavelengths)), set.Wavelength, set.Summary(sp.Unit()))
	}
	if sp.Airy > 0 {
		notef(e, "Airy radius at %.1f nm: %.3g %s\n", sp.Wavelengths[0], sp.Airy, sp.Unit())
	}
	return closeOutput(e, w, o.Output, fmt.Sprintf("the spot diagrams of solution %d", s.Result.Rank))
}
