package main

import (
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"slices"
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
				if !strings.Contains(unwrap(errb.String()), want) { // notes wrap to the width
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

// A coated part's ghosts lie where the bare part's do, and each is as
// concentrated as the bare one times the stated reflectance over the
// Fresnel one, ((n - 1)/(n + 1))^2 at normal incidence (Hecht, Optics, 5th
// ed., sec. 4.6.2), for every reflection met: the product of the two for a
// double ghost. The coated part says so in inspect's table.
func TestInspectGhostsCoated(t *testing.T) {
	const header = "supplier,part,diameter,r1,r2,r3,t1,t2,glass1,glass2,residual_reflectance\n"
	dir := t.TempDir()
	file := filepath.Join(dir, "coated.csv")
	if err := os.WriteFile(file, []byte(header+
		"TEST,BARE,25.4,50,-50,,5,,517642,,\n"+
		"TEST,COATED,25.4,50,-50,,5,,517642,,0.5%\n"+
		"TEST,ACH-C,25.4,60,-40,-150,6,2,517642,620364,0.25\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	type ghost struct {
		Surfaces      []int   `json:"surfaces"`
		Z             float64 `json:"z_mm"`
		Reflectance   float64 `json:"reflectance"`
		Concentration float64 `json:"concentration"`
		From          string  `json:"reflectance_from"`
	}
	ghostsOf := func(part string) []ghost {
		e, out, _ := testEnv()
		o := ghostOpts(e, "json", part)
		o.File = file
		if err := runInspect(o); err != nil {
			t.Fatal(err)
		}
		var got []struct {
			Ghosts []ghost `json:"ghosts"`
		}
		if err := json.Unmarshal(out.Bytes(), &got); err != nil {
			t.Fatal(err)
		}
		return got[0].Ghosts
	}
	bare, coated := ghostsOf("TEST:BARE"), ghostsOf("TEST:COATED")
	if len(bare) == 0 || len(bare) != len(coated) {
		t.Fatalf("%d ghosts bare, %d coated", len(bare), len(coated))
	}
	for i := range bare {
		b, c := bare[i], coated[i]
		// The bare part's reflectance per reflection is the Fresnel value at
		// 1064 nm (optics' TestFresnelReflectance checks the formula); the
		// coated part's is the stated 0.5 % per reflection.
		want := math.Pow(0.005, float64(len(c.Surfaces)))
		if math.Abs(c.Reflectance-want) > 1e-15 || c.From != "coating" || b.From != "indices" {
			t.Errorf("ghost %v: reflectance %g from %q (bare from %q), want %g from the coating", c.Surfaces, c.Reflectance, c.From, b.From, want)
		}
		if math.Abs(c.Z-b.Z) > 1e-9 {
			t.Errorf("ghost %v moved with the coating: %g against %g mm", c.Surfaces, c.Z, b.Z)
		}
		if r := c.Concentration / b.Concentration; math.Abs(r-want/b.Reflectance) > 1e-9*r {
			t.Errorf("ghost %v: concentration ratio %g, want %g", c.Surfaces, r, want/b.Reflectance)
		}
	}
	// In a cemented doublet the cemented face is not coated: a double
	// ghost between an outer face and the cemented one mixes the two.
	for _, g := range ghostsOf("TEST:ACH-C") {
		cemented := slices.Contains(g.Surfaces, 2)
		switch {
		case cemented && len(g.Surfaces) == 2 && g.From != "coating and indices",
			cemented && len(g.Surfaces) == 1 && g.From != "indices",
			!cemented && g.From != "coating":
			t.Errorf("ghost %v: reflectance from %q", g.Surfaces, g.From)
		}
	}
	e, out, _ := testEnv()
	o := inspectOpts(e, func(o *inspectOptions) { o.File, o.Parts = file, []string{"TEST:COATED", "TEST:BARE"} })
	if err := runInspect(o); err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{"coating, residual reflectance   0.5", "coating, residual reflectance   not stated"} {
		if !strings.Contains(out.String(), want) {
			t.Errorf("inspect's table lacks %q:\n%s", want, out.String())
		}
	}
}
