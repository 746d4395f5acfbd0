package solution_test

import (
	"strings"
	"testing"

	"cardinal/search"
	"cardinal/search/solution"
)

// The requirement in words names every condition that was given, with its
// unit, and none that was not.
func TestDescribeRequirement(t *testing.T) {
	focus := search.Defaults()
	focus.Kind, focus.EFL, focus.Beam = search.Focus, 100, 10
	sharp := focus
	sharp.FieldAngle, sharp.Band, sharp.Power, sharp.Prefer = 1, []float64{486.1, 587.6, 656.3}, 0.25, search.PreferSharp
	image := search.Defaults()
	image.Kind, image.Track, image.Mag, image.ObjectHeight, image.NA = search.Image, 300, -0.36, 5, 0.02
	tests := []struct {
		name      string
		req       search.Requirement
		want, not []string
	}{
		{"focus, first order only", focus,
			[]string{"focus: EFL 100 mm ± 1%", "beam 10 mm", "wavelength 587.5618 nm"},
			[]string{"field angle", "band", "power", "prefer"}},
		{"focus with a field, a band and a power", sharp,
			[]string{"field angle 1°", "band 486.1, 587.6, 656.3 nm", "laser power 0.25 W", "prefer sharp"}, nil},
		{"image", image,
			[]string{"image: track 300 mm, magnification -0.36 ± 1%", "NA 0.02", "object height 5 mm"},
			[]string{"field angle", "band", "power"}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			got := solution.DescribeRequirement(tc.req)
			for _, w := range tc.want {
				if !strings.Contains(got, w) {
					t.Errorf("%q lacks %q", got, w)
				}
			}
			for _, n := range tc.not {
				if strings.Contains(got, n) {
					t.Errorf("%q mentions %q, which was not given", got, n)
				}
			}
		})
	}
}
