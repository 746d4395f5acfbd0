package main

import (
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"
)

func TestReportFlags(t *testing.T) {
	for _, tc := range []struct {
		name string
		args []string
		want func(*reportOptions) bool
		err  string
	}{
		{"picks", []string{"last", "--pick", "1,2", "-o", "r.html", "--quantity", "3"}, func(o *reportOptions) bool {
			return slices.Equal(o.Picks, []int{1, 2}) && o.Output == "r.html" && o.Qty == 3
		}, ""},
		{"band", []string{"last", "--pick", "1", "--band", "1064"}, func(o *reportOptions) bool { return slices.Equal(o.Band, []float64{1064}) }, ""},
		{"no pick", []string{"last"}, nil, "--pick"},
		{"no systems", []string{"last", "--pick", "1", "--quantity", "-1"}, nil, "--systems -1"},
		{"band out of range", []string{"last", "--pick", "1", "--band", "50"}, nil, "--band 50"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			e, _, _ := testEnv()
			var got *reportOptions
			err := parseWith(newReportCmd(e, func(o *reportOptions) error { got = o; return nil }), tc.args...)
			checkParse(t, err, tc.err, func() bool { return got != nil && tc.want(got) })
		})
	}
}

// The report of a laser search holds the picks' drawings and plots, the
// request and the laser cautions, and refuses to overwrite without --force.
func TestRunReport(t *testing.T) {
	db := savedCatalog(t)
	file := filepath.Join(t.TempDir(), "report.html")
	_, errs, code := cmdRun(t, db, "report", "1", "--pick", "2,1", "-o", file)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	b, err := os.ReadFile(file)
	if err != nil {
		t.Fatal(err)
	}
	page := string(b)
	mustContain(t, page, `id="drawing-2"`, `id="drawing-1"`, `id="plot-1"`, "data:image/png;base64,", `id="request"`,
		`id="laser-cautions"`, "laser safety officer", "Search 1, run 2025-01-02 03:04 UTC")
	if strings.Index(page, `id="solution-2"`) > strings.Index(page, `id="solution-1"`) {
		t.Error("the picks are not in the order asked")
	}
	mustContain(t, errs, "caution: Focused laser beams", "wrote the report on search 1")
	if _, errs, code := cmdRun(t, db, "report", "1", "--pick", "1", "-o", file); code != exitUsage || !strings.Contains(unwrap(errs), "--force") {
		t.Errorf("overwrite without --force: exit %d, %q", code, errs)
	}
}
