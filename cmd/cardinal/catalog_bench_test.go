package main

import (
	"fmt"
	"os"
	"path/filepath"
	"testing"

	"cardinal/catalog/synth"
	"cardinal/importers"
)

// benchCSV is the prescription CSV of n synthetic parts, kept in
// $CARDINAL_BENCH_DIR between runs when it is set.
func benchCSV(b *testing.B, n int) string {
	dir := os.Getenv("CARDINAL_BENCH_DIR")
	if dir == "" {
		dir = b.TempDir()
	}
	path := filepath.Join(dir, fmt.Sprintf("synth-%d.csv", n))
	if _, err := os.Stat(path); err == nil {
		return path
	}
	f, err := os.Create(path)
	if err != nil {
		b.Fatal(err)
	}
	if err := importers.WritePrescriptions(f, synth.Catalog(1, n)); err != nil {
		b.Fatal(err)
	}
	if err := f.Close(); err != nil {
		b.Fatal(err)
	}
	return path
}

// BenchmarkCatalogImportCommand is `cardinal catalog import` of a
// synthetic catalog into a new file: reading and checking the CSV,
// computing every part and writing it in one transaction.
func BenchmarkCatalogImportCommand(b *testing.B) {
	for _, n := range []int{5000, 50000, 200000} {
		b.Run(fmt.Sprint(n), func(b *testing.B) {
			csv := benchCSV(b, n)
			dir := b.TempDir()
			k := 0
			for b.Loop() {
				k++
				e, _, _ := testEnv()
				o := &catalogImportOptions{importOptions: &importOptions{env: e,
					DB: filepath.Join(dir, fmt.Sprintf("import-%d.db", k)), File: csv}}
				if err := runCatalogImport(o); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
