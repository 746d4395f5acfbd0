package main

import (
	"context"
	"database/sql"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"
)

// An import killed at any moment (SIGKILL: no clean-up runs) leaves the
// catalog as it was before or as the import would have left it, never a
// mix, and the next command opens it as usual. The child process is the
// program itself, importing a file that rewrites every part's description
// and adds more parts; it is killed at moments spread over the time a
// whole import takes, and past it.
func TestKilledImport(t *testing.T) {
	if testing.Short() {
		t.Skip("-short: starts and kills a dozen processes")
	}
	const n, m = 300, 100
	dir := t.TempDir()
	base, v2 := filepath.Join(dir, "base.db"), filepath.Join(dir, "v2.csv")
	must(t, os.WriteFile(filepath.Join(dir, "v1.csv"), []byte(killCSV(n, "v1")), 0o644))
	must(t, os.WriteFile(v2, []byte(killCSV(n+m, "v2")), 0o644))
	e, _, errb := storeEnv(t, nil)
	if code := runCLI(e, "--db", base, "catalog", "import", filepath.Join(dir, "v1.csv")); code != 0 {
		t.Fatalf("import v1: %d %s", code, errb)
	}
	self, err := os.Executable()
	if err != nil {
		t.Fatal(err)
	}
	// How long a whole import takes here, in a process of its own.
	whole := filepath.Join(dir, "whole.db")
	copyFile(t, base, whole)
	start := time.Now()
	if code, _, errs := runChild(t, childCommand(self, dir, []string{"--db", whole, "catalog", "import", v2})); code != 0 {
		t.Fatalf("the whole import failed: %d %s", code, errs)
	}
	full := time.Since(start)
	if got := catalogVersions(t, whole); got != fmt.Sprintf("v2:%d", n+m) {
		t.Fatalf("the whole import left %s", got)
	}
	states := map[string]int{}
	const moments = 10
	for i := 0; i <= moments; i++ {
		at := full * time.Duration(i) / moments * 5 / 4 // 0 to 1.25 times the whole import
		db := filepath.Join(dir, fmt.Sprintf("killed-%02d.db", i))
		copyFile(t, base, db)
		c := childCommand(self, dir, []string{"--db", db, "catalog", "import", v2})
		if err := c.Start(); err != nil {
			t.Fatal(err)
		}
		time.Sleep(at)
		c.Process.Kill()
		c.Wait()
		got := catalogVersions(t, db)
		if got != fmt.Sprintf("v1:%d", n) && got != fmt.Sprintf("v2:%d", n+m) {
			t.Errorf("killed after %s: the catalog holds %s, neither the old (v1:%d) nor the new (v2:%d)", at, got, n, n+m)
		}
		states[got]++
	}
	t.Logf("a whole import took %s; after the kills: %v", full, states)
}

// killCSV is n plano-convex parts whose descriptions carry the version
// (invented parts).
func killCSV(n int, version string) string {
	var b strings.Builder
	b.WriteString("supplier,part,description,diameter,r1,r2,t1,glass1\n")
	for i := range n {
		fmt.Fprintf(&b, "KILLTEST,P%03d,%s,12.7,%g,inf,3,517642\n", i, version, 20+float64(i))
	}
	return b.String()
}

// catalogVersions opens the catalog as the next command would (SQLite
// rolls back what a killed writer left) and says which versions its parts
// carry, "v1:300" for one; it fails the test when SQLite finds the file
// damaged.
func catalogVersions(t *testing.T, path string) string {
	t.Helper()
	e, out, errb := storeEnv(t, nil)
	if code := runCLI(e, "--db", path, "catalog", "list", "--supplier", "KILLTEST", "--columns", "name,description", "--format", "csv"); code != 0 {
		t.Fatalf("listing %s after the kill: exit %d %s", path, code, errb)
	}
	count := map[string]int{}
	for _, line := range strings.Split(strings.TrimSpace(out.String()), "\n")[1:] {
		_, desc, _ := strings.Cut(line, ",")
		count[desc]++
	}
	db, err := sql.Open("sqlite", path)
	if err != nil {
		t.Fatal(err)
	}
	defer db.Close()
	var ok string
	if err := db.QueryRowContext(context.Background(), "PRAGMA integrity_check").Scan(&ok); err != nil || ok != "ok" {
		t.Errorf("%s: integrity check: %q %v", path, ok, err)
	}
	var parts []string
	for v, c := range count {
		parts = append(parts, fmt.Sprintf("%s:%d", v, c))
	}
	return strings.Join(parts, " ")
}

// The first import, which builds the catalog beside its place and puts it
// there when done (catalog.OpenNew), killed at any moment leaves no
// catalog or the whole new one; an import after it creates the catalog as
// usual (in place, as a file left beside it by the killed import may be
// another import's).
func TestKilledFirstImport(t *testing.T) {
	if testing.Short() {
		t.Skip("-short: starts and kills a dozen processes")
	}
	const n = 3000
	dir := t.TempDir()
	csv := filepath.Join(dir, "first.csv")
	must(t, os.WriteFile(csv, []byte(killCSV(n, "v1")), 0o644))
	self, err := os.Executable()
	if err != nil {
		t.Fatal(err)
	}
	whole := filepath.Join(dir, "whole.db")
	start := time.Now()
	if code, _, errs := runChild(t, childCommand(self, dir, []string{"--db", whole, "catalog", "import", csv})); code != 0 {
		t.Fatalf("the whole import failed: %d %s", code, errs)
	}
	full := time.Since(start)
	if got := catalogVersions(t, whole); got != fmt.Sprintf("v1:%d", n) {
		t.Fatalf("the whole import left %s", got)
	}
	states := map[string]int{}
	const moments = 10
	for i := 0; i <= moments; i++ {
		at := full * time.Duration(i) / moments * 5 / 4
		db := filepath.Join(dir, fmt.Sprintf("killed-%02d.db", i))
		c := childCommand(self, dir, []string{"--db", db, "catalog", "import", csv})
		if err := c.Start(); err != nil {
			t.Fatal(err)
		}
		time.Sleep(at)
		c.Process.Kill()
		c.Wait()
		got := "none"
		if _, err := os.Stat(db); err == nil {
			got = catalogVersions(t, db)
			if got != fmt.Sprintf("v1:%d", n) {
				t.Errorf("killed after %s: the catalog holds %s, not the whole import (v1:%d)", at, got, n)
			}
		}
		states[got]++
		if got == "none" {
			if code, _, errs := runChild(t, childCommand(self, dir, []string{"--db", db, "catalog", "import", csv})); code != 0 {
				t.Fatalf("importing after the kill: %d %s", code, errs)
			}
			if got := catalogVersions(t, db); got != fmt.Sprintf("v1:%d", n) {
				t.Errorf("the import after the kill left %s", got)
			}
		}
	}
	t.Logf("a whole first import took %s; after the kills: %v", full, states)
}
