package optics

import (
	"math"
	"testing"
)

// singlet100 is an equiconvex singlet of glass 517642 (nd 1.517, Vd 64.2),
// f about 100 mm, 3 mm thick.
func singlet100(t *testing.T) System {
	glass := mustGlass(t, "517642")
	r := 2 * (glass.Index(LineD) - 1) * 100
	return singletOf(r, -r, 3, glass).System(nil, nil)
}

func assessAt(t *testing.T, sys System, beam, field float64, band []float64) Quality {
	t.Helper()
	q, err := sys.Assess(Conditions{Object: Object{Z: math.Inf(-1), Aperture: Aperture{Beam: beam}}, Field: field, Band: band})
	if err != nil {
		t.Fatal(err)
	}
	return q
}

var fdc = []float64{LineF, LineD, LineC}

// A thin singlet's longitudinal chromatic aberration is f / V (Smith,
// Modern Optical Engineering, 4th ed., sec. 5.3; Hecht, Optics, 5th ed.,
// sec. 6.3.2): f 100 mm in glass of V 64.2 moves the focus about 1.56 mm
// between F and C. A 20 mm beam (f/5) has a Rayleigh depth of focus of
// +-2 lambda N^2 = +-0.03 mm (Smith, ch. 6, from memory), so no plane
// can hold F and C within the diffraction limit.
func TestSingletColourIsNotDiffractionLimited(t *testing.T) {
	q := assessAt(t, singlet100(t), 20, 0, fdc)
	f := singlet100(t).Cardinal(LineD).EFL
	checkNear(t, "focal shift F-C", q.Colour.FocalShift, f/64.2, 0, 0.02)
	if q.DiffractionLimited || q.Verdict.Limited || q.Verdict.Why == LimitedYes {
		t.Fatalf("f/5 singlet over F, d, C judged diffraction limited: %+v", q.Verdict)
	}
	for _, j := range q.Verdict.Judged {
		if j.Wavelength != LineD && !(j.RMS > MarechalRMS) {
			t.Errorf("at %g nm %.3f waves RMS on the common plane, want above %g", j.Wavelength, j.RMS, MarechalRMS)
		}
	}
	if len(q.Verdict.Judged) != 3 {
		t.Errorf("%d bundles judged, want 3 (axis at F, d, C)", len(q.Verdict.Judged))
	}
}

// At f/25 the same singlet is diffraction limited in monochromatic light
// but not over F to C: the verdict says colour. The worst RMS wavefront
// error on the shared plane is then defocus: a focus error dz gives
// W020 = n' u'^2 dz / 2 (Welford, Aberrations of Optical Systems, 1986,
// ch. 6, from memory) and RMS W020 / sqrt 12 over a uniform circular pupil
// (Mahajan, Optical Imaging and Aberrations, Part I, 1998, from memory).
// With a shift S between the F and C foci, measured in waves of each, the
// worst is least where both are equal: S u'^2 / (2 sqrt 12 (lambda_F +
// lambda_C)) (derived here from the two formulas).
func TestSingletColourVerdict(t *testing.T) {
	q := assessAt(t, singlet100(t), 4, 0, fdc)
	if q.Wavefront.RMS > MarechalRMS {
		t.Fatalf("f/25 singlet on axis at d: %.3f waves RMS, the test needs it within %g", q.Wavefront.RMS, MarechalRMS)
	}
	if q.Verdict.Why != LimitedColour {
		t.Fatalf("verdict %q, want %q: %+v", q.Verdict.Why, LimitedColour, q.Verdict)
	}
	u := q.Focus.NA
	want := q.Colour.FocalShift * u * u / (2 * math.Sqrt(12) * (LineF + LineC) * 1e-6)
	checkNear(t, "worst RMS on the common plane", q.Verdict.Worst, want, 0, 0.05)
	// Without a band the same lens at d alone is diffraction limited.
	if q := assessAt(t, singlet100(t), 4, 0, nil); q.Verdict.Why != LimitedYes || len(q.Verdict.Judged) != 1 {
		t.Errorf("at d alone: %+v, want yes over one bundle", q.Verdict)
	}
}

// An achromat of the same focal length does much better over F to C; its
// secondary spectrum, about f / 2000 for ordinary glasses (Smith, ch. 3,
// from memory), lies well within the f/25 depth of focus of +-0.7 mm.
func TestAchromatColourVerdict(t *testing.T) {
	doublet := achromat(t, 0.01, 4, 2)
	qs := assessAt(t, singlet100(t), 4, 0, fdc)
	qa := assessAt(t, doublet, 4, 0, fdc)
	if qa.Verdict.Why != LimitedYes {
		t.Errorf("achromat at f/25 over F, d, C: %+v, want yes", qa.Verdict)
	}
	if qa.Verdict.Worst > qs.Verdict.Worst/5 {
		t.Errorf("achromat worst %.3f waves RMS against the singlet's %.3f: want under a fifth", qa.Verdict.Worst, qs.Verdict.Worst)
	}
}

// A field-limited result says so. A thin lens with the stop at the lens
// puts its tangential and sagittal foci f theta^2 apart (the field
// curvatures (3n+1)/(n f) and (n+1)/(n f); Smith, Modern Optical
// Engineering, 4th ed., ch. 6, from memory): 3 mm at 10 degrees, far
// beyond the +-0.7 mm depth of focus at f/25; at half a degree 0.008 mm,
// far within it.
func TestFieldEdgeVerdict(t *testing.T) {
	doublet := achromat(t, 0.01, 4, 2)
	if q := assessAt(t, doublet, 4, 10, nil); q.Verdict.Why != LimitedFieldEdge {
		t.Errorf("10 degrees: %+v, want %q", q.Verdict, LimitedFieldEdge)
	}
	if q := assessAt(t, doublet, 4, 0.5, nil); q.Verdict.Why != LimitedYes {
		t.Errorf("half a degree: %+v, want yes", q.Verdict)
	}
	// The edge is judged at every band wavelength on the same plane.
	q := assessAt(t, doublet, 4, 0.5, fdc)
	if len(q.Verdict.Judged) != 6 {
		t.Errorf("%d bundles judged, want 6 (axis and edge at F, d, C)", len(q.Verdict.Judged))
	}
}

// A fast singlet fails on axis first: at f/4 its spherical aberration
// alone exceeds the criterion (the angular blur of a best-form singlet,
// about 0.067 / N^3 rad for n 1.5, is 1 mrad, a 100 um blur at 100 mm,
// against an Airy radius of about 3 um; Smith, ch. 16, from memory).
func TestOnAxisVerdict(t *testing.T) {
	q := assessAt(t, singlet100(t), 24, 1, fdc)
	if q.Verdict.Why != LimitedOnAxis {
		t.Errorf("f/4 singlet: %+v, want %q", q.Verdict.Why, LimitedOnAxis)
	}
}

// The verdict's one-pass RMS agrees with Traced.Wavefront on the same
// sphere, and its centroid with SpotAt, at planes about the image.
func TestVerdictRMSMatchesWavefront(t *testing.T) {
	sys := singlet100(t)
	obj := Object{Z: math.Inf(-1), Aperture: Aperture{Beam: 10}}
	b, err := sys.Bundle(obj, 2, LineF, Hexapolar(8))
	if err != nil {
		t.Fatal(err)
	}
	img := sys.Cardinal(LineD).BFD()
	tr := sys.Tracer(LineF).TraceBundle(b, img)
	ba := newBundleAt(tr, true, true, nil)
	for _, dz := range []float64{-1, -0.2, 0, 0.5} {
		sp := tr.SpotAt(img + dz)
		x, y := ba.centroid(img + dz)
		checkNear(t, "centroid x", x, sp.CentroidX, 1e-9, 0)
		checkNear(t, "centroid y", y, sp.CentroidY, 1e-9, 0)
		c := Vec3{X: x, Y: y, Z: tr.Tracer.LastVertex() + img + dz}
		wf, err := tr.Wavefront(c)
		if err != nil {
			t.Fatal(err)
		}
		checkNear(t, "RMS", ba.rms(c), wf.RMS, 1e-9, 1e-6)
	}
}
