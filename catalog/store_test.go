package catalog

import (
	"bytes"
	"database/sql"
	"errors"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

func TestOpenNewFile(t *testing.T) {
	path := filepath.Join(t.TempDir(), "catalog.db")
	s, err := Open(path)
	if err != nil {
		t.Fatal(err)
	}
	mustImport(t, s, sampleEntries(t))
	var app, version int64
	var mode string
	s.db.QueryRow("PRAGMA application_id").Scan(&app)
	s.db.QueryRow("PRAGMA user_version").Scan(&version)
	s.db.QueryRow("PRAGMA journal_mode").Scan(&mode)
	var fk int
	s.db.QueryRow("PRAGMA foreign_keys").Scan(&fk)
	if app != applicationID || int(version) != SchemaVersion() || mode != "wal" || fk != 1 {
		t.Errorf("application_id %#x, user_version %d, journal_mode %s, foreign_keys %d; want %#x, %d, wal, 1",
			app, version, mode, fk, applicationID, SchemaVersion())
	}
	if err := s.Close(); err != nil {
		t.Fatal(err)
	}
	// Opened again, the file keeps its parts and runs no migration twice.
	s, err = Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer s.Close()
	rows, err := s.Computed(ctx, Filter{})
	if err != nil || len(rows) != len(sampleEntries(t)) {
		t.Errorf("reopened: %d parts, %v; want %d", len(rows), err, len(sampleEntries(t)))
	}
}

func TestOpenRefuses(t *testing.T) {
	dir := t.TempDir()
	write := func(name string, b []byte) string {
		p := filepath.Join(dir, name)
		if err := os.WriteFile(p, b, 0o644); err != nil {
			t.Fatal(err)
		}
		return p
	}
	foreign := filepath.Join(dir, "other.db")
	db, err := sql.Open("sqlite", foreign)
	if err != nil {
		t.Fatal(err)
	}
	if _, err := db.Exec("CREATE TABLE notes (id INTEGER PRIMARY KEY, body TEXT); INSERT INTO notes (body) VALUES ('x')"); err != nil {
		t.Fatal(err)
	}
	db.Close()
	foreignApp := filepath.Join(dir, "app.db")
	db, _ = sql.Open("sqlite", foreignApp)
	db.Exec("PRAGMA application_id = 1234")
	db.Close()
	newer := filepath.Join(dir, "newer.db")
	s, err := Open(newer)
	if err != nil {
		t.Fatal(err)
	}
	s.db.Exec("PRAGMA user_version = 99")
	s.Close()

	tests := []struct {
		name, path, want string
	}{
		{"csv file", write("lenses.csv", []byte("supplier,part\nDEMO,PCX-50\n")), "not an SQLite database"},
		{"directory", dir, "is a directory"},
		{"another program's tables", foreign, "another program"},
		{"another application id", foreignApp, "application id 0x4d2"},
		{"newer schema", newer, "newer version of cardinal (schema 99"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			before, _ := os.ReadFile(tc.path)
			s, err := Open(tc.path)
			if err == nil {
				s.Close()
				t.Fatalf("Open(%s) succeeded, want an error", tc.path)
			}
			var oe *OpenError
			if !errors.As(err, &oe) || !strings.Contains(err.Error(), tc.want) {
				t.Errorf("error %q (%T), want an *OpenError containing %q", err, err, tc.want)
			}
			if after, _ := os.ReadFile(tc.path); !bytes.Equal(before, after) {
				t.Errorf("the file changed")
			}
		})
	}
}

func TestOpenUnwritableLocation(t *testing.T) {
	// A directory that cannot be written: the process's own file in /proc
	// refuses new files even to root (common practice on Linux).
	dir := "/proc/self"
	if _, err := os.Stat(dir); err != nil {
		t.Skip("no /proc here")
	}
	_, err := Open(filepath.Join(dir, "catalog.db"))
	var oe *OpenError
	if !errors.As(err, &oe) || !strings.Contains(err.Error(), "read-only location") {
		t.Errorf("error %v, want an *OpenError about a read-only location", err)
	}
}

func TestOpenMemoryIsFresh(t *testing.T) {
	a := newStore(t)
	mustImport(t, a, sampleEntries(t))
	b := newStore(t)
	rows, err := b.Computed(ctx, Filter{})
	if err != nil || len(rows) != 0 {
		t.Errorf("a second in-memory catalog has %d parts (%v), want 0", len(rows), err)
	}
}
