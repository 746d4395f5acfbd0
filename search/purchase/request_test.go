package purchase

import (
	"bytes"
	"encoding/csv"
	"fmt"
	"math"
	"slices"
	"strings"
	"testing"

	"cardinal/catalog/record"
	"cardinal/optics"
	"cardinal/search"
	"cardinal/search/solution"
	"cardinal/search/solution/solutiontest"
)

// stockOf makes a catalog entry for the request tests: only the fields a
// request reads matter here.
func stockOf(supplier, part, desc string, price float64, currency string, inDrawer int, where string) Stock {
	return Stock{Entry: record.Entry{Part: optics.Part{Supplier: supplier, Name: part, Description: desc},
		Price: price, Currency: currency}, InDrawer: inDrawer, Location: where}
}

func use(supplier, part string, rev bool) search.PartUse {
	return search.PartUse{Supplier: supplier, Part: part, Reversed: rev}
}

func testStock() map[string]Stock {
	m := map[string]Stock{}
	for _, s := range []Stock{
		stockOf("ALPHA", "L-10", "Plano-convex", 10, "XTS", 1, "B3"),
		stockOf("ALPHA", "L-20", "=HYPERLINK(\"http://x.invalid\")", 12.5, "XTS", 0, ""),
		stockOf("BETA", "M-5", "Meniscus", 7.25, "XXX", 5, "C1"),
		stockOf("BETA", "N-1", "No price", 0, "", 0, ""),
	} {
		m[s.Entry.Part.ID()] = s
	}
	return m
}

// The expected quantities and sums are worked by hand from the stock
// above (arithmetic only).
func TestBuildRequest(t *testing.T) {
	picks := []search.Result{
		{Rank: 1, Parts: []search.PartUse{use("ALPHA", "L-10", false), use("ALPHA", "L-10", true)}, Gap: solutiontest.F64(2), Envelope: 10, BackClearance: solutiontest.F64(40)},
		{Rank: 3, Parts: []search.PartUse{use("ALPHA", "L-20", false), use("BETA", "M-5", false)}, Gap: solutiontest.F64(3), Envelope: 11, BackClearance: solutiontest.F64(41)},
		{Rank: 4, Parts: []search.PartUse{use("BETA", "N-1", false), use("ALPHA", "L-10", false)}, Gap: solutiontest.F64(1), Envelope: 9, BackClearance: solutiontest.F64(39)},
	}
	rq, err := BuildRequest(17, search.Requirement{Kind: search.Focus, EFL: 50}, picks, 2, testStock())
	if err != nil {
		t.Fatal(err)
	}
	type want struct {
		needed, drawer, order int
		total                 float64 // NaN: no price
		usedBy                []int
	}
	wants := map[string]want{
		"ALPHA:L-10": {6, 1, 5, 50, []int{1, 4}}, // twice in #1 and once in #4, two systems: 6
		"ALPHA:L-20": {2, 0, 2, 25, []int{3}},
		"BETA:M-5":   {2, 5, 0, 0, []int{3}}, // the drawer covers it
		"BETA:N-1":   {2, 0, 2, math.NaN(), []int{4}},
	}
	var ids []string
	for _, g := range rq.Suppliers {
		for _, l := range g.Lines {
			id := l.Supplier + ":" + l.Part
			ids = append(ids, id)
			w := wants[id]
			t.Run(id, func(t *testing.T) {
				if l.Needed != w.needed || l.InDrawer != w.drawer || l.ToOrder != w.order || !slices.Equal(l.UsedBy, w.usedBy) {
					t.Errorf("needed %d, drawer %d, order %d, used by %v; want %d, %d, %d, %v", l.Needed, l.InDrawer, l.ToOrder, l.UsedBy, w.needed, w.drawer, w.order, w.usedBy)
				}
				if math.IsNaN(w.total) != (l.LineTotal == nil) || l.LineTotal != nil && math.Abs(*l.LineTotal-w.total) > 1e-9 {
					t.Errorf("line total %v, want %v", l.LineTotal, w.total)
				}
			})
		}
	}
	if !slices.Equal(ids, []string{"ALPHA:L-10", "ALPHA:L-20", "BETA:M-5", "BETA:N-1"}) {
		t.Errorf("lines in order %v", ids)
	}
	t.Run("subtotals and totals per currency", func(t *testing.T) {
		checkMoney(t, "ALPHA subtotal", rq.Suppliers[0].Subtotals, []Money{{"XTS", 75}})
		checkMoney(t, "BETA subtotal", rq.Suppliers[1].Subtotals, []Money{{"XXX", 0}})
		checkMoney(t, "totals", rq.Totals, []Money{{"XTS", 75}, {"XXX", 0}})
		if !slices.Equal(rq.Unpriced, []string{"BETA:N-1"}) {
			t.Errorf("unpriced %v", rq.Unpriced)
		}
	})
}

func checkMoney(t *testing.T, what string, got, want []Money) {
	t.Helper()
	if len(got) != len(want) {
		t.Fatalf("%s: %v, want %v", what, got, want)
	}
	for i := range got {
		if got[i].Currency != want[i].Currency || math.Abs(got[i].Amount-want[i].Amount) > 1e-9 {
			t.Errorf("%s: %v, want %v", what, got, want)
		}
	}
}

// Mixed currencies are never summed: a request in two currencies has two
// total rows.
func TestRequestRowsMixedCurrencies(t *testing.T) {
	picks := []search.Result{{Rank: 1, Parts: []search.PartUse{use("ALPHA", "L-20", false), use("BETA", "M-5", false)}, Gap: solutiontest.F64(3), Envelope: 11}}
	stock := testStock()
	m := stock["BETA:M-5"]
	m.InDrawer = 0
	stock["BETA:M-5"] = m
	rq, err := BuildRequest(1, search.Requirement{Kind: search.Focus, EFL: 50}, picks, 3, stock)
	if err != nil {
		t.Fatal(err)
	}
	var totals [][]string
	for _, r := range rq.Rows() {
		if r[0] == "total" {
			totals = append(totals, []string{r[8], r[9]})
		}
	}
	// 3 x 12.50 = 37.50 XTS; 3 x 7.25 = 21.75 XXX.
	want := [][]string{{"37.50", "XTS"}, {"21.75", "XXX"}}
	if len(totals) != 2 || !slices.Equal(totals[0], want[0]) || !slices.Equal(totals[1], want[1]) {
		t.Errorf("total rows %v, want %v", totals, want)
	}
	found := false
	for _, n := range rq.Notes() {
		found = found || n[0] == "currencies"
	}
	if !found {
		t.Error("no note that the currencies are listed apart")
	}
}

// The CSV of a request neutralises a formula in a description (OWASP, "CSV
// Injection") and keeps numbers as numbers.
func TestRequestCSV(t *testing.T) {
	picks := []search.Result{{Rank: 2, Parts: []search.PartUse{use("ALPHA", "L-20", false)}, Envelope: 4, BackClearance: solutiontest.F64(48)}}
	req := search.Requirement{Kind: search.Focus, EFL: 50, Beam: 4, Wavelength: 1064}
	rq, err := BuildRequest(5, req, picks, 1, testStock())
	if err != nil {
		t.Fatal(err)
	}
	var b bytes.Buffer
	if err := rq.WriteCSV(&b); err != nil {
		t.Fatal(err)
	}
	rows, err := csv.NewReader(strings.NewReader(b.String())).ReadAll()
	if err != nil {
		t.Fatalf("%v\n%s", err, b.String())
	}
	line := rows[1]
	if got := line[2]; !strings.HasPrefix(got, "'=HYPERLINK") {
		t.Errorf("description cell %q not neutralised", got)
	}
	if line[7] != "12.50" || line[8] != "12.50" || line[3] != "1" {
		t.Errorf("numbers changed: %q", line)
	}
	notes := map[string]string{}
	for _, r := range rows {
		if len(r) != len(RequestHeader()) {
			t.Errorf("row %q has %d cells, want %d", r, len(r), len(RequestHeader()))
		}
		if _, ok := notes[r[0]]; !ok {
			notes[r[0]] = r[1]
		}
	}
	for name, want := range map[string]string{"requirement": "focus: EFL 50 mm", "solution 2": "ALPHA:L-20; back clearance 48.00 mm", "caution": "Focused laser beams"} {
		if !strings.HasPrefix(notes[name], want) {
			t.Errorf("note %s = %q, want it to begin %q", name, notes[name], want)
		}
	}
}

func TestBuildRequestErrors(t *testing.T) {
	picks := []search.Result{{Rank: 1, Parts: []search.PartUse{use("GAMMA", "Z", false)}}}
	if _, err := BuildRequest(1, search.Requirement{}, picks, 1, testStock()); err == nil || !strings.Contains(err.Error(), "GAMMA:Z") {
		t.Errorf("missing part: error %v", err)
	}
	if _, err := BuildRequest(1, search.Requirement{}, nil, 0, testStock()); err == nil {
		t.Error("zero systems accepted")
	}
}

// Cautions follow search.Requirement.Laser: a power, or a wavelength outside
// the visible (400-700 nm, common practice), brings the laser cautions.
func TestCautions(t *testing.T) {
	tests := []struct {
		name  string
		req   search.Requirement
		want  int
		shown []search.Result
	}{
		{"visible imaging, no beam", search.Requirement{Kind: search.Image, Wavelength: 550}, 0, nil},
		{"visible beam, no power", search.Requirement{Kind: search.Focus, Beam: 3, Wavelength: 632.8}, 0, nil},
		{"beam with a power", search.Requirement{Kind: search.Focus, Beam: 3, Power: 0.005}, len(solution.LaserCautions()), nil},
		{"near infrared", search.Requirement{Kind: search.Image, Wavelength: 1064}, len(solution.LaserCautions()), nil},
		{"ultraviolet", search.Requirement{Kind: search.Focus, Wavelength: 355}, len(solution.LaserCautions()), nil},
		{"expander of any form", search.Requirement{Kind: search.Expand, Beam: 2, Power: 1}, len(solution.LaserCautions()) + 1, nil},
		{"Galilean expander", search.Requirement{Kind: search.Expand, Beam: 2, Power: 1, Form: search.Galilean}, len(solution.LaserCautions()), nil},
		{"expander of any form, Galilean rows shown", search.Requirement{Kind: search.Expand, Beam: 2, Power: 1}, len(solution.LaserCautions()),
			[]search.Result{{Form: search.Galilean}, {Form: search.Galilean}}},
		{"expander of any form, a Keplerian row shown", search.Requirement{Kind: search.Expand, Beam: 2, Power: 1}, len(solution.LaserCautions()) + 1,
			[]search.Result{{Form: search.Galilean}, {Form: search.Keplerian}}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			if got := solution.Cautions(tc.req, tc.shown...); len(got) != tc.want {
				t.Errorf("%d cautions, want %d", len(got), tc.want)
			}
		})
	}
}

// Every format of a request names where to buy each part (the url column
// of the rows, and the JSON line), and a request with its solutions
// rebuilt carries each one's build sheet in its notes.
func TestRequestURLAndBuild(t *testing.T) {
	req := solutiontest.Requirements()["image"]
	sols := solutiontest.Solve(t, req)[:2]
	stock := map[string]Stock{}
	for _, e := range solutiontest.Entries(t) {
		e.URL = "https://test.example.com/" + e.Part.Name
		stock[e.Part.ID()] = Stock{Entry: e}
	}
	var picks []search.Result
	for _, s := range sols {
		picks = append(picks, s.Result)
	}
	rq, err := BuildRequest(3, req, picks, 1, stock)
	if err != nil {
		t.Fatal(err)
	}
	rq.AddBuilds(sols)
	url := slices.Index(RequestHeader(), "url")
	for _, r := range rq.Rows() {
		if r[1] == "subtotal" || r[0] == "total" {
			continue
		}
		if want := "https://test.example.com/" + r[1]; r[url] != want {
			t.Errorf("row %q: url %q, want %q", r, r[url], want)
		}
	}
	builds := map[string][]string{}
	for _, n := range rq.Notes() {
		if strings.HasPrefix(n[0], "build ") {
			builds[n[0]] = append(builds[n[0]], n[1])
		}
	}
	for _, s := range sols {
		lines := builds[fmt.Sprintf("build %d", s.Result.Rank)]
		want := s.Build().Lines(solution.SidesOf(req.Kind))
		if !slices.Equal(lines, want) {
			t.Errorf("solution %d: build notes %q, want %q", s.Result.Rank, lines, want)
		}
		if len(lines) < 4 || !strings.HasPrefix(lines[0], "object to first vertex") || !strings.Contains(strings.Join(lines, "\n"), "toward the object") {
			t.Errorf("solution %d: build notes %q", s.Result.Rank, lines)
		}
	}
}
