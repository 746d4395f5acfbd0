package catalog

import (
	"database/sql"
	"errors"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"cardinal/catalog/synth"
)

// tableRows is every row of the catalog's tables, each table in key
// order, as text: two catalogs holding the same parts compare equal.
func tableRows(t *testing.T, path string) string {
	t.Helper()
	db, err := sql.Open("sqlite", path)
	if err != nil {
		t.Fatal(err)
	}
	defer db.Close()
	var b strings.Builder
	for _, q := range []string{
		"SELECT * FROM parts ORDER BY id",
		"SELECT * FROM surfaces ORDER BY part_id, idx",
		"SELECT * FROM computed ORDER BY part_id, reversed",
		"SELECT * FROM warnings ORDER BY part_id, seq",
		"SELECT * FROM search_index ORDER BY chunk",
		"SELECT type, name, tbl_name, sql FROM sqlite_schema ORDER BY name",
		"PRAGMA user_version", "PRAGMA application_id", "PRAGMA journal_mode", "PRAGMA integrity_check",
	} {
		writeRows(t, db, q, &b)
		fmt.Fprintf(&b, "%s\n", q)
	}
	return b.String()
}

func missing(t *testing.T, path string) bool {
	t.Helper()
	_, err := os.Lstat(path)
	return errors.Is(err, fs.ErrNotExist)
}

// A new catalog built beside its place (OpenNew) holds, row for row, what
// an import into a catalog created in place holds, and it is in place,
// in write-ahead logging mode, with nothing left beside it.
func TestOpenNewMatchesOpen(t *testing.T) {
	old := bulkParts
	bulkParts = 50 // the bulk path (indexes built after the rows) too
	defer func() { bulkParts = old }()
	es := synth.Catalog(3, 400)
	dir := t.TempDir()
	inPlace, built := filepath.Join(dir, "in-place.db"), filepath.Join(dir, "built.db")
	s, err := Open(inPlace)
	if err != nil {
		t.Fatal(err)
	}
	want, err := s.Import(ctx, es, false)
	if err != nil {
		t.Fatal(err)
	}
	s.Close()

	// The file is a whole catalog in write-ahead logging mode the moment it
	// appears, before the store opens it again: bytes 18 and 19 of an
	// SQLite header are 2 for WAL (the file format's documentation, from
	// memory).
	publishedHook = func(path string) {
		head := make([]byte, 20)
		f, err := os.Open(path)
		if err == nil {
			_, err = f.Read(head)
			f.Close()
		}
		if err != nil || head[18] != 2 || head[19] != 2 {
			t.Errorf("the catalog put in place has header bytes 18-19 %v (%v), want 2 2 (WAL)", head[18:20], err)
		}
		if !missing(t, path+"-wal") {
			t.Errorf("the catalog put in place has a log beside it")
		}
	}
	defer func() { publishedHook = nil }()
	s, err = OpenNew(built)
	if err != nil {
		t.Fatal(err)
	}
	if !missing(t, built) {
		t.Fatalf("%s exists before the import", built)
	}
	got, err := s.Import(ctx, es, false)
	if err != nil {
		t.Fatal(err)
	}
	if len(got.Added) != len(want.Added) || len(got.Added) != 400 {
		t.Errorf("added %d, want %d", len(got.Added), len(want.Added))
	}
	if s.Path() != built {
		t.Errorf("Path() = %s, want %s", s.Path(), built)
	}
	// The store goes on working on the catalog in place.
	again, err := s.Import(ctx, es[:10], false)
	if err != nil || len(again.Unchanged) != 10 {
		t.Errorf("importing again: %+v %v", again, err)
	}
	s.Close()
	for _, f := range []string{built + stageSuffix, built + stageSuffix + "-wal", built + "-wal"} {
		if !missing(t, f) {
			t.Errorf("%s is left behind", f)
		}
	}
	a, b := tableRows(t, inPlace), tableRows(t, built)
	if !strings.Contains(b, `{"wal"}`) || !strings.Contains(b, `{"ok"}`) {
		t.Errorf("the built catalog is not in WAL mode or not intact:\n%.300s", b[len(b)-300:])
	}
	if a != b {
		t.Errorf("the built catalog differs from the one imported in place (%d and %d bytes of rows)", len(b), len(a))
	}
}

// An import that fails, or a dry run, leaves no catalog and no file
// beside it.
func TestOpenNewFailedImport(t *testing.T) {
	path := filepath.Join(t.TempDir(), "new.db")
	good := sampleEntries(t)
	bad := append(sampleEntries(t), good[0]) // a part given twice
	for _, tc := range []struct {
		name string
		run  func(*Store) error
	}{
		{"failed", func(s *Store) error {
			if _, err := s.Import(ctx, bad, false); err == nil {
				return errors.New("a part given twice was imported")
			}
			return nil
		}},
		{"bad part", func(s *Store) error {
			es := sampleEntries(t)
			es[3].Part.Thickness[0] = -1 // found while the parts before it are written
			var ie *ImportError
			if _, err := s.Import(ctx, es, false); !errors.As(err, &ie) || len(ie.Rows) != 1 {
				return fmt.Errorf("a negative thickness gave %v", err)
			}
			return nil
		}},
		{"dry run", func(s *Store) error { _, err := s.Import(ctx, good, true); return err }},
	} {
		s, err := OpenNew(path)
		if err != nil {
			t.Fatal(err)
		}
		if err := tc.run(s); err != nil {
			t.Errorf("%s: %v", tc.name, err)
		}
		s.Close()
		if !missing(t, path) || !missing(t, path+stageSuffix) {
			t.Errorf("%s: a file is left at %s or beside it", tc.name, path)
		}
	}
}

// A catalog that appears at the path while a new one is being built is
// not replaced: the import goes into it, as into any catalog.
func TestOpenNewCatalogAppears(t *testing.T) {
	path := filepath.Join(t.TempDir(), "new.db")
	es := sampleEntries(t)
	s, err := OpenNew(path)
	if err != nil {
		t.Fatal(err)
	}
	defer s.Close()
	other, err := Open(path)
	if err != nil {
		t.Fatal(err)
	}
	if _, err := other.Import(ctx, es[:2], false); err != nil {
		t.Fatal(err)
	}
	other.Close()
	rep, err := s.Import(ctx, es, false)
	if err != nil {
		t.Fatal(err)
	}
	if len(rep.Added) != len(es)-2 || len(rep.Unchanged) != 2 {
		t.Errorf("added %d, unchanged %d; want %d and 2", len(rep.Added), len(rep.Unchanged), len(es)-2)
	}
	if !missing(t, path+stageSuffix) {
		t.Error("the file built beside the catalog is left behind")
	}
}

// A file left beside the path by a killed first import (or another import
// building there now) is left alone, and the catalog is created in place.
func TestOpenNewStageTaken(t *testing.T) {
	path := filepath.Join(t.TempDir(), "new.db")
	if err := os.WriteFile(path+stageSuffix, []byte("left by a killed import"), 0o644); err != nil {
		t.Fatal(err)
	}
	s, err := OpenNew(path)
	if err != nil {
		t.Fatal(err)
	}
	defer s.Close()
	if missing(t, path) {
		t.Error("the catalog is not created in place")
	}
	if _, err := s.Import(ctx, sampleEntries(t), false); err != nil {
		t.Fatal(err)
	}
	if b, err := os.ReadFile(path + stageSuffix); err != nil || string(b) != "left by a killed import" {
		t.Errorf("the file beside the catalog was touched: %q %v", b, err)
	}
}
