package synth_test

import (
	"fmt"

	"cardinal/catalog/synth"
	"cardinal/optics"
)

func ExampleDesign() {
	p, err := synth.Design(synth.Spec{Kind: synth.Achromat, Glass: "517642", Flint: "620364", Diameter: 25.4, EFL: 100})
	if err != nil {
		fmt.Println(err)
		return
	}
	c := p.System(nil, nil).Cardinal(optics.LineD)
	fmt.Printf("R %g %g %g mm, t %g %g mm\n", p.Surfaces[0].Radius, p.Surfaces[1].Radius, p.Surfaces[2].Radius, p.Thickness[0], p.Thickness[1])
	fmt.Printf("EFL %.2f mm, BFD %.2f mm\n", c.EFL, c.BFD())
	// Output:
	// R 51.51 -38.07 -230.1 mm, t 5.3 2.1 mm
	// EFL 100.00 mm, BFD 95.53 mm
}

func ExampleCatalog() {
	for _, e := range synth.Catalog(1, 3) {
		fmt.Printf("%s: %s, %g %s\n", e.Part.ID(), e.Part.Description, e.Price, e.Currency)
	}
	// Output:
	// DEMO:ACH-80-H-BS: Cemented achromatic doublet, glasses 517642/785258, EFL 80 mm, dia. 12.7 mm, uncoated, 50 XTS
	// DEMO:BFX-900-CF: Best-form lens, CaF2, EFL 900 mm, dia. 25.4 mm, uncoated, 175 XTS
	// DEMO:BFX-160: Best-form lens, glass 517642, EFL 160 mm, dia. 25.4 mm, uncoated, 38 XTS
}
