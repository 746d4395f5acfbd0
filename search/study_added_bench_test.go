package search

import (
	"context"
	"fmt"
	"testing"
	"time"
)

// BenchmarkFindStudyAdded measures what the build study adds to find: the
// same search on the catalog index (FindIndexed, as the command runs it),
// once with the study (1,000 builds of every ranked result, the real-ray
// spots of the first rows' builds) and once without, alternating which
// comes first, on synthetic catalogs (catalog/synth, seed 1) of 5,000 and
// 50,000 parts, for the three example requirements. It reports the mean
// difference per find in wall time (added-ms/op) and in the process's CPU
// time (added-cpu-ms/op), and the wall time of a find with the study
// (with-ms/op), and the wall time find spent inside the study stage
// itself (study-ms/op: reading the studied parts, the builds, the shown
// rows' spots, the new order), which is what the difference measures
// without the noise of two whole searches. The target is at most
// 50 ms added at 50,000 parts.
func BenchmarkFindStudyAdded(b *testing.B) {
	for _, n := range []int{5000, 50000} {
		for _, kind := range []string{"focus", "image", "expand"} {
			b.Run(fmt.Sprintf("%s/%d", kind, n), func(b *testing.B) {
				ctx, ix := context.Background(), benchIndexRead(b, n)
				with := benchRequirements()[kind]
				without := with
				without.noBuildStudy = true
				find := func(req Requirement) (wall time.Duration, cpu int64) {
					t0, c0 := time.Now(), cpuTime()
					out, err := FindIndexed(ctx, ix, req)
					if err != nil || len(out.Results) == 0 {
						b.Fatalf("no result: %v", err)
					}
					if studied := out.Results[0].Build != nil; studied == req.noBuildStudy {
						b.Fatalf("build figures %v with noBuildStudy %v", studied, req.noBuildStudy)
					}
					return time.Since(t0), cpuTime() - c0
				}
				find(with) // warm the caches of both paths
				find(without)
				var added, addedCPU, total time.Duration
				i := 0
				b.ResetTimer()
				study0 := studyWall.Load()
				for b.Loop() {
					var ws, ow time.Duration
					var wc, oc int64
					if i%2 == 0 {
						ws, wc = find(with)
						ow, oc = find(without)
					} else {
						ow, oc = find(without)
						ws, wc = find(with)
					}
					i++
					added += ws - ow
					addedCPU += time.Duration(wc - oc)
					total += ws
				}
				ms := func(d time.Duration) float64 { return float64(d) / 1e6 / float64(i) }
				b.ReportMetric(ms(added), "added-ms/op")
				b.ReportMetric(ms(addedCPU), "added-cpu-ms/op")
				b.ReportMetric(ms(total), "with-ms/op")
				b.ReportMetric(ms(time.Duration(studyWall.Load()-study0)), "study-ms/op")
			})
		}
	}
}
