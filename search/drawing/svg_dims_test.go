package drawing

import (
	"regexp"
	"strconv"
	"testing"

	"cardinal/search"
	"cardinal/search/solution"
	"cardinal/search/solution/solutiontest"
)

// shortGapSolution is a pair with a 14.48 mm gap beside a 59.92 mm back
// clearance on a 300 mm track, small parts on a long track: the case where
// the gap's label used to be printed on the back clearance's.
func shortGapSolution(t *testing.T) solution.Solution {
	t.Helper()
	req := search.Defaults()
	req.Kind, req.Track, req.Mag, req.NA, req.ObjectHeight = search.Image, 300, -0.36, 0.02, 2
	r := search.Result{Rank: 1, Parts: []search.PartUse{{Supplier: "TEST", Part: "PCX-50"}, {Supplier: "TEST", Part: "BCC-50"}},
		Gap: solutiontest.F64(14.48), WorkingDistance: solutiontest.F64(222.61), BackClearance: solutiontest.F64(59.92)}
	s, err := solution.New(req, r, solutiontest.EntryMap(solutiontest.Entries(t)))
	if err != nil {
		t.Fatal(err)
	}
	return s
}

func shortGapDrawing(t *testing.T) []byte {
	_, svg := drawBytes(t, shortGapSolution(t), DrawOptions{})
	return svg
}

// No two dimension labels overlap, as placeDims estimates their widths
// (the browser test measures the real ones), and every dimension is drawn
// once.
func TestDimensionLabelsApart(t *testing.T) {
	sols := map[string]solution.Solution{"short gap": shortGapSolution(t)}
	for kind, req := range solutiontest.Requirements() {
		sols[kind] = solutiontest.Solve(t, req)[0]
	}
	for name, s := range sols {
		t.Run(name, func(t *testing.T) {
			sc, b := drawBytes(t, s, DrawOptions{})
			d := &svgDoc{sc: &sc, fs: fontSize(sc)}
			x0, x1 := d.extent()
			d.placeDims(x0, x1)
			if len(d.dimLabels) != len(sc.Dims) {
				t.Fatalf("%d labels for %d dimensions", len(d.dimLabels), len(sc.Dims))
			}
			for i, a := range d.dimLabels {
				for _, c := range d.dimLabels[:i] {
					if a.Row == c.Row && a.below == c.below && a.x0 < c.x1 && c.x0 < a.x1 {
						t.Errorf("%q [%.1f, %.1f] overlaps %q [%.1f, %.1f] in row %d", a.text, a.x0, a.x1, c.text, c.x0, c.x1, a.Row)
					}
				}
			}
			labels := regexp.MustCompile(`class="dim-label" data-name="([a-z ]+)"`).FindAllSubmatch(b, -1)
			if len(labels) != len(sc.Dims) {
				t.Errorf("the SVG has %d dimension labels for %d dimensions", len(labels), len(sc.Dims))
			}
		})
	}
}

// The glyphs of the cardinal points stay smaller than the parts: on a
// 300 mm track with 12.7 mm parts a principal-plane bar is no taller than
// the smallest part's semi-diameter.
func TestMarksScaleWithTheParts(t *testing.T) {
	s := shortGapSolution(t)
	_, svg := drawBytes(t, s, DrawOptions{})
	bar := regexp.MustCompile(`class="glyph-principal" x1="[-0-9.]+" y1="([-0-9.]+)" x2="[-0-9.]+" y2="([-0-9.]+)"`)
	ms := bar.FindAllStringSubmatch(string(svg), -1)
	if len(ms) == 0 {
		t.Fatal("no principal-plane bar drawn")
	}
	semi := 12.7 / 2
	for _, m := range ms {
		y1, _ := strconv.ParseFloat(m[1], 64)
		y2, _ := strconv.ParseFloat(m[2], 64)
		if h := y2 - y1; h > semi {
			t.Errorf("a principal-plane bar is %.2f mm tall, more than the %.2f mm semi-diameter of the smallest part", h, semi)
		}
	}
}
