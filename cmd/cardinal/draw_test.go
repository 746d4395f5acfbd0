package main

import (
	"encoding/xml"
	"image/png"
	"math"
	"os"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"testing"
)

func TestDrawFlags(t *testing.T) {
	for _, tc := range []struct {
		name string
		args []string
		want func(*drawOptions) bool
		err  string
	}{
		{"layout", []string{"last", "--pick", "1", "-o", "a.svg"}, func(o *drawOptions) bool { return o.format == "svg" && !o.Spot }, ""},
		{"layout to stdout", []string{"last", "--pick", "1"}, func(o *drawOptions) bool { return o.format == "svg" && o.Output == "" }, ""},
		{"spot png", []string{"last", "--pick", "2", "--spot", "-o", "s.PNG", "--band", "486.1,587.6"},
			func(o *drawOptions) bool {
				return o.format == "png" && o.Spot && slices.Equal(o.Band, []float64{486.1, 587.6})
			}, ""},
		{"former --field", []string{"last", "--pick", "1", "--field", "2.5"}, func(o *drawOptions) bool { return o.field.Former == 2.5 }, ""},
		{"field angle", []string{"last", "--pick", "1", "--field-angle", "1.5"}, func(o *drawOptions) bool { return o.field.Angle == 1.5 }, ""},
		{"two picks", []string{"last", "--pick", "1,2"}, nil, "one result at a time"},
		{"layout as png", []string{"last", "--pick", "1", "-o", "a.png"}, nil, "the layout drawing is SVG"},
		{"unknown extension", []string{"last", "--pick", "1", "--spot", "-o", "a.pdf"}, nil, "name the file .svg"},
		{"band without spot", []string{"last", "--pick", "1", "--band", "500"}, nil, "--spot plots only"},
		{"band not a number", []string{"last", "--pick", "1", "--spot", "--band", "green"}, nil, `"green" for "--band"`},
		{"no pick", []string{"last"}, nil, "--pick"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			e, _, _ := testEnv()
			var got *drawOptions
			err := parseWith(newDrawCmd(e, func(o *drawOptions) error { got = o; return nil }), tc.args...)
			checkParse(t, err, tc.err, func() bool { return got != nil && tc.want(got) })
		})
	}
}

// drawnNode is any element of a drawn SVG.
type drawnNode struct {
	XMLName  xml.Name
	Attrs    []xml.Attr  `xml:",any,attr"`
	Children []drawnNode `xml:",any"`
}

func (n drawnNode) attr(name string) string {
	for _, a := range n.Attrs {
		if a.Name.Local == name {
			return a.Value
		}
	}
	return ""
}

func (n drawnNode) all(class string) []drawnNode {
	var out []drawnNode
	if n.attr("class") == class {
		out = append(out, n)
	}
	for _, c := range n.Children {
		out = append(out, c.all(class)...)
	}
	return out
}

// The layout drawn from a saved search puts the object plane, the first
// and last vertices and the image plane where the saved result says
// (the SVG's user unit is the millimetre, z = 0 at the first vertex).
func TestRunDrawLayout(t *testing.T) {
	db := savedCatalog(t)
	_, rs := savedResults(t, db, "2")
	file := filepath.Join(t.TempDir(), "layout.svg")
	_, errs, code := cmdRun(t, db, "draw", "2", "--pick", "1", "-o", file)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	b, err := os.ReadFile(file)
	if err != nil {
		t.Fatal(err)
	}
	var root drawnNode
	if err := xml.Unmarshal(b, &root); err != nil {
		t.Fatal(err)
	}
	r := rs[0]
	x := func(n drawnNode) float64 {
		v, err := strconv.ParseFloat(n.attr("x1"), 64)
		if err != nil {
			t.Fatal(err)
		}
		return v
	}
	checks := map[string]float64{"object-plane": -*r.WorkingDistance, "image-plane": r.Envelope + *r.BackClearance}
	for class, want := range checks {
		got := root.all(class)
		if len(got) != 1 || math.Abs(x(got[0])-want) > 1e-4 {
			t.Errorf("%s: %d drawn, want one at x = %.4f", class, len(got), want)
		}
	}
	surfaces := root.all("surface")
	first, last := vertexX(t, surfaces[0]), vertexX(t, surfaces[len(surfaces)-1])
	if math.Abs(first) > 1e-4 || math.Abs(last-r.Envelope) > 1e-4 {
		t.Errorf("vertices drawn at %.4f and %.4f, want 0 and %.4f", first, last, r.Envelope)
	}
	if !strings.Contains(unwrap(errs), "wrote the layout of solution 1 of search 2") || strings.Contains(errs, "caution") {
		t.Errorf("stderr %q", errs)
	}
}

// vertexX is where a surface profile crosses the axis.
func vertexX(t *testing.T, n drawnNode) float64 {
	t.Helper()
	for _, p := range strings.Split(strings.TrimPrefix(n.attr("d"), "M"), " L") {
		xy := strings.Split(p, ",")
		if len(xy) == 2 && xy[1] == "0.0000" {
			v, err := strconv.ParseFloat(xy[0], 64)
			if err != nil {
				t.Fatal(err)
			}
			return v
		}
	}
	t.Fatalf("surface %s does not cross the axis", n.attr("data-surface"))
	return 0
}

// Spot plots come out as PNG or SVG, with the RMS figures on stderr and,
// for a laser search, the cautions.
func TestRunDrawSpot(t *testing.T) {
	db := savedCatalog(t)
	dir := t.TempDir()
	for _, name := range []string{"spot.png", "spot.svg"} {
		t.Run(name, func(t *testing.T) {
			file := filepath.Join(dir, name)
			_, errs, code := cmdRun(t, db, "draw", "1", "--pick", "1", "--spot", "-o", file, "--field", "0.5")
			if code != 0 {
				t.Fatalf("exit %d: %s", code, errs)
			}
			mustContain(t, errs, "RMS spot radius", "Airy radius", "caution: Focused laser beams", "on axis, 1064.0 nm: RMS")
			checkFieldUnits(t, errs, "field angle ", "°, ")
			// Without a field, a laser search is plotted on axis only: no
			// invented field point.
			_, errs, code = cmdRun(t, db, "draw", "1", "--pick", "1", "--spot", "-o", file+"-axis"+filepath.Ext(name))
			if code != 0 || strings.Contains(errs, "field angle") || !strings.Contains(errs, "on axis, 1064.0 nm: RMS") {
				t.Errorf("exit %d, a laser search without a field: %s", code, errs)
			}
			f, err := os.Open(file)
			if err != nil {
				t.Fatal(err)
			}
			defer f.Close()
			if strings.HasSuffix(name, ".png") {
				if _, err := png.Decode(f); err != nil {
					t.Error(err)
				}
				return
			}
			if err := xml.NewDecoder(f).Decode(new(drawnNode)); err != nil {
				t.Error(err)
			}
		})
	}
}

// checkFieldUnits checks that every RMS line on stderr names its field
// with its unit: "on axis", or the prefix, a number and the unit.
func checkFieldUnits(t *testing.T, errs, prefix, unit string) {
	t.Helper()
	n := 0
	for _, l := range strings.Split(errs, "\n") {
		if !strings.Contains(l, "RMS spot radius") || strings.HasPrefix(l, "on axis, ") {
			continue
		}
		n++
		rest, ok := strings.CutPrefix(l, prefix)
		num, _, found := strings.Cut(rest, unit)
		if _, err := strconv.ParseFloat(num, 64); !ok || !found || err != nil {
			t.Errorf("the field of %q is not %q, a number and %q", l, prefix, unit)
		}
	}
	if n == 0 {
		t.Errorf("no RMS line off axis in %q", errs)
	}
}

// The spots of an imaging search name their field as an object height in
// mm, the requirement's own (5 mm).
func TestRunDrawSpotObjectHeight(t *testing.T) {
	db := savedCatalog(t)
	file := filepath.Join(t.TempDir(), "spot.png")
	_, errs, code := cmdRun(t, db, "draw", "2", "--pick", "1", "--spot", "-o", file)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	mustContain(t, errs, "object height 5 mm, 587.6 nm: RMS")
	checkFieldUnits(t, errs, "object height ", " mm, ")
}

// A field edge past the range a requirement's own takes is the user's
// input: exit 2, naming the flag and the range, for draw and report alike
// (a field angle reaches 90 degrees only at grazing incidence: geometry).
func TestRunDrawFieldRange(t *testing.T) {
	db := savedCatalog(t)
	dir := t.TempDir()
	for _, tc := range []struct {
		args []string
		want string
	}{
		{[]string{"draw", "1", "--pick", "1", "--field", "100", "-o", filepath.Join(dir, "a.svg")}, "--field 100 is outside 0 to 89.9 degrees"},
		{[]string{"draw", "1", "--pick", "1", "--field-angle", "-90", "--spot", "-o", filepath.Join(dir, "a.png")}, "--field-angle -90 is outside 0 to 89.9 degrees"},
		{[]string{"draw", "2", "--pick", "1", "--object-height", "200000", "-o", filepath.Join(dir, "b.svg")}, "--object-height 200000 is outside 0 to 100000 mm"},
		{[]string{"report", "1", "--pick", "1", "--field", "360", "-o", filepath.Join(dir, "r.html")}, "--field 360 is outside 0 to 89.9 degrees"},
	} {
		t.Run(strings.Join(tc.args[:5], " "), func(t *testing.T) {
			_, errs, code := cmdRun(t, db, tc.args...)
			if code != 2 || !strings.Contains(unwrap(errs), tc.want) {
				t.Errorf("exit %d, %q; want exit 2 and %q", code, errs, tc.want)
			}
			if _, err := os.Stat(tc.args[len(tc.args)-1]); err == nil {
				t.Errorf("%s was written", tc.args[len(tc.args)-1])
			}
		})
	}
}
