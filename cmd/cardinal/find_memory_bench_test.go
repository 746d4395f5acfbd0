package main

import (
	"io"
	"runtime"
	"runtime/metrics"
	"strconv"
	"sync"
	"testing"
	"time"
)

// BenchmarkFindAllMemory is `find --efl 100 --efl-tol 5% --top 0 --format
// json`, the search that once kept every layout that met (tens of GB at
// 50,000 parts), on the synthetic catalogs of BenchmarkFindCommand. Besides
// the time and -benchmem's bytes allocated per run it reports peak-heap-MB:
// the largest heap of live and not yet swept objects seen while the command
// ran, sampled every millisecond. The whole process's peak (RSS) is measured
// with /usr/bin/time -v (DEVELOPERS.md, "Speed").
func BenchmarkFindAllMemory(b *testing.B) {
	for _, n := range []int{5000, 50000} {
		b.Run(strconv.Itoa(n), func(b *testing.B) {
			db := benchCatalog(b, n)
			o, err := parseFind([]string{"--efl", "100", "--efl-tol", "5%", "--top", "0", "--format", "json"})
			if err != nil {
				b.Fatal(err)
			}
			var peak uint64
			b.ResetTimer()
			for b.Loop() {
				e, _, _ := testEnv()
				e.Out = io.Discard // the printed JSON is not the command's memory
				o.env, o.db = e, db
				peak = max(peak, peakHeap(func() {
					if err := runFind(o); err != nil {
						b.Fatal(err)
					}
				}))
			}
			b.ReportMetric(float64(peak)/1e6, "peak-heap-MB")
		})
	}
}

// peakHeap runs f and returns the largest heap (bytes of objects, live or
// not yet swept; runtime/metrics) seen every millisecond while it ran,
// after a collection before it so that earlier garbage does not count.
func peakHeap(f func()) uint64 {
	runtime.GC()
	s := []metrics.Sample{{Name: "/memory/classes/heap/objects:bytes"}}
	read := func() uint64 { metrics.Read(s); return s[0].Value.Uint64() }
	peak := read()
	done := make(chan struct{})
	var wg sync.WaitGroup
	wg.Go(func() {
		t := time.NewTicker(time.Millisecond)
		defer t.Stop()
		for {
			select {
			case <-done:
				return
			case <-t.C:
				peak = max(peak, read())
			}
		}
	})
	f()
	close(done)
	wg.Wait()
	return max(peak, read())
}
