package search

import (
	"fmt"
	"syscall"
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
	b.Run("with-spots", func(b *testing.B) {
		for b.Loop() {
			if _, err := StudyBuild(req, su); err != nil {
				b.Fatal(err)
			}
		}
	})
	// What find runs for every ranked result: the builds and their
	// figures, no real rays.
	b.Run("first-order", func(b *testing.B) {
		for b.Loop() {
			if _, err := studyFirstOrder(req, su); err != nil {
				b.Fatal(err)
			}
		}
	})
}

// cpuTime is the CPU time the process has used, ns.
func cpuTime() int64 {
	var ru syscall.Rusage
	if err := syscall.Getrusage(syscall.RUSAGE_SELF, &ru); err != nil {
		return 0
	}
	return ru.Utime.Nano() + ru.Stime.Nano()
}

// BenchmarkFindStudy is what the default build study adds to find: the
// study of every ranked result (the default top 10, 1,000 builds each) of
// the three example requirements on synthetic catalogs of 500 to 50,000
// parts, timed apart from the search that ranks them. The target
// is at most 50 ms at 50,000 parts.
func BenchmarkFindStudy(b *testing.B) {
	for _, n := range []int{500, 5000, 50000} {
		for _, kind := range []string{"focus", "image", "expand"} {
			req := benchRequirements()[kind]
			b.Run(fmt.Sprintf("%s/%d", kind, n), func(b *testing.B) {
				its := synthItems(n)
				p := prepare(its, req)
				s := newSearch(p, req, limitsOf(req), survivors(req))
				s.pruned()
				ls := s.sorted()
				if len(ls) > req.Top {
					ls = ls[:req.Top]
				}
				sus := make([]Setup, len(ls))
				for k := range ls {
					sus[k] = s.setup(p, &ls[k])
				}
				b.ReportMetric(float64(len(sus)), "results")
				b.ResetTimer()
				cpu0 := cpuTime()
				for b.Loop() {
					for _, st := range studyAll(req, sus) {
						if st == nil {
							b.Fatal("a study failed")
						}
					}
				}
				// The process's CPU time per run, user and system, over every
				// thread: on a shared machine the wall time (ns/op) counts
				// the waits for a core too.
				b.ReportMetric(float64(cpuTime()-cpu0)/1e6/float64(b.N), "cpu-ms/op")
			})
		}
	}
}
