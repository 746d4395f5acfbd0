package report

import (
	"bytes"
	"fmt"
	"html"
	"math"
	"regexp"
	"slices"
	"strconv"
	"strings"
	"testing"
	"time"

	"cardinal/search"
	"cardinal/search/plots"
	"cardinal/search/purchase"
	"cardinal/search/solution/solutiontest"
)

// testReport writes a report for the first two results of a requirement.
func testReport(t *testing.T, req search.Requirement) string {
	t.Helper()
	page, _ := testReportOf(t, req)
	return page
}

// testReportOf writes a report for the first two results of a requirement
// and returns it with all the results.
func testReportOf(t *testing.T, req search.Requirement) (string, []search.Result) {
	t.Helper()
	sols := solutiontest.Solve(t, req)
	var results []search.Result
	for _, s := range sols {
		results = append(results, s.Result)
	}
	stock := map[string]purchase.Stock{}
	for _, e := range solutiontest.Entries(t) {
		stock[e.Part.ID()] = purchase.Stock{Entry: e}
	}
	rq, err := purchase.BuildRequest(7, req, results[:2], 1, stock)
	if err != nil {
		t.Fatal(err)
	}
	at := time.Date(2025, 1, 2, 3, 4, 5, 0, time.UTC)
	var b bytes.Buffer
	err = WriteReport(&b, ReportInput{Search: 7, SearchedAt: at, GeneratedAt: at, Requirement: req, Results: results,
		Picks: sols[:2], Request: rq, Plot: plots.PlotOptions{Rings: 6}})
	if err != nil {
		t.Fatal(err)
	}
	return b.String(), results
}

// The page fetches nothing: no external style sheet, script, import or
// url(), and every src is a data URI; the drawings are inline SVG.
func TestReportIsSelfContained(t *testing.T) {
	req := solutiontest.Requirements()["focus"]
	page := testReport(t, req)
	for _, bad := range []string{"<link", "<script", "@import", "url(", "<iframe", "<object", "<embed"} {
		if strings.Contains(strings.ToLower(page), bad) {
			t.Errorf("the report holds %q", bad)
		}
	}
	srcs := regexp.MustCompile(`\ssrc="([^"]*)"`).FindAllStringSubmatch(page, -1)
	if len(srcs) != 4 {
		t.Errorf("%d images, want 4 (the spot plot and the build study's histograms of each pick)", len(srcs))
	}
	for _, s := range srcs {
		if !strings.HasPrefix(s[1], "data:image/png;base64,") {
			t.Errorf("src %.60q is not a PNG data URI", s[1])
		}
	}
	if n := strings.Count(page, `<svg xmlns="http://www.w3.org/2000/svg" class="cardinal-layout"`); n != 2 {
		t.Errorf("%d inline drawings, want 2", n)
	}
	_, results := testReportOf(t, req)
	for _, want := range []string{"Requirement", "Ranked results", `class="picked"`, "Purchase request", results[0].Parts[0].ID(), "Cautions",
		"Will it build?", `id="buildstudy-1"`, "of builds meet the target", "focal length of part 1"} {
		if !strings.Contains(page, want) {
			t.Errorf("the report lacks %q", want)
		}
	}
}

// A laser requirement (a power) brings the laser cautions; an imaging
// requirement in the visible without a beam does not.
func TestReportCautions(t *testing.T) {
	laser := testReport(t, solutiontest.Requirements()["focus"])
	if !strings.Contains(laser, `id="laser-cautions"`) || !strings.Contains(laser, "laser safety officer") {
		t.Error("the laser report lacks the laser cautions")
	}
	if testing.Short() {
		return
	}
	plain := testReport(t, solutiontest.Requirements()["image"])
	if strings.Contains(plain, `id="laser-cautions"`) {
		t.Error("a visible imaging report carries the laser cautions")
	}
	if !strings.Contains(plain, "Lenses concentrate light") {
		t.Error("the general caution is missing")
	}
}

// resultsTable reads the ranked table of a report: its header and rows of
// cell texts.
func resultsTable(t *testing.T, page string) ([]string, [][]string) {
	t.Helper()
	start := strings.Index(page, `<table class="results">`)
	if start < 0 {
		t.Fatal("the report has no ranked table")
	}
	table := page[start : start+strings.Index(page[start:], "</table>")]
	cells := func(s, tag string) []string {
		var out []string
		for _, m := range regexp.MustCompile(`<`+tag+`[^>]*>(.*?)</`+tag+`>`).FindAllStringSubmatch(s, -1) {
			out = append(out, html.UnescapeString(m[1]))
		}
		return out
	}
	head := cells(table, "th")
	var rows [][]string
	for _, r := range regexp.MustCompile(`(?s)<tr[^>]*>(.*?)</tr>`).FindAllStringSubmatch(table, -1)[1:] {
		rows = append(rows, cells(r[1], "td"))
	}
	return head, rows
}

// The ranked table shows each result's real-ray figures: the RMS spot on
// axis and at the field edge, the Airy radius, the diffraction-limited
// verdict and, with a band, the focal shift; the note under it says the
// ranking used them.
func TestReportRankedTableQuality(t *testing.T) {
	req := solutiontest.Requirements()["focus"]
	req.FieldAngle, req.Band = 1, []float64{486.1327, 587.5618, 656.2725}
	page, results := testReportOf(t, req)
	head, rows := resultsTable(t, page)
	col := map[string]int{}
	for _, h := range []string{"spot µm", "edge spot µm", "Airy µm", "diffraction limited", "focal shift µm"} {
		if col[h] = slices.Index(head, h); col[h] < 0 {
			t.Fatalf("the ranked table has no column %q: %q", h, head)
		}
	}
	if len(rows) != len(results) {
		t.Fatalf("%d rows, %d results", len(rows), len(results))
	}
	for i, r := range results {
		q := r.ImageQuality
		if q == nil || q.RMSSpotEdge == nil || q.FocalShift == nil {
			t.Fatalf("result %d was not traced with a field and a band: %+v", r.Rank, q)
		}
		want := map[string]string{
			"spot µm":             fmt.Sprintf("%.1f", q.RMSSpot),
			"edge spot µm":        fmt.Sprintf("%.1f", *q.RMSSpotEdge),
			"diffraction limited": q.DiffractionLimitedWhy,
			"focal shift µm":      fmt.Sprintf("%.0f", *q.FocalShift),
		}
		if q.DiffractionLimited != (q.DiffractionLimitedWhy == "yes") || q.DiffractionLimitedWhy == "" {
			t.Errorf("result %d: diffraction limited %v, why %q", r.Rank, q.DiffractionLimited, q.DiffractionLimitedWhy)
		}
		for h, w := range want {
			if got := rows[i][col[h]]; got != w {
				t.Errorf("result %d, %s: %q, want %q", r.Rank, h, got, w)
			}
		}
		// The Airy radius of a beam of diameter D focused at f is 1.22
		// lambda f / D (Born and Wolf, Principles of Optics, 7th ed.,
		// section 8.5.2); a real marginal ray's sine differs from D / 2f by
		// well under 1 % at f/9.
		airy, err := strconv.ParseFloat(rows[i][col["Airy µm"]], 64)
		if wantAiry := 1.22 * req.Lambda() * 1e-3 * *r.EFL / req.Beam; err != nil || math.Abs(airy-wantAiry) > 0.02*wantAiry {
			t.Errorf("result %d: Airy radius cell %q, want %.2f µm within 2 %%", r.Rank, rows[i][col["Airy µm"]], wantAiry)
		}
	}
	note := page[strings.Index(page, `id="ranking-note"`):]
	note = note[:strings.Index(note, "</p>")]
	for _, w := range []string{"first-order score", "traced with real rays at 587.5618 nm", "focal shift over the band", "best focus"} {
		if !strings.Contains(note, w) {
			t.Errorf("the ranking note lacks %q: %s", w, note)
		}
	}
	if strings.Contains(page, "The ranking is first order (paraxial") {
		t.Error("the report still says the ranking is first order only")
	}
}

// The ranking note follows what the search did: first order only for an
// expander or without an aperture, real rays too with one.
func TestRankingNote(t *testing.T) {
	reqs := solutiontest.Requirements()
	noBeam := reqs["focus"]
	noBeam.Beam = 0
	for _, tc := range []struct {
		name      string
		req       search.Requirement
		want, not string
	}{
		{"expander", reqs["expand"], "afocal and are ranked on first order only", "traced with real rays"},
		{"no aperture", noBeam, "no aperture was given", "traced with real rays"},
		{"image with an NA", reqs["image"], "traced with real rays", "first order only"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			got := rankingNote(tc.req, search.QualityShown{Any: tc.req.TracesRays()})
			if !strings.Contains(got, tc.want) || strings.Contains(got, tc.not) {
				t.Errorf("%q: want %q in it, not %q", got, tc.want, tc.not)
			}
		})
	}
}
