package drawing

import (
	"encoding/xml"
	"fmt"
	"math"
	"slices"
	"strconv"
	"strings"
	"testing"

	"cardinal/search/solution"
	"cardinal/search/solution/solutiontest"
)

// svgNode is any element of a parsed SVG.
type svgNode struct {
	XMLName  xml.Name
	Attrs    []xml.Attr `xml:",any,attr"`
	Children []svgNode  `xml:",any"`
	Text     string     `xml:",chardata"`
}

func (n svgNode) attr(name string) string {
	for _, a := range n.Attrs {
		if a.Name.Local == name {
			return a.Value
		}
	}
	return ""
}

func (n svgNode) num(t *testing.T, name string) float64 {
	t.Helper()
	v, err := strconv.ParseFloat(n.attr(name), 64)
	if err != nil {
		t.Fatalf("<%s %s=%q>: %v", n.XMLName.Local, name, n.attr(name), err)
	}
	return v
}

// find lists the elements with the given class, depth first.
func (n svgNode) find(class string) []svgNode {
	var out []svgNode
	if slices.Contains(strings.Fields(n.attr("class")), class) {
		out = append(out, n)
	}
	for _, c := range n.Children {
		out = append(out, c.find(class)...)
	}
	return out
}

func parseSVG(t *testing.T, b []byte) svgNode {
	t.Helper()
	var root svgNode
	if err := xml.Unmarshal(b, &root); err != nil {
		t.Fatalf("the SVG does not parse: %v", err)
	}
	if root.XMLName.Local != "svg" || root.XMLName.Space != "http://www.w3.org/2000/svg" {
		t.Fatalf("root element %v", root.XMLName)
	}
	return root
}

// pathPoints reads the points of a path "Mx,y Lx,y ...".
func pathPoints(t *testing.T, d string) [][2]float64 {
	t.Helper()
	d = strings.TrimSuffix(strings.TrimPrefix(d, "M"), "Z")
	var pts [][2]float64
	for _, f := range strings.FieldsFunc(d, func(r rune) bool { return r == 'L' || r == ' ' }) {
		var x, y float64
		if _, err := fmt.Sscanf(f, "%g,%g", &x, &y); err != nil {
			t.Fatalf("path point %q: %v", f, err)
		}
		pts = append(pts, [2]float64{x, y})
	}
	return pts
}

// expectedVertices places every surface vertex from the result alone: the
// parts' thicknesses (in reverse order for a part turned around) and the
// solved gap, from the first vertex at z = 0 (DESIGN.md: the gap runs from
// the last vertex of the first part to the first vertex of the second).
func expectedVertices(s solution.Solution) []float64 {
	z := []float64{0}
	for i, u := range s.Result.Parts {
		th := slices.Clone(s.Entries[i].Part.Thickness)
		if u.Reversed {
			slices.Reverse(th)
		}
		if i > 0 {
			z = append(z, z[len(z)-1]+*s.Result.Gap)
		}
		for _, t := range th {
			z = append(z, z[len(z)-1]+t)
		}
	}
	return z
}

func drawSVG(t *testing.T, s solution.Solution) (Scene, svgNode) {
	t.Helper()
	sc, b := drawBytes(t, s, DrawOptions{})
	return sc, parseSVG(t, b)
}

// The drawn vertices, planes and dimensions sit where the solution puts
// them: in the SVG's user units (mm) a vertex at z is drawn at x = z on
// the axis y = 0.
func TestSVGPositionsEqualTheSolution(t *testing.T) {
	const tol = 1e-4 // the SVG carries 0.1 micrometre
	for kind, req := range solutiontest.Requirements() {
		for _, s := range solutiontest.Solve(t, req) {
			t.Run(kind+" "+solution.DescribeParts(s.Result.Parts), func(t *testing.T) {
				_, root := drawSVG(t, s)
				want := expectedVertices(s)
				surfaces := root.find("surface")
				if len(surfaces) != len(want) {
					t.Fatalf("%d surfaces drawn, want %d", len(surfaces), len(want))
				}
				for k, sf := range surfaces {
					onAxis := math.NaN()
					for _, p := range pathPoints(t, sf.attr("d")) {
						if p[1] == 0 {
							onAxis = p[0]
						}
					}
					if !(math.Abs(onAxis-want[k]) <= tol) {
						t.Errorf("surface %d: vertex drawn at x = %v, the solution has z = %.4f", k+1, onAxis, want[k])
					}
				}
				checkPlanes(t, root, s, want[len(want)-1], tol)
			})
		}
	}
}

// checkPlanes compares the object and image planes and the dimensions
// with the result's working distance, gap, back clearance and envelope.
func checkPlanes(t *testing.T, root svgNode, s solution.Solution, last float64, tol float64) {
	t.Helper()
	r := s.Result
	if math.Abs(last-r.Envelope) > tol {
		t.Errorf("last vertex at %.4f, envelope %.4f", last, r.Envelope)
	}
	planes := map[string]*float64{"object-plane": nil, "image-plane": nil}
	if r.WorkingDistance != nil {
		planes["object-plane"] = solutiontest.F64(-*r.WorkingDistance)
	}
	if r.BackClearance != nil {
		planes["image-plane"] = solutiontest.F64(r.Envelope + *r.BackClearance)
	}
	for class, z := range planes {
		got := root.find(class)
		if (z == nil) != (len(got) == 0) {
			t.Fatalf("%s: %d drawn, want one: %v", class, len(got), z != nil)
		}
		if z != nil && (math.Abs(got[0].num(t, "x1")-*z) > tol || math.Abs(got[0].num(t, "x2")-*z) > tol) {
			t.Errorf("%s drawn at x = %s, want %.4f", class, got[0].attr("x1"), *z)
		}
	}
	for _, d := range root.find("dim") {
		length := math.Abs(d.num(t, "x2") - d.num(t, "x1"))
		var want *float64
		switch d.attr("data-name") {
		case "working distance":
			want = r.WorkingDistance
		case "gap":
			want = r.Gap
		case "back clearance":
			want = r.BackClearance
		case "envelope":
			want = &r.Envelope
		case "track":
			want = r.Track
		}
		if want == nil || math.Abs(length-math.Abs(*want)) > 2*tol {
			t.Errorf("dimension %s drawn %.4f long, the result says %v", d.attr("data-name"), length, want)
		}
	}
}

// Every drawn ray and surface lies inside the viewBox.
func TestSVGViewBoxHoldsTheDrawing(t *testing.T) {
	for kind, req := range solutiontest.Requirements() {
		t.Run(kind, func(t *testing.T) {
			_, root := drawSVG(t, solutiontest.Solve(t, req)[0])
			var x, y, w, h float64
			if _, err := fmt.Sscanf(root.attr("viewBox"), "%g %g %g %g", &x, &y, &w, &h); err != nil {
				t.Fatal(err)
			}
			var pts [][2]float64
			for _, s := range root.find("surface") {
				pts = append(pts, pathPoints(t, s.attr("d"))...)
			}
			for _, r := range root.find("ray") {
				pts = append(pts, pathPoints(t, strings.ReplaceAll(r.attr("points"), " ", "L"))...)
			}
			for _, p := range pts {
				if p[0] < x || p[0] > x+w || p[1] < y || p[1] > y+h {
					t.Errorf("point %v outside the viewBox %v %v %v %v", p, x, y, w, h)
				}
			}
		})
	}
}

// A drawing for a laser requirement carries the cautions in its legend,
// word for word those of Cautions (the one text of them); one for visible
// imaging without a beam does not.
func TestSVGLaserCaution(t *testing.T) {
	for kind, want := range map[string]bool{"focus": true, "image": false} {
		t.Run(kind, func(t *testing.T) {
			req := solutiontest.Requirements()[kind]
			_, root := drawSVG(t, solutiontest.Solve(t, req)[0])
			var words []string
			var walk func(n svgNode)
			walk = func(n svgNode) {
				words = append(words, strings.Fields(n.Text)...)
				for _, c := range n.Children {
					walk(c)
				}
			}
			walk(root)
			text := strings.Join(words, " ") // the wrapped rows read as one text
			if got := strings.Contains(text, "laser caution"); got != want {
				t.Errorf("laser caution shown: %v, want %v", got, want)
			}
			for _, c := range solution.Cautions(req) {
				if !strings.Contains(text, "laser caution: "+c) {
					t.Errorf("the legend lacks the caution %q", c)
				}
			}
		})
	}
}
