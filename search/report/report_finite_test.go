package report

import (
	"bytes"
	"errors"
	"math"
	"strings"
	"testing"
	"time"

	"cardinal/search"
	"cardinal/search/finite"
	"cardinal/search/plots"
	"cardinal/search/purchase"
	"cardinal/search/solution/solutiontest"
)

// The report never holds NaN or an infinity (IEEE Std 754-2019, section
// 3.4; common practice): a ranked result with one is refused with an error
// naming the figure, and no page is written. Its drawings and plots are
// refused by their own writers' guards (drawing, plots).
func TestReportRefusesNonFinite(t *testing.T) {
	req := solutiontest.Requirements()["focus"]
	sols := solutiontest.Solve(t, req)
	var results []search.Result
	for _, s := range sols {
		results = append(results, s.Result)
	}
	results[1].EFL = solutiontest.F64(math.NaN())
	stock := map[string]purchase.Stock{}
	for _, e := range solutiontest.Entries(t) {
		stock[e.Part.ID()] = purchase.Stock{Entry: e}
	}
	rq, err := purchase.BuildRequest(7, req, results[:1], 1, stock)
	if err != nil {
		t.Fatal(err)
	}
	at := time.Date(2025, 1, 2, 3, 4, 5, 0, time.UTC)
	var b bytes.Buffer
	err = WriteReport(&b, ReportInput{Search: 7, SearchedAt: at, GeneratedAt: at, Requirement: req, Results: results,
		Picks: sols[:1], Request: rq, Plot: plots.PlotOptions{Rings: 4}})
	var fe *finite.Error
	if !errors.As(err, &fe) || !strings.Contains(fe.Path, "Results[1].EFL") || b.Len() > 0 {
		t.Fatalf("got %v and %d bytes, want a *finite.Error at Results[1].EFL and nothing written", err, b.Len())
	}
}
