package search

import (
	"fmt"
	"reflect"
	"sync"
	"testing"
	"time"

	"cardinal/catalog/synth"
)

// The three example requirements.
func benchRequirements() map[string]Requirement {
	focus := Defaults()
	focus.Kind, focus.EFL, focus.EFLTol = Focus, 75, Tolerance{Value: 1, Percent: true}
	focus.Beam, focus.BFDMin, focus.Wavelength = 6, 40, 1064
	img := Defaults()
	img.Kind, img.Track, img.Mag, img.MagTol = Image, 300, -0.36, Tolerance{Value: 2, Percent: true}
	img.ObjectHeight, img.NA, img.WDMin, img.BFDMin = 5, 0.02, 60, 15
	exp := Defaults()
	exp.Kind, exp.Expansion, exp.ExpandTol = Expand, 5, Tolerance{Value: 2, Percent: true}
	exp.Beam, exp.Form, exp.LengthMax = 2, Galilean, 150
	focusD := focus
	focusD.Wavelength = 0 // the d line: the index's stored cardinal points
	return map[string]Requirement{"focus": focus, "image": img, "expand": exp, "focus-d": focusD}
}

var (
	benchMu    sync.Mutex
	benchItems = map[int][]Item{}
)

// synthItems is a synthetic catalog of n parts, every tenth part with one
// piece in the drawer.
func synthItems(n int) []Item {
	benchMu.Lock()
	defer benchMu.Unlock()
	if its, ok := benchItems[n]; ok {
		return its
	}
	its := Items(synth.Catalog(1, n), nil)
	for i := range its {
		if i%10 == 0 {
			its[i].Drawer = 1
		}
	}
	benchItems[n] = its
	return its
}

func BenchmarkFind(b *testing.B) {
	for _, n := range []int{500, 5000, 50000} {
		for _, kind := range []string{"focus", "image", "expand"} {
			req := benchRequirements()[kind]
			b.Run(fmt.Sprintf("%s/%d", kind, n), func(b *testing.B) {
				its := synthItems(n)
				b.ReportAllocs()
				b.ResetTimer()
				for b.Loop() {
					if _, err := Find(its, req); err != nil {
						b.Fatal(err)
					}
				}
			})
		}
	}
}

// BenchmarkFindNoDrawer is BenchmarkFind at 50,000 parts with an empty
// drawer: fewer parts stand out in the ranking, so the score bound prunes
// less.
func BenchmarkFindNoDrawer(b *testing.B) {
	its := append([]Item(nil), synthItems(50000)...)
	for i := range its {
		its[i].Drawer = 0
	}
	for _, kind := range []string{"focus", "image", "expand"} {
		req := benchRequirements()[kind]
		b.Run(kind+"/50000", func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				if _, err := Find(its, req); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// BenchmarkFindExhaustive is the baseline the pruned search is measured
// against (run it with -benchtime=1x: one op solves every ordered pair).
func BenchmarkFindExhaustive(b *testing.B) {
	for _, n := range []int{500, 5000} {
		for _, kind := range []string{"focus", "image", "expand"} {
			req := benchRequirements()[kind]
			b.Run(fmt.Sprintf("%s/%d", kind, n), func(b *testing.B) {
				its := synthItems(n)
				b.ResetTimer()
				for b.Loop() {
					if _, err := FindExhaustive(its, req); err != nil {
						b.Fatal(err)
					}
				}
			})
		}
	}
}

// BenchmarkPrunedVsExhaustive runs both searches in the same run on 5,000
// parts, fails unless their results are equal, and reports how many times
// faster the pruned one is (run with -benchtime=1x).
func BenchmarkPrunedVsExhaustive(b *testing.B) {
	for _, kind := range []string{"focus", "image", "expand"} {
		req := benchRequirements()[kind]
		b.Run(kind+"/5000", func(b *testing.B) {
			its := synthItems(5000)
			var pruned, exhaustive time.Duration
			for b.Loop() {
				t0 := time.Now()
				got, err := Find(its, req)
				pruned += time.Since(t0)
				if err != nil {
					b.Fatal(err)
				}
				t0 = time.Now()
				want, err := FindExhaustive(its, req)
				exhaustive += time.Since(t0)
				if err != nil {
					b.Fatal(err)
				}
				if !reflect.DeepEqual(got.Results, want.Results) || len(got.Results) == 0 {
					b.Fatalf("pruned and exhaustive results differ (or are empty): %d and %d", len(got.Results), len(want.Results))
				}
			}
			b.ReportMetric(float64(pruned.Milliseconds())/float64(b.N), "pruned-ms/op")
			b.ReportMetric(float64(exhaustive.Milliseconds())/float64(b.N), "exhaustive-ms/op")
			b.ReportMetric(exhaustive.Seconds()/pruned.Seconds(), "speedup")
		})
	}
}
