package main

import (
	"context"
	"database/sql"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"
)

// holdWriteLock takes the catalog's write lock from another connection, as
// a long import in another process does, until release is called.
func holdWriteLock(t *testing.T, path string) (release func()) {
	t.Helper()
	ctx := context.Background()
	db, err := sql.Open("sqlite", path)
	if err != nil {
		t.Fatal(err)
	}
	conn, err := db.Conn(ctx)
	if err != nil {
		t.Fatal(err)
	}
	if _, err := conn.ExecContext(ctx, "BEGIN IMMEDIATE"); err != nil {
		t.Fatal(err)
	}
	done := false
	release = func() {
		if done {
			return
		}
		done = true
		conn.ExecContext(ctx, "ROLLBACK")
		conn.Close()
		db.Close()
	}
	t.Cleanup(release)
	return release
}

// A second writer waits for the first (CARDINAL_LOCK_WAIT, short here) and
// then either does its work or gives up saying that another command is
// writing, that nothing changed and to retry; a find whose save cannot get
// the lock still prints its results and says the run was not saved.
func TestLockWaiting(t *testing.T) {
	base := preparedCatalog(t)
	newPart := filepath.Join(t.TempDir(), "new.csv")
	must(t, os.WriteFile(newPart, []byte("supplier,part,diameter,r1,r2,t1,glass1\nLOCKTEST,PCX-1,25.4,51.7,inf,4,517642\n"), 0o644))
	for _, tc := range []struct {
		name    string
		wait    string        // CARDINAL_LOCK_WAIT
		release time.Duration // when the other writer lets go; 0 never
		args    []string
		code    int
		stdout  string
		stderr  []string
		changed bool
	}{
		{"import gives up", "0.2", 0, []string{"catalog", "import", newPart}, 2, "",
			[]string{"is busy", "another cardinal command", "did not finish within 200ms", "nothing was changed", "retry"}, false},
		{"drawer set gives up", "0.2", 0, []string{"drawer", "set", "DEMO:PCX-50", "--quantity", "1"}, 2, "",
			[]string{"is busy", "nothing was changed", "retry"}, false},
		{"find prints, not saved", "0.2", 0, []string{"find", "--efl", "100", "--efl-tol", "5%", "--top", "3"}, 0, "100.0",
			[]string{"not saved (the results are printed)", "is busy"}, false},
		{"import waits, then imports", "20", 300 * time.Millisecond, []string{"catalog", "import", newPart}, 0, "LOCKTEST:PCX-1", nil, true},
		{"a terminal is told of the wait", "20", lockNoticeAfter + 300*time.Millisecond, []string{"catalog", "import", newPart}, 0, "LOCKTEST:PCX-1",
			[]string{"waiting for another cardinal command to finish writing", "at most 20s"}, true},
	} {
		t.Run(tc.name, func(t *testing.T) {
			db := filepath.Join(t.TempDir(), "cat.db")
			copyFile(t, base, db)
			before := fileHash(t, db)
			release := holdWriteLock(t, db)
			if tc.release > 0 {
				timer := time.AfterFunc(tc.release, release)
				defer timer.Stop()
			}
			e, out, errb := storeEnv(t, map[string]string{"CARDINAL_LOCK_WAIT": tc.wait})
			e.ErrTerminal = true
			code := runCLI(e, append([]string{"--db", db}, tc.args...)...)
			release()
			errs := unwrap(errb.String())
			if code != tc.code {
				t.Errorf("exit %d, want %d\nstderr: %s", code, tc.code, errs)
			}
			if !strings.Contains(out.String(), tc.stdout) {
				t.Errorf("stdout lacks %q:\n%.400s", tc.stdout, out.String())
			}
			for _, s := range tc.stderr {
				if !strings.Contains(errs, s) {
					t.Errorf("stderr lacks %q:\n%s", s, errs)
				}
			}
			if changed := fileHash(t, db) != before; changed != tc.changed {
				t.Errorf("catalog changed: %v, want %v", changed, tc.changed)
			}
		})
	}
}

// CARDINAL_LOCK_WAIT takes seconds from 0 to 3600; anything else is a
// usage error that names it.
func TestLockWaitSetting(t *testing.T) {
	for _, v := range []string{"-1", "abc", "NaN", "1e9", "3601"} {
		e, _, errb := storeEnv(t, map[string]string{"CARDINAL_LOCK_WAIT": v})
		if code := runCLI(e, "version"); code != exitUsage || !strings.Contains(errb.String(), "CARDINAL_LOCK_WAIT") {
			t.Errorf("CARDINAL_LOCK_WAIT=%s: exit %d, %s", v, code, errb)
		}
	}
	for _, v := range []string{"0", "2.5", "30s", "3600"} {
		e, _, errb := storeEnv(t, map[string]string{"CARDINAL_LOCK_WAIT": v})
		if code := runCLI(e, "version"); code != 0 {
			t.Errorf("CARDINAL_LOCK_WAIT=%s: exit %d, %s", v, code, errb)
		}
	}
}
