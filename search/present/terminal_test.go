package present

import (
	"bytes"
	"slices"
	"strings"
	"testing"

	"github.com/mattn/go-runewidth"
)

func sample() Table {
	t := Table{Columns: []Column{
		{Key: "rank", Label: "#"},
		{Key: "parts", Label: "parts"},
		{Key: "efl_mm", Label: "EFL", Unit: "mm"},
		{Key: "price", Label: "price"},
		{Key: "why", Label: "why", Note: true},
	}}
	t.Add(Int(1), Text("DEMO:PCX-50-H + DEMO:PCV-125-H (reversed)"), Num(75.0004, 3), Num(27.5, 2),
		Text("pair, on target, 10 mm long, diffraction limited, both parts at hand in the drawer"))
	t.Add(Int(2), Text("TARNWICK:KC-12-125"), Num(-0.0001, 3), OptNum(nil, 2), Text(""))
	return t
}

func maxLine(s string) int {
	m := 0
	for _, l := range strings.Split(strings.TrimRight(s, "\n"), "\n") {
		m = max(m, runewidth.StringWidth(l))
	}
	return m
}

func TestWriteTerminalFits(t *testing.T) {
	for _, width := range []int{0, 200, 100, 60, 40} {
		var b bytes.Buffer
		fit, err := WriteTerminal(&b, sample(), width)
		if err != nil {
			t.Fatal(err)
		}
		got := maxLine(b.String())
		if width > 0 && got > width {
			t.Errorf("width %d: widest line %d:\n%s", width, got, b.String())
		}
		// Every value stays readable somewhere: in the table, in the notes
		// under it, or named by the fit's note.
		for _, want := range []string{"TARNWICK:KC-12-125", "75.000"} {
			if !strings.Contains(b.String(), want) && fit.Note() == "" {
				t.Errorf("width %d: %q lost:\n%s", width, want, b.String())
			}
		}
		if strings.Contains(b.String(), "-0.000") {
			t.Errorf("width %d: signed zero shown:\n%s", width, b.String())
		}
	}
}

func TestWriteTerminalMovesNotes(t *testing.T) {
	var b bytes.Buffer
	fit, err := WriteTerminal(&b, sample(), 60)
	if err != nil {
		t.Fatal(err)
	}
	if len(fit.Moved) != 1 || fit.Moved[0] != "why" {
		t.Fatalf("moved %v, want [why]:\n%s", fit.Moved, b.String())
	}
	if !strings.Contains(b.String(), "1 why: pair, on target") {
		t.Errorf("the why text is not under the table:\n%s", b.String())
	}
}

func TestWriteTerminalHidesLastResort(t *testing.T) {
	var b bytes.Buffer
	fit, err := WriteTerminal(&b, sample(), 30)
	if err != nil {
		t.Fatal(err)
	}
	if len(fit.Hidden) == 0 || fit.Note() == "" {
		t.Fatalf("nothing hidden at 30 columns:\n%s", b.String())
	}
	if got := maxLine(b.String()); got > 30 {
		t.Errorf("widest line %d > 30:\n%s", got, b.String())
	}
}

func TestSelect(t *testing.T) {
	tab := sample()
	tab.Columns[3].Optional = true
	def, _ := tab.Select(nil, false, false)
	if strings.Join(def.Keys(), ",") != "rank,parts,efl_mm,why" {
		t.Errorf("default keys %v", def.Keys())
	}
	wide, _ := tab.Select(nil, true, false)
	if len(wide.Columns) != 5 {
		t.Errorf("wide keys %v", wide.Keys())
	}
	chosen, err := tab.Select([]string{"price", "rank"}, false, false)
	if err != nil || strings.Join(chosen.Keys(), ",") != "price,rank" || chosen.Rows[0][0].Text != "27.50" {
		t.Errorf("chosen %v %v %v", chosen.Keys(), chosen.Rows, err)
	}
	if _, err := tab.Select([]string{"nope"}, false, false); err == nil || !strings.Contains(err.Error(), "efl_mm") {
		t.Errorf("unknown column error %v", err)
	}
}

func TestWriteCSVPlainValues(t *testing.T) {
	var b bytes.Buffer
	tab := sample()
	tab.Add(Int(3), Text("=1+1"), Num(1e-3, 3), Num(-2, 2), Text("-2+3"))
	if err := WriteCSV(&b, tab); err != nil {
		t.Fatal(err)
	}
	want := "rank,parts,efl_mm,price,why\n" +
		"1,DEMO:PCX-50-H + DEMO:PCV-125-H (reversed),75.0004,27.5,\"pair, on target, 10 mm long, diffraction limited, both parts at hand in the drawer\"\n" +
		"2,TARNWICK:KC-12-125,-0.0001,,\n" +
		"3,'=1+1,0.001,-2,'-2+3\n"
	if b.String() != want {
		t.Errorf("csv:\n%s\nwant:\n%s", b.String(), want)
	}
}

func TestWriteJSONOrderAndNull(t *testing.T) {
	var b bytes.Buffer
	if err := WriteJSON(&b, sample()); err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(b.String(), `{"rank": 2, "parts": "TARNWICK:KC-12-125", "efl_mm": -0.0001, "price": null, "why": null}`) {
		t.Errorf("json:\n%s", b.String())
	}
}

func TestWrap(t *testing.T) {
	tests := []struct {
		in    string
		width int
		want  string
	}{
		{"a bb ccc", 4, "a bb\nccc"},
		{"a bb ccc", 0, "a bb ccc"},
		{"longword x", 3, "longword\nx"},
		{"µm spot", 2, "µm\nspot"},
	}
	for _, tc := range tests {
		if got := Wrap(tc.in, tc.width); got != tc.want {
			t.Errorf("Wrap(%q, %d) = %q, want %q", tc.in, tc.width, got, tc.want)
		}
	}
}

// A price in two currencies wraps between them, never between an amount
// and its currency, so that a narrow terminal keeps the other columns.
func TestPriceWrapsBetweenCurrencies(t *testing.T) {
	tbl := Table{Columns: []Column{{Key: "rank", Label: "#"}, {Key: "price", Label: "price"}, {Key: "yield_pct", Label: "yield", Unit: "%"}}}
	tbl.Add(Int(1), Cell{Text: "12.50 XTS + 21.00 XXX"}, Num(97, 0))
	var b bytes.Buffer
	fit, err := WriteTerminal(&b, tbl, 24)
	if err != nil {
		t.Fatal(err)
	}
	out := b.String()
	if len(fit.Hidden) > 0 || !strings.Contains(out, "12.50 XTS +") || !strings.Contains(out, "21.00 XXX") || !strings.Contains(out, "97") {
		t.Errorf("hidden %v:\n%s", fit.Hidden, out)
	}
	if got := maxLine(out); got > 24 {
		t.Errorf("widest line %d > 24:\n%s", got, out)
	}
}

// WrapWords fills lines greedily by the fit it is given; a word too long
// for a line stands alone, and no words give one empty line.
func TestWrapWords(t *testing.T) {
	upTo := func(n int) func(string) bool { return func(l string) bool { return len(l) <= n } }
	for _, tc := range []struct {
		words []string
		n     int
		want  []string
	}{
		{nil, 10, []string{""}},
		{[]string{"a", "bb", "ccc"}, 4, []string{"a bb", "ccc"}},
		{[]string{"a", "bb", "ccc"}, 8, []string{"a bb ccc"}},
		{[]string{"abcdefgh", "b"}, 4, []string{"abcdefgh", "b"}},
		{[]string{"a", "abcdefgh", "b"}, 3, []string{"a", "abcdefgh", "b"}},
	} {
		if got := WrapWords(tc.words, upTo(tc.n)); !slices.Equal(got, tc.want) {
			t.Errorf("WrapWords(%q, %d) = %q, want %q", tc.words, tc.n, got, tc.want)
		}
	}
}
