package main

import (
	"bytes"
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"cardinal/catalog"
)

// storeEnv is an env for the catalog commands: buffers for the streams and
// an environment of its own, HOME in a fresh directory and nothing else.
func storeEnv(t *testing.T, vars map[string]string) (*env, *bytes.Buffer, *bytes.Buffer) {
	t.Helper()
	home := t.TempDir()
	var out, errb bytes.Buffer
	e := &env{In: strings.NewReader(""), Out: &out, Err: &errb,
		Now: func() time.Time { return time.Date(2025, 1, 2, 3, 4, 5, 0, time.UTC) },
		Getenv: func(k string) string {
			if v, ok := vars[k]; ok {
				return v
			}
			if k == "HOME" {
				return home
			}
			return ""
		}}
	return e, &out, &errb
}

// runCLI runs a command line against e and returns the exit code, with the
// streams reset first.
func runCLI(e *env, args ...string) int {
	e.Out.(*bytes.Buffer).Reset()
	e.Err.(*bytes.Buffer).Reset()
	return execute(args, e)
}

const demoLensesCSV = "../../catalog/demo/lenses.csv"

func TestLocateCatalog(t *testing.T) {
	for _, tc := range []struct {
		name     string
		flag     string
		vars     map[string]string
		want     string
		explicit bool
		err      bool
	}{
		{"--db wins", "/x/a.db", map[string]string{"CARDINAL_DB": "/y/b.db", "XDG_DATA_HOME": "/z", "HOME": "/h"}, "/x/a.db", true, false},
		{"CARDINAL_DB next", "", map[string]string{"CARDINAL_DB": "/y/b.db", "XDG_DATA_HOME": "/z", "HOME": "/h"}, "/y/b.db", true, false},
		// XDG Base Directory Specification: $XDG_DATA_HOME, else
		// $HOME/.local/share; a relative path is ignored.
		{"XDG_DATA_HOME", "", map[string]string{"XDG_DATA_HOME": "/z", "HOME": "/h"}, "/z/cardinal/catalog.db", false, false},
		{"relative XDG_DATA_HOME ignored", "", map[string]string{"XDG_DATA_HOME": "rel", "HOME": "/h"}, "/h/.local/share/cardinal/catalog.db", false, false},
		{"HOME", "", map[string]string{"HOME": "/h"}, "/h/.local/share/cardinal/catalog.db", false, false},
		{"nothing set", "", map[string]string{"HOME": ""}, "", false, true},
	} {
		t.Run(tc.name, func(t *testing.T) {
			e, _, _ := storeEnv(t, tc.vars)
			loc, err := locateCatalog(tc.flag, e)
			if tc.err {
				if exitCode(err) != exitUsage {
					t.Errorf("error %v, want a usage error", err)
				}
				return
			}
			if err != nil || loc.Path != tc.want || loc.Explicit != tc.explicit {
				t.Errorf("locateCatalog = %+v, %v; want %s (explicit %v)", loc, err, tc.want, tc.explicit)
			}
		})
	}
}

func TestOpenForRead(t *testing.T) {
	e, _, errb := storeEnv(t, nil)
	s, err := openForRead("", e)
	if err != nil {
		t.Fatal(err)
	}
	defer s.Close()
	if lines := strings.Count(unwrap(errb.String()), "\n"); lines != 1 || !strings.Contains(unwrap(errb.String()), "built-in demo catalog") {
		t.Errorf("stderr %q, want one line about the demo catalog", errb.String())
	}
	// A read command creates no catalog of the user's; it keeps the demo
	// catalog beside where that would be, so that searches on it last.
	dir := filepath.Join(e.Getenv("HOME"), ".local/share/cardinal")
	if _, err := os.Stat(filepath.Join(dir, "catalog.db")); !errors.Is(err, os.ErrNotExist) {
		t.Errorf("a read command created the catalog (%v)", err)
	}
	if _, err := os.Stat(filepath.Join(dir, "demo-"+catalog.DemoVersion()+".db")); err != nil {
		t.Errorf("demo catalog not kept: %v", err)
	}
}

func TestOpenForWrite(t *testing.T) {
	e, _, _ := storeEnv(t, nil)
	if _, err := openForWrite("", e, false); exitCode(err) != exitNotFound {
		t.Errorf("no catalog, no create: %v, want not found", err)
	}
	s, err := openForWrite("", e, true)
	if err != nil {
		t.Fatal(err)
	}
	s.Close()
	if _, err := os.Stat(filepath.Join(e.Getenv("HOME"), ".local/share/cardinal/catalog.db")); err != nil {
		t.Errorf("default catalog not created: %v", err)
	}
	missing := filepath.Join(t.TempDir(), "no", "such", "dir", "c.db")
	if _, err := openForWrite(missing, e, true); exitCode(err) != exitUsage || !strings.Contains(err.Error(), "does not exist") {
		t.Errorf("explicit path in a missing directory: %v", err)
	}
}

func TestDBFlagAndEnvironment(t *testing.T) {
	dir := t.TempDir()
	byFlag, byEnv := filepath.Join(dir, "flag.db"), filepath.Join(dir, "env.db")
	e, out, errb := storeEnv(t, map[string]string{"CARDINAL_DB": byEnv})
	if code := runCLI(e, "--db", byFlag, "catalog", "import", demoLensesCSV); code != 0 {
		t.Fatalf("exit %d: %s", code, errb)
	}
	if !strings.Contains(out.String(), byFlag) {
		t.Errorf("import output %q does not name %s", out, byFlag)
	}
	if _, err := os.Stat(byEnv); !errors.Is(err, os.ErrNotExist) {
		t.Errorf("--db did not take precedence over CARDINAL_DB")
	}
	// The flag goes after the subcommand too (a persistent flag).
	if code := runCLI(e, "catalog", "import", demoLensesCSV, "--db", byEnv); code != 0 {
		t.Fatalf("exit %d: %s", code, errb)
	}
	if code := runCLI(e, "catalog", "list", "--format", "csv"); code != 0 || errb.Len() != 0 {
		t.Errorf("list from CARDINAL_DB: exit %d, stderr %q", code, errb)
	}
}

// Opening a catalog written by the previous version says once, on stderr,
// that it was brought up to date; the next command says nothing of it.
func TestUpgradeNotice(t *testing.T) {
	b, err := os.ReadFile("../../catalog/testdata/schema6.db") // written by the version before the chunked index
	if err != nil {
		t.Fatal(err)
	}
	for _, args := range [][]string{{"searches", "list"}, {"find", "--efl", "50", "--elements", "1"}} {
		t.Run(args[0], func(t *testing.T) {
			db := filepath.Join(t.TempDir(), "old.db")
			if err := os.WriteFile(db, b, 0o644); err != nil {
				t.Fatal(err)
			}
			e, _, errb := storeEnv(t, nil)
			runCLI(e, append([]string{"--db", db}, args...)...)
			want := "(schema 6 to " + fmt.Sprint(catalog.SchemaVersion()) + "), once"
			if !strings.Contains(unwrap(errb.String()), want) {
				t.Errorf("first run's stderr %q does not say %q", errb.String(), want)
			}
			runCLI(e, append([]string{"--db", db}, args...)...)
			if strings.Contains(errb.String(), "schema 6") {
				t.Errorf("second run says the upgrade again: %q", errb.String())
			}
		})
	}
}

// An import that finds the file a stopped first import was building
// (catalog.OpenNew) says so, and creates the catalog in place.
func TestLeftoverBuildNotice(t *testing.T) {
	dir := t.TempDir()
	db := filepath.Join(dir, "new.db")
	left := db + ".importing"
	if err := os.WriteFile(left, []byte("half a catalog"), 0o644); err != nil {
		t.Fatal(err)
	}
	csv := filepath.Join(dir, "parts.csv")
	if err := os.WriteFile(csv, []byte(killCSV(3, "v1")), 0o644); err != nil {
		t.Fatal(err)
	}
	e, _, errb := storeEnv(t, nil)
	if code := runCLI(e, "--db", db, "catalog", "import", csv); code != 0 {
		t.Fatalf("exit %d: %s", code, errb.String())
	}
	if !strings.Contains(unwrap(errb.String()), left+" is there") {
		t.Errorf("stderr %q does not name %s", errb.String(), left)
	}
	if got := catalogVersions(t, db); got != "v1:3" {
		t.Errorf("the catalog holds %s, not the 3 parts imported", got)
	}
	if b, err := os.ReadFile(left); err != nil || string(b) != "half a catalog" {
		t.Errorf("the file left beside the catalog was changed: %q, %v", b, err)
	}
}
