package search_test

import (
	"fmt"
	"math"

	"cardinal/catalog/record"
	"cardinal/optics"
	"cardinal/search"
)

// The same plano-convex lens focusing a 10 mm beam to 100 mm: both
// orientations meet the first-order requirement equally, and the real
// rays rank the curved side toward the beam first.
func ExampleFind_imageQuality() {
	glass, _ := optics.GlassCode("517642")
	pcx := search.Item{Entry: record.Entry{Part: optics.Part{
		Supplier: "EXAMPLE", Name: "PCX-100", Diameter: 25.4,
		Surfaces:  []optics.Surface{optics.Sphere(51.7), optics.Sphere(math.Inf(1))},
		Thickness: []float64{4},
		Media:     []optics.Medium{glass}}}}
	req := search.Defaults()
	req.Kind, req.EFL, req.EFLTol, req.Elements, req.Beam = search.Focus, 100, search.Tolerance{Value: 2, Percent: true}, 1, 10
	out, err := search.Find([]search.Item{pcx}, req)
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, row := range out.Results {
		for _, r := range append([]search.Result{row}, row.Arrangements...) {
			q := r.ImageQuality
			fmt.Printf("%s. %s%s: RMS spot %.1f um, Airy radius %.1f um, %.3f waves RMS, diffraction limited %v, sharpness %.3f\n",
				label(r), r.Parts[0].ID(), rev(r.Parts[0]), q.RMSSpot, q.AiryRadius, q.WavefrontRMS, q.DiffractionLimited, q.Sharpness(req.Lambda()))
		}
	}
	// Output:
	// 1. EXAMPLE:PCX-100: RMS spot 2.3 um, Airy radius 7.1 um, 0.022 waves RMS, diffraction limited true, sharpness 0.070
	// 1.1. EXAMPLE:PCX-100 (rev): RMS spot 9.1 um, Airy radius 7.1 um, 0.086 waves RMS, diffraction limited false, sharpness 0.694
}
