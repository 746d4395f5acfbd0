package optics

import (
	"fmt"
	"math"
	"testing"
)

// The Seidel sums against real rays: as aperture and field shrink, the
// exact trace approaches the third-order prediction (the definition of
// the primary aberrations as the lowest-order terms of the ray
// aberration expansion; Welford, Aberrations of Optical Systems, 1986,
// ch. 7-8).

func pcx100() Part { return singletOf(51.7, math.Inf(1), 4, Constant{"n", 1.517}) }

func TestSphericalCubeLaw(t *testing.T) {
	// RMS spot of pure third-order spherical aberration over a uniform
	// pupil, transverse aberration a rho^3: a/2 about the paraxial image
	// (mean of rho^6 over the disc is 1/4) and a/6 at the best plane
	// (defocus b rho with b = -2a/3) -- derived from the definition of the
	// RMS radius. The real-ray RMS approaches these and scales with the
	// cube of the beam diameter.
	sys := pcx100().System(nil, nil)
	prevErr, prevRMS := math.Inf(1), 0.0
	for _, beam := range []float64{8, 4, 2, 1} {
		obj := Object{Z: math.Inf(-1), Aperture: Aperture{Beam: beam}}
		sd, err := sys.Seidel(obj, 0, LineD, LineF, LineC)
		if err != nil {
			t.Fatal(err)
		}
		tr := traceAtParaxialFocus(t, sys, obj, 0)
		a := math.Abs(sd.TransverseSpherical())
		ratio := tr.SpotAt(tr.ImageZ).RMS / (a / 2)
		relErr := math.Abs(ratio - 1)
		if relErr > prevErr {
			t.Errorf("beam %g: real/Seidel RMS %.5f moved away from 1", beam, ratio)
		}
		checkNear(t, fmt.Sprintf("beam %g: real/Seidel RMS at paraxial focus", beam), ratio, 1, 0.005, 0)
		checkNear(t, fmt.Sprintf("beam %g: real/Seidel RMS at best focus", beam), tr.BestFocus().RMS/(a/6), 1, 0.005, 0)
		if prevRMS > 0 {
			checkNear(t, "cube law", prevRMS/tr.SpotAt(tr.ImageZ).RMS, 8, 0.1, 0)
		}
		prevErr, prevRMS = relErr, tr.SpotAt(tr.ImageZ).RMS
	}
}

func TestMarginalRayLSA(t *testing.T) {
	// The real marginal ray's axial crossing against the third-order LSA,
	// -S1/(2 n' u'^2), with under-correction (negative LSA) for a positive
	// singlet (common practice).
	sys := pcx100().System(nil, nil)
	for _, beam := range []float64{4, 1} {
		obj := Object{Z: math.Inf(-1), Aperture: Aperture{Beam: beam}}
		sd, _ := sys.Seidel(obj, 0, LineD, LineF, LineC)
		m, err := sys.MarginalFocus(obj, LineD)
		if err != nil {
			t.Fatal(err)
		}
		if m.LSA >= 0 {
			t.Errorf("LSA %g should be negative for a positive singlet", m.LSA)
		}
		checkNear(t, fmt.Sprintf("beam %g: LSA", beam), m.LSA, sd.LongitudinalSpherical(), 0, 0.01)
	}
}

func TestComaAgainstRealRays(t *testing.T) {
	// Tangential coma: mean height of the upper and lower rim rays of the
	// meridional fan less the chief ray's, 3 S2 / (2 n' u'), on the
	// paraxial image plane; the stop 30 mm in front of the lens.
	sys := stopInFront(30)
	for _, tc := range []struct{ beam, angle, tol float64 }{{4, 1, 0.03}, {2, 0.5, 0.01}} {
		obj := Object{Z: math.Inf(-1), Aperture: Aperture{Beam: tc.beam}}
		sd, _ := sys.Seidel(obj, tc.angle, LineD, LineF, LineC)
		b, _ := sys.Bundle(obj, tc.angle, LineD, []PupilPoint{{Y: 1}, {Y: -1}, {}})
		z := sys.Cardinal(LineD).BFD()
		tr := sys.Tracer(LineD).TraceBundle(b, z)
		coma := (tr.Paths[0].Image.Y+tr.Paths[1].Image.Y)/2 - tr.Paths[2].Image.Y
		checkNear(t, fmt.Sprintf("coma at %g deg", tc.angle), coma, sd.TangentialComa(), 0, tc.tol)
	}
}

// stopInFront is a plano-convex lens (curved side first) behind a plane
// dummy surface that acts as the stop, gap mm in front of it.
func stopInFront(gap float64) System {
	p := pcx100()
	s := p.System(nil, nil)
	return System{Surfaces: append([]Surface{{}}, s.Surfaces...), Gaps: append([]float64{gap}, s.Gaps...),
		Media: append([]Medium{Air}, s.Media...)}
}

func TestDistortionAgainstRealRays(t *testing.T) {
	// Distortion: the real chief ray's height on the paraxial focal plane
	// less the paraxial image height EFL tan(theta) (the nodal ray of an
	// object at infinity; Hecht, Optics, 5th ed., ch. 6), against
	// S5 / (2 n' u'); third order, so it scales with theta^3.
	sys := stopInFront(30)
	c := sys.Cardinal(LineD)
	for _, tc := range []struct{ angle, tol float64 }{{4, 0.03}, {2, 0.01}, {1, 0.003}} {
		obj := Object{Z: math.Inf(-1), Aperture: Aperture{Beam: 2}}
		sd, _ := sys.Seidel(obj, tc.angle, LineD, LineF, LineC)
		b, _ := sys.Bundle(obj, tc.angle, LineD, []PupilPoint{{}})
		tr := sys.Tracer(LineD).TraceBundle(b, c.BFD())
		d := tr.Paths[0].Image.Y - c.EFL*math.Tan(tc.angle*math.Pi/180)
		checkNear(t, fmt.Sprintf("distortion at %g deg", tc.angle), d, sd.Distortion(), 0, tc.tol)
	}
}

func TestFieldCurvesAgainstRealRays(t *testing.T) {
	// The tangential and sagittal foci of a thin pencil round the chief
	// ray lie -(3 S3 + S4)/(2 n' u'^2) and -(S3 + S4)/(2 n' u'^2) from the
	// paraxial image plane (W's rho^2 cos^2 and rho^2 terms as defocus;
	// Welford 1986, ch. 7-8; Coddington's equations give the same in the
	// limit). Found here as where the pencil's rays cross the chief ray.
	sys := stopInFront(30)
	bfd := sys.Cardinal(LineD).BFD()
	angle := 0.5
	obj := Object{Z: math.Inf(-1), Aperture: Aperture{Beam: 0.02}}
	full, _ := sys.Seidel(Object{Z: math.Inf(-1), Aperture: Aperture{Beam: 20}}, angle, LineD, LineF, LineC)
	b, _ := sys.Bundle(obj, angle, LineD, []PupilPoint{{}, {Y: 1}, {X: 1}})
	tr := sys.Tracer(LineD).TraceBundle(b, bfd)
	chief := tr.Paths[0]
	tan := crossing(chief, tr.Paths[1], func(v Vec3) float64 { return v.Y })
	sag := crossing(chief, tr.Paths[2], func(v Vec3) float64 { return v.X })
	den := 2 * full.NImage * full.UImage * full.UImage
	checkNear(t, "tangential focus", tan-bfd-tr.Tracer.LastVertex(), -(3*full.S3+full.S4)/den, 0, 0.01)
	checkNear(t, "sagittal focus", sag-bfd-tr.Tracer.LastVertex(), -(full.S3+full.S4)/den, 0, 0.01)
}

// crossing is the z where ray p meets the chief ray in the coordinate f.
func crossing(chief, p Path, f func(Vec3) float64) float64 {
	ds := f(p.Dir)/p.Dir.Z - f(chief.Dir)/chief.Dir.Z
	return p.Image.Z - (f(p.Image)-f(chief.Image))/ds
}
