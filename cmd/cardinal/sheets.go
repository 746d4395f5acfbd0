package main

import (
	"bytes"
	"context"
	"fmt"
	"io"

	"github.com/spf13/cobra"

	"cardinal/catalog"
	"cardinal/importers"
	"cardinal/optics"
	"cardinal/search/present"
)

// catalogImportOptions are the arguments of `catalog import`: those of every
// import, and the mapping of a spreadsheet or foreign CSV.
type catalogImportOptions struct {
	*importOptions
	Map    string // --map: a column-mapping file; "" reads the neutral CSV
	Sheet  string // --sheet: overrides the mapping's sheet
	Show   int    // --show: rows of the preview
	Format string // --format of the preview
}

func (o *catalogImportOptions) validate() error {
	if o.Map == "" && (o.Sheet != "" || o.Show != 10 || o.Format != "table") {
		return usageErrorf("--sheet, --show and --format go with --map (a spreadsheet or foreign CSV); the neutral CSV needs none")
	}
	if o.Show < 0 {
		return usageErrorf("--show %d: give how many rows to preview (0 or more)", o.Show)
	}
	return checkFormat(o.Format)
}

// runMappedImport imports a spreadsheet or foreign CSV through a mapping;
// with --dry-run it previews the first rows as stored and every part whose
// stated EFL disagrees with its prescription.
func runMappedImport(o *catalogImportOptions) error {
	ctx := context.Background()
	m, err := readMappingFile(o.Map, o.env)
	if err != nil {
		return err
	}
	if o.Sheet != "" {
		m.Sheet = o.Sheet
	}
	data, t, err := openImport(ctx, o.importOptions)
	if err != nil {
		return err
	}
	defer t.Close()
	f, err := importers.ReadMapped(importers.Source{Name: o.File, Data: data}, m,
		importers.MapOptions{Glasses: t.glasses, Progress: progress(o.env, o.File)})
	where := sheetWhere(o.File, f.Sheet)
	if err != nil && o.DryRun && len(f.Rows) > 0 {
		if perr := writePreview(o, m, f); perr != nil {
			return perr
		}
		return usageErrorf("%s cannot be imported; the preview above shows the %d part(s) that read. Fix these and import again:\n%v", where, len(f.Rows), err)
	}
	if err != nil {
		return usageErrorf("%s cannot be imported; nothing was changed. Fix these and import again:\n%v", where, err)
	}
	for _, w := range f.Warnings {
		notef(o.env, "cardinal: warning: %v\n", w)
	}
	s, err := t.store()
	if err != nil {
		return err
	}
	if o.DryRun {
		if err := writePreview(o, m, f); err != nil {
			return err
		}
	}
	rep, err := s.Import(ctx, f.Rows, o.DryRun)
	if err != nil {
		return importErrorf(where, err)
	}
	for _, w := range rep.Warnings {
		notef(o.env, "cardinal: warning: %s, row %d: %s: %s\n", where, w.Line, w.ID, w.Reason)
	}
	pe := *o.env
	if o.DryRun && o.Format != "table" {
		pe.Out = o.env.Err // keep the preview alone on stdout
	}
	printChanges(&pe, t.name(), where, "parts", rep.Added, rep.Updated, len(rep.Unchanged), len(rep.Warnings), o.DryRun)
	return nil
}

func sheetWhere(file, sheet string) string {
	if sheet == "" {
		return file
	}
	return fmt.Sprintf("%s (sheet %q)", file, sheet)
}

func readMappingFile(name string, e *env) (*importers.Mapping, error) {
	b, err := readInputFile(name, e)
	if err != nil {
		return nil, err
	}
	m, err := importers.ReadMapping(bytes.NewReader(b), name)
	if err != nil {
		return nil, usageErrorf("the mapping %s cannot be used; fix these lines ('cardinal catalog mapping --help' shows the format):\n%v", name, err)
	}
	return m, nil
}

// progress reports rows read on a terminal's standard error; nil (no
// report) when standard error is not a terminal.
func progress(e *env, file string) func(int) {
	if !e.ErrTerminal {
		return nil
	}
	return func(n int) {
		fmt.Fprintf(e.Err, "\rreading %s: %d rows", file, n)
		if n%importers.ProgressEvery != 0 {
			fmt.Fprintln(e.Err)
		}
	}
}

// A previewedPart is one part of the preview in --format json.
type previewedPart struct {
	Row           int        `json:"row"`
	Supplier      string     `json:"supplier"`
	Part          string     `json:"part"`
	RadiiMm       []*float64 `json:"radii_mm"` // null: flat
	ThicknessesMm []float64  `json:"thicknesses_mm"`
	Glasses       []string   `json:"glasses"`
	DiameterMm    float64    `json:"diameter_mm"`
	StatedEFLMm   *float64   `json:"stated_efl_mm"`
	ComputedEFLMm *float64   `json:"computed_efl_mm"` // null: afocal
	EFLOffPercent *float64   `json:"efl_off_percent"`
	EFLOff        bool       `json:"efl_off"`
}

type previewJSON struct {
	File      string          `json:"file"`
	Sheet     string          `json:"sheet"`
	Lengths   string          `json:"lengths"`
	Radii     string          `json:"radii"`
	Parts     int             `json:"parts"`
	First     []previewedPart `json:"first_rows"`
	Disagree  []previewedPart `json:"efl_disagreements"`
	Tolerance float64         `json:"efl_tolerance_percent"`
}

func previewed(r importers.PreviewRow) previewedPart {
	e := r.Entry
	p := previewedPart{Row: e.Line, Supplier: e.Part.Supplier, Part: e.Part.Name, ThicknessesMm: e.Part.Thickness,
		DiameterMm: e.Part.Diameter, EFLOff: r.Off}
	for _, s := range e.Part.Surfaces {
		if isFlat(s.Radius) {
			p.RadiiMm = append(p.RadiiMm, nil)
		} else {
			v := s.Radius
			p.RadiiMm = append(p.RadiiMm, &v)
		}
	}
	for _, m := range e.Part.Media {
		p.Glasses = append(p.Glasses, m.Name())
	}
	v := func(x float64) *float64 { return &x }
	if e.StatedEFL != 0 {
		p.StatedEFLMm = v(e.StatedEFL)
		if !r.Afocal {
			p.EFLOffPercent = v(r.OffPercent)
		}
	}
	if !r.Afocal {
		p.ComputedEFLMm = v(r.Computed)
	}
	return p
}

func isFlat(r float64) bool { return r > 1e300 || r < -1e300 }

// writePreview prints the first rows as they will be stored and every part
// whose stated EFL is off by more than 1 %.
func writePreview(o *catalogImportOptions, m *importers.Mapping, f importers.MappedFile) error {
	rows := importers.Preview(f.Rows)
	off := importers.Disagreeing(rows)
	first := rows[:min(o.Show, len(rows))]
	radii := "signed"
	if m.Magnitudes {
		radii = "magnitudes"
	}
	pj := previewJSON{File: o.File, Sheet: f.Sheet, Lengths: m.Unit.String(), Radii: radii, Parts: len(rows),
		First: []previewedPart{}, Disagree: []previewedPart{}, Tolerance: 100 * importers.FocalTolerance}
	for _, r := range first {
		pj.First = append(pj.First, previewed(r))
	}
	for _, r := range off {
		pj.Disagree = append(pj.Disagree, previewed(r))
	}
	of := outputFlags{Format: o.Format}
	if o.Format == "json" {
		return render(o.env, o.env.Out, of, present.Table{}, pj)
	}
	w := o.env.Out
	if o.Format == "table" {
		note(o.env, fmt.Sprintf("Preview of %s, read with lengths in %s and radii %s: the first %d of %d parts as they will be stored (mm; radii signed as cardinal signs them).",
			sheetWhere(o.File, f.Sheet), pj.Lengths, radii, len(first), len(rows)))
	}
	if err := render(o.env, w, of, previewTable(pj.First), nil); err != nil {
		return err
	}
	if o.Format == "csv" {
		if len(off) > 0 {
			note(o.env, fmt.Sprintf("cardinal: %d part(s) state an EFL more than 1 %% from their prescription; --format table or json lists them.", len(off)))
		}
		return nil
	}
	fmt.Fprintln(w)
	if len(off) == 0 {
		note(o.env, fmt.Sprintf("Every stated EFL agrees with its prescription within 1 %% (%d of %d parts state one).", countStated(rows), len(rows)))
		return nil
	}
	note(o.env, fmt.Sprintf("%d of %d parts state an EFL more than 1 %% from their prescription. A wrong sign convention (radii:) or unit (lengths:) in the mapping shows here first; check those lines before importing:", len(off), len(rows)))
	return render(o.env, w, of, offTable(pj.Disagree), nil)
}

func countStated(rows []importers.PreviewRow) int {
	n := 0
	for _, r := range rows {
		if r.Entry.StatedEFL != 0 {
			n++
		}
	}
	return n
}

// previewTable lays out the parts as they will be stored: one column per
// radius, thickness and glass, then the EFL check.
func previewTable(parts []previewedPart) present.Table {
	n := 0
	for _, p := range parts {
		n = max(n, len(p.RadiiMm))
	}
	t := present.Table{Columns: []present.Column{{Key: "row", Label: "row"}, {Key: "part", Label: "part"}}}
	for i := 1; i <= n; i++ {
		t.Columns = append(t.Columns, present.Column{Key: fmt.Sprintf("r%d_mm", i), Label: fmt.Sprintf("r%d", i), Unit: "mm"})
	}
	for i := 1; i < n; i++ {
		t.Columns = append(t.Columns, present.Column{Key: fmt.Sprintf("t%d_mm", i), Label: fmt.Sprintf("t%d", i), Unit: "mm"},
			present.Column{Key: fmt.Sprintf("glass%d", i), Label: fmt.Sprintf("glass%d", i)})
	}
	t.Columns = append(t.Columns, present.Column{Key: "diameter_mm", Label: "diameter", Unit: "mm"})
	t.Columns = append(t.Columns, eflColumns()...)
	for _, p := range parts {
		row := []present.Cell{present.Int(p.Row), present.Text(p.Supplier + ":" + p.Part)}
		for i := range n {
			switch {
			case i >= len(p.RadiiMm):
				row = append(row, present.Cell{Text: present.Missing})
			case p.RadiiMm[i] == nil:
				row = append(row, present.Cell{Text: "flat"})
			default:
				row = append(row, present.Num(*p.RadiiMm[i], 3))
			}
		}
		for i := 0; i < n-1; i++ {
			if i < len(p.ThicknessesMm) {
				row = append(row, present.Num(p.ThicknessesMm[i], 3), present.Text(p.Glasses[i]))
			} else {
				row = append(row, present.Cell{Text: present.Missing}, present.Cell{Text: present.Missing})
			}
		}
		row = append(row, present.Num(p.DiameterMm, 3))
		t.Add(append(row, eflCells(p)...)...)
	}
	return t
}

func eflColumns() []present.Column {
	return []present.Column{{Key: "stated_efl_mm", Label: "stated EFL", Unit: "mm"}, {Key: "computed_efl_mm", Label: "computed EFL", Unit: "mm"},
		{Key: "efl_off_percent", Label: "off", Unit: "%"}, {Key: "efl_off", Label: "over 1 %"}}
}

func eflCells(p previewedPart) []present.Cell {
	computed := present.Cell{Text: "afocal"}
	if p.ComputedEFLMm != nil {
		computed = present.Num(*p.ComputedEFLMm, 3)
	}
	return []present.Cell{present.OptNum(p.StatedEFLMm, 3), computed, present.OptNum(p.EFLOffPercent, 2), present.Bool(p.EFLOff)}
}

// offTable lists the parts whose stated EFL is off.
func offTable(parts []previewedPart) present.Table {
	t := present.Table{Columns: append([]present.Column{{Key: "row", Label: "row"}, {Key: "part", Label: "part"}}, eflColumns()[:3]...)}
	for _, p := range parts {
		t.Add(append([]present.Cell{present.Int(p.Row), present.Text(p.Supplier + ":" + p.Part)}, eflCells(p)[:3]...)...)
	}
	return t
}

// catalogMappingOptions are the arguments of `catalog mapping`.
type catalogMappingOptions struct {
	env   *env
	DB    string
	File  string
	Sheet string
}

func newCatalogMappingCmd(e *env, run func(*catalogMappingOptions) error) *cobra.Command {
	o := &catalogMappingOptions{env: e}
	cmd := &cobra.Command{
		Use:   "mapping FILE",
		Short: "Write a first column mapping for a spreadsheet or foreign CSV, guessed from its headers",
		Long: `Read the first rows of a spreadsheet (.xlsx) or CSV file with its own column
names, find the header row, and write a column mapping guessed from the words
of the trade (Radius 1, R1, CT, Center Thickness, Dia., Material, EFL, ...) to
standard output, with comments saying what to check: the unit of lengths,
whether radii are signed or magnitudes, how flats are written, and glass
names the catalog does not know. Check every line, then preview the import:
  cardinal catalog import FILE --map FILE.colmap --dry-run

The mapping format (cardinal's own; one line each, a # starts a comment
line, blank lines are ignored):
  SETTING: VALUE          sheet: NAME (default the first sheet)
                          header row: N (default 1)
                          first data row: N (default the row after the header)
                          blank row: skip (default, with a warning) or stop
                          lengths: mm (default), cm or inch (25.4 mm exactly)
                          radii: signed (default: as cardinal signs them, a
                            radius is positive when its centre lies after the
                            surface) or magnitudes (the shape field signs them)
                          flat: a comma list of how a flat is written; the
                            default is inf, infinity, plano, flat; add 0 or
                            blank when the sheet writes a flat so
                          delimiter: comma, semicolon or tab (CSV only)
                          decimal: point or comma (CSV only)
  FIELD <- SOURCE COLUMN  a catalog field from the column with that header text
                          (case and runs of spaces do not matter)
  FIELD = VALUE           one value for the whole file (supplier = LAB,
                          currency = XTS); lengths in the file's unit
  glass NAME -> GLASS     a glass name the sheet uses, and the six-digit code,
                          built-in or imported glass it stands for

The fields are the columns of the neutral prescription CSV (supplier, part,
description, diameter, clear_aperture, r1-r6, t1-t5, glass1-glass5,
conic1-conic6, asph1-asph6, efl, bfd, edge_thickness, stated_wavelength,
price, currency, url, notes) and shape: with radii: magnitudes, a singlet's
shape is biconvex, biconcave, plano-convex, plano-concave or meniscus (taken
convex side first), and any part may give a sign pattern instead, one sign
per radius in light order (+-- for a cemented doublet). Asphere terms are
converted with the unit (a_n scales as length^(1-n)). Glass names resolve
through the mapping's glass lines, then your glass aliases ('cardinal glass
alias'), then the catalog's glasses.`,
		Example: `  cardinal catalog mapping supplier-a.xlsx > supplier-a.colmap
  cardinal catalog mapping stock.xlsx --sheet "Plano-convex" > pcx.colmap`,
		Args: cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			o.DB, o.File = dbFlag(cmd), args[0]
			return run(o)
		},
	}
	cmd.Flags().StringVar(&o.Sheet, "sheet", "", "the sheet to read (default: the first)")
	return cmd
}

func runCatalogMapping(o *catalogMappingOptions) error {
	data, err := readInputFile(o.File, o.env)
	if err != nil {
		return err
	}
	glasses, err := knownGlasses(o.DB, o.env)
	if err != nil {
		return err
	}
	var b bytes.Buffer
	if err := importers.GuessMapping(&b, importers.Source{Name: o.File, Data: data}, o.Sheet, glasses); err != nil {
		return usageErrorf("%v", err)
	}
	_, err = io.Copy(o.env.Out, &b)
	return err
}

// knownGlasses is the glass table of the user's catalog, with aliases; the
// built-in glasses when there is no catalog yet.
func knownGlasses(flag string, e *env) (optics.GlassTable, error) {
	s, _, err := openForImport(flag, e, false)
	if err != nil || s == nil {
		return optics.BuiltinGlasses(), err
	}
	defer s.Close()
	return s.Glasses(context.Background())
}

// glassAliasOptions are the arguments of `glass alias`.
type glassAliasOptions struct {
	env          *env
	DB           string
	Name, Target string
	Remove       bool
}

func newGlassAliasCmd(e *env, run func(*glassAliasOptions) error) *cobra.Command {
	o := &glassAliasOptions{env: e}
	cmd := &cobra.Command{
		Use:   "alias NAME GLASS",
		Short: "Say which glass a name in supplier sheets stands for, for every import",
		Long: `Store a glass alias: a name that sheets use for a glass (their own trade
name, a melt name) and the glass it is: a six-digit glass code (517642: nd
1.517, Vd 64.2), a built-in glass or one you imported with 'glass import'.
Every import (the neutral CSV and spreadsheets through a mapping) resolves
the name; a part stores the glass itself, never the alias. An alias cannot
take the name of a glass. 'glass aliases' lists them.`,
		Example: `  cardinal glass alias "Crown A" 517642
  cardinal glass alias "Lab melt 7" melt-7a
  cardinal glass alias --remove "Crown A"`,
		Args: func(cmd *cobra.Command, args []string) error {
			if o.Remove {
				return cobra.ExactArgs(1)(cmd, args)
			}
			return cobra.ExactArgs(2)(cmd, args)
		},
		RunE: func(cmd *cobra.Command, args []string) error {
			o.DB, o.Name = dbFlag(cmd), args[0]
			if len(args) > 1 {
				o.Target = args[1]
			}
			return run(o)
		},
	}
	cmd.Flags().BoolVar(&o.Remove, "remove", false, "remove the alias NAME (parts imported through it keep their glass)")
	return cmd
}

func runGlassAlias(o *glassAliasOptions) error {
	ctx := context.Background()
	s, err := o.env.stores().Write(o.DB, !o.Remove)
	if err != nil {
		return err
	}
	defer s.Close()
	if o.Remove {
		if err := s.RemoveGlassAlias(ctx, o.Name); err != nil {
			return catalogError(err)
		}
		fmt.Fprintf(o.env.Out, "removed the glass alias %q from %s\n", o.Name, s.Path())
		return nil
	}
	replaced, err := s.SetGlassAlias(ctx, o.Name, o.Target)
	if err != nil {
		return usageErrorf("%v", err)
	}
	verb := "added"
	if replaced {
		verb = "replaced"
	}
	table, err := s.Glasses(ctx)
	if err != nil {
		return err
	}
	m, _ := table.Lookup(o.Name)
	fmt.Fprintf(o.env.Out, "%s the glass alias %q -> %s (nd %.5f) in %s\n", verb, o.Name, m.Name(), m.Index(optics.LineD), s.Path())
	return nil
}

// glassAliasesOptions are the flags of `glass aliases`.
type glassAliasesOptions struct{ listOptions }

func newGlassAliasesCmd(e *env, run func(*glassAliasesOptions) error) *cobra.Command {
	o := &glassAliasesOptions{}
	return newListCmd(e, listCommand{
		Use:     "aliases",
		Short:   "List your glass aliases and the glass each stands for",
		Example: `  cardinal glass aliases --format csv`,
	}, &o.listOptions, func() error { return run(o) })
}

// A listedAlias is one alias in `glass aliases --format json`.
type listedAlias struct {
	Name  string  `json:"name"`
	Glass string  `json:"glass"`
	Nd    float64 `json:"nd"`
}

func runGlassAliases(o *glassAliasesOptions) error {
	ctx := context.Background()
	s, _, err := openForImport(o.DB, o.env, true)
	if err != nil {
		return err
	}
	var aliases []catalog.GlassAlias
	table := optics.BuiltinGlasses()
	if s != nil {
		defer s.Close()
		if aliases, err = s.GlassAliases(ctx); err != nil {
			return catalogError(err)
		}
		if table, err = s.Glasses(ctx); err != nil {
			return catalogError(err)
		}
	}
	out := []listedAlias{}
	t := present.Table{Columns: []present.Column{{Key: "name", Label: "name"}, {Key: "glass", Label: "glass"}, {Key: "nd", Label: "nd"}}}
	for _, a := range aliases {
		l := listedAlias{Name: a.Name, Glass: a.Target}
		if m, err := table.Lookup(a.Name); err == nil {
			l.Glass, l.Nd = m.Name(), m.Index(optics.LineD)
		}
		out = append(out, l)
		t.Add(present.Text(l.Name), present.Text(l.Glass), present.Num(l.Nd, 5))
	}
	if len(out) == 0 && o.Format == "table" {
		fmt.Fprintln(o.env.Err, "cardinal: no glass aliases yet; add one with 'cardinal glass alias NAME CODE'")
	}
	return render(o.env, o.env.Out, outputFlags{Format: o.Format}, t, out)
}
