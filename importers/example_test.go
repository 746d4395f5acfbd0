package importers_test

import (
	"fmt"
	"math"
	"os"
	"strings"

	"cardinal/catalog/record"
	"cardinal/importers"
	"cardinal/optics"
)

func ExampleReadPrescriptions() {
	csv := `supplier,part,diameter,r1,r2,t1,glass1,efl
DEMO,PCX-50,25.4,25.84,plano,5.3,517642,52
DEMO,BAD,12.7,20,4,3,517642,
`
	_, err := importers.ReadPrescriptions(strings.NewReader(csv), "lenses.csv", optics.BuiltinGlasses())
	fmt.Println(err)

	entries, _ := importers.ReadPrescriptions(strings.NewReader(csv[:strings.LastIndex(csv, "DEMO,BAD")]), "lenses.csv", optics.BuiltinGlasses())
	fmt.Println(entries[0].Part.ID(), entries[0].Warnings)
	// Output:
	// lenses.csv:3: r2: radius 4 mm is smaller than the 6.35 mm semi-diameter
	// DEMO:PCX-50 [efl: stated 52 mm, but the prescription gives 49.981 mm at 587.6 nm (3.9 % off, more than the 1 % stock tolerance)]
}

func ExampleWritePrescriptions() {
	glass, _ := optics.GlassCode("517642")
	pcx := optics.Part{Supplier: "DEMO", Name: "PCX-50", Diameter: 25.4,
		Surfaces:  []optics.Surface{optics.Sphere(25.84), optics.Sphere(math.Inf(1))},
		Thickness: []float64{5.3},
		Media:     []optics.Medium{glass}}
	importers.WritePrescriptions(os.Stdout, []record.Entry{{Part: pcx, StatedEFL: 49.98}})
	// Output:
	// supplier,part,description,diameter,clear_aperture,r1,r2,t1,glass1,efl,bfd,edge_thickness,stated_wavelength,price,currency,url,notes
	// DEMO,PCX-50,,25.4,,25.84,inf,5.3,517642,49.98,,,,,,,
}

func ExampleGlass_Medium() {
	csv := `name,formula,coefficients,min_nm,max_nm,source
# I. H. Malitson, J. Opt. Soc. Am. 55, 1205 (1965); C in um^2
silica,sellmeier,0.6961663 0.004679148 0.4079426 0.01351206 0.8974794 97.934,210,3710,Malitson 1965
`
	glasses, err := importers.ReadGlasses(strings.NewReader(csv), "glasses.csv")
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%s nd = %.5f\n", glasses[0].Name, glasses[0].Medium().Index(optics.LineD))
	// Output:
	// silica nd = 1.45846
}

func ExampleReadDrawer() {
	csv := "supplier,part,quantity,location\nDEMO,PCX-50,3,B2\nDEMO,PCX-50,1,B3\nDEMO,ACH-100,two,\n"
	_, err := importers.ReadDrawer(strings.NewReader(csv), "drawer.csv")
	fmt.Println(err)
	// Output:
	// drawer.csv:3: part: DEMO:PCX-50 is already on line 2; list each part once
	// drawer.csv:4: quantity: "two" is not a whole number from 0 to 1000000
}
