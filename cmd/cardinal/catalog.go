package main

import (
	"bytes"
	"context"
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"

	"github.com/spf13/cobra"

	"cardinal/catalog"
	"cardinal/catalog/record"
	"cardinal/importers"
	"cardinal/optics"
	"cardinal/search/present"
)

func newCatalogCmd(e *env) *cobra.Command {
	cmd := &cobra.Command{
		Use:   "catalog",
		Short: "Import, list, export and remove the parts of your catalog",
		Long: `Your catalog is one SQLite file of lens prescriptions with every part's
cardinal points worked out at the d line (587.5618 nm), in both orientations.
It lives in $XDG_DATA_HOME/cardinal/catalog.db (by default
~/.local/share/cardinal/catalog.db); --db PATH or CARDINAL_DB choose another.
Until you import a file, read commands show the built-in demo catalog.`,
	}
	cmd.AddCommand(newCatalogImportCmd(e, runCatalogImport), newCatalogListCmd(e, runCatalogList),
		newCatalogExportCmd(e, runCatalogExport), newCatalogRemoveCmd(e, runCatalogRemove),
		newCatalogMappingCmd(e, runCatalogMapping), newCatalogTolerancesCmd(e, runCatalogTolerances))
	return cmd
}

// importOptions are the arguments of the three import commands
// (catalog, glass and drawer).
type importOptions struct {
	env    *env
	DB     string // --db; "" means CARDINAL_DB or the data directory
	File   string // the CSV to read; "-" reads standard input
	DryRun bool
}

// newImportCmd builds an `import FILE [--dry-run]` command.
func newImportCmd(e *env, short, long, example string, run func(*importOptions) error) *cobra.Command {
	o := &importOptions{env: e}
	cmd := &cobra.Command{
		Use:     "import FILE",
		Short:   short,
		Long:    long,
		Example: example,
		Args:    cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			o.DB, o.File = dbFlag(cmd), args[0]
			return run(o)
		},
	}
	cmd.Flags().BoolVar(&o.DryRun, "dry-run", false, "check the file and report what would change, changing nothing")
	return cmd
}

func newCatalogImportCmd(e *env, run func(*catalogImportOptions) error) *cobra.Command {
	co := &catalogImportOptions{}
	cmd := newImportCmd(e, "Add and update parts from a prescription CSV or a mapped spreadsheet, all rows or none", `Read a prescription CSV (the neutral format: supplier, part, diameter, r1, r2,
t1, glass1, ...) and store its parts. A file with any bad row changes nothing;
every problem is listed with its line. Parts already in the catalog with the
same supplier and part are updated when the row changed and left alone when
not, so importing the same file twice changes nothing. Stated values that
disagree with the prescription are kept as warnings.

With --map, read a spreadsheet (.xlsx) or a CSV with its own column names
through a column mapping ('cardinal catalog mapping FILE' guesses one;
'cardinal catalog mapping --help' describes the format): lengths in mm, cm or inch,
radii signed or as magnitudes with a shape, flats however the sheet writes
them, glass names through the mapping or your glass aliases. The rows go
through the same checks and the same all-or-nothing import; every problem
names the file, sheet, row and source column. With --dry-run the first rows
are shown as they will be stored, each part's computed EFL beside the stated
one, with every part whose stated EFL is off by more than 1 % (how a wrong
sign convention or unit shows itself), and nothing changes.`,
		`  cardinal catalog import supplier-a.csv
  cardinal catalog import supplier-a.csv --dry-run
  cardinal catalog import supplier-b.xlsx --map supplier-b.colmap --dry-run
  cardinal catalog import supplier-b.xlsx --map supplier-b.colmap --sheet Achromats`,
		func(o *importOptions) error {
			co.importOptions = o
			if err := co.validate(); err != nil {
				return err
			}
			return run(co)
		})
	f := cmd.Flags()
	f.StringVar(&co.Map, "map", "", "a column-mapping file: read FILE as a spreadsheet or foreign CSV through it")
	f.StringVar(&co.Sheet, "sheet", "", "with --map: the sheet to read, instead of the mapping's")
	f.IntVar(&co.Show, "show", 10, "with --map --dry-run: how many rows the preview shows")
	f.StringVar(&co.Format, "format", "table", "with --map --dry-run: preview format: table, json, csv or md")
	return cmd
}

func runCatalogImport(co *catalogImportOptions) error {
	if co.Map != "" {
		return runMappedImport(co)
	}
	o := co.importOptions
	ctx := context.Background()
	data, t, err := openImport(ctx, o)
	if err != nil {
		return err
	}
	defer t.Close()
	f, err := importers.ReadPrescriptionFile(bytes.NewReader(data), o.File, t.glasses)
	if err != nil {
		return usageErrorf("%s cannot be imported; nothing was changed. Fix these lines and import again:\n%v", o.File, err)
	}
	for _, w := range f.Warnings {
		notef(o.env, "cardinal: warning: %v\n", w)
	}
	s, err := t.store()
	if err != nil {
		return err
	}
	var rep catalog.ImportReport
	err = waitNotice(o.env, s.Path(), func() (err error) {
		rep, err = s.Import(ctx, f.Rows, o.DryRun)
		return err
	})
	if err != nil {
		return importErrorf(o.File, err)
	}
	for _, w := range rep.Warnings {
		notef(o.env, "cardinal: warning: %s:%d: %s: %s\n", o.File, w.Line, w.ID, w.Reason)
	}
	printChanges(o.env, t.name(), o.File, "parts", rep.Added, rep.Updated, len(rep.Unchanged), len(rep.Warnings), o.DryRun)
	return nil
}

// An importTarget is the catalog an import of parts writes to, with the
// glass table its rows are read against: the catalog's, or the built-in
// glasses while there is no catalog yet.
type importTarget struct {
	o       *importOptions
	s       *catalog.Store // nil until store() while there is no catalog yet
	glasses optics.GlassTable
	into    string // the catalog a dry run with none yet names (openForImport)
}

// openImport reads the file to import and opens the catalog it goes to
// (openForImport); Close the target when done.
func openImport(ctx context.Context, o *importOptions) ([]byte, *importTarget, error) {
	data, err := readInputFile(o.File, o.env)
	if err != nil {
		return nil, nil, err
	}
	s, into, err := openForImport(o.DB, o.env, o.DryRun)
	if err != nil {
		return nil, nil, err
	}
	t := &importTarget{o: o, s: s, glasses: optics.BuiltinGlasses(), into: into}
	if s != nil {
		if t.glasses, err = s.Glasses(ctx); err != nil {
			s.Close()
			return nil, nil, err
		}
	}
	return data, t, nil
}

// store is the catalog to write to, created now (once the file has read
// without error) when there was none.
func (t *importTarget) store() (*catalog.Store, error) {
	if t.s == nil {
		open := func(flag string) (*catalog.Store, error) { return t.o.env.stores().Write(flag, true) }
		if c, ok := t.o.env.stores().(creator); ok {
			open = c.Create
		}
		s, err := open(t.o.DB)
		if err != nil {
			return nil, err
		}
		t.s = s
	}
	return t.s, nil
}

// name is the catalog the import's report names: the store's file, or
// the file a dry run with no catalog yet would create.
func (t *importTarget) name() string {
	if t.into != "" {
		return t.into
	}
	return t.s.Path()
}

func (t *importTarget) Close() {
	if t.s != nil {
		t.s.Close()
	}
}

// openForImport opens the catalog an import writes to. It returns nil
// when the catalog does not exist yet, so that it is created only once the
// input reads without error; a dry run then checks against an empty
// in-memory catalog and creates nothing, and into names the file the
// import would create, for the report ("" in every other case).
func openForImport(flag string, e *env, dryRun bool) (s *catalog.Store, into string, err error) {
	s, err = e.stores().Write(flag, false)
	var none errNoCatalog
	switch {
	case !errors.As(err, &none):
		return s, "", err
	case dryRun:
		s, err := catalog.Open(catalog.Memory)
		return s, none.path + " (a new catalog; a dry run creates none)", catalogError(err)
	}
	return nil, "", nil
}

// printChanges prints the outcome of an import on stdout: counts of what
// (a plural: "parts"), then the names added and updated when there are few.
func printChanges(e *env, db, file, what string, added, updated []string, unchanged, warnings int, dryRun bool) {
	verb := "imported"
	if dryRun {
		verb = "dry run, nothing changed: would import"
	}
	fmt.Fprintf(e.Out, "%s %s into %s: %s: %d added, %d updated, %d unchanged", verb, file, db, what, len(added), len(updated), unchanged)
	if warnings > 0 {
		fmt.Fprintf(e.Out, ", %d warning(s)", warnings)
	}
	fmt.Fprintln(e.Out)
	for _, l := range []struct {
		label string
		names []string
	}{{"added", added}, {"updated", updated}} {
		if len(l.names) > 0 && len(l.names) <= 12 {
			fmt.Fprintf(e.Out, "  %s: %s\n", l.label, strings.Join(l.names, ", "))
		}
	}
}

// catalogListOptions are the flags of `catalog list`.
type catalogListOptions struct {
	env                      *env
	DB                       string
	EFL                      string // MIN:MAX in mm, either side may be empty
	DiameterMin, DiameterMax float64
	Suppliers, Kinds         []string
	InDrawer                 bool
	out                      outputFlags
	filter                   catalog.Filter // built by validate
}

func newCatalogListCmd(e *env, run func(*catalogListOptions) error) *cobra.Command {
	o := &catalogListOptions{env: e}
	cmd := &cobra.Command{
		Use:   "list",
		Short: "List parts with their focal lengths, filtered by focal length, size, supplier or kind",
		Long: `List the parts of the catalog with the values computed from their
prescriptions at the d line: EFL, BFD (last vertex to back focal point), FFD
(first vertex to front focal point, negative in front), length and diameter,
in mm, and how many are in the drawer. --format json carries every computed
column, with the reversed orientation, under the key names of inspect.`,
		Example: `  cardinal catalog list --efl 45:55 --diameter-max 25.4
  cardinal catalog list --kind negative,singlet --supplier DEMO --format json
  cardinal catalog list --in-drawer --format csv`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, _ []string) error {
			o.DB = dbFlag(cmd)
			if err := o.validate(); err != nil {
				return err
			}
			return run(o)
		},
	}
	f := cmd.Flags()
	f.StringVar(&o.EFL, "efl", "", "focal-length range MIN:MAX in mm (45:55, :0 for negative parts, 100: for 100 mm and up)")
	f.Float64Var(&o.DiameterMin, "diameter-min", 0, "smallest diameter in mm")
	f.Float64Var(&o.DiameterMax, "diameter-max", 0, "largest diameter in mm")
	f.StringSliceVar(&o.Suppliers, "supplier", nil, "only these suppliers (repeat or separate with commas)")
	f.StringSliceVar(&o.Kinds, "kind", nil, "only parts of every kind given: "+strings.Join(catalog.KindNames(), ", "))
	f.BoolVar(&o.InDrawer, "in-drawer", false, "only parts with at least one piece in the drawer")
	addOutputFlags(f, &o.out, true)
	return cmd
}

func (o *catalogListOptions) validate() error {
	if err := checkFormat(o.out.Format); err != nil {
		return err
	}
	efl, err := parseRange(o.EFL)
	if err != nil {
		return usageErrorf("--efl %q: %v", o.EFL, err)
	}
	if o.DiameterMin < 0 || o.DiameterMax < 0 || o.DiameterMax > 0 && o.DiameterMin > o.DiameterMax {
		return usageErrorf("--diameter-min %g and --diameter-max %g: give sizes in mm with min <= max", o.DiameterMin, o.DiameterMax)
	}
	var dia catalog.Range
	if o.DiameterMin > 0 || o.DiameterMax > 0 {
		dia = catalog.Range{Min: o.DiameterMin, Max: math.Inf(1)}
		if o.DiameterMax > 0 {
			dia.Max = o.DiameterMax
		}
	}
	for _, k := range o.Kinds {
		if !containsFold(catalog.KindNames(), k) {
			return usageErrorf("--kind %q: use %s", k, strings.Join(catalog.KindNames(), ", "))
		}
	}
	o.filter = catalog.Filter{EFL: efl, Diameter: dia, Suppliers: o.Suppliers, Kinds: o.Kinds, InDrawer: o.InDrawer}
	return nil
}

// parseRange reads MIN:MAX, either side empty for no limit; "" is no range.
func parseRange(s string) (catalog.Range, error) {
	if strings.TrimSpace(s) == "" {
		return catalog.Range{}, nil
	}
	lo, hi, ok := strings.Cut(s, ":")
	if !ok {
		return catalog.Range{}, fmt.Errorf("give MIN:MAX in mm, such as 45:55 (either side may be left out)")
	}
	r := catalog.Range{Min: math.Inf(-1), Max: math.Inf(1)}
	for _, side := range []struct {
		text string
		v    *float64
	}{{lo, &r.Min}, {hi, &r.Max}} {
		if t := strings.TrimSpace(side.text); t != "" {
			v, err := strconv.ParseFloat(t, 64)
			if err != nil || math.IsNaN(v) || math.IsInf(v, 0) || math.Abs(v) > 1e9 {
				return r, fmt.Errorf("%q is not a finite number of mm (up to 1e9 in size); give MIN:MAX in mm, such as 45:55", t)
			}
			*side.v = v
		}
	}
	if r.Min > r.Max {
		return r, fmt.Errorf("MIN %g is above MAX %g", r.Min, r.Max)
	}
	if math.IsInf(r.Min, -1) && math.IsInf(r.Max, 1) {
		return catalog.Range{}, nil
	}
	return r, nil
}

func containsFold(list []string, s string) bool {
	for _, x := range list {
		if strings.EqualFold(x, strings.TrimSpace(s)) {
			return true
		}
	}
	return false
}

func runCatalogList(o *catalogListOptions) error {
	s, err := o.env.stores().Read(o.DB)
	if err != nil {
		return err
	}
	defer s.Close()
	rows, err := s.Computed(context.Background(), o.filter)
	if err != nil {
		return catalogError(err)
	}
	for _, r := range rows {
		for _, w := range r.Warnings {
			notef(o.env, "cardinal: warning: %s: %s\n", r.ID(), w)
		}
	}
	if len(rows) == 0 && o.out.Format == "table" {
		notef(o.env, "cardinal: no part matches; widen the filters or run 'cardinal catalog list' without any\n")
	}
	return writePartRows(o.env, o.out, rows)
}

// A listedPart is one part in `catalog list --format json`: the keys of
// inspect for the forward orientation, reversed_* for the part turned
// around; focal values are null for an afocal part.
type listedPart struct {
	Supplier                 string   `json:"supplier"`
	Part                     string   `json:"part"`
	Description              string   `json:"description"`
	Kind                     string   `json:"kind"`
	WavelengthNm             float64  `json:"wavelength_nm"`
	DiameterMm               float64  `json:"diameter_mm"`
	ClearApertureMm          float64  `json:"clear_aperture_mm"`
	LengthMm                 float64  `json:"length_mm"`
	PowerDpt                 float64  `json:"power_dpt"`
	EFLMm                    *float64 `json:"efl_mm"`
	BFDMm                    *float64 `json:"bfd_mm"`
	FFDMm                    *float64 `json:"ffd_mm"`
	PrincipalMm              *float64 `json:"principal_mm"`
	PrincipalPrimeMm         *float64 `json:"principal_prime_mm"`
	ReversedBFDMm            *float64 `json:"reversed_bfd_mm"`
	ReversedFFDMm            *float64 `json:"reversed_ffd_mm"`
	ReversedPrincipalMm      *float64 `json:"reversed_principal_mm"`
	ReversedPrincipalPrimeMm *float64 `json:"reversed_principal_prime_mm"`
	Quantity                 int      `json:"quantity"`
	Location                 string   `json:"location"`
	Warnings                 []string `json:"warnings"`
}

func listed(r catalog.PartRow) listedPart {
	l := listedPart{Supplier: r.Supplier, Part: r.Part, Description: r.Description, Kind: r.Kind,
		WavelengthNm: r.Forward.Wavelength, DiameterMm: r.Diameter, ClearApertureMm: r.ClearAperture,
		LengthMm: r.Length, PowerDpt: r.Forward.Power * 1000, Quantity: r.Quantity, Location: r.Location,
		Warnings: append([]string{}, r.Warnings...)}
	v := func(x float64) *float64 { return &x }
	if f := r.Forward; !f.Afocal {
		l.EFLMm, l.BFDMm, l.FFDMm, l.PrincipalMm, l.PrincipalPrimeMm = v(f.EFL), v(f.BFD), v(f.FFD), v(f.P), v(f.PPrime)
	}
	if b := r.Reversed; !b.Afocal {
		l.ReversedBFDMm, l.ReversedFFDMm, l.ReversedPrincipalMm, l.ReversedPrincipalPrimeMm = v(b.BFD), v(b.FFD), v(b.P), v(b.PPrime)
	}
	return l
}

func writePartRows(e *env, o outputFlags, rows []catalog.PartRow) error {
	parts := make([]listedPart, len(rows))
	for i, r := range rows {
		parts[i] = listed(r)
	}
	return render(e, e.Out, o, partTable(parts), parts)
}

// partTable describes the listed parts once: a short default set for a
// terminal, every figure (the JSON keys) for CSV and --wide.
func partTable(parts []listedPart) present.Table {
	opt := func(p *float64) present.Cell {
		if p == nil {
			return present.Cell{Text: "afocal"}
		}
		return present.Num(*p, 3)
	}
	t := present.Table{Columns: []present.Column{
		{Key: "name", Label: "part"}, {Key: "supplier", Label: "supplier", Optional: true}, {Key: "part", Label: "part number", Optional: true},
		{Key: "description", Label: "description", Optional: true}, {Key: "kind", Label: "kind"},
		{Key: "wavelength_nm", Label: "wavelength", Unit: "nm", Optional: true},
		{Key: "diameter_mm", Label: "diameter", Unit: "mm"},
		{Key: "clear_aperture_mm", Label: "clear aperture", Unit: "mm", Optional: true},
		{Key: "length_mm", Label: "length", Unit: "mm"}, {Key: "power_dpt", Label: "power", Unit: "dpt", Optional: true},
		{Key: "efl_mm", Label: "EFL", Unit: "mm"}, {Key: "bfd_mm", Label: "BFD", Unit: "mm"}, {Key: "ffd_mm", Label: "FFD", Unit: "mm"},
		{Key: "principal_mm", Label: "P", Unit: "mm", Optional: true},
		{Key: "principal_prime_mm", Label: "P'", Unit: "mm", Optional: true},
		{Key: "reversed_bfd_mm", Label: "BFD reversed", Unit: "mm", Optional: true},
		{Key: "reversed_ffd_mm", Label: "FFD reversed", Unit: "mm", Optional: true},
		{Key: "reversed_principal_mm", Label: "P reversed", Unit: "mm", Optional: true},
		{Key: "reversed_principal_prime_mm", Label: "P' reversed", Unit: "mm", Optional: true},
		{Key: "quantity", Label: "drawer"}, {Key: "location", Label: "location", Optional: true},
		{Key: "warnings", Label: "warnings", Note: true},
	}}
	for _, p := range parts {
		t.Add(present.Text(p.Supplier+":"+p.Part), present.Text(p.Supplier), present.Text(p.Part), present.Text(p.Description), present.Text(p.Kind),
			present.Num(p.WavelengthNm, 4), present.Num(p.DiameterMm, 2), present.Num(p.ClearApertureMm, 2),
			present.Num(p.LengthMm, 3), present.Num(p.PowerDpt, 3), opt(p.EFLMm), opt(p.BFDMm), opt(p.FFDMm),
			opt(p.PrincipalMm), opt(p.PrincipalPrimeMm), opt(p.ReversedBFDMm), opt(p.ReversedFFDMm),
			opt(p.ReversedPrincipalMm), opt(p.ReversedPrincipalPrimeMm), present.Int(p.Quantity),
			present.Text(p.Location), present.Text(strings.Join(p.Warnings, "; ")))
	}
	return t
}

// catalogExportOptions are the flags of `catalog export`.
type catalogExportOptions struct {
	env       *env
	DB        string
	Suppliers []string
}

func newCatalogExportCmd(e *env, run func(*catalogExportOptions) error) *cobra.Command {
	o := &catalogExportOptions{env: e}
	cmd := &cobra.Command{
		Use:   "export",
		Short: "Write the catalog's prescriptions as a CSV that imports back unchanged",
		Long: `Write every part (or those of --supplier) to standard output as a neutral
prescription CSV. Numbers are written in full precision, so importing the file
again reproduces every field and changes nothing.

It is a lossless backup, written as stored: do not open it in a spreadsheet,
which may run a cell that begins with = + - or @ as a formula. For a
spreadsheet use 'catalog list --format csv', whose cells are made safe.`,
		Example: `  cardinal catalog export > back.csv
  cardinal catalog export --supplier DEMO > demo.csv`,
		Args: cobra.NoArgs,
		RunE: func(cmd *cobra.Command, _ []string) error {
			o.DB = dbFlag(cmd)
			return run(o)
		},
	}
	cmd.Flags().StringSliceVar(&o.Suppliers, "supplier", nil, "only these suppliers (repeat or separate with commas)")
	return cmd
}

func runCatalogExport(o *catalogExportOptions) error {
	ctx := context.Background()
	s, err := o.env.stores().Read(o.DB)
	if err != nil {
		return err
	}
	defer s.Close()
	entries, err := s.Entries(ctx, catalog.Filter{Suppliers: o.Suppliers})
	if err != nil {
		return catalogError(err)
	}
	if len(entries) == 0 && len(o.Suppliers) > 0 {
		return notFoundErrorf("no parts of supplier %s in the catalog; 'cardinal catalog list' shows what there is", strings.Join(o.Suppliers, ", "))
	}
	if err := importers.WritePrescriptions(o.env.Out, entries); err != nil {
		return err
	}
	user, err := s.UserGlasses(ctx)
	if err != nil {
		return err
	}
	noteUserGlasses(o.env, entries, user)
	return nil
}

// noteUserGlasses reminds, on stderr, that the export names glasses of the
// user's own, which a catalog must know before it imports the file.
func noteUserGlasses(e *env, entries []record.Entry, user []importers.Glass) {
	mine := map[string]bool{}
	for _, g := range user {
		mine[strings.ToLower(g.Name)] = true
	}
	used := map[string]bool{}
	var names []string
	for _, en := range entries {
		for _, m := range en.Part.Media {
			n := m.Name()
			if mine[strings.ToLower(n)] && !used[n] {
				used[n] = true
				names = append(names, n)
			}
		}
	}
	if len(names) > 0 {
		notef(e, "cardinal: the export uses your glasses %s; import them first elsewhere ('cardinal glass list --user --format csv' writes them)\n", strings.Join(names, ", "))
	}
}

// catalogRemoveOptions are the arguments of `catalog remove`.
type catalogRemoveOptions struct {
	env  *env
	DB   string
	Part string // SUPPLIER:PART
}

func newCatalogRemoveCmd(e *env, run func(*catalogRemoveOptions) error) *cobra.Command {
	o := &catalogRemoveOptions{env: e}
	return &cobra.Command{
		Use:     "remove SUPPLIER:PART",
		Short:   "Remove a part (and its drawer entry) from the catalog",
		Example: `  cardinal catalog remove DEMO:PCX-50`,
		Args:    cobra.ExactArgs(1),
		RunE: func(cmd *cobra.Command, args []string) error {
			o.DB, o.Part = dbFlag(cmd), args[0]
			return run(o)
		},
	}
}

func runCatalogRemove(o *catalogRemoveOptions) error {
	s, err := o.env.stores().Write(o.DB, false)
	if err != nil {
		return err
	}
	defer s.Close()
	it, err := s.Remove(context.Background(), o.Part)
	if err != nil {
		return catalogError(err)
	}
	fmt.Fprintf(o.env.Out, "removed %s from %s", it.ID(), s.Path())
	if it.Quantity > 0 {
		fmt.Fprintf(o.env.Out, ", with its drawer entry (%d at %s)", it.Quantity, it.Location)
	}
	fmt.Fprintln(o.env.Out)
	return nil
}
