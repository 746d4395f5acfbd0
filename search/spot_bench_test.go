package search

import (
	"fmt"
	"testing"

	"cardinal/optics"
)

// BenchmarkSpot is the real-ray spot of one simulated build of a traced
// pair (a focus requirement with an 8 mm beam), by the number of
// hexapolar rings of the bundle.
func BenchmarkSpot(b *testing.B) {
	its := items(thickPair(0)...)
	req := buildFocusReq(1, BuildSettings{SpacingTol: 0.1})
	req.EFL, req.Beam, req.Top = 70, 8, 1
	out, err := Find(its, req)
	if err != nil || len(out.Results) == 0 {
		b.Fatal("no result", err)
	}
	su := Setup{Gap: deref(out.Results[0].Gap), BackClearance: deref(out.Results[0].BackClearance)}
	for _, u := range out.Results[0].Parts {
		for _, it := range its {
			if it.Entry.Part.ID() == u.ID() {
				p := it.Entry.Part
				if u.Reversed {
					p = p.Reversed()
				}
				su.Parts, su.Tols = append(su.Parts, p), append(su.Tols, optics.Tolerances{})
			}
		}
	}
	for _, rings := range []int{4, 6, spotRings} {
		b.Run(fmt.Sprintf("rings=%d", rings), func(b *testing.B) {
			m, err := newModel(req, su)
			if err != nil {
				b.Fatal(err)
			}
			m.rays.points = optics.Hexapolar(rings)
			d := make(draw, len(m.params))
			d[0] = optics.Const(0.5)
			t := m.eval(d)
			cpu0 := cpuTime()
			for b.Loop() {
				if _, ok := m.spot(d, t); !ok {
					b.Fatal("no spot")
				}
			}
			b.ReportMetric(float64(cpuTime()-cpu0)/1e3/float64(b.N), "cpu-us/op")
		})
	}
}
