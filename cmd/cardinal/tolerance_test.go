package main

import (
	"encoding/json"
	"encoding/xml"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"cardinal/search"
)

func TestToleranceFlags(t *testing.T) {
	for _, tc := range []struct {
		name string
		args []string
		want func(*toleranceOptions) bool
		err  string
	}{
		{"defaults", []string{"last", "--pick", "1"}, func(o *toleranceOptions) bool {
			b := o.settings(search.BuildSettings{})
			return b.SpacingTol == search.DefaultSpacingTol && b.Trials == search.DefaultTrials && b.Compensator == "" && b.Distribution == ""
		}, ""},
		{"the search's settings kept", []string{"last", "--pick", "1"}, func(o *toleranceOptions) bool {
			b := o.settings(search.BuildSettings{SpacingTol: 0.2, Seed: 9, Distribution: search.Normal})
			return b.SpacingTol == 0.2 && b.Seed == 9 && b.Distribution == search.Normal
		}, ""},
		{"flags over the search's", []string{"last", "--pick", "2", "--trials", "20000", "--spacing-tol", "0.05", "--compensator", "gap",
			"--distribution", "uniform", "--seed", "4"}, func(o *toleranceOptions) bool {
			b := o.settings(search.BuildSettings{SpacingTol: 0.2, Seed: 9, Distribution: search.Normal})
			return b.SpacingTol == 0.05 && b.Trials == 20000 && b.Compensator == search.CompensateGap && b.Distribution == search.Uniform && b.Seed == 4
		}, ""},
		{"plot svg", []string{"last", "--pick", "1", "--plot", "h.SVG"}, func(o *toleranceOptions) bool { return o.plotFormat == "svg" }, ""},
		{"plot pdf", []string{"last", "--pick", "1", "--plot", "h.pdf"}, nil, "name the file .svg or .png"},
		{"two picks", []string{"last", "--pick", "1,2"}, nil, "one result at a time"},
		{"no pick", []string{"last"}, nil, "--pick"},
		{"few trials", []string{"last", "--pick", "1", "--trials", "3"}, nil, "--trials 3"},
		{"negative spacing", []string{"last", "--pick", "1", "--spacing-tol", "-1"}, nil, "--spacing-tol -1"},
		{"unknown compensator", []string{"last", "--pick", "1", "--compensator", "lens"}, nil, "use image, gap or none"},
		{"unknown distribution", []string{"last", "--pick", "1", "--distribution", "gauss"}, nil, "use uniform or normal"},
		{"bad format", []string{"last", "--pick", "1", "--format", "xml"}, nil, "xml"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			e, _, _ := testEnv()
			var got *toleranceOptions
			err := parseWith(newToleranceCmd(e, func(o *toleranceOptions) error { got = o; return nil }), tc.args...)
			checkParse(t, err, tc.err, func() bool { return got != nil && tc.want(got) })
		})
	}
}

// The study of a picked result, run with the search's own settings, gives
// the figures find printed for it: the same seeded builds.
func TestToleranceRepeatsFind(t *testing.T) {
	db := savedCatalog(t)
	_, rs := savedResults(t, db, "1")
	out, errs, code := cmdRun(t, db, "tolerance", "1", "--pick", "2", "--format", "json")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	var doc toleranceOutput
	if err := json.Unmarshal([]byte(out), &doc); err != nil {
		t.Fatal(err)
	}
	if rs[1].Build == nil {
		t.Fatal("find saved no build figures")
	}
	// The spot figures differ by design: find traces the first builds with
	// a small bundle (search.FindSpotBuilds), tolerance every build with
	// the real-ray stage's bundle; find's median of a few builds lies
	// within the 95 % range of all of them.
	tol, found := doc.Study.BuildFigures, *rs[1].Build
	if found.SpotBuilds != search.FindSpotBuilds || tol.SpotBuilds+tol.SpotLost != tol.Trials-doc.Study.Failed {
		t.Errorf("find traced %d builds, tolerance %d of %d", found.SpotBuilds, tol.SpotBuilds, tol.Trials)
	}
	if !(found.SpotMedian >= tol.SpotLow && found.SpotMedian <= tol.SpotHigh) {
		t.Errorf("find's median spot %g um is outside the study's 95 %% range %g..%g um", found.SpotMedian, tol.SpotLow, tol.SpotHigh)
	}
	for _, f := range []*search.BuildFigures{&tol, &found} {
		f.SpotBuilds, f.SpotLow, f.SpotMedian, f.SpotHigh, f.SpotLost = 0, 0, 0, 0, 0
	}
	if tol != found {
		t.Errorf("tolerance gave %+v, find %+v", tol, found)
	}
	if n := len(doc.Study.Sensitivities); n < 5 {
		t.Errorf("%d sensitivities for a pair", n)
	}
	sum := 0
	for _, c := range doc.AdjustHist.Counts {
		sum += c
	}
	if sum != doc.Study.Trials-doc.Study.Failed {
		t.Errorf("the histogram holds %d builds of %d", sum, doc.Study.Trials)
	}
}

func TestRunToleranceGolden(t *testing.T) {
	db := savedCatalog(t)
	for _, tc := range []struct {
		name string
		args []string
	}{
		{"focus-table", []string{"1", "--pick", "1"}},
		{"image-gap-md", []string{"2", "--pick", "1", "--compensator", "gap", "--format", "md"}},
		{"image-csv", []string{"2", "--pick", "1", "--distribution", "normal", "--format", "csv"}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			out, errs, code := cmdRun(t, db, append([]string{"tolerance"}, tc.args...)...)
			if code != 0 {
				t.Fatalf("exit %d: %s", code, errs)
			}
			checkGolden(t, filepath.Join("..", "..", "testdata", "tolerance", tc.name+".golden"), "-- stdout --\n"+out+"-- stderr --\n"+errs)
		})
	}
}

func TestTolerancePlot(t *testing.T) {
	db := savedCatalog(t)
	file := filepath.Join(t.TempDir(), "builds.svg")
	if _, errs, code := cmdRun(t, db, "tolerance", "1", "--pick", "1", "--plot", file); code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	b, err := os.ReadFile(file)
	if err != nil {
		t.Fatal(err)
	}
	var n drawnNode
	if err := xml.Unmarshal(b, &n); err != nil {
		t.Fatalf("not SVG: %v", err)
	}
	for _, want := range []string{"focus adjustment (mm)", "EFL after compensation (mm)", "of builds within tolerance"} {
		if !strings.Contains(string(b), want) {
			t.Errorf("the plot lacks %q", want)
		}
	}
}
