package drawing

import (
	"math"
	"strings"

	"cardinal/search/present"
)

// Text sizes of the drawing, in units of its font size, and what wrapping
// assumes of a font.
const (
	titleSize  = 1.1
	legendSize = 0.8
	// legendIndent is where the legend's words start, in font sizes from
	// the drawing's left edge: after the samples of rays and marks.
	legendIndent = 4.0
	// minLegendRunes is the least number of characters a legend line
	// holds; a drawing too narrow for it is widened (its scale unchanged).
	minLegendRunes = 60
	// advance is the width allowed per character, in ems: more than the
	// mean advance of the legend's words in DejaVu Sans, a wide sans-serif
	// font (about 0.45 em, measured on a headless-browser screenshot of a
	// drawing), so that lines wrapped by it fit; TestSVGTextInsideTheDrawing
	// checks that they do, in a real browser.
	advance = 0.6
)

// runesIn is how many characters of a font size fit in a width.
func runesIn(width, size float64) int {
	return max(int(math.Floor(width/(advance*size))), 1)
}

// wrapText breaks s between words into lines of at most n characters; a
// single word longer than n has a line of its own.
func wrapText(s string, n int) []string {
	return present.WrapWords(strings.Fields(s), func(line string) bool { return len([]rune(line)) <= n })
}
