package report

import (
	"image/png"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"cardinal/search/solution/solutiontest"
)

// The report loads in a real headless browser without console messages,
// its drawings are in the DOM, and its screenshot is not blank.
func TestReportInBrowser(t *testing.T) {
	bin := solutiontest.Chromium(t)
	dir := t.TempDir()
	page := filepath.Join(dir, "report.html")
	if err := os.WriteFile(page, []byte(testReport(t, solutiontest.Requirements()["focus"])), 0o644); err != nil {
		t.Fatal(err)
	}
	t.Run("dom and console", func(t *testing.T) {
		dom, console := solutiontest.Headless(t, bin, page, "--dump-dom")
		if len(console) > 0 {
			t.Errorf("console messages:\n%s", strings.Join(console, "\n"))
		}
		for _, want := range []string{`id="drawing-1"`, `class="cardinal-layout"`, `class="surface"`, `id="request"`} {
			if !strings.Contains(dom, want) {
				t.Errorf("the DOM lacks %s", want)
			}
		}
	})
	t.Run("screenshot", func(t *testing.T) {
		shot := filepath.Join(dir, "shot.png")
		solutiontest.Headless(t, bin, page, "--screenshot="+shot, "--window-size=1200,1600", "--hide-scrollbars")
		f, err := os.Open(shot)
		if err != nil {
			t.Fatal(err)
		}
		defer f.Close()
		img, err := png.Decode(f)
		if err != nil {
			t.Fatal(err)
		}
		if ink := solutiontest.InkFraction(img); ink < 0.02 {
			t.Errorf("the screenshot is nearly blank: %.4f of its pixels drawn", ink)
		}
	})
	t.Run("the console check sees an error", func(t *testing.T) {
		bad := filepath.Join(dir, "bad.html")
		if err := os.WriteFile(bad, []byte(`<!DOCTYPE html><p>x</p><script>console.error("planted")</script>`), 0o644); err != nil {
			t.Fatal(err)
		}
		if _, console := solutiontest.Headless(t, bin, bad, "--dump-dom"); len(console) == 0 {
			t.Error("a page that logs an error shows no console message: the check above could not fail")
		}
	})
}
