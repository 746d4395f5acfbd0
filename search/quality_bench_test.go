package search

import (
	"fmt"
	"testing"
)

// BenchmarkJudge is the real-ray stage alone: the survivors of the
// first-order search of the focus and image requirements (3 x top
// 10 = 30 layouts, singlets and pairs) traced with optics.Assess (468-ray
// bundles on axis and at the field edge, wavefront, three-wavelength
// colour, Seidel sums) and ranked. It reports the cost per candidate.
func BenchmarkJudge(b *testing.B) {
	band := []float64{486.1327, 587.5618, 656.2725}
	for _, n := range []int{5000, 50000} {
		for _, kind := range []string{"focus", "image"} {
			req := benchRequirements()[kind]
			req.Band = band
			if kind == "focus" {
				req.FieldAngle = 1
			}
			b.Run(fmt.Sprintf("%s/%d", kind, n), func(b *testing.B) {
				its := synthItems(n)
				p := prepare(its, req)
				s := newSearch(p, req, limitsOf(req), survivors(req))
				s.pruned()
				ls := s.sorted()
				if len(ls) == 0 {
					b.Fatal("no survivors")
				}
				b.ResetTimer()
				for b.Loop() {
					s.judge(p, ls)
				}
				b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N*len(ls)), "ns/candidate")
				b.ReportMetric(float64(len(ls)), "candidates")
			})
		}
	}
}
