package catalog

import (
	"context"
	"os"
	"path/filepath"
	"testing"
	"time"
)

func TestOpenDemoAtKeepsSearches(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "demo-"+DemoVersion()+".db")
	s, err := OpenDemoAt(path)
	if err != nil {
		t.Fatal(err)
	}
	ctx := context.Background()
	mem, err := OpenDemo()
	if err != nil {
		t.Fatal(err)
	}
	defer mem.Close()
	kept, _ := s.Entries(ctx, Filter{})
	fresh, _ := mem.Entries(ctx, Filter{})
	if len(kept) != len(fresh) || len(kept) < 300 {
		t.Fatalf("kept demo has %d parts, the in-memory one %d", len(kept), len(fresh))
	}
	id, err := s.SaveSearch(ctx, SavedSearch{Kind: "focus", Requirement: []byte(`{}`), Results: []byte(`[]`), At: time.Unix(0, 0)})
	if err != nil {
		t.Fatal(err)
	}
	if err := s.Close(); err != nil {
		t.Fatal(err)
	}
	// Only the demo file is left behind: no temporary build files.
	files, _ := os.ReadDir(dir)
	for _, f := range files {
		if f.Name() != filepath.Base(path) {
			t.Errorf("left behind: %s", f.Name())
		}
	}
	s, err = OpenDemoAt(path)
	if err != nil {
		t.Fatal(err)
	}
	defer s.Close()
	got, err := s.LoadSearch(ctx, "last")
	if err != nil || got.ID != id {
		t.Fatalf("search %d not kept: %+v, %v", id, got, err)
	}
}

func TestDemoVersionStable(t *testing.T) {
	if a, b := DemoVersion(), DemoVersion(); a != b || len(a) != 12 {
		t.Errorf("DemoVersion %q, %q", a, b)
	}
}
