package main

import (
	"encoding/csv"
	"encoding/json"
	"encoding/xml"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"cardinal/search"
	"cardinal/search/present"
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
		{"unknown bins", []string{"last", "--pick", "1", "--bins", "gap"}, nil, "use adjust, figure or spot"},
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
	for key, want := range map[string]int{"adjust_mm": doc.Study.Trials - doc.Study.Failed, "spot_um": doc.Study.SpotBuilds} {
		var bins []map[string]float64
		if err := json.Unmarshal(doc.Histograms[key], &bins); err != nil {
			t.Fatalf("%s: %v", key, err)
		}
		sum := 0
		for _, b := range bins {
			sum += int(b["builds"])
		}
		if sum != want || want == 0 {
			t.Errorf("the %s histogram holds %d builds of %d", key, sum, want)
		}
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

// --bins prints one histogram's bins as rows in every format: CSV through
// the safe writer with the unit in each key, the edges meeting bin to bin,
// every traced build counted once.
func TestToleranceBins(t *testing.T) {
	db := savedCatalog(t)
	out, errs, code := cmdRun(t, db, "tolerance", "1", "--pick", "1", "--bins", "spot", "--format", "csv")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	recs, err := csv.NewReader(strings.NewReader(out)).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	if got := strings.Join(recs[0], ","); got != "spot_from_um,spot_to_um,builds" {
		t.Fatalf("header %s", got)
	}
	sum, prev := 0, ""
	for _, r := range recs[1:] {
		if prev != "" && r[0] != prev {
			t.Errorf("bin from %s does not start where the last ended (%s)", r[0], prev)
		}
		n, _ := strconv.Atoi(r[2])
		sum, prev = sum+n, r[1]
	}
	if len(recs) != 16 || sum != search.DefaultTrials {
		t.Errorf("%d bins holding %d builds, want 15 holding %d", len(recs)-1, sum, search.DefaultTrials)
	}
	for _, tc := range []struct {
		args []string
		want string
	}{
		{[]string{"--bins", "adjust", "--format", "json"}, `"adjust_from_mm"`},
		{[]string{"--bins", "figure", "--format", "md"}, "| EFL from mm | to mm | builds |"},
		{[]string{"--bins", "figure", "--format", "csv"}, "efl_from_mm,efl_to_mm,builds"},
	} {
		out, errs, code := cmdRun(t, db, append([]string{"tolerance", "1", "--pick", "1"}, tc.args...)...)
		if code != 0 || !strings.Contains(out, tc.want) {
			t.Errorf("%v: exit %d, %s%s; want %q", tc.args, code, out, errs, tc.want)
		}
	}
	e, _, _ := testEnv()
	err = renderBins(&toleranceOptions{env: e, Bins: "spot", out: outputFlags{Format: "csv"}}, make([]present.StudyHistogram, 2))
	if err == nil || !strings.Contains(err.Error(), "no spot") {
		t.Errorf("spot bins of a study without rays: %v", err)
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
