package optics_test

import (
	"fmt"
	"math"

	"cardinal/optics"
)

// A plano-convex lens, curved side first: its front principal point sits on
// the curved vertex, the back one inside the glass.
func ExampleSystem_Cardinal() {
	glass, _ := optics.GlassCode("517642")
	pcx := optics.Part{Supplier: "EXAMPLE", Name: "PCX", Diameter: 25.4,
		Surfaces:  []optics.Surface{optics.Sphere(25.8), optics.Sphere(math.Inf(1))},
		Thickness: []float64{5.3},
		Media:     []optics.Medium{glass}}
	c := pcx.System(nil, nil).Cardinal(optics.LineD)
	fmt.Printf("EFL %.3f mm, BFD %.3f mm\n", c.EFL, c.BFD())
	fmt.Printf("P %.3f mm from the first vertex, P' %.3f mm from the last\n", c.P, c.PPrime)
	// Output:
	// EFL 49.903 mm, BFD 46.410 mm
	// P 0.000 mm from the first vertex, P' -3.494 mm from the last
}

// The object-image pair at magnification -1 (unit conjugates of the inverted
// kind) of a lens in air lie at its anti-principal points.
func ExampleCardinal_ForMagnification() {
	glass, _ := optics.GlassCode("517642")
	dcx := optics.Part{Supplier: "EXAMPLE", Name: "DCX", Diameter: 25.4,
		Surfaces:  []optics.Surface{optics.Sphere(51.7), optics.Sphere(-51.7)},
		Thickness: []float64{4},
		Media:     []optics.Medium{glass}}
	c := dcx.System(nil, nil).Cardinal(optics.LineD)
	zo, zi, _ := c.ForMagnification(-1)
	fmt.Printf("object %.2f mm, image %.2f mm (AP %.2f, AP' %.2f)\n", zo, zi, c.AP, c.APPrime)
	// Output:
	// object -100.00 mm, image 100.00 mm (AP -100.00, AP' 100.00)
}
