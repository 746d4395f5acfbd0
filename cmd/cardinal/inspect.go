package main

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"math"
	"os"
	"strconv"
	"strings"

	"github.com/spf13/cobra"

	"cardinal/catalog"
	"cardinal/catalog/record"
	"cardinal/importers"
	"cardinal/optics"
	"cardinal/search"
	"cardinal/search/present"
)

// inspectOptions are the flags of `cardinal inspect`. The zero value is not
// used; the flag defaults are the useful ones.
type inspectOptions struct {
	env *env
	// File is a prescription CSV; "" means the built-in demo lenses.
	File string
	// Parts are SUPPLIER:PART names; none means every part of the file.
	Parts []string
	// CatalogParts are the SUPPLIER:PART arguments: parts taken from the
	// catalog (db.go) instead of a file.
	CatalogParts        []string
	db                  string
	Reverse             bool
	Wavelength          float64 // nm
	MediumIn, MediumOut string  // glass names of object and image space
	Format              string
	// Rays are the real-ray settings (inspect_quality.go); zero traces
	// nothing.
	Rays rayOptions
	// Ghosts are the ghost-focus settings (inspect_ghosts.go).
	Ghosts ghostOptions
}

func newInspectCmd(e *env, run func(*inspectOptions) error) *cobra.Command {
	opts := &inspectOptions{env: e}
	cmd := &cobra.Command{
		Use:   "inspect",
		Short: "Print every cardinal point of stock parts",
		Long: `Print the first-order properties of each part of a prescription CSV: EFL,
front and back focal lengths, FFD and BFD, the focal, principal, nodal,
anti-principal and anti-nodal points, length, power, edge thickness and the
indices used.

Front points are measured from the first vertex, back points from the last
vertex, both in mm and positive toward the image (light travels left to
right). Parts named as arguments come from your catalog (or the built-in demo
catalog until you have one). Without --file or arguments the built-in demo
lenses (invented parts) are used.

With --beam (a collimated beam, object at infinity) or --na (an object at a
finite distance) each part is also traced with real rays: RMS spot at best
focus on axis and at the field edge (--field-angle with --beam,
--object-height with --na), Airy radius, RMS wavefront error and whether it
is diffraction limited (0.07 waves RMS, Marechal), focal shift over --band,
and the best focus from the paraxial image. With --na the object sits
--object-distance mm in front of the first vertex; without it, where the
part images it at -1x (twice the focal length before the front principal
point), the symmetric finite conjugate, which needs no further choice.

With --ghosts each part is judged for a laser beam instead (--beam, its 1/e^2
diameter with the waist at the first vertex, or --waist-in and --waist-in-at):
every ghost focus of light reflected once (back toward the laser) or twice (on
toward the image), where it lies from the first vertex, its radius, the
reflectance (Fresnel, from the indices) and its concentration against the beam
at the part, flagged inside the part, within 1 mm of a surface, or at the
laser's exit (--laser-exit); with --power, the peak irradiance. These are
paraxial estimates: they do not replace a safety assessment; ask your laser
safety officer and follow local rules.`,
		Example: `  cardinal inspect
  cardinal inspect DEMO:PCX-50 --reverse
  cardinal inspect --file lenses.csv --part DEMO:PCX-50 --reverse --wavelength 632.8 --format json
  cardinal inspect --file lenses.csv --medium-in water
  cardinal inspect DEMO:PCX-50 --beam 10 --field-angle 1 --band 486.1,587.6,656.3
  cardinal inspect DEMO:PCX-50 --na 0.05 --object-distance 120 --format json
  cardinal inspect DEMO:PCX-50 --ghosts --beam 3 --wavelength 1064 --power 2 --laser-exit 250`,
		Args: cobra.ArbitraryArgs,
		RunE: func(c *cobra.Command, args []string) error {
			opts.CatalogParts, opts.db = args, dbFlag(c)
			if err := opts.validate(); err != nil {
				return err
			}
			return run(opts)
		},
	}
	f := cmd.Flags()
	f.StringVar(&opts.File, "file", "", "prescription CSV to read (default: the built-in demo lenses)")
	f.StringSliceVar(&opts.Parts, "part", nil, "part to inspect as SUPPLIER:PART; repeat or separate with commas (default: all)")
	f.BoolVar(&opts.Reverse, "reverse", false, "turn the parts around")
	f.Float64Var(&opts.Wavelength, "wavelength", optics.LineD, "wavelength in nm")
	f.StringVar(&opts.MediumIn, "medium-in", "air", "medium of object space: air, a glass name or a six-digit glass code")
	f.StringVar(&opts.MediumOut, "medium-out", "air", "medium of image space")
	f.StringVar(&opts.Format, "format", "table", "output format: table, json, csv or md")
	opts.Rays.flags(f)
	opts.Ghosts.flags(f)
	return cmd
}

func (o *inspectOptions) validate() error {
	if len(o.CatalogParts) > 0 && (o.File != "" || len(o.Parts) > 0) {
		return usageErrorf("name parts either as arguments (from the catalog) or with --file and --part, not both")
	}
	if err := checkFormat(o.Format); err != nil {
		return err
	}
	if !(o.Wavelength > 0) || math.IsInf(o.Wavelength, 0) {
		return usageErrorf("--wavelength %g: give a wavelength in nm, such as 587.5618 (the d line) or 632.8", o.Wavelength)
	}
	if o.Ghosts.Ghosts {
		return o.Ghosts.validate(o.Rays)
	}
	if err := o.Ghosts.validate(o.Rays); err != nil {
		return err
	}
	return o.Rays.validate()
}

func runInspect(o *inspectOptions) error {
	glasses := optics.BuiltinGlasses()
	in, err := glasses.Lookup(o.MediumIn)
	if err != nil {
		return usageErrorf("--medium-in: %v", err)
	}
	out, err := glasses.Lookup(o.MediumOut)
	if err != nil {
		return usageErrorf("--medium-out: %v", err)
	}
	entries, err := loadInspectEntries(o, glasses)
	if err != nil {
		return err
	}
	if entries, err = selectParts(entries, o.Parts, o.fileName()); err != nil {
		return err
	}
	if o.Ghosts.Ghosts {
		return writeGhosts(o, entries, in, out)
	}
	set := search.InspectSetting{Reverse: o.Reverse, Wavelength: o.Wavelength, In: in, Out: out, Rays: o.Rays.setting()}
	if set.Defaults, set.DefaultsFrom, err = o.inspectTolerances(); err != nil {
		return err
	}
	results := make([]search.Inspection, len(entries))
	for i, e := range entries {
		results[i] = search.Inspect(e, set)
		for _, w := range results[i].Warnings {
			notef(o.env, "cardinal: warning: %s: %s\n", results[i].ID(), w)
		}
	}
	if set.Rays.IsLaser(o.Wavelength) {
		writeLaserCautions(o.env)
	}
	return writeInspections(o.env, o.env.Out, o.Format, results)
}

// fileName is the name of the file the parts come from, for messages.
func (o *inspectOptions) fileName() string {
	if o.File == "" {
		return "demo lenses.csv"
	}
	return o.File
}

// loadInspectEntries reads the parts to inspect: the --file, or the
// built-in demo lenses when there is none.
func loadInspectEntries(o *inspectOptions, glasses optics.GlassTable) ([]record.Entry, error) {
	if len(o.CatalogParts) > 0 {
		return catalogEntries(o.db, o.env, o.CatalogParts)
	}
	name := o.fileName()
	var data []byte
	var err error
	if o.File == "" {
		notef(o.env, "cardinal: no --file given: inspecting the built-in demo lenses (invented parts); use --file to read your own\n")
		data = catalog.DemoLenses()
	} else {
		data, err = os.ReadFile(name)
	}
	switch {
	case errors.Is(err, fs.ErrNotExist):
		return nil, notFoundErrorf("--file %s: no such file; give the path of a prescription CSV", name)
	case err != nil:
		return nil, usageErrorf("--file %s: %v", name, err)
	}
	f, err := importers.ReadPrescriptionFile(bytes.NewReader(data), name, glasses)
	if err != nil {
		return nil, usageErrorf("%s cannot be read; fix these lines and try again:\n%v", name, err)
	}
	for _, w := range f.Warnings {
		notef(o.env, "cardinal: warning: %v\n", w)
	}
	return f.Rows, nil
}

// selectParts picks the named parts of a file in the order asked, by the
// catalog's part-name rules (catalog.ResolvePart), the same as for parts
// named from the catalog.
func selectParts(entries []record.Entry, names []string, file string) ([]record.Entry, error) {
	if len(names) == 0 {
		return entries, nil
	}
	ids := make([]string, len(entries))
	for i, e := range entries {
		ids[i] = e.Part.ID()
	}
	picked, missing := catalog.ResolveParts(names, ids, file)
	for _, nf := range missing {
		nf.Hint = fmt.Sprintf("none of its %d parts is close; run without --part to list them", len(ids))
	}
	if len(missing) > 0 {
		return nil, partsNotFound(missing)
	}
	out := make([]record.Entry, len(picked))
	for i, j := range picked {
		out[i] = entries[j]
	}
	return out, nil
}

// partsNotFound is the error for part names that matched nothing: the
// catalog's own error for one, all of them in one message for several.
func partsNotFound(missing []*catalog.NotFoundError) error {
	if len(missing) == 1 {
		return missing[0]
	}
	lines := make([]string, len(missing))
	for i, nf := range missing {
		lines[i] = nf.Error()
	}
	return notFoundErrorf("%d parts not found:\n  %s", len(missing), strings.Join(lines, "\n  "))
}

func formatNm(wl float64) string { return strconv.FormatFloat(wl, 'g', -1, 64) }

// writeInspections prints the results: JSON, one CSV row per part, or for
// people (table, md) one "figure | value | unit" block per part, which reads
// in 100 columns.
func writeInspections(e *env, w io.Writer, format string, rs []search.Inspection) error {
	switch format {
	case "json":
		return render(e, w, outputFlags{Format: format}, present.Table{}, rs)
	case "csv":
		return render(e, w, outputFlags{Format: format}, inspectionTable(rs), nil)
	}
	for i, r := range rs {
		if i > 0 {
			fmt.Fprintln(w)
		}
		title := inspectionTitle(r)
		if format == "md" {
			title = "### " + title + "\n"
		}
		fmt.Fprintln(w, title)
		if err := render(e, w, outputFlags{Format: format}, figureTable(r), nil); err != nil {
			return err
		}
	}
	return nil
}

func inspectionTitle(r search.Inspection) string {
	t := r.ID()
	if r.Reversed {
		t += " (reversed)"
	}
	if r.Description != "" {
		t += ": " + r.Description
	}
	t = fmt.Sprintf("%s\nat %s nm, object space %s, image space %s", t, formatNm(r.WavelengthNm), r.Media[0].Name(), r.Media[len(r.Media)-1].Name())
	if r.RaySetting != "" {
		t += "\n" + r.RaySetting
	}
	return t
}

// figureTable is the vertical layout of one part for people.
func figureTable(r search.Inspection) present.Table {
	c := r.Cardinal
	var rows [][]string
	add := func(figure, value, unit string) { rows = append(rows, []string{figure, value, unit}) }
	const front, back = "mm from first vertex", "mm from last vertex"
	add("length, vertex to vertex", present.Fixed(c.Length, 3), "mm")
	add("power", present.Fixed(c.Dioptres(), 4), "dioptres")
	if c.Afocal {
		add("angular magnification", present.Fixed(c.AngularMagnification, 6), "(afocal)")
		add("lateral magnification", present.Fixed(c.LateralMagnification, 6), "(afocal)")
	} else {
		add("EFL", present.Fixed(c.EFL, 3), "mm")
		add("front focal length f, P to F", present.Fixed(c.FFront, 3), "mm")
		add("back focal length f', P' to F'", present.Fixed(c.FBack, 3), "mm")
		add("focal point F (FFD)", present.Fixed(c.F, 3), front)
		add("focal point F' (BFD)", present.Fixed(c.FPrime, 3), back)
		add("principal point P", present.Fixed(c.P, 3), front)
		add("principal point P'", present.Fixed(c.PPrime, 3), back)
		add("nodal point N", present.Fixed(c.N, 3), front)
		add("nodal point N'", present.Fixed(c.NPrime, 3), back)
		add("anti-principal point, front", present.Fixed(c.AP, 3), front)
		add("anti-principal point, back", present.Fixed(c.APPrime, 3), back)
		add("anti-nodal point, front", present.Fixed(c.AN, 3), front)
		add("anti-nodal point, back", present.Fixed(c.ANPrime, 3), back)
	}
	add("edge thickness", present.Fixed(r.EdgeThicknessMm, 3), "mm at "+strconv.FormatFloat(r.Diameter, 'g', -1, 64)+" mm diameter")
	for i, m := range r.Media {
		where := fmt.Sprintf("index, surface %d to %d", i, i+1)
		switch i {
		case 0:
			where = "index of object space"
		case len(r.Media) - 1:
			where = "index of image space"
		}
		add(where, present.Fixed(r.Indices[i], 6), m.Name())
	}
	rows = append(rows, toleranceRows(r)...)
	if c := r.ResidualReflectancePct; c != nil {
		add("coating, residual reflectance", strconv.FormatFloat(*c, 'g', -1, 64), "% per face in air")
	} else {
		add("coating, residual reflectance", "not stated", "Fresnel from the indices")
	}
	return textTable([]string{"figure", "value", "unit"}, append(rows, qualityRows(r)...))
}

// inspectionTable is one row per part with the JSON keys as header;
// numbers in full precision, empty for an afocal part's focal quantities.
func inspectionTable(rs []search.Inspection) present.Table {
	keys := []string{"supplier", "part", "reversed", "wavelength_nm", "length_mm", "efl_mm", "f_front_mm", "f_back_mm",
		"ffd_mm", "bfd_mm", "focal_mm", "focal_prime_mm", "principal_mm", "principal_prime_mm", "nodal_mm", "nodal_prime_mm",
		"antiprincipal_mm", "antiprincipal_prime_mm", "antinodal_mm", "antinodal_prime_mm", "edge_thickness_mm", "warnings"}
	rays := len(rs) > 0 && rs[0].RaySetting != ""
	if rays {
		keys = append(keys, qualityKeys...)
	}
	t := present.Table{}
	for _, k := range keys {
		t.Columns = append(t.Columns, present.Column{Key: k, Label: k})
	}
	for _, r := range rs {
		row := []present.Cell{present.Text(r.Supplier), present.Text(r.Part), present.Bool(r.Reversed),
			present.Num(r.WavelengthNm, 4), present.Num(r.LengthMm, 3)}
		for _, p := range []*float64{r.EFLMm, r.FFrontMm, r.FBackMm, r.FFDMm, r.BFDMm, r.FocalMm, r.FocalPrimeMm,
			r.PrincipalMm, r.PrincipalPrimeMm, r.NodalMm, r.NodalPrimeMm, r.AntiPrincipalMm, r.AntiPrincipalPrimeMm,
			r.AntiNodalMm, r.AntiNodalPrimeMm} {
			row = append(row, present.OptNum(p, 3))
		}
		row = append(row, present.Num(r.EdgeThicknessMm, 3), present.Text(strings.Join(r.Warnings, "; ")))
		if rays {
			row = append(row, qualityCells(r.ImageQuality)...)
		}
		t.Add(row...)
	}
	return t
}
