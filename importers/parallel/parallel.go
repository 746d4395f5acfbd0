// Package parallel works a function out over many inputs on every
// processor: the one helper the readers (package importers) and the
// catalog's import share.
package parallel

import (
	"runtime"
	"sync"
)

// Map returns f(0), ..., f(n-1), worked out on the processors in
// contiguous runs (small inputs on the calling goroutine alone).
func Map[T any](n int, f func(i int) T) []T {
	out := make([]T, n)
	workers := max(1, min(runtime.GOMAXPROCS(0), n/256))
	var wg sync.WaitGroup
	for k := 0; k < workers; k++ {
		wg.Add(1)
		go func(k int) {
			defer wg.Done()
			for i := k * n / workers; i < (k+1)*n/workers; i++ {
				out[i] = f(i)
			}
		}(k)
	}
	wg.Wait()
	return out
}
