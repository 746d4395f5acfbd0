package main

import (
	"fmt"
	"math"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"cardinal/optics"
)

func TestInspectRayFlags(t *testing.T) {
	tests := []struct {
		name    string
		args    []string
		check   func(rayOptions) bool
		errText string // part of the usage error, "" for none
	}{
		{"none by default", nil, func(r rayOptions) bool { return !r.traces() }, ""},
		{"beam with field, band and power", []string{"--beam", "10", "--field-angle", "1", "--band", "486.1,587.6,656.3", "--power", "0.5"},
			func(r rayOptions) bool {
				return r.Beam == 10 && r.FieldAngle == 1 && slices.Equal(r.Band, []float64{486.1, 587.6, 656.3}) && r.Power == 0.5 && r.traces()
			}, ""},
		{"na with object distance and height", []string{"--na", "0.1", "--object-distance", "120", "--object-height", "2"},
			func(r rayOptions) bool { return r.NA == 0.1 && r.ObjectDistance == 120 && r.ObjectHeight == 2 }, ""},
		{"beam and na", []string{"--beam", "10", "--na", "0.1"}, nil, "not both"},
		{"band without an aperture", []string{"--band", "500,600"}, nil, "go with --beam or --na"},
		{"object distance with a beam", []string{"--beam", "10", "--object-distance", "100"}, nil, "go with --na"},
		{"field angle with an NA", []string{"--na", "0.1", "--field-angle", "1"}, nil, "its field is --object-height"},
		{"power with an NA", []string{"--na", "0.1", "--power", "1"}, nil, "go with --beam"},
		{"field angle of 95", []string{"--beam", "5", "--field-angle", "95"}, nil, "--field-angle 95 is outside 0 to 89.9 degrees"},
		{"negative beam", []string{"--beam", "-5"}, nil, "positive number"},
		{"band out of range", []string{"--beam", "5", "--band", "50"}, nil, "--band 50: want a wavelength of 150 to 20000 nm"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			o, err := parseInspect(tc.args)
			if tc.errText != "" {
				if err == nil || !strings.Contains(err.Error(), tc.errText) || exitCode(err) != exitUsage {
					t.Fatalf("got error %v (exit %d), want a usage error containing %q", err, exitCode(err), tc.errText)
				}
				return
			}
			if err != nil {
				t.Fatal(err)
			}
			if !tc.check(o.Rays) {
				t.Errorf("options %+v", o.Rays)
			}
		})
	}
}

// Real-ray output for people and programs, against golden files (rewrite
// with go test ./cmd/cardinal -run InspectRays -update and review the diff).
func TestInspectRaysGolden(t *testing.T) {
	band := []float64{optics.LineF, optics.LineD, optics.LineC}
	tests := []struct {
		name   string
		mod    func(*inspectOptions)
		golden string
	}{
		{"table with a beam", func(o *inspectOptions) {
			o.Parts, o.Rays = []string{"TEST:PCX"}, rayOptions{Beam: 5, FieldAngle: 1, Band: band}
		}, "table-beam"},
		{"json with an NA at -1x", func(o *inspectOptions) {
			o.Parts, o.Format, o.Rays = []string{"TEST:PCX"}, "json", rayOptions{NA: 0.05, ObjectHeight: 1}
		}, "json-na"},
		{"csv of a lens and a window", func(o *inspectOptions) {
			o.Parts, o.Format, o.Rays = []string{"TEST:ACH", "TEST:WINDOW"}, "csv", rayOptions{Beam: 8, Band: band}
		}, "csv-beam"},
		{"md reversed at 1064 nm with a power", func(o *inspectOptions) {
			o.Parts, o.Format, o.Reverse, o.Wavelength, o.Rays = []string{"TEST:PCX"}, "md", true, 1064, rayOptions{Beam: 5, Power: 0.2}
		}, "md-laser"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			e, out, errb := testEnv()
			if err := runInspect(inspectOpts(e, tc.mod)); err != nil {
				t.Fatal(err)
			}
			checkGolden(t, filepath.Join("..", "..", "testdata", "inspect", tc.golden+".golden"),
				"-- stdout --\n"+out.String()+"-- stderr --\n"+errb.String())
		})
	}
}

// With --beam or --na the JSON gains the real-ray keys of issue 5 (the
// edge spot only with a field, the focal shift only with a band); without
// them it keeps exactly the keys of issue 2 (TestInspectJSONKeys).
func TestInspectRaysJSON(t *testing.T) {
	base := []string{"supplier", "part", "reversed", "wavelength_nm", "length_mm", "efl_mm", "f_front_mm", "f_back_mm", "ffd_mm", "bfd_mm",
		"focal_mm", "focal_prime_mm", "principal_mm", "principal_prime_mm", "nodal_mm", "nodal_prime_mm",
		"antiprincipal_mm", "antiprincipal_prime_mm", "antinodal_mm", "antinodal_prime_mm", "edge_thickness_mm", "tolerances", "tolerances_stated", "tolerances_from", "residual_reflectance_pct", "warnings"}
	always := []string{"rms_spot_um", "airy_radius_um", "wavefront_rms_waves", "diffraction_limited", "best_focus_shift_mm",
		"diffraction_limited_why", "wavefront_worst_rms_waves", "verdict_plane_mm"}
	tests := []struct {
		name  string
		rays  rayOptions
		extra []string
	}{
		{"beam", rayOptions{Beam: 5}, always},
		{"beam, field and band", rayOptions{Beam: 5, FieldAngle: 1, Band: []float64{486.1, 656.3}}, append([]string{"rms_spot_edge_um", "focal_shift_um", "wavefront_band"}, always...)},
		{"na", rayOptions{NA: 0.05, ObjectDistance: 150}, always},
		{"na and object height", rayOptions{NA: 0.05, ObjectHeight: 1}, append([]string{"rms_spot_edge_um"}, always...)},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			want := append(append([]string(nil), base...), tc.extra...)
			slices.Sort(want)
			for _, r := range inspectJSON(t, func(o *inspectOptions) { o.Parts, o.Rays = []string{"TEST:PCX", "TEST:ACH"}, tc.rays }) {
				var keys []string
				for k := range r {
					keys = append(keys, k)
				}
				slices.Sort(keys)
				if !slices.Equal(keys, want) {
					t.Errorf("%v: keys %v, want %v", r["part"], keys, want)
				}
				if msg := verdictProblem(r); msg != "" {
					t.Errorf("%v: %s", r["part"], msg)
				}
			}
		})
	}
}

// The command's figure against an outside formula: the Airy radius of a
// focus at f-number N is 1.22 lambda N (Born and Wolf, Principles of
// Optics, 7th ed., sec. 8.5.2). The -1x conjugate of --na without
// --object-distance is checked in package search (TestRayConditionsMinusOne).
func TestInspectRaysAgainstFormulas(t *testing.T) {
	rs := inspectJSON(t, func(o *inspectOptions) { o.Parts, o.Rays = []string{"TEST:PCX"}, rayOptions{Beam: 5} })
	efl := rs[0]["efl_mm"].(float64)
	want := 1.22 * optics.LineD * 1e-3 * efl / 5
	if got := rs[0]["airy_radius_um"].(float64); math.Abs(got-want) > 0.01*want {
		t.Errorf("Airy radius %.4f um, want 1.22 lambda N = %.4f um within 1%%", got, want)
	}
}

// A part with no real focus is not traced, and says why; the laser
// cautions come with a power or a wavelength outside the visible.
func TestInspectRaysWarningsAndCautions(t *testing.T) {
	tests := []struct {
		name           string
		mod            func(*inspectOptions)
		stderr, stdout string
		caution        bool
	}{
		{"afocal window", func(o *inspectOptions) { o.Parts, o.Rays = []string{"TEST:WINDOW"}, rayOptions{Beam: 5} },
			"real rays not traced: an afocal part has no focus to judge", "not traced (see warnings)", false},
		{"object inside the focal length", func(o *inspectOptions) {
			o.Parts, o.Rays = []string{"TEST:PCX"}, rayOptions{NA: 0.05, ObjectDistance: 20}
		}, "the image is not real", "not traced", false},
		{"visible beam without a power", func(o *inspectOptions) { o.Parts, o.Rays = []string{"TEST:PCX"}, rayOptions{Beam: 5} },
			"", "RMS spot on axis", false},
		{"visible beam with a power", func(o *inspectOptions) { o.Parts, o.Rays = []string{"TEST:PCX"}, rayOptions{Beam: 5, Power: 1} },
			"", "RMS spot on axis", true},
		{"infrared object", func(o *inspectOptions) {
			o.Parts, o.Wavelength, o.Rays = []string{"TEST:PCX"}, 1064, rayOptions{NA: 0.02}
		}, "", "RMS spot on axis", true},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			e, out, errb := testEnv()
			if err := runInspect(inspectOpts(e, tc.mod)); err != nil {
				t.Fatal(err)
			}
			if !strings.Contains(unwrap(errb.String()), tc.stderr) || !strings.Contains(out.String(), tc.stdout) {
				t.Errorf("stdout %q lacks %q or stderr %q lacks %q", out.String(), tc.stdout, errb.String(), tc.stderr)
			}
			if got := strings.Contains(errb.String(), "caution: "); got != tc.caution {
				t.Errorf("cautions shown %v, want %v:\n%s", got, tc.caution, errb.String())
			}
		})
	}
}

// verdictProblem checks the diffraction-limited verdict of one JSON result
// against its own figures and Marechal's criterion (0.07 waves RMS, common
// practice): yes exactly when the why says yes, and then the worst over
// every field point and wavelength and the axis within 0.07; no only when
// one of them is over it. "" when consistent.
func verdictProblem(r map[string]any) string {
	limited, why := r["diffraction_limited"].(bool), r["diffraction_limited_why"].(string)
	worst, axis := r["wavefront_worst_rms_waves"].(float64), r["wavefront_rms_waves"].(float64)
	switch {
	case limited != (why == "yes"):
		return fmt.Sprintf("diffraction limited %v but why %q", limited, why)
	case limited && (worst > 0.07 || axis > 0.07):
		return fmt.Sprintf("diffraction limited with %v waves RMS worst, %v on axis", worst, axis)
	case !limited && worst <= 0.07 && axis <= 0.07:
		return fmt.Sprintf("not diffraction limited (%s) with %v waves RMS worst, %v on axis", why, worst, axis)
	case !slices.Contains([]string{"yes", "no: on axis", "no: field edge", "no: colour"}, why):
		return fmt.Sprintf("why %q is not a verdict word", why)
	}
	return ""
}
