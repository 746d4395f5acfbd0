package search

import (
	"testing"

	"cardinal/optics"
)

// BenchmarkStudy is the default build study of one pair (1,000 builds):
// find runs it once for each ranked result.
func BenchmarkStudy(b *testing.B) {
	ps := thickPair(0)
	req := buildFocusReq(1, BuildSettings{SpacingTol: DefaultSpacingTol})
	req.EFL = 70
	req.Top = 1
	out, err := Find(items(ps...), req)
	if err != nil || len(out.Results) == 0 {
		b.Fatal("no result", err)
	}
	var su Setup
	r := out.Results[0]
	for _, u := range r.Parts {
		for _, p := range ps {
			if p.ID() == u.ID() {
				if u.Reversed {
					p = p.Reversed()
				}
				su.Parts = append(su.Parts, p)
				su.Tols = append(su.Tols, optics.Tolerances{})
			}
		}
	}
	su.Gap, su.BackClearance = deref(r.Gap), deref(r.BackClearance)
	b.ResetTimer()
	for b.Loop() {
		if _, err := StudyBuild(req, su); err != nil {
			b.Fatal(err)
		}
	}
}
