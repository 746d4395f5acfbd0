package main

import (
	"cardinal/search/present"

	"bytes"
	"context"
	"fmt"
	"math"
	"sort"

	"github.com/spf13/cobra"

	"cardinal/catalog"
	"cardinal/importers"
	"cardinal/optics"
)

func newGlassCmd(e *env) *cobra.Command {
	cmd := &cobra.Command{
		Use:   "glass",
		Short: "Import and list the glasses your parts are made of",
		Long: `Parts name their glass by a six-digit code (517642: nd 1.517, Vd 64.2), a
built-in name (fused-silica, caf2, sapphire, water) or a glass of your own,
imported from a glass CSV: name, formula (sellmeier, cauchy, constant, abbe),
coefficients separated by spaces, min_nm, max_nm, source. Changing a glass
recomputes every part made of it. A name that supplier sheets use for a glass
becomes known to every import with 'glass alias NAME CODE'.`,
	}
	cmd.AddCommand(newGlassImportCmd(e, runGlassImport), newGlassListCmd(e, runGlassList),
		newGlassAliasCmd(e, runGlassAlias), newGlassAliasesCmd(e, runGlassAliases))
	return cmd
}

func newGlassImportCmd(e *env, run func(*importOptions) error) *cobra.Command {
	return newImportCmd(e, "Add and update your glasses from a glass CSV, all rows or none",
		`Read a glass CSV (columns name, formula, coefficients, min_nm, max_nm,
source; formula sellmeier, cauchy, constant or abbe) and store the glasses.
A file with any bad row changes nothing. A glass that changed recomputes
every catalog part made of it, in the same transaction.`,
		`  cardinal glass import my-glasses.csv
  cardinal glass import my-glasses.csv --dry-run`, run)
}

func runGlassImport(o *importOptions) error {
	data, err := readInputFile(o.File, o.env)
	if err != nil {
		return err
	}
	f, err := importers.ReadGlassFile(bytes.NewReader(data), o.File)
	if err != nil {
		return usageErrorf("%s cannot be imported; nothing was changed. Fix these lines and import again:\n%v", o.File, err)
	}
	for _, w := range f.Warnings {
		notef(o.env, "cardinal: warning: %v\n", w)
	}
	s, into, err := openForImport(o.DB, o.env, o.DryRun)
	if err == nil && s == nil {
		s, err = o.env.stores().Write(o.DB, true)
	}
	if err != nil {
		return err
	}
	defer s.Close()
	var rep catalog.GlassReport
	err = waitNotice(o.env, s.Path(), func() (err error) {
		rep, err = s.ImportGlasses(context.Background(), f.Rows, o.DryRun)
		return err
	})
	if err != nil {
		return importErrorf(o.File, err)
	}
	if into == "" {
		into = s.Path()
	}
	printChanges(o.env, into, o.File, "glasses", rep.Added, rep.Updated, len(rep.Unchanged), 0, o.DryRun)
	if len(rep.Recomputed) > 0 {
		fmt.Fprintf(o.env.Out, "  recomputed %d part(s) made of a changed glass\n", len(rep.Recomputed))
	}
	return nil
}

// glassListOptions are the flags of `glass list`.
type glassListOptions struct {
	listOptions
	User bool // only the user's glasses
}

func newGlassListCmd(e *env, run func(*glassListOptions) error) *cobra.Command {
	o := &glassListOptions{}
	cmd := newListCmd(e, listCommand{
		Use:   "list",
		Short: "List the built-in glasses and yours, with nd and Vd",
		Long: `List every named glass with its index nd at the d line (587.5618 nm) and its
Abbe number Vd = (nd - 1)/(nF - nC). Six-digit glass codes need no entry.
With --user --format csv the output is a glass CSV that 'glass import' reads.`,
		Example: `  cardinal glass list
  cardinal glass list --user --format csv > my-glasses.csv`,
	}, &o.listOptions, func() error { return run(o) })
	cmd.Flags().BoolVar(&o.User, "user", false, "only your own glasses")
	return cmd
}

// A listedGlass is one glass in `glass list --format json`; vd is null for
// a medium without dispersion.
type listedGlass struct {
	Name         string    `json:"name"`
	Origin       string    `json:"origin"` // built-in or user
	Formula      string    `json:"formula"`
	Coefficients []float64 `json:"coefficients"`
	Nd           float64   `json:"nd"`
	Vd           *float64  `json:"vd"`
	MinNm        float64   `json:"min_nm"`
	MaxNm        float64   `json:"max_nm"`
	Source       string    `json:"source"`
}

func runGlassList(o *glassListOptions) error {
	s, err := o.env.stores().Read(o.DB)
	if err != nil {
		return err
	}
	defer s.Close()
	user, err := s.UserGlasses(context.Background())
	if err != nil {
		return catalogError(err)
	}
	if o.User && o.Format == "csv" {
		return importers.WriteGlasses(o.env.Out, user)
	}
	var out []listedGlass
	if !o.User {
		out = builtinGlasses()
	}
	for _, g := range user {
		out = append(out, describeGlass(g.Name, "user", g.Formula, g.Coefficients, g.Medium(), g.Source))
	}
	t := present.Table{Columns: []present.Column{{Key: "name", Label: "name"}, {Key: "origin", Label: "origin"},
		{Key: "formula", Label: "formula"}, {Key: "nd", Label: "nd"}, {Key: "vd", Label: "Vd"},
		{Key: "min_nm", Label: "from", Unit: "nm"}, {Key: "max_nm", Label: "to", Unit: "nm"}, {Key: "source", Label: "source", Note: true}}}
	for _, l := range out {
		rng := func(v float64) present.Cell {
			if l.MinNm == 0 && l.MaxNm == 0 {
				return present.Cell{Text: present.Missing}
			}
			return present.Num(v, 0)
		}
		t.Add(present.Text(l.Name), present.Text(l.Origin), present.Text(l.Formula), present.Num(l.Nd, 5),
			present.OptNum(l.Vd, 2), rng(l.MinNm), rng(l.MaxNm), present.Text(l.Source))
	}
	return render(o.env, o.env.Out, outputFlags{Format: o.Format}, t, out)
}

// builtinGlasses describes the built-in glasses, by name.
func builtinGlasses() []listedGlass {
	table := optics.BuiltinGlasses()
	names := make([]string, 0, len(table))
	for n := range table {
		names = append(names, n)
	}
	sort.Strings(names)
	out := make([]listedGlass, len(names))
	for i, n := range names {
		m := table[n]
		formula, coef := "", []float64(nil)
		if sm, ok := m.(optics.Sellmeier); ok {
			formula = "sellmeier"
			for j := range sm.B {
				coef = append(coef, sm.B[j], sm.C[j])
			}
		}
		out[i] = describeGlass(m.Name(), "built-in", formula, coef, m, "built in; see the optics package for its reference")
	}
	return out
}

// describeGlass works out nd and the Abbe number Vd = (nd - 1)/(nF - nC)
// (the definition in ISO 7944; common practice) of a medium.
func describeGlass(name, origin, formula string, coef []float64, m optics.Medium, source string) listedGlass {
	lo, hi := m.Range()
	l := listedGlass{Name: name, Origin: origin, Formula: formula, Coefficients: coef, MinNm: lo, MaxNm: hi, Source: source,
		Nd: m.Index(optics.LineD)}
	if dn := m.Index(optics.LineF) - m.Index(optics.LineC); dn != 0 {
		vd := (l.Nd - 1) / dn
		if !math.IsInf(vd, 0) {
			l.Vd = &vd
		}
	}
	if l.Coefficients == nil {
		l.Coefficients = []float64{}
	}
	return l
}
