// Package solutiontest holds what the tests of the packages that present a
// solution share: a small catalog of test prescriptions, one requirement of
// each kind met by it, the search rebuilt into solutions, and the headless
// browser the drawing and report tests load their pages in. The
// prescriptions are fixtures, not check values.
package solutiontest

import (
	"bytes"
	"context"
	"image"
	"math"
	"os"
	"os/exec"
	"strings"
	"testing"
	"time"

	"cardinal/catalog/record"
	"cardinal/optics"
	"cardinal/search"
	"cardinal/search/solution"
)

// Entries is a small catalog for the drawing and plot tests: stock-like
// prescriptions written for these tests (plano-convex, biconcave and a
// cemented achromat in two six-digit glasses). They are fixtures, not
// check values: the checks compare the drawing with the search's own
// solution and with Snell's and Newton's equations.
func Entries(t *testing.T) []record.Entry {
	t.Helper()
	crown, err := optics.GlassCode("517642")
	if err != nil {
		t.Fatal(err)
	}
	flint, err := optics.GlassCode("620364")
	if err != nil {
		t.Fatal(err)
	}
	inf := math.Inf(1)
	part := func(name string, d float64, radii, thick []float64, media ...optics.Medium) record.Entry {
		p := optics.Part{Supplier: "TEST", Name: name, Diameter: d, Thickness: thick, Media: media}
		for _, r := range radii {
			p.Surfaces = append(p.Surfaces, optics.Sphere(r))
		}
		if err := p.Validate(); err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		return record.Entry{Part: p, Price: 20, Currency: "XTS"}
	}
	return []record.Entry{
		part("PCX-100", 25.4, []float64{51.7, inf}, []float64{4}, crown),
		part("PCX-50", 25.4, []float64{25.84, inf}, []float64{5.3}, crown),
		part("BCC-50", 12.7, []float64{-51.7, 51.7}, []float64{2}, crown),
		part("ACH-100", 25.4, []float64{60.46, -35.06, -138.46}, []float64{6, 2.5}, crown, flint),
	}
}

func EntryMap(es []record.Entry) map[string]record.Entry {
	m := map[string]record.Entry{}
	for _, e := range es {
		m[e.Part.ID()] = e
	}
	return m
}

// Solve runs the search over the test catalog and rebuilds its results.
func Solve(t *testing.T, req search.Requirement) []solution.Solution {
	t.Helper()
	es := Entries(t)
	items := search.Items(es, nil)
	out, err := search.Find(items, req)
	if err != nil {
		t.Fatal(err)
	}
	if len(out.Results) == 0 {
		t.Fatalf("no result for %+v: %v", req, out.Why)
	}
	var sols []solution.Solution
	for _, r := range out.Results {
		s, err := solution.New(req, r, EntryMap(es))
		if err != nil {
			t.Fatal(err)
		}
		sols = append(sols, s)
	}
	return sols
}

// Requirements are one of each kind, met by the test catalog.
func Requirements() map[string]search.Requirement {
	focus := search.Defaults()
	focus.Kind, focus.EFL, focus.Beam, focus.Top = search.Focus, 75, 8, 3
	focus.Power = 0.5 // a laser: brings the cautions (search.Requirement.Laser)
	image := search.Defaults()
	image.Kind, image.Track, image.Mag, image.NA, image.ObjectHeight, image.Top = search.Image, 300, -1, 0.02, 3, 3
	image.MagTol = search.Tolerance{Value: 2, Percent: true}
	expand := search.Defaults()
	expand.Kind, expand.Expansion, expand.Beam, expand.Top = search.Expand, 2, 4, 3
	expand.ExpandTol = search.Tolerance{Value: 5, Percent: true}
	return map[string]search.Requirement{"focus": focus, "image": image, "expand": expand}
}

// InkFraction is the share of pixels that are not white.
func InkFraction(img image.Image) float64 {
	b := img.Bounds()
	ink := 0
	for y := b.Min.Y; y < b.Max.Y; y++ {
		for x := b.Min.X; x < b.Max.X; x++ {
			r, g, bl, _ := img.At(x, y).RGBA()
			if r < 0xf000 || g < 0xf000 || bl < 0xf000 {
				ink++
			}
		}
	}
	return float64(ink) / float64(b.Dx()*b.Dy())
}

// F64 returns a pointer to v.
func F64(v float64) *float64 { return &v }

// Chromium finds Debian's chromium. Outside CI a machine without it skips
// the browser checks and says how to get them; under CI (CI=true) .ci/run
// installs it, so its absence is a failure.
func Chromium(t *testing.T) string {
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

// Headless runs chromium on a page with the given extra flags and returns
// its standard output and the page's console messages (the lines chromium
// logs as CONSOLE with --enable-logging=stderr).
func Headless(t *testing.T, bin, page string, flags ...string) (string, []string) {
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
