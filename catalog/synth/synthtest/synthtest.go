// Package synthtest gives benchmarks the catalog files of synthetic parts
// (package synth, seed 1) that they read: built once, kept in
// $CARDINAL_BENCH_DIR between runs when it is set (building 50,000 parts
// takes tens of seconds), else in the benchmark's temporary directory.
package synthtest

import (
	"context"
	"fmt"
	"os"
	"path/filepath"
	"testing"

	"cardinal/catalog"
	"cardinal/catalog/synth"
)

// CatalogFile is the path of the catalog file of n synthetic parts,
// synth-N.db, built now if it is not there yet.
func CatalogFile(tb testing.TB, n int) string {
	tb.Helper()
	dir := os.Getenv("CARDINAL_BENCH_DIR")
	if dir == "" {
		dir = tb.TempDir()
	}
	path := filepath.Join(dir, fmt.Sprintf("synth-%d.db", n))
	if _, err := os.Stat(path); err == nil {
		return path
	}
	st, err := catalog.Open(path)
	if err != nil {
		tb.Fatal(err)
	}
	defer st.Close()
	if _, err := st.Import(context.Background(), synth.Catalog(1, n), false); err != nil {
		tb.Fatal(err)
	}
	return path
}
