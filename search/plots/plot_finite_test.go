package plots

import (
	"bytes"
	"errors"
	"math"
	"strconv"
	"strings"
	"testing"

	"cardinal/search"
	"cardinal/search/finite"
	"cardinal/search/solution/solutiontest"
)

// The spot plot and the build-study plot never hold NaN or an infinity
// (IEEE Std 754-2019, section 3.4: the values that are not finite; common
// practice): figures with one are refused, in either format, with an
// error naming the figure, and nothing is written.
func TestPlotsRefuseNonFinite(t *testing.T) {
	req := solutiontest.Requirements()["focus"]
	s := solutiontest.Solve(t, req)[0]
	for _, format := range []string{"png", "svg"} {
		t.Run("spots "+format, func(t *testing.T) {
			sp, err := NewSpots(s, PlotOptions{Rings: 4})
			if err != nil {
				t.Fatal(err)
			}
			sp.Sets[0].X[3] = math.NaN()
			var b bytes.Buffer
			err = sp.WritePlot(&b, "t", format)
			var fe *finite.Error
			if !errors.As(err, &fe) || fe.Path != "Sets[0].X[3]" || b.Len() > 0 {
				t.Fatalf("got %v and %d bytes, want a *finite.Error at Sets[0].X[3] and nothing written", err, b.Len())
			}
		})
		t.Run("study "+format, func(t *testing.T) {
			st := search.Study{Figure: []float64{1, math.Inf(1), 2}, Adjust: []float64{0, 0.1, 0.2}, Target: 1, Tol: 0.5}
			var b bytes.Buffer
			err := WriteStudyPlot(&b, req, st, "t", format)
			var fe *finite.Error
			if !errors.As(err, &fe) || fe.Path != "Figure[1]" || b.Len() > 0 {
				t.Fatalf("got %v and %d bytes, want a *finite.Error at Figure[1] and nothing written", err, b.Len())
			}
		})
	}
}

// A field point whose every ray is lost has no spot: its summary, its
// table cell and its panel say that no ray reached the image, never an
// RMS radius of zero; one with some rays lost says how many its radius
// rests on. The plot of such a solution still draws.
func TestNoRayReachedTheImage(t *testing.T) {
	s := solutiontest.Solve(t, solutiontest.Requirements()["focus"])[0]
	sp, err := NewSpots(s, PlotOptions{Rings: 4})
	if err != nil {
		t.Fatal(err)
	}
	n := len(sp.Sets[0].X)
	all, part, none := sp.Sets[0], sp.Sets[0], sp.Sets[0]
	all.X, all.Y, all.W, all.DX, all.DY, all.Passed, all.Lost, all.RMS = nil, nil, nil, nil, nil, 0, n, 0
	part.Lost = 5
	for _, tc := range []struct {
		name          string
		set           SpotSet
		summary, cell string
		zero          bool // an RMS of 0 may not appear
	}{
		{"every ray lost", all, "no ray reached the image (all " + itoa(n) + " rays stopped)", "no ray reached the image", true},
		{"some lost", part, "rays that reached the image (5 lost)", "of " + itoa(n+5) + " rays)", false},
		{"none lost", none, "(" + itoa(n) + " rays, none lost)", "", false},
	} {
		t.Run(tc.name, func(t *testing.T) {
			if got := tc.set.Summary("µm"); !strings.Contains(got, tc.summary) || tc.zero && strings.Contains(got, "RMS") {
				t.Errorf("summary %q, want %q", got, tc.summary)
			}
			if got := tc.set.Cell(); !strings.Contains(got, tc.cell) {
				t.Errorf("cell %q, want %q", got, tc.cell)
			}
		})
	}
	lost := sp
	lost.Sets = append([]SpotSet(nil), sp.Sets...)
	lost.Sets[0] = all
	if got := spotNote(lost, 0); got != "no ray reached the image" {
		t.Errorf("the panel says %q", got)
	}
	plotPNG(t, lost, "every ray on axis lost")
}

func itoa(n int) string { return strconv.Itoa(n) }
