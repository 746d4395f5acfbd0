package parallel

import (
	"runtime"
	"testing"
)

// Map gives f(i) at i for every size, below and above the size that
// splits the work, whatever the number of processors.
func TestMapKeepsOrder(t *testing.T) {
	for _, procs := range []int{1, 2, 3} {
		old := runtime.GOMAXPROCS(procs)
		for _, n := range []int{0, 1, 255, 256, 1000, 4099} {
			got := Map(n, func(i int) int { return i * i })
			if len(got) != n {
				t.Fatalf("procs %d, n %d: %d results", procs, n, len(got))
			}
			for i, v := range got {
				if v != i*i {
					t.Fatalf("procs %d, n %d: result %d is %d", procs, n, i, v)
				}
			}
		}
		runtime.GOMAXPROCS(old)
	}
}
