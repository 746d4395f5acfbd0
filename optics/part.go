package optics

import (
	"fmt"
	"math"
	"strings"
)

// A Part is one stock optical part: a singlet, a cemented doublet or
// triplet, or an air-spaced assembly, described surface by surface.
type Part struct {
	Supplier, Name string // together unique; the ID is SUPPLIER:NAME
	Description    string
	Diameter       float64 // mm
	// ClearAperture is the usable diameter in mm; zero means 90 % of the
	// diameter.
	ClearAperture float64
	Surfaces      []Surface // in light order
	// Thickness[i] is the axial distance from surface i to surface i+1.
	Thickness []float64
	// Media[i] is the material between surface i and surface i+1.
	Media []Medium
	// Coating is the stated residual reflectance of the surfaces that
	// border air; the zero value states none (coating.go).
	Coating Coating
}

// ID returns SUPPLIER:NAME.
func (p Part) ID() string { return p.Supplier + ":" + p.Name }

// Aperture returns the clear aperture in mm, defaulting to 90 % of the
// diameter (common practice for stock lenses).
func (p Part) Aperture() float64 {
	if p.ClearAperture > 0 {
		return p.ClearAperture
	}
	return 0.9 * p.Diameter
}

// Length is the axial distance from the first to the last vertex.
func (p Part) Length() float64 {
	l := 0.0
	for _, t := range p.Thickness {
		l += t
	}
	return l
}

// Reversed returns the part turned around.
func (p Part) Reversed() Part {
	n := len(p.Surfaces)
	r := p
	r.Surfaces = make([]Surface, n)
	for i, s := range p.Surfaces {
		r.Surfaces[n-1-i] = s.Reversed()
	}
	r.Thickness = make([]float64, len(p.Thickness))
	r.Media = make([]Medium, len(p.Media))
	for i := range p.Thickness {
		r.Thickness[len(p.Thickness)-1-i] = p.Thickness[i]
		r.Media[len(p.Media)-1-i] = p.Media[i]
	}
	return r
}

// Symmetric tells whether the part is the same turned around, so that a
// search need consider one orientation only.
func (p Part) Symmetric() bool {
	r := p.Reversed()
	for i := range p.Surfaces {
		if p.Surfaces[i] != r.Surfaces[i] {
			return false
		}
	}
	for i := range p.Thickness {
		if p.Thickness[i] != r.Thickness[i] || p.Media[i].Name() != r.Media[i].Name() {
			return false
		}
	}
	return true
}

// A Problem is one thing wrong with a part, tied to the field that holds it
// (the neutral CSV column name: "r2", "t1", "glass1", "diameter", ...).
type Problem struct {
	Field, Reason string
}

func (p Problem) Error() string { return p.Field + ": " + p.Reason }

// Problems is the list of everything wrong with a part.
type Problems []Problem

func (ps Problems) Error() string {
	s := make([]string, len(ps))
	for i, p := range ps {
		s[i] = p.Error()
	}
	return strings.Join(s, "; ")
}

// Validate reports every problem with the part's prescription: shape of the
// lists, non-positive thicknesses or diameter, a surface that does not reach
// the semi-diameter, a negative edge thickness. It returns nil or Problems.
func (p Part) Validate() error {
	var ps Problems
	add := func(field, format string, a ...any) { ps = append(ps, Problem{field, fmt.Sprintf(format, a...)}) }
	n := len(p.Surfaces)
	if p.Supplier == "" {
		add("supplier", "is empty")
	}
	if p.Name == "" {
		add("part", "is empty")
	}
	if !(p.Diameter > 0) || math.IsInf(p.Diameter, 0) {
		add("diameter", "must be a positive number of mm, not %g", p.Diameter)
	}
	if p.ClearAperture < 0 || p.ClearAperture > p.Diameter {
		add("clear_aperture", "%g mm must lie between 0 and the %g mm diameter", p.ClearAperture, p.Diameter)
	}
	if n < 2 {
		add("r2", "a part needs at least two surfaces")
	}
	if len(p.Thickness) != n-1 || len(p.Media) != n-1 {
		panic(fmt.Sprintf("optics: part %s has %d surfaces, %d thicknesses and %d media", p.ID(), n, len(p.Thickness), len(p.Media)))
	}
	for i, t := range p.Thickness {
		if !(t > 0) || math.IsInf(t, 0) {
			add(fmt.Sprintf("t%d", i+1), "thickness must be positive, not %g mm", t)
		}
	}
	for i, m := range p.Media {
		if m == nil {
			add(fmt.Sprintf("glass%d", i+1), "no material")
		}
	}
	if err := p.Coating.Validate(); err != nil {
		ps = append(ps, err.(Problem))
	}
	if len(ps) > 0 || !(p.Diameter > 0) {
		return ps
	}
	h := p.Diameter / 2
	for i, s := range p.Surfaces {
		if err := s.checkHeight(h); err != nil {
			add(fmt.Sprintf("r%d", i+1), "%v", err)
		}
	}
	if len(ps) > 0 {
		return ps
	}
	for i := range p.Thickness {
		e := p.edgeGap(i, h)
		if e < 0 {
			what := "element"
			if p.Media[i].Name() == "air" {
				what = "air space"
			}
			add(fmt.Sprintf("t%d", i+1), "the %s between surfaces %d and %d has a negative edge thickness (%.3f mm) at the %.4g mm diameter", what, i+1, i+2, e, p.Diameter)
		}
	}
	if len(ps) > 0 {
		return ps
	}
	return nil
}

// edgeGap is the axial distance between surfaces i and i+1 at height h.
func (p Part) edgeGap(i int, h float64) float64 {
	z1, _ := p.Surfaces[i].Sag(h)
	z2, _ := p.Surfaces[i+1].Sag(h)
	return p.Thickness[i] - z1 + z2
}

// EdgeThickness is the axial distance between the first and last surfaces at
// the full diameter: the edge thickness a supplier states.
func (p Part) EdgeThickness() (float64, error) {
	if err := p.Validate(); err != nil {
		return 0, err
	}
	h := p.Diameter / 2
	z1, _ := p.Surfaces[0].Sag(h)
	z2, _ := p.Surfaces[len(p.Surfaces)-1].Sag(h)
	return p.Length() - z1 + z2, nil
}
