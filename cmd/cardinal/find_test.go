package main

import (
	"context"
	"encoding/json"
	"fmt"
	"math/rand/v2"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"cardinal/catalog"
	"cardinal/search"
)

// parseFind runs the command line through a root command whose find
// captures its options instead of running.
func parseFind(args []string) (*findOptions, error) {
	e, _, _ := testEnv()
	root := newRootCmd(e)
	for _, c := range root.Commands() {
		if c.Name() == "find" {
			root.RemoveCommand(c)
		}
	}
	var got *findOptions
	root.AddCommand(newFindCmd(e, func(o *findOptions) error { got = o; return nil }))
	root.SetArgs(append([]string{"find"}, args...))
	err := root.Execute()
	return got, err
}

func writeSpec(t *testing.T, body string) string {
	t.Helper()
	p := filepath.Join(t.TempDir(), "relay.json")
	if err := os.WriteFile(p, []byte(body), 0o644); err != nil {
		t.Fatal(err)
	}
	return p
}

func TestFindFlags(t *testing.T) {
	spec := writeSpec(t, `{"kind": "image", "track_mm": 400, "magnification": -1, "mag_tol": "0.5%", "wd_min_mm": 20}`)
	badSpec := writeSpec(t, `{"kind": "image", "track": 400}`)
	tests := []struct {
		name    string
		args    []string
		check   func(search.Requirement) bool
		errText string // part of the usage error, "" for none
	}{
		{"focus example", []string{"--efl", "75", "--efl-tol", "1%", "--beam", "6", "--bfd-min", "40", "--wavelength", "1064"},
			func(r search.Requirement) bool {
				return r.Kind == search.Focus && r.EFL == 75 && r.EFLTol == (search.Tolerance{Value: 1, Percent: true}) &&
					r.Beam == 6 && r.BFDMin == 40 && r.Wavelength == 1064 && r.GapMin == 0.5 && r.Top == 10 && r.Elements == 2
			}, ""},
		{"efl tolerance in mm", []string{"--efl", "50", "--efl-tol", "0.4mm"},
			func(r search.Requirement) bool { return r.EFLTol == search.Tolerance{Value: 0.4} }, ""},
		{"image example", []string{"--track", "300", "--mag", "-0.36", "--mag-tol", "2%", "--object-height", "5", "--na", "0.02", "--wd-min", "60", "--bfd-min", "15"},
			func(r search.Requirement) bool {
				return r.Kind == search.Image && r.Track == 300 && r.Mag == -0.36 && r.NA == 0.02 && r.ObjectHeight == 5 && r.WDMin == 60
			}, ""},
		{"expand example", []string{"--expand", "5", "--expand-tol", "2%", "--beam", "2", "--galilean", "--length-max", "150"},
			func(r search.Requirement) bool {
				return r.Kind == search.Expand && r.Expansion == 5 && r.Form == search.Galilean && r.LengthMax == 150
			}, ""},
		{"common constraints", []string{"--efl", "100", "--diameter-max", "25.4", "--gap-min", "1", "--elements", "1", "--supplier", "DEMO", "--drawer-only", "--top", "0", "--prefer", "cheap"},
			func(r search.Requirement) bool {
				return r.DiameterMax == 25.4 && r.GapMin == 1 && r.Elements == 1 && r.Supplier == "DEMO" && r.DrawerOnly && r.Top == 0 && r.Prefer == search.PreferCheap
			}, ""},
		{"spec file", []string{"--spec", spec},
			func(r search.Requirement) bool {
				return r.Kind == search.Image && r.Track == 400 && r.Mag == -1 && r.MagTol == (search.Tolerance{Value: 0.5, Percent: true}) && r.WDMin == 20 && r.GapMin == 0.5
			}, ""},
		{"flags override the spec file", []string{"--spec", spec, "--track", "420", "--wd-min", "0"},
			func(r search.Requirement) bool { return r.Track == 420 && r.WDMin == 0 && r.Mag == -1 }, ""},
		{"spec file of another kind", []string{"--spec", spec, "--efl", "50"}, nil, "asks for image"},
		{"misspelt spec key", []string{"--spec", badSpec}, nil, `"track": is not a requirement key`},
		{"missing spec file", []string{"--spec", "no-such.json"}, nil, "no such file"},
		{"no requirement", nil, nil, "say what to find"},
		{"two requirements", []string{"--efl", "50", "--expand", "3"}, nil, "give one requirement"},
		{"negative track", []string{"--track", "-10", "--mag", "-1"}, nil, "track is negative"},
		{"negative tolerance", []string{"--efl", "50", "--efl-tol", "-1%"}, nil, "below zero"},
		{"tolerance not a number", []string{"--efl", "50", "--efl-tol", "lots"}, nil, "want a percentage"},
		{"both expander forms", []string{"--expand", "3", "--galilean", "--keplerian"}, nil, "exclude each other"},
		{"beam on an image", []string{"--track", "200", "--mag", "-1", "--beam", "3"}, nil, "--beam does not apply"},
		{"margins eat the track", []string{"--track", "100", "--mag", "-1", "--wd-min", "60", "--bfd-min", "50"}, nil, "leave nothing"},
		{"erect image from one part", []string{"--track", "300", "--mag", "0.5", "--elements", "1"}, nil, "needs two --elements"},
		{"expander of one part", []string{"--expand", "3", "--elements", "1"}, nil, "needs two elements"},
		{"unknown preference", []string{"--efl", "50", "--prefer", "pretty"}, nil, "unknown preference"},
		{"real-ray flags", []string{"--efl", "100", "--beam", "10", "--field-angle", "1.5", "--band", "486.1,587.6", "--band", "656.3", "--prefer", "sharp", "--power", "0.2"},
			func(r search.Requirement) bool {
				return r.FieldAngle == 1.5 && slices.Equal(r.Band, []float64{486.1, 587.6, 656.3}) && r.Prefer == search.PreferSharp && r.Power == 0.2 && r.TracesRays()
			}, ""},
		{"spec band kept without the flag", []string{"--spec", writeSpec(t, `{"kind": "focus", "efl_mm": 50, "beam_mm": 5, "band_nm": [500, 600]}`)},
			func(r search.Requirement) bool { return slices.Equal(r.Band, []float64{500, 600}) }, ""},
		{"band not a number", []string{"--efl", "50", "--band", "blue"}, nil, `--band "blue": want finite numbers`},
		{"band out of range", []string{"--efl", "50", "--band", "100,500"}, nil, "--band 100: want a wavelength of 150 to 20000 nm"},
		{"field angle on an image", []string{"--track", "300", "--mag", "-1", "--field-angle", "2"}, nil, "give --object-height"},
		{"field angle of 90", []string{"--efl", "50", "--field-angle", "90"}, nil, "--field-angle 90 is outside 0 to 89.9 degrees"},
		{"negative power", []string{"--efl", "50", "--power", "-1"}, nil, "power is negative"},
		{"laser focus from a waist", []string{"--efl", "50", "--laser", "--wavelength", "532", "--waist-in", "0.4", "--waist-in-at", "250", "--m2", "1.2", "--laser-exit", "300"},
			func(r search.Requirement) bool {
				return r.Laser && r.WaistIn == 0.4 && r.WaistInAt == 250 && r.M2 == 1.2 && r.LaserExit == 300 && r.Gaussian() && r.TracesRays()
			}, ""},
		{"laser expander waist beyond", []string{"--expand", "4", "--beam", "1", "--power", "0.1", "--waist-out-at", "500"},
			func(r search.Requirement) bool { return r.Kind == search.Expand && r.WaistOutAt == 500 && r.Gaussian() }, ""},
		{"mode matching on a track", []string{"--waist-in", "0.35", "--waist-out", "0.003", "--track", "120", "--wavelength", "1064", "--coupling-min", "0.9"},
			func(r search.Requirement) bool {
				return r.Kind == search.Match && r.Track == 120 && r.WaistOut == 0.003 && r.CouplingMin == 0.9 && r.IsLaser()
			}, ""},
		{"mode matching with a magnification", []string{"--waist-in", "0.35", "--waist-out", "0.1", "--mag", "-1"}, nil, "--mag does not apply"},
		{"M^2 below 1", []string{"--efl", "50", "--beam", "2", "--laser", "--m2", "0.5"}, nil, "outside 1 to 1000"},
		{"beam and waist both", []string{"--efl", "50", "--beam", "2", "--waist-in", "0.5"}, nil, "give the input beam once"},
		{"waist position alone", []string{"--efl", "50", "--beam", "2", "--waist-in-at", "100"}, nil, "give its radius with --waist-in"},
		{"output waist position on a focus", []string{"--efl", "50", "--beam", "2", "--waist-out-at", "10"}, nil, "applies to an expand requirement only"},
		{"mode matching of a multimode beam", []string{"--waist-in", "0.35", "--waist-out", "0.1", "--m2", "1.5"}, nil, "M^2 must be 1"},
		{"band on an expander", []string{"--expand", "3", "--band", "500,600"}, nil, "first order only"},
		{"unknown format", []string{"--efl", "50", "--format", "xml"}, nil, `unknown --format "xml"`},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			o, err := parseFind(tc.args)
			if tc.errText != "" {
				if err == nil || !strings.Contains(err.Error(), tc.errText) {
					t.Fatalf("got error %v, want one containing %q", err, tc.errText)
				}
				if code := exitCode(err); code != exitUsage && code != exitNotFound {
					t.Errorf("exit code %d, want a usage or not-found code", code)
				}
				return
			}
			if err != nil {
				t.Fatal(err)
			}
			if !tc.check(o.Req) {
				t.Errorf("requirement %+v", o.Req)
			}
		})
	}
}

// findRun parses args, runs find against the catalog at db (the demo when
// the file does not exist) and returns stdout, stderr and the exit code.
func findRun(t *testing.T, db string, args ...string) (string, string, int) {
	t.Helper()
	o, err := parseFind(args)
	if err != nil {
		t.Fatal(err)
	}
	e, out, errb := testEnv()
	o.env, o.db = e, db
	if _, err := os.Stat(db); err != nil {
		// No catalog there: the demo, kept beside the default location
		// (a catalog named with --db must exist).
		o.db = ""
		e.Getenv = func(k string) string { return map[string]string{"XDG_DATA_HOME": filepath.Dir(db)}[k] }
	}
	err = runFind(o)
	if err != nil {
		msg, _ := describe(err)
		errb.WriteString("cardinal: " + msg + "\n")
	}
	return out.String(), errb.String(), exitCode(err)
}

func TestRunFind(t *testing.T) {
	demo := filepath.Join(t.TempDir(), "none.db")
	tests := []struct {
		name      string
		args      []string
		code      int
		stdoutIn  []string
		stderrIn  []string
		stderrOut []string
	}{
		{"focus at 1064 nm", []string{"--efl", "75", "--beam", "6", "--bfd-min", "40", "--wavelength", "1064"}, 0,
			[]string{"EFL", "75.000", "(reversed)"},
			[]string{"saved as search 1", "laser safety officer", "built-in demo catalog", "extrapolated"},
			[]string{"clear apertures not checked"}},
		{"image", []string{"--track", "300", "--mag", "-0.36", "--mag-tol", "2%", "--object-height", "5", "--na", "0.02", "--wd-min", "60", "--bfd-min", "15", "--format", "md"}, 0,
			[]string{"| # | parts | + | wd mm |", "-0.3600"}, []string{"aperture stop at the first part"}, []string{"laser"}},
		{"expand as csv", []string{"--expand", "5", "--expand-tol", "2%", "--galilean", "--length-max", "150", "--format", "csv"}, 0,
			[]string{"rank,parts,other_arrangements,working_distance_mm,gap_mm,back_clearance_mm,envelope_mm,track_mm,efl_mm,magnification,expansion,form", "galilean"},
			[]string{"clear apertures not checked"}, []string{"laser"}},
		{"keplerian at 1064 nm warns of the internal focus", []string{"--expand", "3", "--expand-tol", "3%", "--keplerian", "--wavelength", "1064"}, 0,
			[]string{"keplerian"}, []string{"focus between its parts"}, nil},
		{"nothing that short", []string{"--efl", "75", "--length-max", "0.8"}, exitNoResult,
			nil, []string{"none meets every constraint", "longer than the envelope maximum", "nearest misses", "fails gap,"}, nil},
		{"ultraviolet is a laser wavelength", []string{"--efl", "100", "--efl-tol", "3%", "--wavelength", "355"}, 0,
			nil, []string{"laser safety officer"}, nil},
		{"--laser in the visible: one wavelength and the cautions", []string{"--efl", "100", "--efl-tol", "3%", "--wavelength", "632.8", "--beam", "4", "--laser"}, 0,
			nil, []string{"laser safety officer", "a laser is one wavelength: spots and the verdict use 632.8 nm alone"}, []string{"no colour figure"}},
		{"no part strong enough", []string{"--track", "20", "--mag", "-1", "--elements", "1"}, exitNoResult,
			nil, []string{"no part is strong enough for a 20 mm track"}, nil},
		{"no aperture: quality not judged, in one line", []string{"--efl", "75"}, 0,
			nil, []string{"note: image quality not judged: give --beam (focus) or --na (image) to trace real rays\n"}, []string{"real rays traced"}},
		{"a beam traces real rays", []string{"--efl", "75", "--beam", "6", "--top", "3"}, 0,
			[]string{"spot", "µm", "diffraction", "limited", "yield"}, []string{"real rays traced at 587.5618 nm through the ", "no colour figure"}, []string{"caution"}},
		{"a band gives the focal shift", []string{"--efl", "75", "--beam", "6", "--top", "3", "--band", "486.1,587.6,656.3", "--field-angle", "1", "--columns", "rank,parts,rms_spot_edge_um,focal_shift_um"}, 0,
			[]string{"edge", "focal", "shift"}, nil, []string{"no colour figure"}},
		{"power brings the laser cautions", []string{"--efl", "75", "--beam", "6", "--power", "0.01"}, 0,
			nil, []string{"caution: Focused laser beams", "laser safety officer"}, nil},
		{"an expander is ranked on first order only", []string{"--expand", "3", "--expand-tol", "3%", "--beam", "2"}, 0,
			nil, []string{"expanders are ranked on first order only"}, []string{"real rays traced"}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			out, errs, code := findRun(t, demo, tc.args...)
			if code != tc.code {
				t.Fatalf("exit code %d, want %d\nstderr: %s", code, tc.code, errs)
			}
			for _, s := range tc.stdoutIn {
				if !strings.Contains(out, s) {
					t.Errorf("stdout lacks %q:\n%s", s, out)
				}
			}
			for _, s := range tc.stderrIn {
				if !strings.Contains(unwrap(errs), s) {
					t.Errorf("stderr lacks %q:\n%s", s, errs)
				}
			}
			for _, s := range tc.stderrOut {
				if strings.Contains(errs, s) {
					t.Errorf("stderr has %q:\n%s", s, errs)
				}
			}
		})
	}
}

// The JSON document is {"requirement": {...}, "results": [...]} with the
// keys issue 4 names.
func TestFindJSON(t *testing.T) {
	demo := filepath.Join(t.TempDir(), "none.db")
	out, errs, code := findRun(t, demo, "--efl", "75", "--efl-tol", "2%", "--top", "0", "--length-max", "8", "--format", "json")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	var doc struct {
		Requirement map[string]any   `json:"requirement"`
		Results     []map[string]any `json:"results"`
	}
	if err := json.Unmarshal([]byte(out), &doc); err != nil {
		t.Fatal(err)
	}
	if doc.Requirement["kind"] != "focus" || doc.Requirement["efl_mm"] != 75.0 || doc.Requirement["efl_tol"] != "2%" {
		t.Errorf("requirement %v", doc.Requirement)
	}
	singlets, pairs := 0, 0
	for _, r := range doc.Results {
		for _, k := range []string{"rank", "parts", "working_distance_mm", "back_clearance_mm", "envelope_mm", "track_mm", "efl_mm", "meets", "checks", "reason"} {
			if _, ok := r[k]; !ok {
				t.Fatalf("result lacks %q: %v", k, r)
			}
		}
		if r["working_distance_mm"] != nil {
			t.Errorf("working distance of an object at infinity is %v, want null", r["working_distance_mm"])
		}
		parts := r["parts"].([]any)
		for _, p := range parts {
			m := p.(map[string]any)
			if _, ok := m["reversed"].(bool); !ok || m["supplier"] == "" || m["part"] == "" {
				t.Errorf("part %v", m)
			}
		}
		_, hasGap := r["gap_mm"]
		if len(parts) == 2 != hasGap {
			t.Errorf("%d parts, gap_mm present %v", len(parts), hasGap)
		}
		if len(parts) == 1 {
			singlets++
		} else {
			pairs++
		}
	}
	if singlets == 0 || pairs == 0 {
		t.Errorf("%d singlets and %d pairs: the demo has both for a 75 mm EFL at 2 %%", singlets, pairs)
	}
}

// The real-ray figures are in each result under the keys issue 5 names,
// the edge spot only with a field and the focal shift only with a band;
// the diffraction-limited verdict is Marechal's 0.07 waves RMS (common
// practice) and the rows come best score first.
func TestFindQualityJSON(t *testing.T) {
	tests := []struct {
		name        string
		args        []string
		edge, shift bool
	}{
		{"focus on axis", []string{"--efl", "75", "--beam", "6"}, false, false},
		{"focus with field and band", []string{"--efl", "75", "--beam", "6", "--field-angle", "1", "--band", "486.1,587.6,656.3"}, true, true},
		{"image with object height", []string{"--track", "300", "--mag", "-0.36", "--mag-tol", "2%", "--object-height", "5", "--na", "0.02"}, true, false},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			out, errs, code := findRun(t, filepath.Join(t.TempDir(), "none.db"), append(tc.args, "--top", "4", "--format", "json")...)
			if code != 0 {
				t.Fatalf("exit %d: %s", code, errs)
			}
			var doc struct {
				Results []map[string]any `json:"results"`
			}
			if err := json.Unmarshal([]byte(out), &doc); err != nil {
				t.Fatal(err)
			}
			if len(doc.Results) != 4 {
				t.Fatalf("%d results", len(doc.Results))
			}
			for i, r := range doc.Results {
				for _, k := range []string{"rms_spot_um", "airy_radius_um", "wavefront_rms_waves", "diffraction_limited", "best_focus_shift_mm",
					"diffraction_limited_why", "wavefront_worst_rms_waves", "verdict_plane_mm"} {
					if _, ok := r[k]; !ok {
						t.Fatalf("result %d lacks %q: %v", i+1, k, r)
					}
				}
				_, edge := r["rms_spot_edge_um"]
				_, shift := r["focal_shift_um"]
				if edge != tc.edge || shift != tc.shift {
					t.Errorf("result %d: edge spot %v (want %v), focal shift %v (want %v)", i+1, edge, tc.edge, shift, tc.shift)
				}
				if msg := verdictProblem(r); msg != "" {
					t.Errorf("result %d: %s", i+1, msg)
				}
				if i > 0 && r["score"].(float64) < doc.Results[i-1]["score"].(float64) {
					t.Errorf("result %d scores below result %d", i+1, i)
				}
			}
		})
	}
}

// In a fresh HOME with no catalog, a search runs on the demo catalog kept
// beside where the catalog would be, says so, and a purchase request can
// be made from it afterwards.
func TestFindThenRequestOnDemo(t *testing.T) {
	home := t.TempDir()
	run := func(args ...string) (string, string, error) {
		e, out, errb := testEnv()
		e.Getenv = func(k string) string { return map[string]string{"HOME": home}[k] }
		root := newRootCmd(e)
		root.SetArgs(args)
		err := root.Execute()
		return out.String(), errb.String(), err
	}
	_, errs, err := run("find", "--efl", "75", "--beam", "6", "--top", "3")
	if err != nil || !strings.Contains(unwrap(errs), "saved as search 1 (in the demo catalog, until you import your own)") {
		t.Fatalf("find: %v\n%s", err, errs)
	}
	out, errs, err := run("request", "last", "--pick", "1")
	if err != nil || !strings.Contains(out, "search: 1") {
		t.Fatalf("request: %v\nstdout %s\nstderr %s", err, out, errs)
	}
	_, errs, err = run("request", "9", "--pick", "1")
	if err == nil || !strings.Contains(err.Error(), "saved in it, until you import your own") {
		t.Errorf("request of a search never run: %v", err)
	}
}

// A run is saved in the user's catalog and can be read back as "last".
func TestFindSaves(t *testing.T) {
	path := filepath.Join(t.TempDir(), "catalog.db")
	demo, err := catalog.OpenDemo()
	if err != nil {
		t.Fatal(err)
	}
	ctx := context.Background()
	entries, err := demo.Entries(ctx, catalog.Filter{})
	demo.Close()
	if err != nil {
		t.Fatal(err)
	}
	st, err := catalog.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	if _, err := st.Import(ctx, entries, false); err != nil {
		t.Fatal(err)
	}
	st.Close()
	for want := 1; want <= 2; want++ {
		_, errs, code := findRun(t, path, "--expand", "4", "--expand-tol", "3%")
		if code != 0 || !strings.Contains(errs, "saved as search "+string(rune('0'+want))+"\n") {
			t.Fatalf("exit %d, stderr %q", code, errs)
		}
	}
	st, err = catalog.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer st.Close()
	s, err := st.LoadSearch(ctx, "last")
	if err != nil {
		t.Fatal(err)
	}
	var req search.Requirement
	var res []search.Result
	if err := json.Unmarshal(s.Requirement, &req); err != nil || json.Unmarshal(s.Results, &res) != nil {
		t.Fatalf("saved search does not decode: %v", err)
	}
	if s.ID != 2 || s.Kind != "expand" || req.Expansion != 4 || len(res) == 0 {
		t.Errorf("saved %d %q %+v with %d results", s.ID, s.Kind, req, len(res))
	}
}

// The output of find for people and for programs, against golden files
// under testdata/find (rewrite with go test ./cmd/cardinal -run FindGolden
// -update and review the diff).
func TestFindGolden(t *testing.T) {
	tests := []struct {
		name string
		args []string
		code int
	}{
		{"focus-table", []string{"--efl", "75", "--beam", "6", "--bfd-min", "40", "--wavelength", "1064", "--top", "5"}, 0},
		{"relay-spec-md", []string{"--spec", "../../testdata/find/relay.json", "--format", "md"}, 0},
		{"expand-json", []string{"--expand", "5", "--expand-tol", "2%", "--beam", "2", "--galilean", "--length-max", "150", "--top", "2", "--format", "json"}, 0},
		{"focus-quality-json", []string{"--efl", "100", "--beam", "10", "--field-angle", "1", "--band", "486.1,587.6,656.3", "--elements", "1", "--efl-tol", "3%", "--top", "2", "--format", "json"}, 0},
		{"focus-sharp-table", []string{"--efl", "100", "--beam", "10", "--band", "486.1,587.6,656.3", "--prefer", "sharp", "--top", "4"}, 0},
		{"no-result", []string{"--efl", "75", "--length-max", "0.8"}, exitNoResult},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			dir := fixedLengthDir(t)
			out, errs, code := findRun(t, filepath.Join(dir, "none.db"), tc.args...)
			if code != tc.code {
				t.Fatalf("exit code %d, want %d: %s", code, tc.code, errs)
			}
			errs = strings.ReplaceAll(errs, dir, "$DIR")
			checkGolden(t, filepath.Join("..", "..", "testdata", "find", tc.name+".golden"),
				"-- stdout --\n"+out+"-- stderr --\n"+errs)
		})
	}
}

// fixedLengthDir is a fresh directory whose path has the same length on
// every run, so that messages naming it wrap at the same place.
func fixedLengthDir(t *testing.T) string {
	t.Helper()
	dir := filepath.Join(os.TempDir(), fmt.Sprintf("cardinal-golden-%016x", rand.Uint64()))
	if err := os.Mkdir(dir, 0o755); err != nil {
		t.Fatal(err)
	}
	t.Cleanup(func() { os.RemoveAll(dir) })
	return dir
}
