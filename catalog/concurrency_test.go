package catalog

import (
	"fmt"
	"math"
	"path/filepath"
	"sync"
	"sync/atomic"
	"testing"

	"cardinal/catalog/record"
)

// versioned builds n plano-convex parts whose descriptions carry a version.
func versioned(t *testing.T, n int, version string) []record.Entry {
	es := make([]record.Entry, n)
	for i := range es {
		es[i] = lens(t, "TEST", fmt.Sprintf("P%03d", i), 20+float64(i), math.Inf(1), 3, 12.7, "517642")
		es[i].Part.Description = version
	}
	return es
}

func TestReaderSeesWholeImports(t *testing.T) {
	path := filepath.Join(t.TempDir(), "catalog.db")
	writer, err := Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer writer.Close()
	// A second Store on the same file has its own SQLite connections, as a
	// second process would.
	reader, err := Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer reader.Close()
	n, m := 150, 50
	if testing.Short() {
		n, m = 60, 20
	}
	mustImport(t, writer, versioned(t, n, "v1"))
	// Each import moves the catalog from one whole state to the next:
	// v1 (n parts) -> v2 (n+m parts) -> v3 (n+m) -> v4 ...
	want := map[string]int{"v1": n}
	var done atomic.Bool
	var wg sync.WaitGroup
	var snapshots atomic.Int64
	seen := sync.Map{}
	wg.Add(1)
	go func() {
		defer wg.Done()
		for !done.Load() {
			rows, err := reader.Computed(ctx, Filter{})
			if err != nil {
				t.Error(err)
				return
			}
			versions := map[string]int{}
			for _, r := range rows {
				versions[r.Description]++
			}
			if len(versions) != 1 {
				t.Errorf("a reader saw a mixed catalog: %v", versions)
				return
			}
			for v, count := range versions {
				seen.Store(v, count)
			}
			snapshots.Add(1)
		}
	}()
	for i := 2; i <= 6; i++ {
		v := fmt.Sprintf("v%d", i)
		mustImport(t, writer, versioned(t, n+m, v))
		want[v] = n + m
	}
	done.Store(true)
	wg.Wait()
	versions := 0
	seen.Range(func(k, v any) bool {
		versions++
		if want[k.(string)] != v.(int) {
			t.Errorf("reader saw %s with %d parts, want %d", k, v, want[k.(string)])
		}
		return true
	})
	if versions < 2 {
		t.Errorf("the reader saw %d version(s) of the catalog; the test needs it to overlap the imports", versions)
	}
	t.Logf("%d consistent snapshots read during 5 imports", snapshots.Load())
}
