package search

import (
	"context"
	"fmt"
	"os"
	"path/filepath"
	"testing"

	"cardinal/catalog"
	"cardinal/catalog/synth"
)

// benchIndex opens the catalog file of n synthetic parts (catalog/synth,
// seed 1), building it once: in $CARDINAL_BENCH_DIR when set (the same
// synth-N.db files the command's benchmarks use), else in a temporary
// directory.
func benchIndex(b *testing.B, n int) *catalog.Store {
	dir := os.Getenv("CARDINAL_BENCH_DIR")
	if dir == "" {
		dir = b.TempDir()
	}
	path := filepath.Join(dir, fmt.Sprintf("synth-%d.db", n))
	_, statErr := os.Stat(path)
	st, err := catalog.Open(path)
	if err != nil {
		b.Fatal(err)
	}
	if statErr != nil {
		if _, err := st.Import(context.Background(), synth.Catalog(1, n), false); err != nil {
			b.Fatal(err)
		}
	}
	b.Cleanup(func() { st.Close() })
	return st
}

// BenchmarkPrepareIndex is the stage after the index is read: every
// part's candidates at the requirement's wavelength, filtered, priced and
// sorted (focus is at 1064 nm, so its cardinal points are computed from
// the paraxial prescriptions; image and expand use the stored d-line ones).
func BenchmarkPrepareIndex(b *testing.B) {
	for _, n := range []int{5000, 50000, 200000} {
		for _, kind := range []string{"focus", "focus-d", "image", "expand"} {
			req := benchRequirements()[kind]
			b.Run(fmt.Sprintf("%s/%d", kind, n), func(b *testing.B) {
				ctx := context.Background()
				ix, err := benchIndex(b, n).SearchIndex(ctx, catalog.IndexOptions{})
				if err != nil {
					b.Fatal(err)
				}
				defer ix.Close()
				b.ReportAllocs()
				b.ResetTimer()
				for b.Loop() {
					prepareIndex(ctx, ix, req)
				}
			})
		}
	}
}

// BenchmarkFindIndexed is the search on an index already read: preparing
// the candidates, the pruned search, reading the full prescriptions of the
// survivors and tracing them with real rays (focus and image).
func BenchmarkFindIndexed(b *testing.B) {
	for _, n := range []int{5000, 50000, 200000} {
		for _, kind := range []string{"focus", "focus-d", "image", "expand"} {
			req := benchRequirements()[kind]
			b.Run(fmt.Sprintf("%s/%d", kind, n), func(b *testing.B) {
				ctx := context.Background()
				ix, err := benchIndex(b, n).SearchIndex(ctx, catalog.IndexOptions{})
				if err != nil {
					b.Fatal(err)
				}
				defer ix.Close()
				b.ReportAllocs()
				b.ResetTimer()
				for b.Loop() {
					if _, err := FindIndexed(ctx, ix, req); err != nil {
						b.Fatal(err)
					}
				}
			})
		}
	}
}
