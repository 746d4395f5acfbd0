package importers

import (
	"math"
	"strings"
	"testing"

	"cardinal/optics"
)

// TestPreview: the computed EFL of a thin-ish plano-convex lens against the
// lensmaker's equation, and the 1 % check of the stated EFL.
func TestPreview(t *testing.T) {
	csv := "supplier,part,diameter,r1,r2,t1,glass1,efl\nLAB,OK,25.4,51.68,inf,3.6,517642,99.96\nLAB,OFF,25.4,51.68,inf,3.6,517642,105\nLAB,NONE,25.4,51.68,inf,3.6,517642,\n"
	es, err := ReadPrescriptions(strings.NewReader(csv), "p.csv", optics.BuiltinGlasses())
	if err != nil {
		t.Fatal(err)
	}
	rows := Preview(es)
	// A plano-convex lens has f = R/(n - 1) whatever its thickness when the
	// flat side faces the image (Hecht, Optics, 5th ed., sec. 6.2, thick-lens
	// focal length with R2 infinite; the section number from memory); n = 1.517 for glass code 517642 (the
	// code's first three digits, common practice). The code's dispersion
	// moves n by ~1e-6 between 587.56 and 587.6 nm, hence 1e-3 mm.
	want := 51.68 / 0.517
	if math.Abs(rows[0].Computed-want) > 1e-3 {
		t.Errorf("computed EFL %.6f mm, want %.6f", rows[0].Computed, want)
	}
	if rows[0].Off || !rows[1].Off || rows[2].Off {
		t.Errorf("off flags %v %v %v, want false true false", rows[0].Off, rows[1].Off, rows[2].Off)
	}
	if p := 100 * math.Abs(want-105) / 105; math.Abs(rows[1].OffPercent-p) > 1e-3 {
		t.Errorf("off %.4f %%, want %.4f", rows[1].OffPercent, p)
	}
	if d := Disagreeing(rows); len(d) != 1 || d[0].Entry.Part.Name != "OFF" {
		t.Errorf("disagreeing %v", d)
	}
}
