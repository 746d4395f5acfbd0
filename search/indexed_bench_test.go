package search

import (
	"context"
	"fmt"
	"testing"

	"cardinal/catalog"
	"cardinal/catalog/synth/synthtest"
)

// benchIndex opens the catalog file of n synthetic parts (catalog/synth,
// seed 1; synthtest keeps it in $CARDINAL_BENCH_DIR, the same synth-N.db
// files the command's benchmarks use).
func benchIndex(b *testing.B, n int) *catalog.Store {
	st, err := catalog.Open(synthtest.CatalogFile(b, n))
	if err != nil {
		b.Fatal(err)
	}
	b.Cleanup(func() { st.Close() })
	return st
}

// benchIndexRead is the search index of the catalog file of n synthetic
// parts, read once and closed when the benchmark ends.
func benchIndexRead(b *testing.B, n int) *catalog.Index {
	ix, err := benchIndex(b, n).SearchIndex(context.Background(), catalog.IndexOptions{})
	if err != nil {
		b.Fatal(err)
	}
	b.Cleanup(func() { ix.Close() })
	return ix
}

// benchOnIndex runs body, timed, on the search index of each catalog size
// read once, for each requirement kind.
func benchOnIndex(b *testing.B, body func(ctx context.Context, ix *catalog.Index, req Requirement) error) {
	for _, n := range []int{5000, 50000, 200000} {
		for _, kind := range []string{"focus", "focus-d", "image", "expand"} {
			req := benchRequirements()[kind]
			b.Run(fmt.Sprintf("%s/%d", kind, n), func(b *testing.B) {
				ctx, ix := context.Background(), benchIndexRead(b, n)
				b.ReportAllocs()
				b.ResetTimer()
				for b.Loop() {
					if err := body(ctx, ix, req); err != nil {
						b.Fatal(err)
					}
				}
			})
		}
	}
}

// BenchmarkPrepareIndex is the stage after the index is read: every
// part's candidates at the requirement's wavelength, filtered, priced and
// sorted (focus is at 1064 nm, so its cardinal points are computed from
// the paraxial prescriptions; image and expand use the stored d-line ones).
func BenchmarkPrepareIndex(b *testing.B) {
	benchOnIndex(b, func(ctx context.Context, ix *catalog.Index, req Requirement) error {
		prepareIndex(ctx, ix, req)
		return nil
	})
}

// BenchmarkFindIndexed is the search on an index already read: preparing
// the candidates, the pruned search, reading the full prescriptions of the
// survivors and tracing them with real rays (focus and image).
func BenchmarkFindIndexed(b *testing.B) {
	benchOnIndex(b, func(ctx context.Context, ix *catalog.Index, req Requirement) error {
		_, err := FindIndexed(ctx, ix, req)
		return err
	})
}

// BenchmarkFirstOrderIndexed is the first-order stage alone, on candidates
// prepared once: the power trees and the pruned search (and, when too few
// rows group out of what it kept, its reruns), as runPrepared calls it.
func BenchmarkFirstOrderIndexed(b *testing.B) {
	for _, n := range []int{5000, 50000, 200000} {
		for _, kind := range []string{"focus-d", "image", "expand"} {
			req := benchRequirements()[kind]
			b.Run(fmt.Sprintf("%s/%d", kind, n), func(b *testing.B) {
				ctx, ix := context.Background(), benchIndexRead(b, n)
				p := prepareIndex(ctx, ix, req)
				class := twinClasses(p, p.cands)
				b.ReportAllocs()
				b.ResetTimer()
				for b.Loop() {
					p.forest = forest{}
					firstOrderGroups(p, req, true, class)
				}
			})
		}
	}
}
