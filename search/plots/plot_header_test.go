package plots

import (
	"image"
	"image/color"
	"strings"
	"testing"

	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"
)

// inkMask renders parts of a header at the top of a canvas one panel
// taller than the header and returns which pixels are not white.
func inkMask(h header, what string) [][]bool {
	c := vgimg.NewWith(vgimg.UseWH(h.width, h.height+panel), vgimg.UseDPI(plotDPI))
	dc := draw.New(c)
	dc.SetColor(color.White)
	dc.Fill(dc.Rectangle.Path())
	h.draw(dc, h.height+panel, what)
	img := c.Image()
	b := img.Bounds()
	m := make([][]bool, b.Dy())
	for y := range m {
		m[y] = make([]bool, b.Dx())
		for x := range m[y] {
			r, g, bl, _ := img.At(b.Min.X+x, b.Min.Y+y).RGBA()
			m[y][x] = r < 0xf000 || g < 0xf000 || bl < 0xf000
		}
	}
	return m
}

// inkBox is the bounding box of a mask's ink in pixels.
func inkBox(m [][]bool) image.Rectangle {
	var r image.Rectangle
	for y := range m {
		for x := range m[y] {
			if m[y][x] {
				r = r.Union(image.Rect(x, y, x+1, y+1))
			}
		}
	}
	return r
}

// The plot's title and notes never touch the key, whatever the title's
// length, and the header stays inside the page's width and above the
// panels: rendered apart, the two share no pixel, even one pixel apart.
func TestPlotHeaderDoesNotOverlap(t *testing.T) {
	three := Spots{Wavelengths: []float64{587.5618, 486.1327, 656.2725}, Airy: 3.04, ImageZ: 96.2}
	one := Spots{Wavelengths: []float64{1064}, Airy: 16.2, ImageZ: 69.527}
	afocal := Spots{Wavelengths: []float64{1064}, Angular: true}
	pxPerPt := float64(plotDPI) / 72
	for _, tc := range []struct {
		name, title string
		sp          Spots
	}{
		{"short title", "test", three},
		{"the title that overlapped", "Search 1, solution 1: DEMO:PCX-63-H + DEMO:PCV-400-H (reversed): spot diagrams and ray fans", one},
		{"long title, three colours", "Search 12, solution 3: " + strings.Repeat("SUPPLIER-WITH-A-LONG-NAME:PART-0001 (reversed) + ", 3) + "spot diagrams and ray fans", three},
		{"afocal", "Search 2, solution 1: DEMO:PCV-25-H + DEMO:PCX-100-H: spot diagrams and ray fans", afocal},
	} {
		t.Run(tc.name, func(t *testing.T) {
			h := tc.sp.newHeader(tc.title, 3*panel)
			words, key := inkMask(h, "text"), inkMask(h, "key")
			for y := 1; y < len(words)-1; y++ {
				for x := 1; x < len(words[y])-1; x++ {
					if !words[y][x] {
						continue
					}
					for _, d := range [][2]int{{0, 0}, {1, 0}, {-1, 0}, {0, 1}, {0, -1}} {
						if key[y+d[1]][x+d[0]] {
							t.Fatalf("title or notes touch the key at pixel (%d, %d)", x, y)
						}
					}
				}
			}
			right := int(float64(3*panel-headerMargin/2) * pxPerPt)
			bottom := int(float64(h.height) * pxPerPt)
			for name, m := range map[string][][]bool{"text": words, "key": key} {
				box := inkBox(m)
				if box.Empty() {
					t.Fatalf("nothing drawn of the %s", name)
				}
				if box.Max.X > right || box.Min.X < 1 || box.Min.Y < 1 {
					t.Errorf("the %s reaches the page's edge: ink %v, page width %d px", name, box, len(m[0]))
				}
				if box.Max.Y > bottom {
					t.Errorf("the %s runs into the panels: ink down to %d px, the header ends at %d px", name, box.Max.Y, bottom)
				}
			}
		})
	}
}
