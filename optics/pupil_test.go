package optics

import (
	"math"
	"strings"
	"testing"
)

func TestEntrancePupilBehindThinLens(t *testing.T) {
	// A stop d behind a thin lens of power phi is seen from object space
	// at z = d / (1 - d phi), magnified by 1/(1 - d phi) (the thin-lens
	// equation 1/s' - 1/s = phi imaging the stop backward; Hecht, Optics,
	// 5th ed., ch. 5 on stops and pupils).
	for _, tc := range []struct{ phi, d float64 }{{0.01, 20}, {0.02, 30}, {-0.01, 15}, {0.01, 150}} {
		lens := thinLens(1.5, tc.phi, 0.3)
		sys := System{Surfaces: append(lens.Surfaces, Surface{}), Gaps: append(lens.Gaps, tc.d),
			Media: append(lens.Media, Air), SemiApertures: []float64{0, 0, 3}}
		p, err := sys.EntrancePupil(Object{Z: math.Inf(-1), Stop: 2}, LineD)
		if err != nil {
			t.Fatal(err)
		}
		checkNear(t, "pupil z", p.Z, tc.d/(1-tc.d*tc.phi), 1e-12, 1e-12)
		checkNear(t, "pupil radius", p.Radius, 3/math.Abs(1-tc.d*tc.phi), 1e-12, 1e-12)
	}
}

func TestApertureSettings(t *testing.T) {
	// NA = n sin U of the ray from the axial object point to the pupil's
	// edge; f-number N = f/D at infinity, and the working f-number
	// 1/(2 NA') with NA = |m| NA' at a finite conjugate (Smith, Modern
	// Optical Engineering, 4th ed., ch. 6; Lagrange invariant).
	lens := thinLens(1.5, 0.01, 0)
	for _, tc := range []struct {
		name string
		obj  Object
		want float64
	}{
		{"beam", Object{Z: math.Inf(-1), Aperture: Aperture{Beam: 12}}, 6},
		{"NA", Object{Z: -300, Aperture: Aperture{NA: 0.05}}, 300 * math.Tan(math.Asin(0.05))},
		{"f-number at infinity", Object{Z: math.Inf(-1), Aperture: Aperture{FNumber: 4}}, 100 / 8.0},
		{"working f-number at m = -1", Object{Z: -200, Aperture: Aperture{FNumber: 5}}, 200 * math.Tan(math.Asin(0.1))},
	} {
		t.Run(tc.name, func(t *testing.T) {
			p, err := lens.EntrancePupil(tc.obj, LineD)
			if err != nil {
				t.Fatal(err)
			}
			checkNear(t, "radius", p.Radius, tc.want, 1e-12, 1e-9)
		})
	}
}

func TestApertureErrors(t *testing.T) {
	lens := thinLens(1.5, 0.01, 0)
	afocal := System{Surfaces: []Surface{Sphere(50), Sphere(50)}, Gaps: []float64{10}, Media: []Medium{Air}}
	for _, tc := range []struct {
		name string
		sys  System
		obj  Object
		want string
	}{
		{"object behind the vertex", lens, Object{Z: 5, Aperture: Aperture{Beam: 1}}, "in front of the first vertex"},
		{"NA at infinity", lens, Object{Z: math.Inf(-1), Aperture: Aperture{NA: 0.1}}, "finite distance"},
		{"NA above the index", lens, Object{Z: -100, Aperture: Aperture{NA: 1.2}}, "not below"},
		{"no aperture at all", lens, Object{Z: math.Inf(-1)}, "no aperture"},
		{"f-number of an afocal system", afocal, Object{Z: math.Inf(-1), Aperture: Aperture{FNumber: 4}}, "afocal"},
		{"negative beam", lens, Object{Z: math.Inf(-1), Aperture: Aperture{Beam: -1}}, "positive"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			_, err := tc.sys.EntrancePupil(tc.obj, LineD)
			if err == nil || !strings.Contains(err.Error(), tc.want) {
				t.Errorf("error %v, want one mentioning %q", err, tc.want)
			}
		})
	}
}
