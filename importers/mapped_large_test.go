package importers

import (
	"bytes"
	"fmt"
	"os"
	"runtime"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"
)

// largeSheet writes n invented plano-convex parts with excelize's stream
// writer, as a large supplier file.
func largeSheet(t testing.TB, n int) []byte {
	t.Helper()
	f := excelize.NewFile()
	defer f.Close()
	sw, err := f.NewStreamWriter("Sheet1")
	if err != nil {
		t.Fatal(err)
	}
	sw.SetRow("A1", []any{"Part", "Dia", "R1", "R2", "CT", "Glass", "EFL", "Description"})
	for i := range n {
		r := 20 + float64(i%400)*0.25 // R/(n - 1) with n = 1.517 gives the EFL
		row := []any{fmt.Sprintf("P-%06d", i), 12.7, r, "plano", 3, "517642", nil, fmt.Sprintf("invented plano-convex %d", i)}
		if err := sw.SetRow(fmt.Sprintf("A%d", i+2), row); err != nil {
			t.Fatal(err)
		}
	}
	if err := sw.Flush(); err != nil {
		t.Fatal(err)
	}
	b, err := f.WriteToBuffer()
	if err != nil {
		t.Fatal(err)
	}
	return b.Bytes()
}

const largeMapping = "supplier = LAB\npart <- Part\ndiameter <- Dia\nr1 <- R1\nr2 <- R2\nt1 <- CT\nglass1 <- Glass\ndescription <- Description\n"

// TestReadMapped100k reads 100,000 rows, reports progress every
// ProgressEvery rows, and streams the sheet: the heap while reading the rows
// stays well below the size of the sheet's XML, which a reader holding the
// whole sheet would exceed. With CARDINAL_SHEET_OUT set, the workbook is
// also written there, for measuring the command (README, Speed).
func TestReadMapped100k(t *testing.T) {
	if testing.Short() {
		t.Skip("100,000 rows")
	}
	const n = 100_000
	data := largeSheet(t, n)
	if out := os.Getenv("CARDINAL_SHEET_OUT"); out != "" {
		os.WriteFile(out, data, 0o644)
		os.WriteFile(out+".colmap", []byte(largeMapping), 0o644)
	}
	b, err := openXLSX(bytes.NewReader(data), int64(len(data)))
	if err != nil {
		t.Fatal(err)
	}
	sheetXML := int64(0)
	for _, f := range b.zr.File {
		if strings.HasPrefix(f.Name, "xl/worksheets/") {
			sheetXML += int64(f.UncompressedSize64)
		}
	}
	rows, _, err := b.rows("")
	if err != nil {
		t.Fatal(err)
	}
	var ms runtime.MemStats
	runtime.GC()
	runtime.ReadMemStats(&ms)
	base, peak := ms.HeapAlloc, uint64(0)
	count := 0
	for {
		if _, ok := rows.next(); !ok {
			break
		}
		if count++; count%10_000 == 0 {
			runtime.ReadMemStats(&ms)
			peak = max(peak, ms.HeapAlloc)
		}
	}
	if rows.err != nil || count != n+1 {
		t.Fatalf("read %d rows (%v), want %d", count, rows.err, n+1)
	}
	if grown := int64(peak) - int64(base); grown > sheetXML/2 {
		t.Errorf("the heap grew by %d bytes while reading a sheet of %d bytes of XML: the sheet is not streamed", grown, sheetXML)
	}
	t.Logf("sheet XML %d bytes; heap grew by at most %d bytes while reading its rows", sheetXML, int64(peak)-int64(base))

	var calls []int
	got, err := ReadMapped(Source{Name: "large.xlsx", Data: data}, readMap(t, largeMapping), MapOptions{Progress: func(r int) { calls = append(calls, r) }})
	if err != nil {
		t.Fatal(err)
	}
	if len(got.Rows) != n {
		t.Errorf("%d entries, want %d", len(got.Rows), n)
	}
	if len(calls) != n/ProgressEvery+1 || calls[0] != ProgressEvery || calls[len(calls)-1] != n {
		t.Errorf("progress calls %v", calls)
	}
}

// BenchmarkReadMapped reads a 5,000-row sheet through a mapping.
func BenchmarkReadMapped(b *testing.B) {
	data := largeSheet(b, 5000)
	m, err := ReadMapping(strings.NewReader(largeMapping), "large.colmap")
	if err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := ReadMapped(Source{Name: "large.xlsx", Data: data}, m, MapOptions{}); err != nil {
			b.Fatal(err)
		}
	}
}
