package main

import (
	"fmt"
	"testing"

	"cardinal/catalog/synth/synthtest"
)

// benchCatalog is a catalog file of n synthetic parts (synthtest keeps
// them in $CARDINAL_BENCH_DIR between runs).
func benchCatalog(b *testing.B, n int) string { return synthtest.CatalogFile(b, n) }

// BenchmarkFindCommand is the whole command: open the catalog, load every
// part and the drawer, search, save the run, print the table.
func BenchmarkFindCommand(b *testing.B) {
	args := map[string][]string{
		"focus":  {"--efl", "75", "--efl-tol", "1%", "--beam", "6", "--bfd-min", "40", "--wavelength", "1064"},
		"image":  {"--track", "300", "--mag", "-0.36", "--mag-tol", "2%", "--object-height", "5", "--na", "0.02", "--wd-min", "60", "--bfd-min", "15"},
		"expand": {"--expand", "5", "--expand-tol", "2%", "--beam", "2", "--galilean", "--length-max", "150"},
	}
	for _, n := range []int{5000, 50000, 200000} {
		for _, kind := range []string{"focus", "image", "expand"} {
			b.Run(fmt.Sprintf("%s/%d", kind, n), func(b *testing.B) {
				db := benchCatalog(b, n)
				o, err := parseFind(args[kind])
				if err != nil {
					b.Fatal(err)
				}
				b.ResetTimer()
				for b.Loop() {
					e, _, _ := testEnv()
					o.env, o.db = e, db
					if err := runFind(o); err != nil {
						b.Fatal(err)
					}
				}
			})
		}
	}
}
