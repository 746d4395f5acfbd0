package importers

import (
	"strings"
	"testing"

	"cardinal/optics"
)

// The tolerance columns are read as stated, empty cells as not stated, and
// written back so that they read the same.
func TestToleranceColumns(t *testing.T) {
	csv := `supplier,part,diameter,r1,r2,t1,glass1,efl_tolerance,thickness_tolerance,index_tolerance,radius_tolerance
DEMO,A,25,100,-100,5,517642,2%,0.05,0.0005,0.5
DEMO,B,25,100,-100,5,517642,,,,
DEMO,C,25,100,-100,5,517642,1.5,,,
`
	es, err := read(t, csv)
	if err != nil {
		t.Fatal(err)
	}
	want := []optics.Tolerances{{EFLPct: 2, Thickness: 0.05, Index: 0.0005, RadiusPct: 0.5}, {}, {EFLPct: 1.5}}
	for i, e := range es {
		if e.Tolerances != want[i] {
			t.Errorf("%s: tolerances %+v, want %+v", e.Part.ID(), e.Tolerances, want[i])
		}
	}
	sameEntries(t, roundTrip(t, es), es)
}

func TestToleranceColumnErrors(t *testing.T) {
	for _, tc := range []struct{ col, cell, want string }{
		{"efl_tolerance", "-1%", "efl_tolerance"},
		{"efl_tolerance", "60", "below 50"},
		{"thickness_tolerance", "-0.1", "0 to 10 mm"},
		{"index_tolerance", "0.7", "below 0.5"},
		{"radius_tolerance", "x", "percentage"},
	} {
		t.Run(tc.col+" "+tc.cell, func(t *testing.T) {
			csv := "supplier,part,diameter,r1,r2,t1,glass1," + tc.col + "\nDEMO,A,25,100,-100,5,517642," + tc.cell + "\n"
			_, err := read(t, csv)
			if err == nil || !strings.Contains(err.Error(), tc.want) {
				t.Errorf("error %v, want one containing %q", err, tc.want)
			}
		})
	}
}
