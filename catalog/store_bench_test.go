package catalog

import (
	"fmt"
	"math"
	"math/rand/v2"
	"path/filepath"
	"testing"

	"cardinal/catalog/record"
	"cardinal/catalog/synth"
)

// benchEntries draws n plano-convex and plano-concave parts with focal
// lengths spread over 10 to 1000 mm (invented test data).
func benchEntries(b *testing.B, n int) []record.Entry {
	rng := rand.New(rand.NewPCG(1, 2))
	es := make([]record.Entry, n)
	for i := range es {
		f := 10 * math.Pow(100, rng.Float64())
		r := f * 0.517
		if rng.IntN(4) == 0 {
			r = -r
		}
		d := math.Min(50.8, 0.8*math.Abs(r)) // sag at the edge about 0.1 d
		es[i] = record.Entry{Part: lens(&testing.T{}, "BENCH", fmt.Sprintf("P-%06d", i), r, math.Inf(1), 1.5+0.15*d, d, "517642").Part}
	}
	return es
}

var sizes = []int{500, 5000, 50000}

func BenchmarkImport(b *testing.B) {
	for _, n := range sizes {
		b.Run(fmt.Sprint(n), func(b *testing.B) {
			es := benchEntries(b, n)
			for b.Loop() {
				b.StopTimer()
				s, _ := Open(Memory)
				b.StartTimer()
				if _, err := s.Import(ctx, es, false); err != nil {
					b.Fatal(err)
				}
				s.Close()
			}
		})
	}
}

func BenchmarkComputedEFLRange(b *testing.B) {
	for _, n := range sizes {
		b.Run(fmt.Sprint(n), func(b *testing.B) {
			s, _ := Open(Memory)
			defer s.Close()
			if _, err := s.Import(ctx, benchEntries(b, n), false); err != nil {
				b.Fatal(err)
			}
			// 45 to 55 mm: about 3.5 % of the log-uniform focal lengths.
			f := Filter{EFL: Range{45, 55}}
			for b.Loop() {
				if _, err := s.Computed(ctx, f); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

func BenchmarkOpenDemo(b *testing.B) {
	for b.Loop() {
		s, err := OpenDemo()
		if err != nil {
			b.Fatal(err)
		}
		s.Close()
	}
}

// BenchmarkImportSynth imports a synthetic catalog (catalog/synth, seed 1)
// into a new catalog file, as `cardinal catalog import` does after reading
// the CSV (built beside its place and put there: OpenNew): the figure the
// import targets are about. in-place-N imports into an empty catalog that
// exists already (Open), as an import into a catalog emptied by hand does.
func BenchmarkImportSynth(b *testing.B) {
	for _, n := range []int{5000, 50000, 200000} {
		for _, place := range []string{"", "in-place-"} {
			open := OpenNew
			if place != "" {
				open = Open
			}
			b.Run(fmt.Sprint(place, n), func(b *testing.B) {
				es := synth.Catalog(1, n)
				dir := b.TempDir()
				k := 0
				for b.Loop() {
					b.StopTimer()
					k++
					s, err := open(filepath.Join(dir, fmt.Sprintf("import-%d.db", k)))
					if err != nil {
						b.Fatal(err)
					}
					b.StartTimer()
					if _, err := s.Import(ctx, es, false); err != nil {
						b.Fatal(err)
					}
					b.StopTimer()
					s.Close()
					b.StartTimer()
				}
			})
		}
	}
}
