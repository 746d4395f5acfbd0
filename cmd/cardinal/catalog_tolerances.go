package main

import (
	"context"
	"fmt"
	"strconv"
	"strings"

	"github.com/spf13/cobra"

	"cardinal/optics"
	"cardinal/search/present"
)

// catalogTolerancesOptions are the flags of `cardinal catalog tolerances`.
type catalogTolerancesOptions struct {
	env               *env
	DB                string
	EFL, Radius       string // percentages, "1%" or "1"
	Thickness, Index  float64
	out               outputFlags
	set               func(string) bool
	eflPct, radiusPct float64
	changesAny        bool
}

func newCatalogTolerancesCmd(e *env, run func(*catalogTolerancesOptions) error) *cobra.Command {
	o := &catalogTolerancesOptions{env: e}
	cmd := &cobra.Command{
		Use:   "tolerances",
		Short: "Show or set the tolerances of parts that state none",
		Long: `Show, or with flags set, the manufacturing tolerances the build study of
find and tolerance gives a part whose row states none (the prescription CSV's
efl_tolerance, thickness_tolerance, index_tolerance and radius_tolerance
columns): focal length in percent (realised by scaling the part's radii
together), centre thickness of each element in mm, index of each glass, and
each radius on its own in percent. The program's defaults are 1 %, 0.1 mm,
0.001 and none (common practice for stock catalog singlets).`,
		Example: `  cardinal catalog tolerances
  cardinal catalog tolerances --efl-tol 2% --thickness-tol 0.2`,
		Args: cobra.NoArgs,
		RunE: func(c *cobra.Command, _ []string) error {
			o.DB = dbFlag(c)
			o.set = func(n string) bool { return c.Flags().Changed(n) }
			if err := o.validate(); err != nil {
				return err
			}
			return run(o)
		},
	}
	f := cmd.Flags()
	f.StringVar(&o.EFL, "efl-tol", "", "focal-length tolerance of a part that states none, percent (e.g. 1%)")
	f.Float64Var(&o.Thickness, "thickness-tol", 0, "centre-thickness tolerance, mm")
	f.Float64Var(&o.Index, "index-tol", 0, "index tolerance")
	f.StringVar(&o.Radius, "radius-tol", "", "tolerance of each radius on its own, percent (0 for none)")
	addOutputFlags(f, &o.out, false)
	return cmd
}

func (o *catalogTolerancesOptions) validate() error {
	if err := checkFormat(o.out.Format); err != nil {
		return err
	}
	pct := func(flag, s string, zeroOK bool) (float64, error) {
		v, err := strconv.ParseFloat(strings.TrimSuffix(strings.TrimSpace(s), "%"), 64)
		if err != nil || !(v >= 0 && v < 50) || (v == 0 && !zeroOK) {
			return 0, usageErrorf("--%s %q: give a percentage above 0 and below 50, such as 1%%", flag, s)
		}
		return v, nil
	}
	var err error
	if o.set("efl-tol") {
		if o.eflPct, err = pct("efl-tol", o.EFL, false); err != nil {
			return err
		}
	}
	if o.set("radius-tol") {
		if o.radiusPct, err = pct("radius-tol", o.Radius, true); err != nil {
			return err
		}
	}
	if o.set("thickness-tol") && !(o.Thickness > 0 && o.Thickness <= 10) {
		return usageErrorf("--thickness-tol %g: give a tolerance above 0 and up to 10 mm", o.Thickness)
	}
	if o.set("index-tol") && !(o.Index > 0 && o.Index < 0.5) {
		return usageErrorf("--index-tol %g: give a tolerance above 0 and below 0.5", o.Index)
	}
	o.changesAny = o.set("efl-tol") || o.set("radius-tol") || o.set("thickness-tol") || o.set("index-tol")
	return nil
}

func runCatalogTolerances(o *catalogTolerancesOptions) error {
	ctx := context.Background()
	if !o.changesAny {
		st, err := o.env.stores().Read(o.DB)
		if err != nil {
			return err
		}
		defer st.Close()
		t, err := st.PartTolerances(ctx)
		if err != nil {
			return catalogError(err)
		}
		return render(o.env, o.env.Out, o.out, tolerancesTable(t), tolerancesDoc(t))
	}
	st, err := o.env.stores().Write(o.DB, false)
	if err != nil {
		return err
	}
	defer st.Close()
	t, err := st.PartTolerances(ctx)
	if err != nil {
		return catalogError(err)
	}
	if o.set("efl-tol") {
		t.EFLPct = o.eflPct
	}
	if o.set("radius-tol") {
		t.RadiusPct = o.radiusPct
	}
	if o.set("thickness-tol") {
		t.Thickness = o.Thickness
	}
	if o.set("index-tol") {
		t.Index = o.Index
	}
	if err := st.SetPartTolerances(ctx, t); err != nil {
		return catalogError(err)
	}
	fmt.Fprintf(o.env.Err, "set the tolerances of parts that state none in %s\n", st.Path())
	return render(o.env, o.env.Out, o.out, tolerancesTable(t), tolerancesDoc(t))
}

func tolerancesDoc(t optics.Tolerances) map[string]float64 {
	return map[string]float64{"efl_tol_pct": t.EFLPct, "thickness_tol_mm": t.Thickness, "index_tol": t.Index, "radius_tol_pct": t.RadiusPct}
}

// tolerancesTable lists tolerances, one per row.
func tolerancesTable(t optics.Tolerances) present.Table {
	tb := present.Table{Columns: []present.Column{{Key: "tolerance", Label: "tolerance"}, {Key: "value", Label: "+-"}, {Key: "unit", Label: "unit"}}}
	for _, r := range []struct {
		name string
		v    float64
		unit string
	}{{"focal length", t.EFLPct, "%"}, {"centre thickness of each element", t.Thickness, "mm"},
		{"index of each glass", t.Index, ""}, {"each radius on its own", t.RadiusPct, "%"}} {
		tb.Add(present.Text(r.name), present.SigCell(r.v), present.Text(r.unit))
	}
	return tb
}
