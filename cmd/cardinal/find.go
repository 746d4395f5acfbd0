package main

import (
	"bytes"
	"context"
	"errors"
	"fmt"
	"runtime/debug"
	"strings"

	"github.com/spf13/cobra"
	"github.com/spf13/pflag"

	"cardinal/catalog"
	"cardinal/search"
	"cardinal/search/present"
	"cardinal/search/saved"
	"cardinal/search/solution"
)

// findOptions are the flags of `cardinal find`, bound as given; Req is the
// requirement they describe once validate has run.
type findOptions struct {
	env   *env
	db    string
	flags *pflag.FlagSet

	EFL, Beam, BFDMin, Wavelength  float64
	EFLTol, MagTol, ExpandTol      string
	Track, Mag, ObjectHeight, NA   float64
	WDMin, Expand                  float64
	Galilean, Keplerian            bool
	LengthMax, DiameterMax, GapMin float64
	Elements, Top                  int
	Supplier, Prefer, Spec         string
	DrawerOnly, Laser              bool
	Arrangements                   bool
	FieldAngle, Power              float64
	Band                           []float64
	WaistIn, WaistInAt, M2         float64
	WaistOutAt, LaserExit          float64
	WaistOut, CouplingMin          float64

	out outputFlags

	Req search.Requirement
}

func newFindCmd(e *env, run func(*findOptions) error) *cobra.Command {
	opts := &findOptions{env: e}
	cmd := &cobra.Command{
		Use:   "find",
		Short: "Find stock singlets and pairs that meet first-order requirements",
		Long: `Find single parts and pairs of parts from the catalog that meet one of four
requirements, using each part's thick-lens cardinal points at the
wavelength, in both orientations:

  focus   --efl: focus a collimated beam (EFL, back clearance)
  image   --track and --mag: image an object plane onto an image plane
  expand  --expand: an afocal pair that expands (or reduces) a beam
  match   --waist-out: couple a laser's waist (--waist-in) into another
          waist (a fibre's mode, a cavity's), over --track if given

Pairs are solved at the target (the gap absorbs the difference); a single
part or an expander is admitted within the tolerance and its error shown.
Lengths in mm: working distance is object plane to first vertex, back
clearance last vertex to image (or focal) plane, envelope first to last
vertex, gap between the facing vertices. Results meeting every constraint are
ranked by a score (error against tolerance, envelope, number of parts, and
the pieces to order after the drawer's with their price; --prefer shifts it).
A piece in the drawer costs nothing, so a layout built from the drawer ranks
first unless a purchase is clearly better. A price counts against the median
price of the parts in its own currency; amounts in different currencies are
never added (the price column shows each currency's amount). Every run is
saved; its id is printed on stderr.

One row per set of parts: the other arrangements of the same parts (order,
orientation, the other root) that meet fold into the best of them ("+" column,
e.g. +3; JSON keeps them under the row as arrangements), and parts optically
the same (EFL, front and back focal distances within 0.5 % of the EFL,
diameter within 0.01 mm) count as one part, named under "also". --top counts
rows; --arrangements lists every arrangement as its own row.

With an aperture (--beam for focus, --na for image) the best first-order
layouts (3 x --top, at least 30) are traced with real rays at the wavelength
and ranked by image quality too: RMS spot at best focus on axis and at the
field edge (--field-angle, --object-height) against the Airy radius, and the
focal shift over --band. Each row shows the spot, the Airy radius and whether
the image is diffraction limited (0.07 waves RMS, Marechal) at every field
point and every wavelength judged, on one image plane shared by all (the one
that makes the worst least): yes, or which fails first: "no: on axis", "no:
field edge" or "no: colour". Expanders are ranked on first order only,
except for a laser.

A laser (--laser, --power, or a wavelength outside 400-700 nm) is one
wavelength: the verdict, and the spots and plots of draw and report, use it
alone unless --band asks for more. It is also a Gaussian beam: --beam is its
1/e^2 diameter at the first part (waist there), or give --waist-in (1/e^2
radius) and --waist-in-at (before the first vertex); --m2 scales it. Focus
results then show the focused waist, where it lies against the paraxial
focus, its Rayleigh range and whether aberration or the waist limits the
spot, and rank the spot against the waist. Laser expanders are set at the gap
that collimates the beam (output waist at the last part, or --waist-out-at
beyond it), with the output waist, the divergence and the wavefront error
from real rays, ranked by divergence against its diffraction limit. Mode
matching ranks by the power coupling into the target mode (--coupling-min,
default 0.95) and shows how far the gap may move before the coupling drops
1 %. Every laser result names its most concentrated ghost focus (light
reflected at lens surfaces); see inspect --ghosts. These are estimates: they
do not replace a safety assessment.`,
		Example: `  cardinal find --efl 75 --efl-tol 1% --beam 6 --back-clearance-min 40 --wavelength 1064
  cardinal find --track 300 --mag -0.36 --mag-tol 2% --object-height 5 --na 0.02 --working-distance-min 60 --back-clearance-min 15
  cardinal find --expand 5 --expand-tol 2% --beam 2 --galilean --envelope-max 150
  cardinal find --efl 100 --beam 10 --field-angle 1 --band 486.1,587.6,656.3 --prefer sharp
  cardinal find --efl 50 --beam 2 --wavelength 1064 --power 0.5 --laser-exit 300
  cardinal find --waist-in 0.35 --waist-out 0.0026 --wavelength 1064 --track 120
  cardinal find --spec relay.json --top 3 --format json`,
		Args: cobra.NoArgs,
		RunE: func(c *cobra.Command, _ []string) error {
			opts.db = dbFlag(c)
			opts.flags = c.Flags()
			if err := opts.validate(); err != nil {
				return err
			}
			return run(opts)
		},
	}
	f := cmd.Flags()
	f.Float64Var(&opts.EFL, "efl", 0, "focus: effective focal length to reach, mm")
	f.StringVar(&opts.EFLTol, "efl-tol", "1%", "EFL tolerance: percent (1%) or mm (0.5mm)")
	f.Float64Var(&opts.Beam, "beam", 0, "collimated input beam diameter, mm (checks ray heights); for a laser its 1/e^2 diameter")
	f.Float64Var(&opts.BFDMin, "back-clearance-min", 0, "least back clearance, last vertex to the focal or image plane, mm")
	f.Float64Var(&opts.Wavelength, "wavelength", 587.5618, "wavelength, nm")
	f.Float64Var(&opts.Power, "power", 0, "laser power, W (brings the laser cautions)")
	f.BoolVar(&opts.Laser, "laser", false, "the light is a laser (also in the visible without --power): one wavelength in spots, plots and verdicts unless --band, and the laser cautions")
	f.Float64Var(&opts.FieldAngle, "field-angle", 0, "focus: field edge for the real-ray spot, degrees")
	f.Float64SliceVar(&opts.Band, "band", nil, "wavelengths for the focal shift, nm, e.g. 486.1,587.6,656.3; none gives no colour figure")
	f.Float64Var(&opts.Track, "track", 0, "image: object plane to image plane, mm")
	f.Float64Var(&opts.Mag, "mag", 0, "image: signed magnification (-0.5: inverted, half size)")
	f.StringVar(&opts.MagTol, "mag-tol", "1%", "magnification tolerance: percent (2%) or absolute (0.01)")
	f.Float64Var(&opts.ObjectHeight, "object-height", 0, "image: half the object field, mm (checks ray heights)")
	f.Float64Var(&opts.NA, "na", 0, "image: object-space numerical aperture (checks ray heights)")
	f.Float64Var(&opts.WDMin, "working-distance-min", 0, "image: least working distance, object plane to first vertex, mm")
	f.Float64Var(&opts.Expand, "expand", 0, "expand: output over input beam diameter")
	f.StringVar(&opts.ExpandTol, "expand-tol", "1%", "expansion tolerance: percent (2%) or absolute (0.05)")
	f.BoolVar(&opts.Galilean, "galilean", false, "expand: negative and positive part, no internal focus")
	f.BoolVar(&opts.Keplerian, "keplerian", false, "expand: two positive parts, an internal focus")
	f.Float64Var(&opts.WaistIn, "waist-in", 0, "laser: input waist, 1/e^2 radius, mm (instead of --beam)")
	f.Float64Var(&opts.WaistInAt, "waist-in-at", 0, "laser: input waist's distance before the first vertex, mm (negative: after it)")
	f.Float64Var(&opts.M2, "m2", 0, "laser: beam quality M^2 (default 1)")
	f.Float64Var(&opts.WaistOutAt, "waist-out-at", 0, "laser expand: output waist's distance beyond the last vertex, mm")
	f.Float64Var(&opts.LaserExit, "laser-exit", 0, "laser: exit aperture's distance before the first vertex, mm (flags ghosts near it)")
	f.Float64Var(&opts.WaistOut, "waist-out", 0, "match: target waist, 1/e^2 radius, mm; --track is then waist plane to waist plane")
	f.Float64Var(&opts.CouplingMin, "coupling-min", 0, "match: least power coupling into the target mode (default 0.95)")
	f.Float64Var(&opts.LengthMax, "envelope-max", 0, "longest envelope, first to last vertex, mm (0: no limit)")
	f.Float64Var(&opts.DiameterMax, "diameter-max", 0, "largest part diameter, mm (0: no limit)")
	f.Float64Var(&opts.GapMin, "gap-min", search.DefaultGapMin, "least edge clearance between facing parts, mm")
	f.IntVar(&opts.Elements, "elements", 2, "1: single parts only; 2: single parts and pairs")
	f.StringVar(&opts.Supplier, "supplier", "", "only parts of this supplier")
	f.BoolVar(&opts.DrawerOnly, "in-drawer", false, "only parts in the drawer")
	f.IntVar(&opts.Top, "top", search.DefaultTop, "rows to show, one per set of parts (0: all that meet the requirement)")
	f.BoolVar(&opts.Arrangements, "arrangements", false, "list every arrangement of a set of parts as its own row (default: the best, '+N' for the others)")
	f.StringVar(&opts.Prefer, "prefer", "", "rank weight to raise: drawer, short, cheap, sharp (image quality) or robust (yield of real builds)")
	f.StringVar(&opts.Spec, "spec", "", "JSON requirement file; flags given override it")
	addOutputFlags(f, &opts.out, true)
	return cmd
}

// validate builds the requirement from the spec file and the flags given,
// and checks it. A problem with a field is named as the user gave it: by
// its flag, or by its key in the spec file.
func (o *findOptions) validate() error {
	if err := checkFormat(o.out.Format); err != nil {
		return err
	}
	req := search.Defaults()
	if o.Spec != "" {
		b, err := readInputFile(o.Spec, o.env)
		if err != nil {
			return err
		}
		if req, err = search.ReadSpec(bytes.NewReader(b), o.Spec); err != nil {
			return err
		}
	}
	if err := o.apply(&req); err != nil {
		return err
	}
	if err := req.Validate(); err != nil {
		var re *search.RequirementError
		if errors.As(err, &re) {
			return &namedError{re, o.fieldNamer()}
		}
		return err
	}
	o.Req = req
	return nil
}

// fieldNamer names a requirement key by the flag that set it; with a spec
// file, every other key by its key in the file.
func (o *findOptions) fieldNamer() func(string) string {
	return func(key string) string {
		flag, hasFlag := flagKeys[key]
		if hasFlag && o.flags != nil && o.flags.Changed(strings.TrimPrefix(flag, "--")) {
			return flag
		}
		if o.Spec != "" {
			return fmt.Sprintf("%q in %s", key, o.Spec)
		}
		return flagName(key)
	}
}

// apply lays the flags given on the command line over the requirement.
func (o *findOptions) apply(req *search.Requirement) error {
	set := func(name string) bool { return o.flags != nil && o.flags.Changed(name) }
	if err := o.applyKind(req, set); err != nil {
		return err
	}
	floats := map[string]*float64{"efl": &req.EFL, "beam": &req.Beam, "back-clearance-min": &req.BFDMin,
		"wavelength": &req.Wavelength, "track": &req.Track, "mag": &req.Mag,
		"object-height": &req.ObjectHeight, "na": &req.NA, "working-distance-min": &req.WDMin, "expand": &req.Expansion,
		"envelope-max": &req.LengthMax, "diameter-max": &req.DiameterMax, "gap-min": &req.GapMin,
		"power": &req.Power, "field-angle": &req.FieldAngle, "waist-in": &req.WaistIn, "waist-in-at": &req.WaistInAt,
		"m2": &req.M2, "waist-out-at": &req.WaistOutAt, "laser-exit": &req.LaserExit, "waist-out": &req.WaistOut,
		"coupling-min": &req.CouplingMin}
	values := map[string]float64{"efl": o.EFL, "beam": o.Beam, "back-clearance-min": o.BFDMin,
		"wavelength": o.Wavelength, "track": o.Track, "mag": o.Mag,
		"object-height": o.ObjectHeight, "na": o.NA, "working-distance-min": o.WDMin, "expand": o.Expand,
		"envelope-max": o.LengthMax, "diameter-max": o.DiameterMax, "gap-min": o.GapMin,
		"power": o.Power, "field-angle": o.FieldAngle, "waist-in": o.WaistIn, "waist-in-at": o.WaistInAt,
		"m2": o.M2, "waist-out-at": o.WaistOutAt, "laser-exit": o.LaserExit, "waist-out": o.WaistOut,
		"coupling-min": o.CouplingMin}
	for name, p := range floats {
		if set(name) {
			*p = values[name]
		}
	}
	tols := []struct {
		flag, value, unit string
		dst               *search.Tolerance
	}{{"efl-tol", o.EFLTol, "mm", &req.EFLTol}, {"mag-tol", o.MagTol, "", &req.MagTol}, {"expand-tol", o.ExpandTol, "", &req.ExpandTol}}
	for _, t := range tols {
		if set(t.flag) {
			v, err := search.ParseTolerance(t.value, t.unit)
			if err != nil {
				return usageErrorf("--%s: %v", t.flag, err)
			}
			*t.dst = v
		}
	}
	return o.applyRest(req, set)
}

// applyKind sets the kind from the target flags given: at most one kind,
// and the spec file's own if none.
func (o *findOptions) applyKind(req *search.Requirement, set func(string) bool) error {
	var kinds []search.Kind
	if set("efl") {
		kinds = append(kinds, search.Focus)
	}
	if set("waist-out") {
		kinds = append(kinds, search.Match)
	} else if set("track") || set("mag") {
		kinds = append(kinds, search.Image)
	}
	if set("expand") {
		kinds = append(kinds, search.Expand)
	}
	switch {
	case len(kinds) > 1:
		return usageErrorf("give one requirement: --efl (focus), --track and --mag (image), --expand or --waist-out (mode matching), not several")
	case len(kinds) == 1 && req.Kind != "" && req.Kind != kinds[0]:
		return usageErrorf("the spec file %s asks for %s; its target flags cannot turn it into %s", o.Spec, req.Kind, kinds[0])
	case len(kinds) == 1:
		req.Kind = kinds[0]
	}
	return nil
}

func (o *findOptions) applyRest(req *search.Requirement, set func(string) bool) error {
	if set("elements") {
		req.Elements = o.Elements
	}
	if set("top") {
		req.Top = o.Top
	}
	if set("arrangements") {
		req.Arrangements = o.Arrangements
	}
	if set("supplier") {
		req.Supplier = o.Supplier
	}
	if set("in-drawer") {
		req.DrawerOnly = o.DrawerOnly
	}
	if set("prefer") {
		req.Prefer = search.Prefer(o.Prefer)
	}
	if set("band") {
		req.Band = o.Band
	}
	if set("laser") {
		req.Laser = o.Laser
	}
	switch {
	case o.Galilean && o.Keplerian:
		return usageErrorf("--galilean and --keplerian exclude each other: give one, or neither to accept both forms")
	case o.Galilean:
		req.Form = search.Galilean
	case o.Keplerian:
		req.Form = search.Keplerian
	}
	return nil
}

// findOutput is the JSON document: the requirement and the results, with
// why nothing met it and the nearest misses when nothing did.
type findOutput struct {
	Requirement search.Requirement `json:"requirement"`
	Results     []search.Result    `json:"results"`
	Why         []string           `json:"why,omitempty"`
	Misses      []search.Result    `json:"misses,omitempty"`
	Notes       []string           `json:"notes,omitempty"`
}

func runFind(o *findOptions) error {
	e := o.env
	st, err := e.stores().Read(o.db)
	if err != nil {
		return err
	}
	defer st.Close()
	ctx := context.Background()
	if o.Req.Build.PartDefaults, err = st.PartTolerances(ctx); err != nil {
		return catalogError(err)
	}
	if e.Getenv == nil || e.Getenv("GOGC") == "" {
		defer debug.SetGCPercent(debug.SetGCPercent(findGCPercent))
	}
	out, err := findIndexed(ctx, st, o.Req)
	if err != nil {
		return err
	}
	s := saved.Search{At: e.Now(), Requirement: out.Requirement, Results: out.Results,
		Why: out.Why, Misses: out.Misses, Notes: out.Notes}
	saveSearch(ctx, st, e, s)
	return writeFind(e, o.out, s)
}

// findDoc is the JSON document find prints for a search.
func findDoc(s saved.Search) findOutput {
	rs := s.Results
	if rs == nil {
		rs = []search.Result{}
	}
	return findOutput{Requirement: s.Requirement, Results: rs, Why: s.Why, Misses: s.Misses,
		Notes: append(append([]string(nil), s.Notes...), solution.Cautions(s.Requirement, s.Results...)...)}
}

// writeFind prints what a search found as find prints it: the notes and
// cautions on stderr, the results on stdout in the format, or why nothing
// met the requirement. `searches show` prints a saved search through it,
// so that it reads exactly as find printed it.
func writeFind(e *env, o outputFlags, s saved.Search) error {
	doc := findDoc(s)
	printCautions(e, s.Requirement, s.Notes, s.Results)
	if len(s.Results) == 0 {
		return noResult(e, o, doc)
	}
	return render(e, e.Out, o, present.Results(s.Requirement, s.Results), doc)
}

// findGCPercent is the garbage collector's target while find searches and
// prints, unless GOGC is set: the heap may grow 30 % past what the last
// collection found live (the index and the candidates, some 30 MB at
// 50,000 parts) before the next collection, instead of the default 100 %.
// The real-ray stage makes most of the garbage; on the 50,000-part catalog
// the lower target took 15-20 MiB off the peak resident memory with no
// more CPU, the page faults it saves paying for the extra collections
// (DEVELOPERS.md, "Speed").
const findGCPercent = 30

// findIndexed runs the search on the catalog's search index, which holds
// every part the requirement may use (the drawer's only, for --drawer-only),
// and closes the index before the run is saved.
func findIndexed(ctx context.Context, st *catalog.Store, req search.Requirement) (search.Outcome, error) {
	if err := req.Validate(); err != nil {
		return search.Outcome{}, usageErrorf("%v", err)
	}
	ix, err := st.SearchIndex(ctx, catalog.IndexOptions{InDrawer: req.DrawerOnly})
	if err != nil {
		return search.Outcome{}, catalogError(err)
	}
	defer ix.Close()
	out, err := search.FindIndexed(ctx, ix, req)
	if err != nil {
		return search.Outcome{}, catalogError(err)
	}
	return out, nil
}

// saveSearch stores the run and says its number on stderr. A run that
// cannot be saved (a read-only catalog, another program holding the write
// lock past catalog.LockWait()) is still printed: the message says it was
// not saved and why.
func saveSearch(ctx context.Context, st *catalog.Store, e *env, s saved.Search) {
	if st.ReadOnly() {
		notef(e, "not saved: the catalog %s is read-only for you; the results are printed but 'last' will not find them (copy the catalog somewhere writable to keep runs)\n", st.Path())
		return
	}
	var id int64
	err := waitNotice(e, st.Path(), func() (err error) {
		id, err = saved.New(st).Save(ctx, s)
		return err
	})
	if err != nil {
		msg, _ := describe(err)
		notef(e, "not saved (the results are printed): %s\n", msg)
		return
	}
	switch {
	case st.Path() == catalog.Memory:
		notef(e, "saved as search %d in the built-in demo catalog, which is not kept after this run\n", id)
	case isKeptDemo(st.Path()):
		notef(e, "saved as search %d (in the demo catalog, until you import your own)\n", id)
	default:
		notef(e, "saved as search %d\n", id)
	}
}

// printCautions writes the notes and the safety cautions on stderr.
func printCautions(e *env, req search.Requirement, notes []string, shown []search.Result) {
	for _, n := range notes {
		notef(e, "note: %s\n", n)
	}
	writeCautions(e, req, shown...)
}

// writeCautions writes on stderr the safety cautions the requirement calls
// for (solution.Cautions, the one text of them): every command that prints
// results for a laser requirement uses it.
func writeCautions(e *env, req search.Requirement, shown ...search.Result) {
	for _, c := range solution.Cautions(req, shown...) {
		notef(e, "caution: %s\n", c)
	}
}

// noResult prints why nothing met the requirement and the nearest misses:
// the JSON document for programs, words and a table of misses on stderr for
// people, never an empty table. It returns the no-result error.
func noResult(e *env, o outputFlags, doc findOutput) error {
	if o.Format == "json" {
		if err := render(e, e.Out, o, present.Table{}, doc); err != nil {
			return err
		}
		return noResultErrorf("nothing meets the requirement (see \"why\" and \"misses\")")
	}
	for _, w := range doc.Why {
		notef(e, "%s\n", w)
	}
	if len(doc.Misses) > 0 {
		notef(e, "nearest misses:\n")
		if err := render(e, e.Err, outputFlags{Format: "table"}, present.Results(doc.Requirement, doc.Misses), nil); err != nil {
			return err
		}
	}
	return noResultErrorf("nothing meets the requirement: loosen a limit above and search again")
}
