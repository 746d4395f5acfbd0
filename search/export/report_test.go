package export

import (
	"bytes"
	"regexp"
	"strings"
	"testing"
	"time"

	"cardinal/search"
)

// testReport writes a report for the first two results of a requirement.
func testReport(t *testing.T, req search.Requirement) string {
	t.Helper()
	sols := solve(t, req)
	var results []search.Result
	for _, s := range sols {
		results = append(results, s.Result)
	}
	stock := map[string]Stock{}
	for _, e := range testEntries(t) {
		stock[e.Part.ID()] = Stock{Entry: e}
	}
	rq, err := BuildRequest(7, req, results[:2], 1, stock)
	if err != nil {
		t.Fatal(err)
	}
	at := time.Date(2025, 1, 2, 3, 4, 5, 0, time.UTC)
	var b bytes.Buffer
	err = WriteReport(&b, ReportInput{Search: 7, SearchedAt: at, GeneratedAt: at, Requirement: req, Results: results,
		Picks: sols[:2], Request: rq, Plot: PlotOptions{Rings: 6}})
	if err != nil {
		t.Fatal(err)
	}
	return b.String()
}

// The page fetches nothing: no external style sheet, script, import or
// url(), and every src is a data URI; the drawings are inline SVG.
func TestReportIsSelfContained(t *testing.T) {
	req := testRequirements()["focus"]
	page := testReport(t, req)
	for _, bad := range []string{"<link", "<script", "@import", "url(", "<iframe", "<object", "<embed"} {
		if strings.Contains(strings.ToLower(page), bad) {
			t.Errorf("the report holds %q", bad)
		}
	}
	srcs := regexp.MustCompile(`\ssrc="([^"]*)"`).FindAllStringSubmatch(page, -1)
	if len(srcs) != 2 {
		t.Errorf("%d images, want 2 (one plot per pick)", len(srcs))
	}
	for _, s := range srcs {
		if !strings.HasPrefix(s[1], "data:image/png;base64,") {
			t.Errorf("src %.60q is not a PNG data URI", s[1])
		}
	}
	if n := strings.Count(page, `<svg xmlns="http://www.w3.org/2000/svg" class="cardinal-layout"`); n != 2 {
		t.Errorf("%d inline drawings, want 2", n)
	}
	for _, want := range []string{"Requirement", "Ranked results", `class="picked"`, "Purchase request", "TEST:PCX-50", "Cautions"} {
		if !strings.Contains(page, want) {
			t.Errorf("the report lacks %q", want)
		}
	}
}

// A laser requirement (a power) brings the laser cautions; an imaging
// requirement in the visible without a beam does not.
func TestReportCautions(t *testing.T) {
	laser := testReport(t, testRequirements()["focus"])
	if !strings.Contains(laser, `id="laser-cautions"`) || !strings.Contains(laser, "laser safety officer") {
		t.Error("the laser report lacks the laser cautions")
	}
	if testing.Short() {
		return
	}
	plain := testReport(t, testRequirements()["image"])
	if strings.Contains(plain, `id="laser-cautions"`) {
		t.Error("a visible imaging report carries the laser cautions")
	}
	if !strings.Contains(plain, "Lenses concentrate light") {
		t.Error("the general caution is missing")
	}
}
