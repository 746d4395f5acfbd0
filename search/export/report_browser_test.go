package export

import (
	"bytes"
	"context"
	"image/png"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
	"time"
)

// chromium finds Debian's chromium. Outside CI a machine without it skips
// the browser checks and says how to get them; under CI (CI=true) .ci/run
// installs it, so its absence is a failure.
func chromium(t *testing.T) string {
	t.Helper()
	for _, name := range []string{"chromium", "chromium-browser"} {
		if p, err := exec.LookPath(name); err == nil {
			return p
		}
	}
	if os.Getenv("CI") == "true" {
		t.Fatal("CI=true but no chromium on PATH: .ci/run should have installed Debian's chromium package")
	}
	t.Skip("skipping the browser check of the HTML report: no chromium on PATH (apt-get install chromium to run it)")
	return ""
}

// headless runs chromium on a page with the given extra flags and returns
// its standard output and the page's console messages (the lines chromium
// logs as CONSOLE with --enable-logging=stderr).
func headless(t *testing.T, bin, page string, flags ...string) (string, []string) {
	t.Helper()
	ctx, cancel := context.WithTimeout(context.Background(), 90*time.Second)
	defer cancel()
	args := append([]string{"--headless", "--no-sandbox", "--disable-gpu", "--disable-background-networking",
		"--disable-component-update", "--disable-sync", "--no-first-run", "--user-data-dir=" + t.TempDir(),
		"--enable-logging=stderr", "--v=0"}, flags...)
	cmd := exec.CommandContext(ctx, bin, append(args, "file://"+page)...)
	var out, errb bytes.Buffer
	cmd.Stdout, cmd.Stderr = &out, &errb
	if err := cmd.Run(); err != nil {
		t.Fatalf("chromium %v: %v\n%s", flags, err, errb.String())
	}
	var console []string
	for _, l := range strings.Split(errb.String(), "\n") {
		if strings.Contains(l, ":CONSOLE") {
			console = append(console, l)
		}
	}
	return out.String(), console
}

// The report loads in a real headless browser without console messages,
// its drawings are in the DOM, and its screenshot is not blank.
func TestReportInBrowser(t *testing.T) {
	bin := chromium(t)
	dir := t.TempDir()
	page := filepath.Join(dir, "report.html")
	if err := os.WriteFile(page, []byte(testReport(t, testRequirements()["focus"])), 0o644); err != nil {
		t.Fatal(err)
	}
	t.Run("dom and console", func(t *testing.T) {
		dom, console := headless(t, bin, page, "--dump-dom")
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
		headless(t, bin, page, "--screenshot="+shot, "--window-size=1200,1600", "--hide-scrollbars")
		f, err := os.Open(shot)
		if err != nil {
			t.Fatal(err)
		}
		defer f.Close()
		img, err := png.Decode(f)
		if err != nil {
			t.Fatal(err)
		}
		if ink := inkFraction(img); ink < 0.02 {
			t.Errorf("the screenshot is nearly blank: %.4f of its pixels drawn", ink)
		}
	})
	t.Run("the console check sees an error", func(t *testing.T) {
		bad := filepath.Join(dir, "bad.html")
		if err := os.WriteFile(bad, []byte(`<!DOCTYPE html><p>x</p><script>console.error("planted")</script>`), 0o644); err != nil {
			t.Fatal(err)
		}
		if _, console := headless(t, bin, bad, "--dump-dom"); len(console) == 0 {
			t.Error("a page that logs an error shows no console message: the check above could not fail")
		}
	})
}
