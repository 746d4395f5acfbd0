package optics

import (
	"math"
	"testing"
)

func TestCoatingValidate(t *testing.T) {
	// A reflectance is a fraction of the incident power: 0 to 100 %
	// (common practice).
	for _, tc := range []struct {
		c  Coating
		ok bool
	}{
		{Coating{}, true},
		{Coating{Stated: true}, true},
		{Coating{Stated: true, ResidualPct: 0.25}, true},
		{Coating{Stated: true, ResidualPct: 100}, true},
		{Coating{Stated: true, ResidualPct: -0.1}, false},
		{Coating{Stated: true, ResidualPct: 100.5}, false},
		{Coating{Stated: true, ResidualPct: math.NaN()}, false},
		{Coating{Stated: true, ResidualPct: math.Inf(1)}, false},
	} {
		if err := tc.c.Validate(); (err == nil) != tc.ok {
			t.Errorf("%+v: error %v, want ok %v", tc.c, err, tc.ok)
		}
	}
	p := singlet(50, -50, 5, 1.517, 25)
	p.Coating = Coating{Stated: true, ResidualPct: 150}
	if err := p.Validate(); err == nil {
		t.Error("a part with a 150 % coating validated")
	}
}

func TestCoatedSurfaces(t *testing.T) {
	// A coating covers the faces that border air; a cemented face (glass
	// to glass) keeps the Fresnel value from its indices.
	glass := Constant{Label: "n", N: 1.517}
	flint := Constant{Label: "f", N: 1.62}
	c := Coating{Stated: true, ResidualPct: 0.5}
	cemented := Part{Surfaces: []Surface{Sphere(60), Sphere(-40), Sphere(-150)}, Thickness: []float64{6, 2},
		Media: []Medium{glass, flint}, Coating: c}
	spaced := Part{Surfaces: []Surface{Sphere(60), Sphere(-40), Sphere(-45), Sphere(-150)}, Thickness: []float64{6, 1, 2},
		Media: []Medium{glass, Air, flint}, Coating: c}
	for _, tc := range []struct {
		name   string
		p      Part
		coated []bool
	}{
		{"cemented", cemented, []bool{true, false, true}},
		{"air-spaced", spaced, []bool{true, true, true, true}},
		{"reversed", cemented.Reversed(), []bool{true, false, true}},
	} {
		r := tc.p.Reflectances()
		for i, want := range tc.coated {
			if got := !math.IsNaN(r[i]); got != want {
				t.Errorf("%s surface %d: coated %v, want %v", tc.name, i+1, got, want)
			} else if got && r[i] != 0.005 {
				t.Errorf("%s surface %d: %g, want 0.005", tc.name, i+1, r[i])
			}
		}
	}
	if r := singlet(50, -50, 5, 1.517, 25).Reflectances(); r != nil {
		t.Errorf("a part with no coating stated: %v, want nil (Fresnel everywhere)", r)
	}
	// A pair with one coated part: the other part's surfaces stay Fresnel.
	s := Assemble(nil, nil, []Part{singlet(50, -50, 5, 1.517, 25), cemented}, []float64{10})
	if len(s.Reflectances) != 5 || !math.IsNaN(s.Reflectances[0]) || !math.IsNaN(s.Reflectances[1]) ||
		s.Reflectances[2] != 0.005 || !math.IsNaN(s.Reflectances[3]) || s.Reflectances[4] != 0.005 {
		t.Errorf("pair reflectances %v", s.Reflectances)
	}
}

func TestCoatedGhostScalesWithReflectance(t *testing.T) {
	// The single ghost of the biconvex singlet's second surface (hand
	// computation in TestGhostBiconvexSecondSurface: reflection matrices,
	// Siegman, Lasers, 1986, ch. 15) does not move with the coating; its
	// concentration is R (w_in / w_ghost)^2 with R now the stated 0.5 %
	// instead of the Fresnel 4.22 % (Hecht, Optics, 5th ed., sec. 4.6.2).
	in := NewGaussianBeam(632.8, 2, 0, 1)
	bare := singlet(50, -50, 5, 1.517, 25)
	coated := bare
	coated.Coating = Coating{Stated: true, ResidualPct: 0.5}
	gb := bare.System(nil, nil).Ghosts(in)
	gc := coated.System(nil, nil).Ghosts(in)
	wg := 632.8e-6 / 0.0765897 / (math.Pi * 2) // ghost waist, lambda F / (pi w) (Siegman 1986, ch. 17)
	g := gc[1]
	checkNear(t, "coated ghost z", g.Z, -9.6443, 0.002, 0)
	checkNear(t, "coated reflectance", g.Reflectance, 0.005, 0, 1e-15)
	checkNear(t, "coated concentration", g.Concentration, 0.005*sq(2/wg), 0, 5e-3)
	if !g.Coated[0] || gb[1].Coated[0] {
		t.Errorf("coated flags %v (coated part), %v (bare part)", g.Coated, gb[1].Coated)
	}
	checkNear(t, "bare reflectance is Fresnel", gb[1].Reflectance, FresnelReflectance(1, 1.517), 0, 1e-15)
	checkNear(t, "concentration ratio", g.Concentration/gb[1].Concentration, 0.005/FresnelReflectance(1, 1.517), 0, 1e-12)

	// Double ghost of a coated plate (0.25 % each face) in a converging
	// beam: plane mirrors keep the waist (0.02 mm, see
	// TestGhostDoubleFlatPlate), so the concentration is R1 R2 (w_in /
	// w0)^2, with w_in the input beam's radius at the first face,
	// w0 sqrt(1 + (z / zR)^2), zR = pi w0^2 / lambda (Siegman 1986,
	// ch. 17, Gaussian beam spot size), 50 mm before its waist.
	plate := Part{Surfaces: []Surface{{}, {}}, Thickness: []float64{6}, Media: []Medium{Constant{"n", 1.5}},
		Coating: Coating{Stated: true, ResidualPct: 0.25}}
	conv := NewGaussianBeam(1064, 0.02, -50, 1)
	zr := math.Pi * 0.02 * 0.02 / 1064e-6
	win := 0.02 * math.Sqrt(1+sq(50/zr))
	d := plate.System(nil, nil).Ghosts(conv)[2]
	checkNear(t, "double reflectance R1 R2", d.Reflectance, 0.0025*0.0025, 0, 1e-12)
	checkNear(t, "double concentration", d.Concentration, 0.0025*0.0025*sq(win/0.02), 0, 1e-9)
}
