package catalog_test

import (
	"context"
	"fmt"
	"math"

	"cardinal/catalog"
	"cardinal/catalog/record"
	"cardinal/optics"
)

// Import a plano-convex lens into a fresh catalog and find it by focal
// length. Its BFD is the EFL less the thickness over the index, t/n (the
// principal plane P' sits inside the glass).
func ExampleStore_Import() {
	ctx := context.Background()
	s, err := catalog.Open(catalog.Memory)
	if err != nil {
		panic(err)
	}
	defer s.Close()
	glass, _ := optics.GlassCode("517642")
	pcx := record.Entry{Part: optics.Part{Supplier: "EXAMPLE", Name: "PCX-50", Diameter: 25.4,
		Surfaces:  []optics.Surface{{Radius: 25.84}, {Radius: math.Inf(1)}},
		Thickness: []float64{5.3},
		Media:     []optics.Medium{glass}}}
	rep, _ := s.Import(ctx, []record.Entry{pcx}, false)
	fmt.Println("added", rep.Added)
	rows, _ := s.Computed(ctx, catalog.Filter{EFL: catalog.Range{Min: 45, Max: 55}, Kinds: []string{catalog.Positive}})
	for _, r := range rows {
		fmt.Printf("%s: EFL %.2f mm, BFD %.2f mm, reversed BFD %.2f mm\n", r.ID(), r.Forward.EFL, r.Forward.BFD, r.Reversed.BFD)
	}
	// Output:
	// added [EXAMPLE:PCX-50]
	// EXAMPLE:PCX-50: EFL 49.98 mm, BFD 46.49 mm, reversed BFD 49.98 mm
}
