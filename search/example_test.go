package search_test

import (
	"fmt"
	"math"

	"cardinal/catalog/record"
	"cardinal/optics"
	"cardinal/search"
)

// A catalog of one plano-convex lens of about 100 mm focal length, asked
// for a 60 mm EFL within 1 %: the part alone is far off, so the results are
// the part used twice (two pieces), in its orientations, each solved at the
// target with the gap that gives it.
func ExampleFind() {
	glass, _ := optics.GlassCode("517642")
	pcx := func(name string) search.Item {
		return search.Item{Entry: record.Entry{Part: optics.Part{
			Supplier: "EXAMPLE", Name: name, Diameter: 25.4,
			Surfaces:  []optics.Surface{optics.Sphere(51.7), optics.Sphere(math.Inf(1))},
			Thickness: []float64{4},
			Media:     []optics.Medium{glass}}, Price: 20}}
	}
	req := search.Defaults()
	req.Kind, req.EFL, req.Top = search.Focus, 60, 2
	out, err := search.Find([]search.Item{pcx("PCX-100")}, req)
	if err != nil {
		fmt.Println(err)
		return
	}
	// One row per set of parts; the other layouts of the same parts
	// follow under it.
	for _, row := range out.Results {
		for _, r := range append([]search.Result{row}, row.Arrangements...) {
			fmt.Printf("%s. %s%s + %s%s: gap %.2f mm, EFL %.2f mm, back clearance %.2f mm\n", label(r),
				r.Parts[0].ID(), rev(r.Parts[0]), r.Parts[1].ID(), rev(r.Parts[1]), *r.Gap, *r.EFL, *r.BackClearance)
		}
	}
	fmt.Println(out.Notes[0])
	// Output:
	// 1. EXAMPLE:PCX-100 + EXAMPLE:PCX-100 (rev): gap 28.06 mm, EFL 60.00 mm, back clearance 40.00 mm
	// 1.1. EXAMPLE:PCX-100 + EXAMPLE:PCX-100: gap 30.70 mm, EFL 60.00 mm, back clearance 37.36 mm
	// 1.2. EXAMPLE:PCX-100 (rev) + EXAMPLE:PCX-100 (rev): gap 30.70 mm, EFL 60.00 mm, back clearance 40.00 mm
	// 1.3. EXAMPLE:PCX-100 (rev) + EXAMPLE:PCX-100: gap 33.33 mm, EFL 60.00 mm, back clearance 37.36 mm
	// clear apertures not checked: give --beam, --na or --object-height to check ray heights
}

// label is "3" for row 3, "3.1" for its first other arrangement.
func label(r search.Result) string {
	if r.Arrangement > 0 {
		return fmt.Sprintf("%d.%d", r.Rank, r.Arrangement)
	}
	return fmt.Sprint(r.Rank)
}

func rev(u search.PartUse) string {
	if u.Reversed {
		return " (rev)"
	}
	return ""
}
