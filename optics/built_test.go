package optics

import (
	"fmt"
	"math"
	"testing"
)

func TestBuiltMatchesMatrix(t *testing.T) {
	// The piece the real-ray trace sees and the matrix model of the same
	// departure are one piece: the paraxial matrix of the built part
	// equals Lens.Matrix's (an invariant of the two descriptions).
	doublet, airSpaced := multiPieceParts()
	for _, tc := range []struct {
		name string
		p    Part
		d    Departure
	}{
		{"singlet, focal length", singlet(51.7, math.Inf(1), 4, 1.517, 25), Departure{Focal: Const(0.013)}},
		{"singlet, every departure", singlet(60, -80, 5, 1.6, 25), Departure{Focal: Const(-0.02), Radius: []Dual{Const(0.004), Const(-0.003)},
			Thick: []Dual{Const(0.08)}, Index: []Dual{Const(-0.0007)}}},
		{"doublet", doublet, Departure{Focal: Const(0.01), Thick: []Dual{Const(-0.05), Const(0.1)}, Index: []Dual{Const(0.001), Const(-0.001)}}},
		{"air-spaced", airSpaced, Departure{Focal: Const(-0.015), Thick: []Dual{Const(0.1), Const(-0.1)}, Index: []Dual{Const(0.0005), Const(0)}}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			l := NewLens(tc.p, LineD, Tolerances{})
			want, length := l.Matrix(tc.d)
			b := l.Built(tc.p, tc.d)
			got := b.System(nil, nil).Matrix(LineD)
			for _, c := range []struct {
				name      string
				got, want float64
			}{{"A", got.A, want.A.V}, {"B", got.B, want.B.V}, {"C", got.C, want.C.V}, {"D", got.D, want.D.V}, {"length", b.Length(), length.V}} {
				checkNear(t, c.name, c.got, c.want, 1e-13, 1e-12)
			}
			if tc.p.Surfaces[0].Radius == b.Surfaces[0].Radius {
				t.Error("the built part's first radius did not move")
			}
		})
	}
}

func TestBuiltFocalError(t *testing.T) {
	// A focal-length error e alone makes the piece's EFL (1 + e) times the
	// nominal at the lens's wavelength (the definition of the departure,
	// Lens.Matrix), with its radii scaled together: for a thin lens by
	// 1 + e exactly (lensmaker's equation, Hecht, Optics, 5th ed., sec.
	// 5.2.3), close to it for a thick one.
	for _, e := range []float64{-0.02, 0.005, 0.03} {
		p := singlet(51.7, -80, 4, 1.517, 25)
		b := NewLens(p, LineD, Tolerances{}).Built(p, Departure{Focal: Const(e)})
		f0 := p.System(nil, nil).Cardinal(LineD).EFL
		f1 := b.System(nil, nil).Cardinal(LineD).EFL
		checkNear(t, fmt.Sprintf("EFL at e %g", e), f1, (1+e)*f0, 1e-9, 0)
		checkNear(t, fmt.Sprintf("radius 1 scale at e %g", e), b.Surfaces[0].Radius/p.Surfaces[0].Radius, 1+e, 0, 0.05*math.Abs(e))
		thin := singlet(51.7, -80, 0, 1.517, 25)
		bt := NewLens(thin, LineD, Tolerances{}).Built(thin, Departure{Focal: Const(e)})
		checkNear(t, fmt.Sprintf("thin radius scale at e %g", e), bt.Surfaces[1].Radius/thin.Surfaces[1].Radius, 1+e, 0, 1e-12)
	}
}

func TestBuiltAsphereScaled(t *testing.T) {
	// Scaling a surface by s = 1/u keeps its shape: the new sag at height
	// h is s times the old sag at h/s (geometric similarity), for the
	// conic and for every asphere term.
	s := Surface{Radius: 40, Conic: -0.8, Asph: [7]float64{2e-6, -3e-9, 1e-12}}
	p := Part{Supplier: "TEST", Name: "ASPH", Diameter: 25, Surfaces: []Surface{s, Sphere(-200)},
		Thickness: []float64{6}, Media: []Medium{Constant{"n", 1.58}}}
	l := NewLens(p, LineD, Tolerances{})
	b := l.Built(p, Departure{Focal: Const(0.02)})
	scale := b.Surfaces[1].Radius / p.Surfaces[1].Radius // 1/u
	for _, h := range []float64{2, 6, 11} {
		got, _ := b.Surfaces[0].Sag(h)
		old, _ := s.Sag(h / scale)
		checkNear(t, fmt.Sprintf("sag at %g mm", h), got, scale*old, 1e-13, 1e-11)
	}
}

// multiPieceParts are a cemented doublet and an air-spaced part, for the
// tests that compare two descriptions of a built part.
func multiPieceParts() (doublet, airSpaced Part) {
	doublet = Part{Supplier: "TEST", Name: "D", Diameter: 25,
		Surfaces:  []Surface{Sphere(61.5), Sphere(-44.2), Sphere(-129)},
		Thickness: []float64{6, 2.5}, Media: []Medium{Constant{"crown", 1.517}, Constant{"flint", 1.717}}}
	airSpaced = Part{Supplier: "TEST", Name: "A", Diameter: 25,
		Surfaces:  []Surface{Sphere(80), Sphere(math.Inf(1)), Sphere(-120), Sphere(-60)},
		Thickness: []float64{4, 1.5, 3.5}, Media: []Medium{Constant{"crown", 1.517}, Air, Constant{"crown", 1.517}}}
	return doublet, airSpaced
}
