package present

import (
	"fmt"
	"io"
	"strings"

	"github.com/mattn/go-runewidth"
	"github.com/olekukonko/tablewriter"
	"github.com/olekukonko/tablewriter/renderer"
	"github.com/olekukonko/tablewriter/tw"
)

// DefaultWidth is the width a table is fitted to when neither the terminal
// nor COLUMNS says one.
const DefaultWidth = 100

// A Fit says what WriteTerminal did to make a table fit: the columns it
// moved under the table and those it left out. Its Note is the one line a
// command prints about it, empty when nothing was changed.
type Fit struct {
	Width         int
	Moved, Hidden []string
}

// Note is the one line that says how the table was fitted, or "".
func (f Fit) Note() string {
	if len(f.Hidden) == 0 {
		return ""
	}
	return fmt.Sprintf("columns left out to fit %d characters: %s (see them with --wide or --columns, or in a wider terminal)",
		f.Width, strings.Join(f.Hidden, ", "))
}

// gutter is the space between two columns. Tables have no box: columns
// stand apart by the gutter, and a rule under the heading.
const gutter = "  "

// border is the width the gutters add to n columns (the last column keeps
// its trailing gutter).
func border(n int) int { return len(gutter) * n }

// WriteTerminal writes the table for a person, fitted to width characters
// (0: no limit): numbers right-aligned, long text wrapped at spaces; when
// it is still too wide, Note columns move to numbered lines under the table
// (labelled by the first column), and then columns are left out from the
// right, which the returned Fit says.
func WriteTerminal(w io.Writer, t Table, width int) (Fit, error) {
	fit := Fit{Width: width}
	lay := newLayout(t)
	var notes []int
	if width > 0 && lay.total() > width {
		for i, c := range t.Columns {
			if c.Note && i != t.Label {
				notes = append(notes, i)
			}
		}
		lay.drop(notes)
		lay.shrink(width)
		for lay.total() > width && len(lay.cols) > 1 {
			least := lay.cols[len(lay.cols)-1]
			for _, i := range lay.cols[1:] {
				if t.Columns[i].Keep <= t.Columns[least].Keep {
					least = i
				}
			}
			fit.Hidden = append(fit.Hidden, t.Columns[least].Key)
			lay.drop([]int{least})
			lay.shrink(width)
		}
	}
	for _, i := range notes {
		fit.Moved = append(fit.Moved, t.Columns[i].Key)
	}
	if err := lay.render(w); err != nil {
		return fit, err
	}
	return fit, writeNotes(w, t, notes, width)
}

// layout is the columns shown and their widths.
type layout struct {
	t           Table
	cols        []int // indices into t.Columns
	want, least map[int]int
	num         []bool
}

func newLayout(t Table) *layout {
	l := &layout{t: t, want: map[int]int{}, least: map[int]int{}, num: numeric(t)}
	for i, c := range t.Columns {
		l.cols = append(l.cols, i)
		l.want[i], l.least[i] = widths(c.Heading())
		for _, row := range t.Rows {
			// A number is one word and never wraps; a price in two
			// currencies wraps between them.
			w, least := widths(row[i].Text)
			l.want[i] = max(l.want[i], w)
			l.least[i] = max(l.least[i], least)
		}
	}
	return l
}

// widths is the width of a text on one line and of its longest word.
func widths(s string) (whole, word int) {
	for _, line := range strings.Split(s, "\n") {
		whole = max(whole, runewidth.StringWidth(line))
		for _, f := range glue(strings.Fields(line)) {
			word = max(word, runewidth.StringWidth(f))
		}
	}
	return whole, word
}

func (l *layout) total() int {
	s := border(len(l.cols))
	for _, i := range l.cols {
		s += l.want[i]
	}
	return s
}

func (l *layout) drop(idx []int) {
	for _, d := range idx {
		for k, i := range l.cols {
			if i == d {
				l.cols = append(l.cols[:k], l.cols[k+1:]...)
				break
			}
		}
	}
}

// shrink narrows the widest wrappable column a character at a time until
// the table fits or no column can narrow further.
func (l *layout) shrink(width int) {
	for l.total() > width {
		best, slack := -1, 0
		for _, i := range l.cols {
			if s := l.want[i] - l.least[i]; s > 0 && (best < 0 || l.want[i] > l.want[best]) {
				best, slack = i, s
			}
		}
		if best < 0 || slack == 0 {
			return
		}
		l.want[best]--
	}
}

func (l *layout) render(w io.Writer) error {
	align := make(tw.Alignment, len(l.cols))
	head := make([]string, len(l.cols))
	for k, i := range l.cols {
		head[k] = Wrap(l.t.Columns[i].Heading(), l.want[i])
		align[k] = tw.AlignLeft
		if l.num[i] {
			align[k] = tw.AlignRight
		}
	}
	rows := make([][]string, len(l.t.Rows))
	for r, row := range l.t.Rows {
		rows[r] = make([]string, len(l.cols))
		for k, i := range l.cols {
			rows[r][k] = Wrap(row[i].Text, l.want[i])
		}
	}
	var b strings.Builder
	tbl := tablewriter.NewTable(&b,
		tablewriter.WithRenderer(renderer.NewBlueprint(tw.Rendition{
			Borders: tw.Border{Left: tw.Off, Right: tw.Off, Top: tw.Off, Bottom: tw.Off},
			Settings: tw.Settings{
				Separators: tw.Separators{BetweenColumns: tw.Off, BetweenRows: tw.Off, ShowHeader: tw.On},
				Lines:      tw.Lines{ShowHeaderLine: tw.On},
			},
		})),
		tablewriter.WithPadding(tw.Padding{Left: "", Right: gutter, Overwrite: true}),
		tablewriter.WithHeaderAutoFormat(tw.Off),
		tablewriter.WithHeaderAlignment(tw.AlignLeft),
		tablewriter.WithRowAutoWrap(tw.WrapNone),
		tablewriter.WithHeaderAutoWrap(tw.WrapNone),
		tablewriter.WithRowAlignmentConfig(tw.CellAlignment{PerColumn: align}),
		tablewriter.WithTrimSpace(tw.Off),
	)
	tbl.Header(head)
	if err := tbl.Bulk(rows); err != nil {
		return err
	}
	if err := tbl.Render(); err != nil {
		return err
	}
	lines := strings.SplitAfter(b.String(), "\n")
	for i, l := range lines {
		lines[i] = strings.TrimRight(strings.TrimSuffix(l, "\n"), " ")
		if strings.HasSuffix(l, "\n") {
			lines[i] += "\n"
		}
	}
	_, err := io.WriteString(w, strings.Join(lines, ""))
	return err
}

// writeNotes writes the moved columns as lines under the table, each
// labelled by the row's first cell and wrapped to the width.
func writeNotes(w io.Writer, t Table, notes []int, width int) error {
	pad := 0
	for _, row := range t.Rows {
		pad = max(pad, runewidth.StringWidth(row[t.Label].Text))
	}
	for _, row := range t.Rows {
		for _, i := range notes {
			if row[i].Text == Missing || row[i].Text == "" {
				continue
			}
			label := fmt.Sprintf("%*s %s: ", pad, row[t.Label].Text, t.Columns[i].Label)
			indent := strings.Repeat(" ", runewidth.StringWidth(label))
			text := Wrap(row[i].Text, max(width-len(indent), 20))
			if _, err := fmt.Fprintf(w, "%s%s\n", label, strings.ReplaceAll(text, "\n", "\n"+indent)); err != nil {
				return err
			}
		}
	}
	return nil
}

// Wrap breaks s at spaces into lines of at most width display characters
// (a word longer than the width stands on its own line); existing line
// breaks are kept.
func Wrap(s string, width int) string {
	if width <= 0 {
		return s
	}
	fits := func(line string) bool { return runewidth.StringWidth(line) <= width }
	var out []string
	for _, para := range strings.Split(s, "\n") {
		out = append(out, WrapWords(glue(strings.Fields(para)), fits)...)
	}
	return strings.Join(out, "\n")
}

// WrapWords fills lines greedily with the words in order, a space between
// two, starting a new line when the next word would make the line not fit;
// a word that does not fit alone stands on its own line. No words give one
// empty line. It is the one wrap of every output: the terminal (display
// width), the drawing (characters) and the plots (the font's width).
func WrapWords(words []string, fits func(line string) bool) []string {
	var lines []string
	line := ""
	for _, w := range words {
		switch {
		case line == "":
			line = w
		case fits(line + " " + w):
			line += " " + w
		default:
			lines = append(lines, line)
			line = w
		}
	}
	return append(lines, line)
}

// glue keeps a lone "+" (between the parts of a pair) and "(reversed)"
// with the word before them, so that a line never starts with either.
func glue(words []string) []string {
	var out []string
	for _, w := range words {
		if (w == "+" || w == "(reversed)" || currencyAfterAmount(out, w)) && len(out) > 0 {
			out[len(out)-1] += " " + w
			continue
		}
		out = append(out, w)
	}
	return out
}

// currencyAfterAmount is true for a currency code (three capital letters)
// after an amount, which stay together: "12.50 XTS".
func currencyAfterAmount(out []string, w string) bool {
	if len(out) == 0 || len(w) != 3 || strings.ToUpper(w) != w || strings.ToLower(w) == w {
		return false
	}
	last := out[len(out)-1]
	return last[len(last)-1] >= '0' && last[len(last)-1] <= '9'
}
