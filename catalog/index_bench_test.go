package catalog_test

import (
	"context"
	"fmt"
	"testing"

	"cardinal/catalog"
	"cardinal/catalog/synth/synthtest"
)

// BenchmarkSearchIndex reads the search index of a synthetic catalog file
// (seed 1), with the drawer and the glass table: the loading stage of
// find. $CARDINAL_BENCH_DIR keeps the files (synth-N.db) between runs.
func BenchmarkSearchIndex(b *testing.B) {
	ctx := context.Background()
	for _, n := range []int{5000, 50000, 200000} {
		b.Run(fmt.Sprint(n), func(b *testing.B) {
			s, err := catalog.Open(synthtest.CatalogFile(b, n))
			if err != nil {
				b.Fatal(err)
			}
			defer s.Close()
			b.ReportAllocs()
			b.ResetTimer()
			for b.Loop() {
				ix, err := s.SearchIndex(ctx, catalog.IndexOptions{})
				if err != nil {
					b.Fatal(err)
				}
				ix.Close()
			}
		})
	}
}
