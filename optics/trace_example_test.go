package optics_test

import (
	"fmt"
	"math"

	"cardinal/optics"
)

// examplePCX is a plano-convex lens of about 100 mm focal length, 25.4 mm
// across, curved side first.
func examplePCX() optics.Part {
	glass, _ := optics.GlassCode("517642")
	return optics.Part{Supplier: "EXAMPLE", Name: "PCX-100", Diameter: 25.4,
		Surfaces:  []optics.Surface{optics.Sphere(51.7), optics.Sphere(math.Inf(1))},
		Thickness: []float64{4},
		Media:     []optics.Medium{glass}}
}

// A real ray parallel to the axis, 5 mm up, crosses the paraxial focal
// plane below the axis: the lens is under-corrected.
func ExampleTracer_Trace() {
	sys := examplePCX().System(nil, nil)
	bfd := sys.Cardinal(optics.LineD).BFD()
	tr := sys.Tracer(optics.LineD)
	p := tr.Trace(optics.Ray{Pos: optics.Vec3{Y: 5, Z: -10}, Dir: optics.Vec3{Z: 1}}, bfd)
	fmt.Println(p.Status)
	for i, pt := range p.Points {
		fmt.Printf("surface %d: y %.4f z %.4f\n", i+1, pt.Y, pt.Z)
	}
	fmt.Printf("image plane: y %.4f mm\n", p.Image.Y)
	// Output:
	// passed
	// surface 1: y 5.0000 z 0.2423
	// surface 2: y 4.8757 z 4.0000
	// image plane: y -0.0137 mm
}

// The Seidel sums of the same lens with a 10 mm beam, and what they
// predict for the marginal ray.
func ExampleSystem_Seidel() {
	sys := examplePCX().System(nil, nil)
	obj := optics.Object{Z: math.Inf(-1), Aperture: optics.Aperture{Beam: 10}}
	sd, err := sys.Seidel(obj, 2, optics.LineD, optics.LineF, optics.LineC)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("S1 %.3g  S2 %.3g  S3 %.3g  S4 %.3g  S5 %.3g mm\n", sd.S1, sd.S2, sd.S3, sd.S4, sd.S5)
	fmt.Printf("LSA %.3f mm, axial colour %.3f mm\n", sd.LongitudinalSpherical(), sd.AxialColour())
	// Output:
	// S1 0.00136  S2 0.000127  S3 0.0003  S4 0.000201  S5 3.17e-06 mm
	// LSA -0.272 mm, axial colour -1.544 mm
}

// The figures a ranking uses, for a 10 mm beam and a 2 degree field.
func ExampleSystem_Assess() {
	sys := examplePCX().System(nil, nil)
	q, err := sys.Assess(optics.Conditions{
		Object: optics.Object{Z: math.Inf(-1), Aperture: optics.Aperture{Beam: 10}},
		Field:  2,
		Band:   []float64{optics.LineF, optics.LineD, optics.LineC},
	})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("RMS spot on axis %.1f um at best focus, %.3f mm from the paraxial image\n", q.Axis.RMS*1000, q.BestFocusShift)
	fmt.Printf("RMS spot at the field edge %.1f um\n", q.Edge.RMS*1000)
	fmt.Printf("Airy radius %.1f um, wavefront %.3f waves RMS on axis at best focus\n", q.AiryRadius*1000, q.Wavefront.RMS)
	fmt.Printf("focal shift over the band %.3f mm\n", q.Colour.FocalShift)
	fmt.Printf("diffraction limited over the field and band: %s (worst %.2f waves RMS)\n", q.Verdict.Why, q.Verdict.Worst)
	// Output:
	// RMS spot on axis 2.3 um at best focus, -0.182 mm from the paraxial image
	// RMS spot at the field edge 6.6 um
	// Airy radius 7.1 um, wavefront 0.022 waves RMS on axis at best focus
	// focal shift over the band 1.534 mm
	// diffraction limited over the field and band: no: colour (worst 0.54 waves RMS)
}

// The entrance pupil of a lens with its stop 20 mm behind it.
func ExampleSystem_EntrancePupil() {
	lens := examplePCX().System(nil, nil)
	sys := optics.System{Surfaces: append(lens.Surfaces, optics.Surface{}),
		Gaps:          append(lens.Gaps, 20),
		Media:         append(lens.Media, optics.Air),
		SemiApertures: []float64{0, 0, 4}}
	p, err := sys.EntrancePupil(optics.Object{Z: math.Inf(-1), Stop: 2}, optics.LineD)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("entrance pupil %.3f mm from the first vertex, %.3f mm across\n", p.Z, 2*p.Radius)
	// Output:
	// entrance pupil 29.260 mm from the first vertex, 10.341 mm across
}
