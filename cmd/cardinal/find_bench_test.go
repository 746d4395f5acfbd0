package main

import (
	"context"
	"fmt"
	"os"
	"path/filepath"
	"testing"

	"cardinal/catalog"
	"cardinal/catalog/synth"
)

// benchCatalog is a catalog file of n synthetic parts: $CARDINAL_BENCH_DIR
// keeps them between runs (building 50,000 parts takes tens of seconds),
// otherwise a temporary directory.
func benchCatalog(b *testing.B, n int) string {
	dir := os.Getenv("CARDINAL_BENCH_DIR")
	if dir == "" {
		dir = b.TempDir()
	}
	path := filepath.Join(dir, fmt.Sprintf("synth-%d.db", n))
	if _, err := os.Stat(path); err == nil {
		return path
	}
	st, err := catalog.Open(path)
	if err != nil {
		b.Fatal(err)
	}
	defer st.Close()
	if _, err := st.Import(context.Background(), synth.Catalog(1, n), false); err != nil {
		b.Fatal(err)
	}
	return path
}

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
