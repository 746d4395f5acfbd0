package synth

import (
	"fmt"
	"math"

	"cardinal/optics"
)

// A Spec says which part to design.
type Spec struct {
	Kind Kind
	// Glass is a name known to optics.BuiltinGlasses or a six-digit glass
	// code; for an achromat it is the crown, the first element.
	Glass string
	// Flint is the glass of an achromat's second element; singlets ignore it.
	Flint    string
	Diameter float64 // mm
	// EFL is the nominal focal length in mm at the d line; its sign must
	// agree with Kind.Positive.
	EFL float64
	// ClearAperture in mm; zero leaves the part's default of 90 %.
	ClearAperture float64
}

// Design returns the prescription of a part meeting the spec: radii to
// four significant figures, centre thicknesses in 0.1 mm, and a thick-lens
// EFL at the d line within 0.2 % of the nominal one (only the rounding of
// the radii moves it). Supplier and Name are left empty. A spec that no sensible stock part
// meets (a radius near the semi-diameter, a lens thicker than 0.6 of its
// diameter) is an error.
func Design(s Spec) (optics.Part, error) {
	if s.EFL == 0 || (s.EFL > 0) != s.Kind.Positive() {
		return optics.Part{}, fmt.Errorf("synth: EFL %g mm does not suit a %v part", s.EFL, s.Kind)
	}
	if !(s.Diameter > 0) {
		return optics.Part{}, fmt.Errorf("synth: diameter %g mm", s.Diameter)
	}
	l, err := newLayout(s)
	if err != nil {
		return optics.Part{}, err
	}
	err = l.solve(1/s.EFL, s.Diameter)
	if err == nil && s.Kind == Achromat {
		err = l.achromatize(1/s.EFL, s.Diameter)
	}
	if err != nil {
		return optics.Part{}, fmt.Errorf("synth: %v %g mm, dia. %g mm: %w", s.Kind, s.EFL, s.Diameter, err)
	}
	p := l.part(s)
	named := p // Validate also wants the names, which the caller gives
	named.Supplier, named.Name = "synth", "design"
	if err := named.Validate(); err != nil {
		return optics.Part{}, fmt.Errorf("synth: %v %g mm, dia. %g mm: %w", s.Kind, s.EFL, s.Diameter, err)
	}
	return p, nil
}

// layout is a part in curvature form while it is being designed: thin-lens
// curvatures c scaled by one factor, thicknesses t, media and indices n.
type layout struct {
	c      []float64 // thin-lens design curvatures, 1/mm
	scale  float64   // curvature i is c[i]*scale
	t      []float64
	media  []optics.Medium
	n      []float64 // d-line index of each medium
	nF, nC []float64 // F-line and C-line indices, for the achromat
	ctMins []float64
}

// newLayout makes the thin-lens design of the spec.
func newLayout(s Spec) (*layout, error) {
	g1, err := lookupGlass(s.Glass)
	if err != nil {
		return nil, err
	}
	phi := 1 / s.EFL
	d := s.Diameter
	if s.Kind != Achromat {
		// Thin-lens lensmaker's equation phi = (n - 1)(c1 - c2) (Hecht,
		// Optics, 5th ed., sec. 5.2.3) with the shape factor
		// q = (c1 + c2)/(c1 - c2).
		k := phi / (g1.nd - 1)
		q := s.Kind.shapeFactor(g1.nd)
		ctMin := edgeMin(d)
		if !s.Kind.Positive() {
			ctMin = clamp(0.1*d, 1, 5) // negative lenses: centre about a tenth of the diameter (common practice)
		}
		return &layout{c: []float64{k * (1 + q) / 2, k * (q - 1) / 2}, scale: 1,
			media: []optics.Medium{g1.medium}, n: []float64{g1.nd}, ctMins: []float64{ctMin}}, nil
	}
	return achromatLayout(s, g1, phi)
}

// achromatLayout splits the power between crown and flint so that the
// thin-lens achromat condition phi1/V1 + phi2/V2 = 0 holds with
// phi1 + phi2 = phi: phi1 = phi V1/(V1 - V2), phi2 = -phi V2/(V1 - V2)
// (Hecht, Optics, 5th ed., sec. 6.3.2, thin achromatic doublets; Smith,
// Modern Optical Engineering, 4th ed., sec. 5.3).
func achromatLayout(s Spec, g1 glassInfo, phi float64) (*layout, error) {
	g2, err := lookupGlass(s.Flint)
	if err != nil {
		return nil, err
	}
	if g1.vd-g2.vd < 10 {
		return nil, fmt.Errorf("synth: achromat of %s (V %.1f) and %s (V %.1f): the crown needs an Abbe number at least 10 above the flint's", s.Glass, g1.vd, s.Flint, g2.vd)
	}
	phi1 := phi * g1.vd / (g1.vd - g2.vd)
	phi2 := -phi * g2.vd / (g1.vd - g2.vd)
	k1, k2 := phi1/(g1.nd-1), phi2/(g2.nd-1)
	// A crown close to equiconvex, slightly steeper at the cemented face,
	// as stock achromats are (common practice); the flint takes that face.
	const q1 = -0.15
	c1, c2 := k1*(1+q1)/2, k1*(q1-1)/2
	d := s.Diameter
	at := func(wl float64) []float64 { return []float64{g1.medium.Index(wl), g2.medium.Index(wl)} }
	return &layout{c: []float64{c1, c2, c2 - k2}, scale: 1,
		media: []optics.Medium{g1.medium, g2.medium}, n: []float64{g1.nd, g2.nd},
		nF: at(optics.LineF), nC: at(optics.LineC),
		ctMins: []float64{edgeMin(d), clamp(0.08*d, 1, 4)}}, nil
}

// edgeMin is the least edge thickness of a positive element: 6 % of the
// diameter, at least 1 mm and at most 3 mm (common practice for stock
// lenses, which need an edge to grind and mount).
func edgeMin(d float64) float64 { return clamp(0.06*d, 1, 3) }

func clamp(v, lo, hi float64) float64 { return math.Min(hi, math.Max(lo, v)) }
