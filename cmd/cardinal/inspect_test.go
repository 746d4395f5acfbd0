package main

import (
	"bytes"
	"encoding/json"
	"flag"
	"math"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"
	"time"
	"unicode/utf8"

	"cardinal/optics"
)

// update rewrites the golden files: go test ./cmd/cardinal -run Inspect -update
// Other command tests in this package can use it too.
var update = flag.Bool("update", false, "rewrite the golden files under testdata/")

const inspectFixture = "../../testdata/inspect/lenses.csv"

// testEnv is an env over buffers, as a pipe (not a terminal).
func testEnv() (*env, *bytes.Buffer, *bytes.Buffer) {
	var out, errb bytes.Buffer
	return &env{In: strings.NewReader(""), Out: &out, Err: &errb,
		Now:    func() time.Time { return time.Date(2025, 1, 2, 3, 4, 5, 0, time.UTC) },
		Getenv: func(string) string { return "" }}, &out, &errb
}

// parseInspect runs the command line through a root command whose inspect
// captures its options instead of running.
func parseInspect(args []string) (*inspectOptions, error) {
	e, _, _ := testEnv()
	root := newRootCmd(e)
	for _, c := range root.Commands() {
		if c.Name() == "inspect" {
			root.RemoveCommand(c)
		}
	}
	var got *inspectOptions
	root.AddCommand(newInspectCmd(e, func(o *inspectOptions) error { got = o; return nil }))
	root.SetArgs(append([]string{"inspect"}, args...))
	err := root.Execute()
	return got, err
}

func TestInspectFlags(t *testing.T) {
	tests := []struct {
		name    string
		args    []string
		check   func(*inspectOptions) bool
		errCode int    // exit code of a cmdError, 0 for none
		errText string // part of the error message
	}{
		{name: "defaults", args: nil, check: func(o *inspectOptions) bool {
			return o.File == "" && o.Parts == nil && !o.Reverse && o.Wavelength == 587.5618 &&
				o.MediumIn == "air" && o.MediumOut == "air" && o.Format == "table"
		}},
		{name: "repeated and comma-separated parts", args: []string{"--part", "A:1", "--part", "B:2,C:3"},
			check: func(o *inspectOptions) bool { return slices.Equal(o.Parts, []string{"A:1", "B:2", "C:3"}) }},
		{name: "every flag", args: []string{"--file", "x.csv", "--reverse", "--wavelength", "632.8", "--medium-in", "water", "--medium-out", "caf2", "--format", "json"},
			check: func(o *inspectOptions) bool {
				return o.File == "x.csv" && o.Reverse && o.Wavelength == 632.8 && o.MediumIn == "water" && o.MediumOut == "caf2" && o.Format == "json"
			}},
		{name: "unknown format", args: []string{"--format", "xml"}, errCode: exitUsage, errText: `unknown --format "xml"`},
		{name: "zero wavelength", args: []string{"--wavelength", "0"}, errCode: exitUsage, errText: "--wavelength 0: want a wavelength of 150 to 20000 nm"},
		{name: "infinite wavelength", args: []string{"--wavelength", "inf"}, errCode: exitUsage, errText: "--wavelength +Inf"},
		{name: "wavelength not a number", args: []string{"--wavelength", "red"}, errCode: exitUsage, errText: `--wavelength "red": want a finite number`},
		{name: "unknown flag", args: []string{"--colour"}, errCode: exitUsage, errText: "unknown flag --colour"},
		{name: "catalog part arguments", args: []string{"DEMO:PCX-50", "PCV-50"},
			check: func(o *inspectOptions) bool { return slices.Equal(o.CatalogParts, []string{"DEMO:PCX-50", "PCV-50"}) }},
		{name: "catalog part and --file", args: []string{"DEMO:PCX-50", "--file", "x.csv"}, errCode: exitUsage, errText: "not both"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			o, err := parseInspect(tc.args)
			if tc.errText != "" {
				if err == nil || !strings.Contains(err.Error(), tc.errText) {
					t.Fatalf("got error %v, want one containing %q", err, tc.errText)
				}
				if tc.errCode != 0 && exitCode(err) != tc.errCode {
					t.Errorf("exit code %d, want %d", exitCode(err), tc.errCode)
				}
				return
			}
			if err != nil {
				t.Fatal(err)
			}
			if o == nil || !tc.check(o) {
				t.Errorf("options %+v", o)
			}
		})
	}
}

// inspectOpts returns options over the fixture with the flag defaults.
func inspectOpts(e *env, mod func(*inspectOptions)) *inspectOptions {
	o := &inspectOptions{env: e, File: inspectFixture, Wavelength: optics.LineD, MediumIn: "air", MediumOut: "air", Format: "table"}
	if mod != nil {
		mod(o)
	}
	return o
}

func TestRunInspect(t *testing.T) {
	tests := []struct {
		name     string
		mod      func(*inspectOptions)
		code     int
		golden   string // file under testdata/inspect holding stdout and stderr
		stderrIn string // part of stderr, for cases without a golden
	}{
		{name: "table of every part", golden: "table-all"},
		{name: "json reversed at 632.8 nm", golden: "json-reversed", mod: func(o *inspectOptions) {
			o.Parts, o.Reverse, o.Wavelength, o.Format = []string{"TEST:PCX"}, true, 632.8, "json"
		}},
		{name: "csv with water in object space", golden: "csv-water", mod: func(o *inspectOptions) {
			o.Parts, o.MediumIn, o.Format = []string{"TEST:PCX", "TEST:ACH"}, "water", "csv"
		}},
		{name: "md of an afocal window", golden: "md-afocal", mod: func(o *inspectOptions) {
			o.Parts, o.Format = []string{"TEST:WINDOW"}, "md"
		}},
		{name: "json of an afocal window", golden: "json-afocal", mod: func(o *inspectOptions) {
			o.Parts, o.Format = []string{"TEST:WINDOW"}, "json"
		}},
		{name: "stated value and range warnings", golden: "warnings", mod: func(o *inspectOptions) {
			o.Parts, o.Wavelength = []string{"typo"}, 1064
		}},
		{name: "unknown part suggests close names", code: exitNotFound, golden: "unknown-part", mod: func(o *inspectOptions) {
			o.Parts = []string{"TEST:PCX-50", "TEST:ACH", "nothing-like-it"}
		}},
		{name: "bad file lists every bad line", code: exitUsage, golden: "bad-file", mod: func(o *inspectOptions) {
			o.File = "../../testdata/inspect/bad.csv"
		}},
		{name: "missing file", code: exitNotFound, mod: func(o *inspectOptions) { o.File = "no-such.csv" },
			stderrIn: "--file no-such.csv: no such file"},
		{name: "unknown medium", code: exitUsage, mod: func(o *inspectOptions) { o.MediumIn = "oil" },
			stderrIn: `--medium-in: unknown glass "oil"`},
		{name: "built-in demo", mod: func(o *inspectOptions) { o.File, o.Parts = "", []string{"DEMO:PCX-50"} },
			stderrIn: "no --file given: inspecting the built-in demo lenses"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			e, out, errb := testEnv()
			err := runInspect(inspectOpts(e, tc.mod))
			if err != nil {
				errb.WriteString("cardinal: " + err.Error() + "\n")
			}
			if code := exitCode(err); code != tc.code {
				t.Errorf("exit code %d, want %d (%v)", code, tc.code, err)
			}
			if tc.stderrIn != "" && !strings.Contains(unwrap(errb.String()), tc.stderrIn) {
				t.Errorf("stderr %q does not contain %q", errb.String(), tc.stderrIn)
			}
			if tc.golden != "" {
				checkGolden(t, filepath.Join("..", "..", "testdata", "inspect", tc.golden+".golden"),
					"-- stdout --\n"+out.String()+"-- stderr --\n"+errb.String())
			}
		})
	}
}

// checkGolden compares got with a golden file, or rewrites it under -update.
func checkGolden(t *testing.T, path, got string) {
	t.Helper()
	if *update {
		if err := os.WriteFile(path, []byte(got), 0o644); err != nil {
			t.Fatal(err)
		}
		return
	}
	want, err := os.ReadFile(path)
	if err != nil {
		t.Fatalf("%v (run go test ./cmd/cardinal -update to create it)", err)
	}
	if got != string(want) {
		t.Errorf("output differs from %s (rerun with -update and review the diff):\n--- got ---\n%s--- want ---\n%s", path, got, want)
	}
}

// inspectJSON runs inspect with JSON output and decodes it.
func inspectJSON(t *testing.T, mod func(*inspectOptions)) []map[string]any {
	t.Helper()
	e, out, _ := testEnv()
	o := inspectOpts(e, mod)
	o.Format = "json"
	if err := runInspect(o); err != nil {
		t.Fatal(err)
	}
	var rs []map[string]any
	if err := json.Unmarshal(out.Bytes(), &rs); err != nil {
		t.Fatal(err)
	}
	return rs
}

// The JSON objects carry exactly the keys issue 2 lists.
func TestInspectJSONKeys(t *testing.T) {
	want := []string{"supplier", "part", "reversed", "wavelength_nm", "length_mm", "efl_mm", "f_front_mm", "f_back_mm", "ffd_mm", "bfd_mm",
		"focal_mm", "focal_prime_mm", "principal_mm", "principal_prime_mm", "nodal_mm", "nodal_prime_mm",
		"antiprincipal_mm", "antiprincipal_prime_mm", "antinodal_mm", "antinodal_prime_mm", "edge_thickness_mm", "tolerances", "tolerances_stated", "tolerances_from", "residual_reflectance_pct", "warnings"}
	slices.Sort(want)
	for _, r := range inspectJSON(t, nil) {
		var keys []string
		for k := range r {
			keys = append(keys, k)
		}
		slices.Sort(keys)
		if !slices.Equal(keys, want) {
			t.Errorf("%v:%v: keys %v, want %v", r["supplier"], r["part"], keys, want)
		}
		if r["focal_mm"] != r["ffd_mm"] || r["focal_prime_mm"] != r["bfd_mm"] {
			t.Errorf("%v: focal_mm must equal ffd_mm and focal_prime_mm bfd_mm", r["part"])
		}
		if _, ok := r["warnings"].([]any); !ok {
			t.Errorf("%v: warnings %v is not an array", r["part"], r["warnings"])
		}
	}
}

// The command's figures agree with textbook formulas (E. Hecht, Optics, 5th
// ed., sec. 6.1, thick lenses; principal planes, eqs. 6.3 and 6.4:
// h1 = -f (n-1) d/(n R2), h2 = -f (n-1) d/(n R1)). The fixture's TEST:PCX is R1 = 25.84 mm, flat,
// d = 5.3 mm, glass code 517642, whose nd is 1.517 by definition of the code.
func TestInspectAgainstFormulas(t *testing.T) {
	const r, d, n = 25.84, 5.3, 1.517
	f := r / (n - 1)
	const nWater = 1.333 // water at the d line, common practice
	fw := r / (n - nWater)
	const nSilica = 1.45702 // fused silica at 632.8 nm (Malitson 1965, from memory)
	fs := 1 / ((nSilica - 1) * (2/40.0 - (nSilica-1)*6/(nSilica*40*40)))
	tests := []struct {
		name string
		mod  func(*inspectOptions)
		key  string
		want float64
		tol  float64 // relative
	}{
		{"EFL, lensmaker", nil, "efl_mm", f, 1e-12},
		{"BFD = f - d/n", nil, "bfd_mm", f - d/n, 1e-12},
		{"FFD = -f, flat second", nil, "ffd_mm", -f, 1e-12},
		{"P on the curved vertex", nil, "principal_mm", 0, 1e-12},
		{"P' = -d/n", nil, "principal_prime_mm", -d / n, 1e-12},
		{"nodal points on principal points in air", nil, "nodal_prime_mm", -d / n, 1e-12},
		{"anti-principal point at 2f in front of P", nil, "antiprincipal_mm", -2 * f, 1e-12},
		{"reversed: BFD = f", func(o *inspectOptions) { o.Reverse = true }, "bfd_mm", f, 1e-12},
		{"reversed: P' on the curved vertex", func(o *inspectOptions) { o.Reverse = true }, "principal_prime_mm", 0, 1e-12},
		{"reversed: P = d/n", func(o *inspectOptions) { o.Reverse = true }, "principal_mm", d / n, 1e-12},
		// In water the first surface has power (n - n_w)/R; f = -n_w/phi,
		// f' = 1/phi, and N lies (n' - n)/phi from P (Hecht, Optics, 5th ed., sec. 6.1).
		// n_w = 1.333 is known to about 5e-4 here, which the small index
		// step n - n_w = 0.184 magnifies to 3e-3 in the focal lengths.
		{"water: back focal length", func(o *inspectOptions) { o.MediumIn = "water" }, "f_back_mm", fw, 3e-3},
		{"water: front focal length", func(o *inspectOptions) { o.MediumIn = "water" }, "f_front_mm", -nWater * fw, 3e-3},
		{"water: N = P + (1 - n_w)/phi", func(o *inspectOptions) { o.MediumIn = "water" }, "nodal_mm", (1 - nWater) * fw, 5e-3},
		{"fused silica biconvex at 632.8 nm", func(o *inspectOptions) { o.Parts, o.Wavelength = []string{"TEST:DCX-SILICA"}, 632.8 }, "efl_mm", fs, 3e-5},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			rs := inspectJSON(t, func(o *inspectOptions) {
				o.Parts = []string{"TEST:PCX"}
				if tc.mod != nil {
					tc.mod(o)
				}
			})
			got, ok := rs[0][tc.key].(float64)
			if !ok {
				t.Fatalf("%s = %v, not a number", tc.key, rs[0][tc.key])
			}
			if math.Abs(got-tc.want) > tc.tol*math.Max(math.Abs(tc.want), 1) {
				t.Errorf("%s = %.9g, want %.9g (tolerance %g relative)", tc.key, got, tc.want, tc.tol)
			}
		})
	}
}

// No output format prints NaN or Inf, for any part in either orientation;
// tables stay within 100 columns.
func TestInspectFiniteAndNarrow(t *testing.T) {
	for _, file := range []string{inspectFixture, ""} {
		for _, format := range formats {
			for _, rev := range []bool{false, true} {
				e, out, _ := testEnv()
				o := inspectOpts(e, func(o *inspectOptions) { o.File, o.Format, o.Reverse = file, format, rev })
				if err := runInspect(o); err != nil {
					t.Fatal(err)
				}
				s := out.String()
				for _, bad := range []string{"NaN", "Inf", "null, null"} {
					if strings.Contains(s, bad) {
						t.Errorf("file %q format %s reversed %v: output holds %q", file, format, rev, bad)
					}
				}
				if format != "table" {
					continue
				}
				for _, line := range strings.Split(s, "\n") {
					if n := utf8.RuneCountInString(line); n > 100 {
						t.Errorf("table line of %d columns: %s", n, line)
					}
				}
			}
		}
	}
}

// The whole command line, as a user types it, on the built-in demo.
func TestInspectCommandLine(t *testing.T) {
	e, out, errb := testEnv()
	code := execute([]string{"inspect", "--part", "DEMO:PCX-50", "--reverse", "--wavelength", "632.8", "--format", "json"}, e)
	if code != exitOK {
		t.Fatalf("exit %d: %s", code, errb)
	}
	var rs []map[string]any
	if err := json.Unmarshal(out.Bytes(), &rs); err != nil || len(rs) != 1 || rs[0]["reversed"] != true {
		t.Errorf("output %s (%v)", out, err)
	}
}
