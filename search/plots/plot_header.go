package plots

import (
	"fmt"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"cardinal/search/present"
	"cardinal/search/wavecolour"
)

// Margins and line spacing of the plot's header.
const (
	headerMargin = 4 * vg.Millimeter
	headerTop    = 3 * vg.Millimeter
	headerBelow  = 3 * vg.Millimeter // between the header and the panels
	keyGap       = 6 * vg.Millimeter // between the notes and the key
	lineSpacing  = 1.3               // line pitch over font size
)

// A header is the plot's title, wrapped to the width, then the notes on
// the left and the key (one entry per wavelength and the Airy circle) on
// the right, or below the notes when the two do not fit side by side.
// Offsets are measured down from the top of the canvas.
type header struct {
	title, notes       []string
	titleSty, notesSty text.Style
	notesTop           vg.Length
	key                plot.Legend
	keyNames           []string
	keyTop             vg.Length
	keyW, keyH         vg.Length
	width, height      vg.Length
}

// newHeader lays out the header for a canvas of the given width.
func (sp Spots) newHeader(title string, width vg.Length) header {
	h := header{width: width}
	h.key, h.keyNames = sp.key()
	h.titleSty, h.notesSty = plot.New().Title.TextStyle, plot.New().Title.TextStyle
	h.titleSty.Font, h.notesSty.Font = font.From(plotFont, 12), font.From(plotFont, 10)
	for _, s := range []*text.Style{&h.titleSty, &h.notesSty} {
		s.XAlign, s.YAlign = draw.XLeft, draw.YTop
	}
	inner := width - 2*headerMargin
	h.title = wrapStyled(h.titleSty, title, inner)
	for _, n := range sp.headerNotes() {
		h.notes = append(h.notes, wrapStyled(h.notesSty, n, inner)...)
	}
	h.notesTop = headerTop + vg.Length(len(h.title))*h.titleSty.Font.Size*lineSpacing
	notesH := vg.Length(len(h.notes)) * h.notesSty.Font.Size * lineSpacing
	h.keyW, h.keyH = keySize(h.key, h.keyNames)
	if widest(h.notesSty, h.notes)+keyGap+h.keyW <= inner { // side by side
		h.keyTop = h.notesTop
		h.height = h.notesTop + max(notesH, h.keyH) + headerBelow
		return h
	}
	h.keyTop = h.notesTop + notesH
	h.height = h.keyTop + h.keyH + headerBelow
	return h
}

// headerNotes are the lines under the title: the reference of the spots,
// the image plane and best focus, and the search's verdict.
func (sp Spots) headerNotes() []string {
	n := []string{fmt.Sprintf("spots relative to the chief ray at %s", wavecolour.Name(sp.Wavelengths[0]))}
	if sp.Angular {
		return append(n, "afocal: output directions in µrad; no focus")
	}
	n = append(n, fmt.Sprintf("image plane %s mm behind the last vertex; best focus %s mm from it (least RMS spot on axis)",
		present.Fixed(sp.ImageZ, 3), present.Fixed(sp.BestFocus, 3)))
	if sp.Verdict != "" {
		n = append(n, sp.Verdict)
	}
	return n
}

// key is the legend of the colours, one per wavelength, and of the Airy
// disc, with the names of its entries.
func (sp Spots) key() (plot.Legend, []string) {
	var names []string
	key := plot.NewLegend()
	key.Top = true
	key.TextStyle.Font = font.From(plotFont, 10)
	for _, wl := range sp.Wavelengths {
		g, _ := plotter.NewScatter(plotter.XYs{{}})
		g.GlyphStyle = wavelengthGlyph(wl)
		l, _ := plotter.NewLine(plotter.XYs{{}, {X: 1}})
		l.Color, l.Width = wavecolour.Of(wl), vg.Points(1.6)
		names = append(names, wavecolour.Name(wl))
		key.Add(names[len(names)-1], g, l)
	}
	if sp.Airy > 0 {
		disc, _ := plotter.NewPolygon(plotter.XYs{{}, {X: 1}, {X: 1, Y: 1}})
		disc.Color, disc.LineStyle.Width = airyFill, 0
		names = append(names, fmt.Sprintf("Airy disc, radius %s %s", present.Figure(sp.Airy), sp.Unit()))
		key.Add(names[len(names)-1], disc)
	}
	return key, names
}

// keySize is the width and height the key takes when drawn, as
// plot.Legend.Draw (gonum.org/v1/plot v0.17) places its entries: each a
// thumbnail, a space and the text, one entry height apart, the tallest
// text's height above its baseline, and the font's descent below the last.
func keySize(l plot.Legend, names []string) (w, h vg.Length) {
	sty := l.TextStyle
	var entry vg.Length
	for _, name := range names {
		w = max(w, l.ThumbnailWidth+sty.Rectangle(" ").Max.X+sty.Width(name))
		entry = max(entry, sty.Rectangle(name).Max.Y)
	}
	return w, vg.Length(len(names))*entry + sty.FontExtents().Descent
}

// draw writes the header on a canvas of height height; what says which
// parts: "text" (title and notes), "key", or both.
func (h header) draw(dc draw.Canvas, height vg.Length, what ...string) {
	has := func(s string) bool { return len(what) == 0 || strings.Contains(strings.Join(what, " "), s) }
	if has("text") {
		for i, l := range h.title {
			dc.FillText(h.titleSty, vg.Point{X: headerMargin, Y: height - headerTop - vg.Length(i)*h.titleSty.Font.Size*lineSpacing}, l)
		}
		for i, l := range h.notes {
			dc.FillText(h.notesSty, vg.Point{X: headerMargin, Y: height - h.notesTop - vg.Length(i)*h.notesSty.Font.Size*lineSpacing}, l)
		}
	}
	if has("key") {
		area := dc
		area.Max = vg.Point{X: h.width - headerMargin, Y: height - h.keyTop}
		area.Min = vg.Point{X: h.width - headerMargin - h.keyW, Y: height - h.keyTop - h.keyH}
		h.key.Draw(area)
	}
}

// wrapStyled breaks s between words into lines no wider than width in the
// style's font (a word wider than that has a line of its own).
func wrapStyled(sty text.Style, s string, width vg.Length) []string {
	return present.WrapWords(strings.Fields(s), func(line string) bool { return sty.Width(line) <= width })
}

// widest is the width of the widest line.
func widest(sty text.Style, lines []string) (w vg.Length) {
	for _, l := range lines {
		w = max(w, sty.Width(l))
	}
	return w
}
