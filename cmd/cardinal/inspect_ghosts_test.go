package main

import (
	"encoding/json"
	"math"
	"path/filepath"
	"strings"
	"testing"
)

func TestInspectGhostFlags(t *testing.T) {
	tests := []struct {
		name    string
		args    []string
		check   func(*inspectOptions) bool
		errText string
	}{
		{"collimated laser", []string{"--ghosts", "--beam", "3", "--wavelength", "1064", "--power", "2", "--laser-exit", "200"},
			func(o *inspectOptions) bool {
				return o.Ghosts.Ghosts && o.Rays.Beam == 3 && o.Rays.Power == 2 && o.Ghosts.LaserExit == 200
			}, ""},
		{"waist before the part", []string{"--ghosts", "--waist-in", "0.4", "--waist-in-at", "300", "--m2", "1.1"},
			func(o *inspectOptions) bool {
				return o.Ghosts.WaistIn == 0.4 && o.Ghosts.WaistInAt == 300 && o.Ghosts.M2 == 1.1
			}, ""},
		{"no beam", []string{"--ghosts"}, nil, "--ghosts needs the laser beam"},
		{"beam and waist", []string{"--ghosts", "--beam", "3", "--waist-in", "0.4"}, nil, "--ghosts needs the laser beam"},
		{"with an NA", []string{"--ghosts", "--beam", "3", "--na", "0.1"}, nil, "do not apply"},
		{"waist without --ghosts", []string{"--waist-in", "0.4"}, nil, "go with --ghosts"},
		{"M^2 below 1", []string{"--ghosts", "--beam", "3", "--m2", "0.5"}, nil, "--m2 0.5 is outside 1 to 1000"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			o, err := parseInspect(tc.args)
			if tc.errText != "" {
				if err == nil || !strings.Contains(err.Error(), tc.errText) {
					t.Fatalf("got error %v, want one containing %q", err, tc.errText)
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

func ghostOpts(e *env, format string, parts ...string) *inspectOptions {
	return inspectOpts(e, func(o *inspectOptions) {
		o.Parts, o.Format, o.Wavelength = parts, format, 1064
		o.Rays.Beam, o.Rays.Power = 3, 2
		o.Ghosts = ghostOptions{Ghosts: true, LaserExit: 200}
	})
}

func TestRunInspectGhosts(t *testing.T) {
	for _, tc := range []struct{ name, format, golden string }{
		{"table", "table", "ghosts-table"},
		{"json", "json", "ghosts-json"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			e, out, errb := testEnv()
			if err := runInspect(ghostOpts(e, tc.format, "TEST:PCX", "TEST:ACH")); err != nil {
				t.Fatal(err)
			}
			for _, want := range []string{"do not replace a safety assessment", "laser safety officer"} {
				if !strings.Contains(errb.String(), want) {
					t.Errorf("stderr lacks %q", want)
				}
			}
			checkGolden(t, filepath.Join("..", "..", "testdata", "inspect", tc.golden+".golden"),
				"-- stdout --\n"+out.String()+"-- stderr --\n"+errb.String())
		})
	}
}

// The peak irradiance of a ghost is that of a Gaussian beam carrying the
// reflected power: 2 P R / (pi w^2) (Siegman, Lasers, 1986, ch. 17), in
// W/cm^2 with w in cm.
func TestInspectGhostPeak(t *testing.T) {
	e, out, _ := testEnv()
	if err := runInspect(ghostOpts(e, "json", "TEST:PCX")); err != nil {
		t.Fatal(err)
	}
	var got []struct {
		Ghosts []struct {
			Radius      float64 `json:"radius_um"`
			Reflectance float64 `json:"reflectance"`
			Peak        float64 `json:"peak_w_per_cm2"`
		} `json:"ghosts"`
	}
	if err := json.Unmarshal(out.Bytes(), &got); err != nil {
		t.Fatal(err)
	}
	if len(got) != 1 || len(got[0].Ghosts) == 0 {
		t.Fatalf("ghosts %+v", got)
	}
	for _, g := range got[0].Ghosts {
		w := g.Radius * 1e-4 // um to cm
		want := 2 * 2 * g.Reflectance / (math.Pi * w * w)
		if math.Abs(g.Peak-want) > 1e-9*want {
			t.Errorf("peak %g W/cm^2, want %g", g.Peak, want)
		}
	}
}
