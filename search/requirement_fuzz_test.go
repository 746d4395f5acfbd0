package search_test

import (
	"bytes"
	"context"
	"encoding/json"
	"errors"
	"os"
	"regexp"
	"slices"
	"sync"
	"testing"

	"cardinal/catalog"
	"cardinal/importers"
	"cardinal/optics"
	"cardinal/search"
	"cardinal/search/present"
)

// fuzzStore is the catalog FuzzRequirement searches: the twenty DEMO parts
// of catalog/demo/lenses.csv, small so that each run is quick.
var fuzzStore = sync.OnceValues(func() (*catalog.Store, error) {
	b, err := os.ReadFile("../catalog/demo/lenses.csv")
	if err != nil {
		return nil, err
	}
	entries, err := importers.ReadPrescriptions(bytes.NewReader(b), "lenses.csv", optics.BuiltinGlasses())
	if err != nil {
		return nil, err
	}
	st, err := catalog.Open(catalog.Memory)
	if err != nil {
		return nil, err
	}
	if _, err := st.Import(context.Background(), entries, false); err != nil {
		return nil, err
	}
	return st, nil
})

// nonNumber finds a NaN or an infinity as Go's fmt and strconv write them.
var nonNumber = regexp.MustCompile(`NaN|[+-]?Inf\b`)

// FuzzRequirement sets every number of a requirement from the fuzzer, of
// every kind, and runs it as find does: validation, the search on the
// catalog's index, the JSON document and the table of results. Either the
// requirement is refused with a *RequirementError, or the search runs and
// every output is valid with no NaN or infinity anywhere.
func FuzzRequirement(f *testing.F) {
	// Seeds: the README's three examples, a laser focus, a mode match,
	// an exact EFL, then numbers at the edges of their ranges and beyond.
	for _, sd := range []fuzzSeed{
		{0, 0, 2, map[string]float64{"efl": 75, "efl_tol": 1, "beam": 6, "bfd_min": 40, "gap_min": 0.5, "spacing_tol": 0.1}},
		{1, 0, 2, map[string]float64{"track": 300, "mag": -0.36, "mag_tol": 2, "object_height": 5, "na": 0.02, "wd_min": 60, "bfd_min": 15, "gap_min": 0.5, "spacing_tol": 0.1}},
		{2, 0x20, 2, map[string]float64{"expansion": 5, "expand_tol": 2, "beam": 2, "length_max": 150, "gap_min": 0.5, "spacing_tol": 0.1}},
		{0, 0x08, 0, map[string]float64{"efl": 50, "efl_tol": 2, "beam": 3, "gap_min": 0.5, "wavelength": 1064, "field_angle": 1, "power": 0.5, "m2": 1.3, "spacing_tol": 0.1, "efl_pct": 1, "thickness": 0.1}},
		{3, 0, 1, map[string]float64{"track": 500, "gap_min": 0.5, "wavelength": 633, "waist_in": 0.5, "waist_out": 0.1, "band1": 900, "spacing_tol": 0.1}},
		{0, 0x01, 0, map[string]float64{"efl": 75, "beam": 6}},
		{0, 0xc1, 0, map[string]float64{"efl": 100000, "efl_tol": 99999, "bfd_min": 99999, "field_angle": 89.9, "band1": 150, "band2": 20000, "diameter_max": 0.001, "spacing_tol": 1e300, "thickness": 1e300}},
		{1, 0x12, 2, map[string]float64{"track": 0.1, "mag": 1e4, "mag_tol": 9999, "na": 0.999, "object_height": 99999, "gap_min": 1000}},
		{0, 0, 0, map[string]float64{"efl": 1e-200, "efl_tol": 1e300, "track": 1e308, "mag": -1e308, "beam": 1e300, "gap_min": 1e-300, "wavelength": 1e300, "waist_in_at": -1e300}},
	} {
		a := sd.floats()
		f.Add(sd.kind, sd.flags, sd.top, a[0], a[1], a[2], a[3], a[4], a[5], a[6], a[7], a[8], a[9], a[10], a[11], a[12], a[13], a[14], a[15], a[16], a[17], a[18], a[19], a[20], a[21], a[22], a[23], a[24], a[25], a[26], a[27], a[28], a[29])
	}
	f.Fuzz(func(t *testing.T, kind, flags, top uint8,
		efl, eflTol, track, mag, magTol, objectHeight, na, wdMin, expansion, expandTol, beam, bfdMin, lengthMax, diameterMax, gapMin,
		wavelength, fieldAngle, power, band1, band2, waistIn, waistInAt, m2, waistOutAt, laserExit, waistOut,
		spacingTol, eflPct, thickness, radiusPct float64) {
		req := search.Requirement{
			Kind: []search.Kind{search.Focus, search.Image, search.Expand, search.Match}[kind%4],
			EFL:  efl, EFLTol: search.Tolerance{Value: eflTol, Percent: flags&1 == 0},
			Track: track, Mag: mag, MagTol: search.Tolerance{Value: magTol, Percent: flags&2 == 0},
			ObjectHeight: objectHeight, NA: na, WDMin: wdMin,
			Expansion: expansion, ExpandTol: search.Tolerance{Value: expandTol, Percent: flags&4 == 0},
			Beam: beam, BFDMin: bfdMin, LengthMax: lengthMax, DiameterMax: diameterMax, GapMin: gapMin,
			Wavelength: wavelength, FieldAngle: fieldAngle, Power: power,
			Laser: flags&8 != 0, Arrangements: flags&16 != 0,
			WaistIn: waistIn, WaistInAt: waistInAt, M2: m2, WaistOutAt: waistOutAt, LaserExit: laserExit,
			WaistOut: waistOut, CouplingMin: 0,
			// Few results and few simulated builds keep each run quick;
			// every number of what is traced is still the fuzzer's.
			Top:   1 + int(top)%3,
			Build: search.BuildSettings{SpacingTol: spacingTol, Trials: 40, Seed: 1, PartDefaults: optics.Tolerances{EFLPct: eflPct, Thickness: thickness, Index: 0.001, RadiusPct: radiusPct}},
		}
		if flags&32 != 0 {
			req.Form = search.Galilean
		}
		if flags&64 != 0 {
			req.Elements = 1
		}
		if flags&128 != 0 {
			req.Band = []float64{band1, band2}
		}
		if req.Kind == search.Match {
			req.CouplingMin = band1 / 1000 // a fraction, its own number would be one too many arguments
		}
		if err := req.Validate(); err != nil {
			var re *search.RequirementError
			if !errors.As(err, &re) {
				t.Fatalf("refusal %v (%T) is not a *RequirementError", err, err)
			}
			return
		}
		st, err := fuzzStore()
		if err != nil {
			t.Fatal(err)
		}
		ctx := context.Background()
		ix, err := st.SearchIndex(ctx, catalog.IndexOptions{})
		if err != nil {
			t.Fatal(err)
		}
		out, err := search.FindIndexed(ctx, ix, req)
		ix.Close()
		if err != nil {
			t.Fatalf("%+v: the search failed: %v", req, err)
		}
		checkOutputs(t, req, out)
	})
}

// fuzzSeed names the fuzzed numbers of a seed; those not named are zero.
type fuzzSeed struct {
	kind, flags, top uint8
	v                map[string]float64
}

// fuzzOrder is the order of FuzzRequirement's float arguments.
var fuzzOrder = []string{"efl", "efl_tol", "track", "mag", "mag_tol", "object_height", "na", "wd_min", "expansion", "expand_tol",
	"beam", "bfd_min", "length_max", "diameter_max", "gap_min", "wavelength", "field_angle", "power", "band1", "band2",
	"waist_in", "waist_in_at", "m2", "waist_out_at", "laser_exit", "waist_out", "spacing_tol", "efl_pct", "thickness", "radius_pct"}

func (s fuzzSeed) floats() []float64 {
	var out []float64
	for _, k := range fuzzOrder {
		out = append(out, s.v[k])
	}
	for k := range s.v {
		if !slices.Contains(fuzzOrder, k) {
			panic("fuzz seed: no argument " + k)
		}
	}
	return out
}

// checkOutputs renders an outcome as find does and fails on invalid JSON or
// a NaN or infinity in any format.
func checkOutputs(t *testing.T, req search.Requirement, out search.Outcome) {
	t.Helper()
	doc := struct {
		Requirement search.Requirement `json:"requirement"`
		Results     []search.Result    `json:"results"`
		Why         []string           `json:"why,omitempty"`
		Misses      []search.Result    `json:"misses,omitempty"`
		Notes       []string           `json:"notes,omitempty"`
	}{out.Requirement, out.Results, out.Why, out.Misses, out.Notes}
	b, err := json.Marshal(doc)
	if err != nil {
		t.Fatalf("%+v: the JSON document does not encode: %v", req, err)
	}
	if !json.Valid(b) {
		t.Fatalf("%+v: invalid JSON:\n%s", req, b)
	}
	for _, rs := range [][]search.Result{out.Results, out.Misses} {
		if len(rs) == 0 {
			continue
		}
		table := present.Results(req, rs)
		var buf bytes.Buffer
		for name, write := range map[string]func() error{
			"json":     func() error { return present.WriteJSON(&buf, table) },
			"csv":      func() error { return present.WriteCSV(&buf, table) },
			"markdown": func() error { return present.WriteMarkdown(&buf, table) },
			"table":    func() error { _, err := present.WriteTerminal(&buf, table, 200); return err },
		} {
			buf.Reset()
			if err := write(); err != nil {
				t.Fatalf("%+v: the %s table does not write: %v", req, name, err)
			}
			if m := nonNumber.Find(buf.Bytes()); m != nil {
				t.Fatalf("%+v: the %s table holds %q:\n%s", req, name, m, buf.String())
			}
		}
	}
	for _, s := range append(append([]string(nil), out.Why...), out.Notes...) {
		if m := nonNumber.FindString(s); m != "" {
			t.Fatalf("%+v: a note holds %q: %s", req, m, s)
		}
	}
}
