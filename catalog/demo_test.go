package catalog

import (
	"bytes"
	"io/fs"
	"testing"

	"cardinal/importers"
)

func TestDemoImportsCleanly(t *testing.T) {
	// The demo's stated EFL, BFD and edge thickness agree with its
	// prescriptions, so it imports with no error and no warning.
	name := demoCatalog
	b, err := fs.ReadFile(demoFiles, name)
	if err != nil {
		name = demoLenses
		if b, err = fs.ReadFile(demoFiles, name); err != nil {
			t.Fatal(err)
		}
	}
	s := newStore(t)
	if g, err := fs.ReadFile(demoFiles, demoGlassCSV); err == nil {
		glasses, err := importers.ReadGlasses(bytes.NewReader(g), demoGlassCSV)
		if err != nil {
			t.Fatal(err)
		}
		if _, err := s.ImportGlasses(ctx, glasses, false); err != nil {
			t.Fatal(err)
		}
	}
	table, _ := s.Glasses(ctx)
	entries, err := importers.ReadPrescriptions(bytes.NewReader(b), name, table)
	if err != nil {
		t.Fatal(err)
	}
	rep := mustImport(t, s, entries)
	if len(rep.Added) != len(entries) || len(entries) == 0 {
		t.Errorf("%s: added %d of %d parts", name, len(rep.Added), len(entries))
	}
	for _, w := range rep.Warnings {
		t.Errorf("%s: warning %v", name, w)
	}
}

func TestOpenDemo(t *testing.T) {
	s, err := OpenDemo()
	if err != nil {
		t.Fatal(err)
	}
	defer s.Close()
	rows, err := s.Computed(ctx, Filter{})
	if err != nil || len(rows) == 0 {
		t.Fatalf("demo catalog: %d parts, %v", len(rows), err)
	}
	if s.Path() != Memory {
		t.Errorf("demo catalog at %q, want in memory", s.Path())
	}
	// Each OpenDemo is its own copy: changing one leaves the next alone.
	if _, err := s.Remove(ctx, rows[0].ID()); err != nil {
		t.Fatal(err)
	}
	s2, err := OpenDemo()
	if err != nil {
		t.Fatal(err)
	}
	defer s2.Close()
	rows2, _ := s2.Computed(ctx, Filter{})
	if len(rows2) != len(rows) {
		t.Errorf("a second demo catalog has %d parts, want %d", len(rows2), len(rows))
	}
}
