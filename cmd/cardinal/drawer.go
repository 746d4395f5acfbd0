package main

import (
	"cardinal/search/present"
	"strconv"

	"bytes"
	"context"
	"fmt"

	"github.com/spf13/cobra"

	"cardinal/catalog"
	"cardinal/importers"
)

func newDrawerCmd(e *env) *cobra.Command {
	cmd := &cobra.Command{
		Use:   "drawer",
		Short: "Record which catalog parts you have at hand, how many and where",
		Long: `The drawer is the lenses you hold: for each catalog part, a quantity and a
location. 'cardinal find --in-drawer' and 'catalog list --in-drawer' use it.`,
	}
	cmd.AddCommand(newDrawerImportCmd(e, runDrawerImport), newDrawerSetCmd(e, runDrawerSet), newDrawerListCmd(e, runDrawerList))
	return cmd
}

func newDrawerImportCmd(e *env, run func(*importOptions) error) *cobra.Command {
	return newImportCmd(e, "Set quantities and locations from a drawer CSV (supplier, part, quantity, location)", `Read a drawer CSV (columns supplier, part, quantity, location) and set each
part's quantity and location. Every part must be in the catalog; a file with
any bad row changes nothing. Parts the file does not name keep their entries.`,
		`  cardinal drawer import drawer.csv`, run)
}

func runDrawerImport(o *importOptions) error {
	data, err := readInputFile(o.File, o.env)
	if err != nil {
		return err
	}
	f, err := importers.ReadDrawerFile(bytes.NewReader(data), o.File)
	if err != nil {
		return usageErrorf("%s cannot be imported; nothing was changed. Fix these lines and import again:\n%v", o.File, err)
	}
	for _, w := range f.Warnings {
		notef(o.env, "cardinal: warning: %v\n", w)
	}
	s, err := o.env.stores().Write(o.DB, false)
	if err != nil {
		return err
	}
	defer s.Close()
	var rep catalog.DrawerReport
	err = waitNotice(o.env, s.Path(), func() (err error) {
		rep, err = s.ImportDrawer(context.Background(), f.Rows, o.DryRun)
		return err
	})
	if err != nil {
		return importErrorf(o.File, err)
	}
	printChanges(o.env, s.Path(), o.File, "drawer entries", rep.Added, rep.Updated, len(rep.Unchanged), 0, o.DryRun)
	return nil
}

// drawerSetOptions are the arguments of `drawer set`.
type drawerSetOptions struct {
	env      *env
	DB       string
	Part     string
	Quantity int
	Location string
	// KeepLocation is true when --location was not given.
	KeepLocation bool
}

func newDrawerSetCmd(e *env, run func(*drawerSetOptions) error) *cobra.Command {
	o := &drawerSetOptions{env: e}
	cmd := &cobra.Command{
		Use:   "set SUPPLIER:PART [N] [--location L]",
		Short: "Set how many of a part you have and where",
		Long: `Set how many of a part you have and where. The quantity is the second
argument or --quantity N; 0 when none are left.`,
		Example: `  cardinal drawer set DEMO:PCX-50 3 --location B2
  cardinal drawer set DEMO:PCX-50 --quantity 0`,
		Args: cobra.RangeArgs(1, 2),
		RunE: func(cmd *cobra.Command, args []string) error {
			o.DB, o.Part = dbFlag(cmd), args[0]
			o.KeepLocation = !cmd.Flags().Changed("location")
			given := cmd.Flags().Changed("quantity")
			if len(args) == 2 {
				n, err := strconv.Atoi(args[1])
				switch {
				case err != nil:
					return usageErrorf("quantity %q: give a whole number >= 0 after the part name", args[1])
				case given && n != o.Quantity:
					return usageErrorf("quantity given twice (%d and --quantity %d): give one", n, o.Quantity)
				}
				o.Quantity, given = n, true
			}
			if !given {
				return usageErrorf("give the quantity: cardinal drawer set %s N (0 when none are left)", args[0])
			}
			if o.Quantity < 0 {
				return usageErrorf("--quantity %d: give a whole number >= 0", o.Quantity)
			}
			return run(o)
		},
	}
	cmd.Flags().IntVar(&o.Quantity, "quantity", 0, "pieces at hand, the same as the second argument (0 when none are left)")
	cmd.Flags().StringVar(&o.Location, "location", "", "where they are, such as B2 (default: keep the stored one)")
	return cmd
}

func runDrawerSet(o *drawerSetOptions) error {
	s, err := o.env.stores().Write(o.DB, false)
	if err != nil {
		return err
	}
	defer s.Close()
	it, err := s.SetDrawer(context.Background(), o.Part, o.Quantity, o.Location, o.KeepLocation)
	if err != nil {
		return catalogError(err)
	}
	fmt.Fprintf(o.env.Out, "%s: %d in the drawer", it.ID(), it.Quantity)
	if it.Location != "" {
		fmt.Fprintf(o.env.Out, " at %s", it.Location)
	}
	fmt.Fprintln(o.env.Out)
	return nil
}

// drawerListOptions are the flags of `drawer list`.
type drawerListOptions struct{ listOptions }

func newDrawerListCmd(e *env, run func(*drawerListOptions) error) *cobra.Command {
	o := &drawerListOptions{}
	return newListCmd(e, listCommand{
		Use:        "list",
		Short:      "List the parts in the drawer with their focal lengths",
		Example:    `  cardinal drawer list --format csv > drawer.csv`,
		FormatHelp: "output format: table, json, csv or md (csv is a drawer CSV that 'drawer import' reads)",
	}, &o.listOptions, func() error { return run(o) })
}

// A drawerEntry is one row of `drawer list --format json`.
type drawerEntry struct {
	Supplier    string   `json:"supplier"`
	Part        string   `json:"part"`
	Quantity    int      `json:"quantity"`
	Location    string   `json:"location"`
	Description string   `json:"description"`
	EFLMm       *float64 `json:"efl_mm"`
	DiameterMm  float64  `json:"diameter_mm"`
}

func runDrawerList(o *drawerListOptions) error {
	ctx := context.Background()
	s, err := o.env.stores().Read(o.DB)
	if err != nil {
		return err
	}
	defer s.Close()
	items, err := s.DrawerItems(ctx)
	if err != nil {
		return catalogError(err)
	}
	if o.Format == "csv" {
		return importers.WriteDrawer(o.env.Out, items)
	}
	rows, err := s.Computed(ctx, catalog.Filter{})
	if err != nil {
		return catalogError(err)
	}
	byID := map[string]catalog.PartRow{}
	for _, r := range rows {
		byID[r.ID()] = r
	}
	out := make([]drawerEntry, len(items))
	t := present.Table{Columns: []present.Column{{Key: "name", Label: "part"},
		{Key: "supplier", Label: "supplier", Optional: true}, {Key: "part", Label: "part number", Optional: true},
		{Key: "quantity", Label: "quantity"}, {Key: "location", Label: "location"}, {Key: "efl_mm", Label: "EFL", Unit: "mm"},
		{Key: "diameter_mm", Label: "diameter", Unit: "mm"}, {Key: "description", Label: "description", Note: true}}}
	for i, it := range items {
		r := byID[it.ID()]
		d := drawerEntry{Supplier: it.Supplier, Part: it.Part, Quantity: it.Quantity, Location: it.Location,
			Description: r.Description, DiameterMm: r.Diameter}
		if !r.Forward.Afocal {
			efl := r.Forward.EFL
			d.EFLMm = &efl
		}
		out[i] = d
		efl := present.OptNum(d.EFLMm, 3)
		if d.EFLMm == nil {
			efl.Text = "afocal"
		}
		t.Add(present.Text(it.ID()), present.Text(it.Supplier), present.Text(it.Part), present.Int(it.Quantity), present.Text(it.Location), efl,
			present.Num(d.DiameterMm, 2), present.Text(d.Description))
	}
	return render(o.env, o.env.Out, outputFlags{Format: o.Format}, t, out)
}
