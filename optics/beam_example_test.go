package optics_test

import (
	"fmt"
	"math"

	"cardinal/optics"
)

// A 1 mm (1/e^2 radius) HeNe beam with its waist on a 100 mm plano-convex
// lens is brought to a waist just short of the focal point. (The commands
// print the laser cautions, from package search/solution, beside such
// figures; package optics does no output.)
func ExampleSystem_Beam() {
	glass, _ := optics.GlassCode("517642")
	pcx := optics.Part{Supplier: "EXAMPLE", Name: "PCX-100", Diameter: 25.4,
		Surfaces:  []optics.Surface{optics.Sphere(51.7), optics.Sphere(math.Inf(1))},
		Thickness: []float64{4},
		Media:     []optics.Medium{glass}}
	sys := pcx.System(nil, nil)
	out := sys.Beam(optics.NewGaussianBeam(632.8, 1, 0, 1))
	fmt.Printf("waist %.2f um radius, %.2f mm from the last vertex (BFD %.2f mm)\n",
		out.WaistRadius()*1000, -out.WaistDistance(), sys.Cardinal(632.8).BFD())
	// Output:
	// waist 20.20 um radius, 97.65 mm from the last vertex (BFD 97.69 mm)
}
