package optics

import (
	"math"
	"testing"
)

// plano51AndAchromat are the parts of the two-part system the trace
// benchmark and the scratch-space tests use: a plano-convex singlet of
// crown (R 51.7 mm) and a cemented crown-flint achromat.
func plano51AndAchromat() (pcx, ach Part) {
	crown, _ := GlassCode("517642")
	flint, _ := GlassCode("620364")
	pcx = singletOf(51.7, math.Inf(1), 4, crown)
	ach = Part{Supplier: "B", Name: "ACH", Diameter: 25.4,
		Surfaces:  []Surface{Sphere(61.5), Sphere(-44.6), Sphere(-129)},
		Thickness: []float64{6, 2.5}, Media: []Medium{crown, flint}}
	return pcx, ach
}

// BenchmarkTraceBundleTwoParts traces a 468-ray hexapolar bundle through
// a two-part system (a plano-convex lens and a cemented achromat, 8
// surfaces with the image plane) and measures its best focus.
func BenchmarkTraceBundleTwoParts(b *testing.B) {
	pcx, ach := plano51AndAchromat()
	sys := Assemble(nil, nil, []Part{pcx, ach}, []float64{5})
	obj := Object{Z: math.Inf(-1), Aperture: Aperture{Beam: 10}}
	bundle, err := sys.Bundle(obj, 1, LineD, Hexapolar(12))
	if err != nil {
		b.Fatal(err)
	}
	tr := sys.Tracer(LineD)
	z := sys.Cardinal(LineD).BFD()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		t := tr.TraceBundle(bundle, z)
		if t.BestFocus().Passed != len(bundle.Rays) {
			b.Fatal("rays lost")
		}
	}
}

// BenchmarkAssess is the whole real-ray stage for one candidate: axis and
// field-edge bundles, best focus, wavefront fit, colour over three
// wavelengths and the Seidel sums.
func BenchmarkAssess(b *testing.B) {
	glass, _ := GlassCode("517642")
	sys := singletOf(51.7, math.Inf(1), 4, glass).System(nil, nil)
	c := Conditions{Object: Object{Z: math.Inf(-1), Aperture: Aperture{Beam: 10}}, Field: 2,
		Band: []float64{LineF, LineD, LineC}}
	for i := 0; i < b.N; i++ {
		if _, err := sys.Assess(c); err != nil {
			b.Fatal(err)
		}
	}
}
