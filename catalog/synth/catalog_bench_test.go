package synth

import (
	"strconv"
	"testing"
)

// BenchmarkCatalog measures the generator over the ladder of catalog sizes
// the search benchmarks use.
func BenchmarkCatalog(b *testing.B) {
	for _, n := range []int{500, 5000, 50000} {
		b.Run(strconv.Itoa(n), func(b *testing.B) {
			for b.Loop() {
				if len(Catalog(1, n)) != n {
					b.Fatal("short catalog")
				}
			}
		})
	}
}
