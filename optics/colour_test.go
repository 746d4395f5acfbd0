package optics

import (
	"math"
	"testing"
)

func mustGlass(t *testing.T, code string) Medium {
	t.Helper()
	m, err := GlassCode(code)
	if err != nil {
		t.Fatal(err)
	}
	return m
}

func TestSingletAxialColour(t *testing.T) {
	// A thin lens's longitudinal chromatic aberration between F and C is
	// f/V, the F focus nearer (Smith, Modern Optical Engineering, 4th ed.,
	// sec. 5.3; Welford 1986: CL = y^2 phi / V for a thin lens); the Seidel
	// form agrees with the paraxial focus difference to first order in the
	// dispersion.
	glass := mustGlass(t, "517642")
	nd := glass.Index(LineD)
	phi := 0.01
	c := phi / (nd - 1) / 2
	thin := System{Surfaces: []Surface{Sphere(1 / c), Sphere(-1 / c)}, Gaps: []float64{0}, Media: []Medium{glass}}
	obj := Object{Z: math.Inf(-1), Aperture: Aperture{Beam: 10}}
	sd, err := thin.Seidel(obj, 0, LineD, LineF, LineC)
	if err != nil {
		t.Fatal(err)
	}
	checkNear(t, "CL", sd.CL, 25*phi/64.2, 0, 1e-9)
	ch, err := thin.Chromatic(obj, 0, []float64{LineF, LineD, LineC}, 0)
	if err != nil {
		t.Fatal(err)
	}
	shift := ch.Focus[0] - ch.Focus[2]
	checkNear(t, "F - C focus", shift, -100/64.2, 0, 0.01)
	checkNear(t, "Seidel axial colour", sd.AxialColour(), shift, 0, 0.01)
	checkNear(t, "focal shift over the band", ch.FocalShift, 100/64.2, 0, 0.01)
}

// achromat builds a cemented doublet of power phi from a crown and a
// flint glass code, split by the thin-lens achromat condition
// phi1/V1 + phi2/V2 = 0 (Smith, Modern Optical Engineering, 4th ed., sec. 5.3;
// Hecht, Optics, 5th ed., sec. 6.3.2): phi1 = phi V1/(V1 - V2),
// phi2 = -phi V2/(V1 - V2); the crown equiconvex.
func achromat(t *testing.T, phi, t1, t2 float64) System {
	crown, flint := mustGlass(t, "517642"), mustGlass(t, "620364")
	v1, v2 := 64.2, 36.4
	phi1, phi2 := phi*v1/(v1-v2), -phi*v2/(v1-v2)
	c1 := phi1 / (crown.Index(LineD) - 1) / 2
	c3 := -c1 - phi2/(flint.Index(LineD)-1)
	return System{Surfaces: []Surface{Sphere(1 / c1), Sphere(-1 / c1), Sphere(1 / c3)},
		Gaps: []float64{t1, t2}, Media: []Medium{crown, flint}}
}

func TestAchromatAxialColour(t *testing.T) {
	// Thin: the Seidel CL of the cemented achromat vanishes (CL =
	// y^2 sum phi_i/V_i, Welford 1986). Thick (4 mm crown, 2 mm flint):
	// the F-to-C focal shift is under a tenth of a singlet's of the same
	// power.
	obj := Object{Z: math.Inf(-1), Aperture: Aperture{Beam: 10}}
	thin, _ := achromat(t, 0.01, 0, 0).Seidel(obj, 0, LineD, LineF, LineC)
	checkNear(t, "thin achromat CL", thin.CL, 0, 1e-12*25*0.01/64.2, 0)
	doublet := achromat(t, 0.01, 4, 2)
	glass := mustGlass(t, "517642")
	r := 2 * (glass.Index(LineD) - 1) / 0.01
	singlet := singletOf(r, -r, 4, glass).System(nil, nil)
	band := []float64{LineF, LineC}
	cd, err := doublet.Chromatic(obj, 0, band, 0)
	if err != nil {
		t.Fatal(err)
	}
	cs, _ := singlet.Chromatic(obj, 0, band, 0)
	if ratio := cd.FocalShift / cs.FocalShift; ratio > 0.1 {
		t.Errorf("achromat focal shift %.4f mm is %.3f of the singlet's %.4f mm", cd.FocalShift, ratio, cs.FocalShift)
	}
	checkNear(t, "doublet EFL", doublet.Cardinal(LineD).EFL, 100, 0, 0.05)
}

func TestLateralColourAgainstParaxial(t *testing.T) {
	// The Seidel lateral colour CT/(n'u') against the chief ray's heights
	// at F and C on the d-line paraxial image plane, here from exact rays
	// at a small field so that both are first order (Welford 1986,
	// ch. 7-8). The stop 30 mm in front of a singlet gives lateral colour.
	glass := mustGlass(t, "517642")
	lens := singletOf(51.7, math.Inf(1), 4, glass).System(nil, nil)
	sys := System{Surfaces: append([]Surface{{}}, lens.Surfaces...), Gaps: append([]float64{30}, lens.Gaps...),
		Media: append([]Medium{Air}, lens.Media...)}
	obj := Object{Z: math.Inf(-1), Aperture: Aperture{Beam: 2}}
	angle := 0.5
	sd, _ := sys.Seidel(obj, angle, LineD, LineF, LineC)
	bfd := sys.Cardinal(LineD).BFD()
	ch, err := sys.Chromatic(obj, angle, []float64{LineF, LineC}, bfd)
	if err != nil {
		t.Fatal(err)
	}
	checkNear(t, "lateral colour", ch.ChiefY[0]-ch.ChiefY[1], sd.LateralColour(), 0, 0.02)
	if sd.LateralColour() == 0 {
		t.Error("the test system should have lateral colour")
	}
}
