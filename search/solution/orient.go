package solution

import (
	"fmt"
	"math"

	"cardinal/optics"
	"cardinal/search"
)

// Sides names the two sides of a layout in a technician's words: where the
// light comes from and where it goes. An image requirement has an object
// and an image; a focus requirement a beam and a focus; an expander an
// incoming and an outgoing beam.
type Sides struct{ Before, After string }

// SidesOf gives the side names of a requirement kind.
func SidesOf(k search.Kind) Sides {
	switch k {
	case search.Image:
		return Sides{"object", "image"}
	case search.Expand:
		return Sides{"incoming beam", "outgoing beam"}
	}
	return Sides{"beam", "focus"}
}

// A face is one outer surface of a part as a technician sees it from
// outside the part: flat, convex (bulging out) or concave, with the
// strength of its curve.
type face struct {
	shape     string  // "flat", "convex" or "concave"
	curvature float64 // |1/R|, 1/mm
	asphere   bool
}

// outerFace classifies surface s of a part as seen from outside: the
// part's first surface is convex when its centre of curvature lies behind
// it (R > 0), the last surface when its centre lies in front of it
// (R < 0), with light travelling in +z and the radius positive when its
// centre lies to the right of the vertex (optics/doc.go).
func outerFace(s optics.Surface, first bool) face {
	c := s.Curvature()
	f := face{curvature: math.Abs(c), asphere: s.IsAsphere()}
	switch {
	case c == 0:
		f.shape = "flat"
	case (c > 0) == first:
		f.shape = "convex"
	default:
		f.shape = "concave"
	}
	return f
}

// words is the face's name: "convex side", "flat aspheric side", ...
func (f face) words() string {
	if f.asphere {
		return f.shape + " aspheric side"
	}
	return f.shape + " side"
}

// Orientation says in words which way round a part goes, from its
// prescription as used (turned around already where the solution turns
// it): which face goes toward the light, and which away. A plano or
// meniscus part names its faces ("convex side toward the object, flat
// side toward the image"); a part curved the same way on both sides names
// the stronger curve; a cemented part names its crown side (the element
// of higher Abbe number, the crown of an achromat by common practice;
// Abbe number V = (n_d - 1)/(n_F - n_C), Smith, Modern Optical
// Engineering, 4th ed., sec. 5.3); a symmetric part says that either way
// round will do.
func Orientation(p optics.Part, sides Sides) string {
	n := len(p.Surfaces)
	if n < 2 {
		panic(fmt.Sprintf("solution: orientation of part %s with %d surfaces", p.ID(), n))
	}
	if p.Symmetric() {
		return fmt.Sprintf("either side toward the %s (the part is symmetric)", sides.Before)
	}
	if n > 2 {
		return compoundOrientation(p, sides)
	}
	a, b := outerFace(p.Surfaces[0], true), outerFace(p.Surfaces[1], false)
	if a.shape == b.shape && a.shape != "flat" { // biconvex or biconcave
		strength := "stronger"
		if a.curvature < b.curvature {
			strength = "weaker"
		}
		shape := "bi" + a.shape
		if a.asphere {
			shape += ", aspheric"
		}
		return fmt.Sprintf("the %s curve toward the %s (%s)", strength, sides.Before, shape)
	}
	return fmt.Sprintf("%s toward the %s, %s toward the %s", a.words(), sides.Before, b.words(), sides.After)
}

// compoundOrientation names the first face of a part of several
// elements: the crown or flint side of a cemented part, else its outer
// faces.
func compoundOrientation(p optics.Part, sides Sides) string {
	first, last := p.Media[0], p.Media[len(p.Media)-1]
	a := outerFace(p.Surfaces[0], true)
	if first.Name() == "air" || last.Name() == "air" || !cemented(p) {
		b := outerFace(p.Surfaces[len(p.Surfaces)-1], false)
		return fmt.Sprintf("%s toward the %s, %s toward the %s", a.words(), sides.Before, b.words(), sides.After)
	}
	kind := "flint"
	if abbe(first) > abbe(last) {
		kind = "crown"
	}
	shape := a.shape
	if a.asphere {
		shape += " aspheric"
	}
	return fmt.Sprintf("%s side first: the %s %s face (glass %s) toward the %s", kind, shape, kind, first.Name(), sides.Before)
}

// cemented tells whether every space inside the part is glass.
func cemented(p optics.Part) bool {
	for _, m := range p.Media {
		if m.Name() == "air" {
			return false
		}
	}
	return true
}

// abbe is the Abbe number V = (n_d - 1)/(n_F - n_C) of a medium at the
// d, F and C lines (Hecht, Optics, 5th ed., ch. 6, on achromatic
// doublets; chapter from memory).
func abbe(m optics.Medium) float64 {
	d := m.Index(optics.LineF) - m.Index(optics.LineC)
	if d == 0 {
		return math.Inf(1)
	}
	return (m.Index(optics.LineD) - 1) / d
}

// PartFacing is one part of a solution with its orientation in words.
type PartFacing struct {
	Part     string `json:"part"` // SUPPLIER:PART
	Reversed bool   `json:"reversed"`
	Facing   string `json:"orientation"`
}

// Facings lists the solution's parts in light order with their
// orientation in words.
func (s Solution) Facings() []PartFacing {
	sides := SidesOf(s.Requirement.Kind)
	out := make([]PartFacing, len(s.Parts))
	for i, p := range s.Parts {
		u := s.Result.Parts[i]
		out[i] = PartFacing{Part: u.ID(), Reversed: u.Reversed, Facing: Orientation(p, sides)}
	}
	return out
}
