package optics

import (
	"fmt"
	"math"
)

// Tolerances say how far a built piece of a stock part may depart from its
// prescription. A zero field means not stated (Or fills it from defaults).
type Tolerances struct {
	// EFLPct is the focal-length tolerance in percent of the EFL, realised
	// by scaling every radius of the part together (Lens.Matrix).
	EFLPct float64 `json:"efl_pct"`
	// Thickness is the centre-thickness tolerance of each glass element, mm.
	Thickness float64 `json:"thickness_mm"`
	// Index is the refractive-index tolerance of each glass, a plain number.
	Index float64 `json:"index"`
	// RadiusPct is the tolerance of each radius on its own, in percent;
	// zero means none beyond the focal-length tolerance.
	RadiusPct float64 `json:"radius_pct,omitempty"`
}

// DefaultTolerances are the tolerances of a part that states none: 1 % of
// the focal length, 0.1 mm of centre thickness, 0.001 of index, no radius
// tolerance of its own (common practice for stock catalog singlets).
var DefaultTolerances = Tolerances{EFLPct: 1, Thickness: 0.1, Index: 0.001}

// Or returns t with every field that is zero taken from def.
func (t Tolerances) Or(def Tolerances) Tolerances {
	pick := func(a, b float64) float64 {
		if a != 0 {
			return a
		}
		return b
	}
	return Tolerances{EFLPct: pick(t.EFLPct, def.EFLPct), Thickness: pick(t.Thickness, def.Thickness),
		Index: pick(t.Index, def.Index), RadiusPct: pick(t.RadiusPct, def.RadiusPct)}
}

// Validate reports a tolerance that is negative or not finite, or a
// focal-length or radius tolerance of 50 % or more.
func (t Tolerances) Validate() error {
	for _, f := range []struct {
		name string
		v    float64
		max  float64
	}{{"focal-length tolerance (%)", t.EFLPct, 50}, {"thickness tolerance (mm)", t.Thickness, math.Inf(1)},
		{"index tolerance", t.Index, 0.5}, {"radius tolerance (%)", t.RadiusPct, 50}} {
		if math.IsNaN(f.v) || math.IsInf(f.v, 0) || f.v < 0 || f.v >= f.max {
			return fmt.Errorf("%s %g: want a number from 0 up to below %g", f.name, f.v, f.max)
		}
	}
	return nil
}

// A Lens is the paraxial model of one part in air at one wavelength, as
// tolerancing perturbs it: the curvature of each surface, the index after
// each surface and the thickness to the next.
type Lens struct {
	Curv  []float64 // curvature of each surface, 1/mm
	Index []float64 // index of the medium after surface i (len(Curv)-1)
	Thick []float64 // axial thickness after surface i, mm
	Glass []bool    // medium i is a solid (not air): its thickness and index vary
	Power float64   // nominal power, 1/mm
	Tol   Tolerances
}

// NewLens is the paraxial model of the part (turned as it is given) at the
// wavelength, with its tolerances.
func NewLens(p Part, wavelengthNm float64, tol Tolerances) Lens {
	n := len(p.Surfaces)
	if len(p.Thickness) != n-1 || len(p.Media) != n-1 {
		panic(fmt.Sprintf("optics: part %s has %d surfaces, %d thicknesses and %d media", p.ID(), n, len(p.Thickness), len(p.Media)))
	}
	l := Lens{Curv: make([]float64, n), Index: make([]float64, n-1), Thick: append([]float64(nil), p.Thickness...),
		Glass: make([]bool, n-1), Tol: tol}
	for i, s := range p.Surfaces {
		l.Curv[i] = s.Curvature()
	}
	for i, m := range p.Media {
		l.Index[i] = m.Index(wavelengthNm)
		l.Glass[i] = m.Name() != "air"
	}
	l.Power = -l.matrix(Const(1), nil).C.V
	return l
}

// Elements is the number of solid media (glass elements) of the lens.
func (l Lens) Elements() int {
	k := 0
	for _, g := range l.Glass {
		if g {
			k++
		}
	}
	return k
}

// A Departure is how one built piece departs from its lens. Each field is a
// Dual, so that a sensitivity can follow one of them; a nil slice means no
// departure there.
type Departure struct {
	// Focal is the relative error e of the focal length: the piece's EFL is
	// (1 + e) times the nominal, at nominal thicknesses and indices.
	Focal Dual
	// Radius holds a relative error of each radius, on top of Focal.
	Radius []Dual
	// Thick holds mm added to each glass element's thickness, one per
	// element in light order (see Elements).
	Thick []Dual
	// Index holds an amount added to each glass element's index.
	Index []Dual
}

// Matrix is the reduced matrix of the built piece, first vertex to last, and
// its length. The focal-length error scales every radius by one factor s,
// found so that the power at nominal thickness and index is the nominal
// over 1 + e (so the shape, and the principal planes with it, move as a
// real part's would): Newton's method on the power as a function of the
// curvature factor u = 1/s, then the derivative of u by the implicit
// function theorem, du/de = -P0 / ((1+e)^2 dP/du).
func (l Lens) Matrix(d Departure) (DMat, Dual) {
	u := l.curvatureFactor(d.Focal)
	length := Const(0)
	m := DIdentity
	g := 0
	prev := Const(1)
	for i, c := range l.Curv {
		k := Const(c).Mul(u)
		if d.Radius != nil {
			k = k.Div(Const(1).Add(d.Radius[i]))
		}
		n := Const(1)
		if i < len(l.Index) {
			n = Const(l.Index[i])
			if l.Glass[i] && d.Index != nil {
				n = n.Add(d.Index[g])
			}
		}
		m = m.Then(DRefraction(n.Sub(prev).Mul(k)))
		if i < len(l.Thick) {
			t := Const(l.Thick[i])
			if l.Glass[i] {
				if d.Thick != nil {
					t = t.Add(d.Thick[g])
				}
				g++
			}
			m = m.Then(DTransfer(t, n))
			length = length.Add(t)
		}
		prev = n
	}
	return m, length
}

// matrix is the nominal matrix with the curvatures scaled by u; radius is
// nil or the relative radius errors.
func (l Lens) matrix(u Dual, radius []Dual) DMat {
	m := DIdentity
	prev := 1.0
	for i, c := range l.Curv {
		k := Const(c).Mul(u)
		if radius != nil {
			k = k.Div(Const(1).Add(radius[i]))
		}
		n := 1.0
		if i < len(l.Index) {
			n = l.Index[i]
		}
		m = m.Then(DRefraction(k.Scale(n - prev)))
		if i < len(l.Thick) {
			m = m.Then(DTransfer(Const(l.Thick[i]), Const(n)))
		}
		prev = n
	}
	return m
}

// curvatureFactor is the factor u on every curvature that makes the power
// P0 / (1 + e), with its derivative through e's.
func (l Lens) curvatureFactor(e Dual) Dual {
	if e.V == 0 && e.D == 0 {
		return Const(1)
	}
	want := l.Power / (1 + e.V)
	u := 1 / (1 + e.V) // exact for a thin lens
	var dp float64
	for it := 0; it < 8; it++ {
		m := l.matrix(Var(u), nil)
		p := -m.C.V
		dp = -m.C.D
		if dp == 0 {
			break
		}
		step := (p - want) / dp
		u -= step
		if math.Abs(step) <= 1e-15*math.Abs(u) {
			break
		}
	}
	if dp == 0 {
		return Const(u)
	}
	return Dual{V: u, D: -l.Power / ((1 + e.V) * (1 + e.V) * dp) * e.D}
}
