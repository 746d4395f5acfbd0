package main

import (
	"context"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"cardinal/catalog"
	"cardinal/catalog/record"
	"cardinal/optics"
)

// handedStores hands every command the one store a test built, and counts
// how it was asked for.
type handedStores struct {
	st            *catalog.Store
	reads, writes int
}

func (h *handedStores) Read(string) (*catalog.Store, error) { h.reads++; return h.reopen() }

func (h *handedStores) Write(string, bool) (*catalog.Store, error) { h.writes++; return h.reopen() }

// reopen opens the test's catalog file again: the command closes what it
// gets.
func (h *handedStores) reopen() (*catalog.Store, error) { return catalog.Open(h.st.Path()) }

// A command reads and changes the store the env hands it, not a file of
// its own choosing: the default location stays empty.
func TestCommandsUseTheEnvStore(t *testing.T) {
	path := filepath.Join(t.TempDir(), "handed.db")
	st, err := catalog.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	glass, err := optics.GlassCode("517642")
	if err != nil {
		t.Fatal(err)
	}
	p := optics.Part{Supplier: "HANDED", Name: "PCX-77", Diameter: 25.4, Thickness: []float64{4},
		Surfaces: []optics.Surface{optics.Sphere(40), optics.Sphere(math.Inf(1))}, Media: []optics.Medium{glass}}
	if _, err := st.Import(context.Background(), []record.Entry{{Part: p}}, false); err != nil {
		t.Fatal(err)
	}
	st.Close()
	st, err = catalog.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer st.Close()

	e, out, errb := storeEnv(t, nil)
	h := &handedStores{st: st}
	e.Stores = h
	if code := runCLI(e, "catalog", "list", "--format", "csv"); code != 0 {
		t.Fatalf("catalog list: exit %d: %s", code, errb)
	}
	if !strings.Contains(out.String(), "PCX-77") {
		t.Errorf("catalog list does not show the handed store's part:\n%s", out)
	}
	if code := runCLI(e, "drawer", "set", "HANDED:PCX-77", "3"); code != 0 {
		t.Fatalf("drawer set: exit %d: %s", code, errb)
	}
	d, err := st.Drawer(context.Background())
	if err != nil {
		t.Fatal(err)
	}
	if d["HANDED:PCX-77"].Quantity != 3 {
		t.Errorf("drawer set did not change the handed store: %+v", d)
	}
	if h.reads == 0 || h.writes == 0 {
		t.Errorf("reads %d, writes %d: the commands did not ask the env for the store", h.reads, h.writes)
	}
	home := e.Getenv("HOME")
	if entries, _ := os.ReadDir(home); len(entries) > 0 {
		t.Errorf("the commands wrote under HOME: %v", entries)
	}
}
