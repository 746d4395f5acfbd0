package main

import (
	"os"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
)

// A catalog the user may read but not write (a shared lab catalog owned
// by someone else, or one in a folder the user cannot write): the reading
// commands work, find prints its results and says the run was not saved,
// a command that writes is refused with exit 2 and a message that says
// why, and the file stays byte for byte as it was.
//
// Permissions do not hold for root, so a test run as root runs the
// program as user nobody in a child process (the test binary, copied where
// nobody may run it); where root may not switch users, it skips.
func TestReadOnlyCatalog(t *testing.T) {
	if testing.Short() && os.Getuid() == 0 {
		t.Skip("-short, as root: the runs as user nobody start a dozen processes")
	}
	base := preparedCatalog(t)
	for _, tc := range []struct {
		name   string
		folder bool // the folder read-only, the file the user's own; else the file read-only
	}{
		{"file mode 0444", false},
		{"read-only folder", true},
	} {
		t.Run(tc.name, func(t *testing.T) {
			run, dir := readOnlyRunner(t)
			db := filepath.Join(dir, "cat.db")
			copyFile(t, base, db)
			lenses, err := os.ReadFile(demoLensesCSV)
			if err != nil {
				t.Fatal(err)
			}
			csv := filepath.Join(filepath.Dir(dir), "more.csv")
			if err := os.WriteFile(csv, []byte(strings.ReplaceAll(string(lenses), "DEMO,", "OTHER,")), 0o644); err != nil {
				t.Fatal(err)
			}
			if tc.folder {
				if os.Getuid() == 0 {
					must(t, os.Chown(db, nobody, nobody)) // the file is the user's own
				}
				must(t, os.Chmod(dir, 0o555))
			} else {
				must(t, os.Chmod(db, 0o444))
			}
			t.Cleanup(func() { os.Chmod(dir, 0o755); os.Chmod(db, 0o644) })
			before := fileHash(t, db)
			for _, step := range []struct {
				args      []string
				code      int
				stdout    string
				stderr    []string
				notStderr string
			}{
				{[]string{"catalog", "list", "--supplier", "DEMO"}, 0, "DEMO:PCX-50", nil, "cardinal:"},
				{[]string{"searches", "list"}, 0, "50", nil, "cardinal:"},
				{[]string{"inspect", "DEMO:PCX-50"}, 0, "EFL", nil, "cardinal:"},
				{[]string{"request", "last", "--pick", "1"}, 0, "DEMO:", nil, "cardinal:"},
				{[]string{"find", "--efl", "100", "--efl-tol", "5%", "--top", "3"}, 0, "100.0", []string{"not saved", "read-only for you"}, "saved as search"},
				{[]string{"catalog", "import", csv}, 2, "", []string{db, "read-only", "choose a writable path"}, "internal error"},
				{[]string{"drawer", "set", "DEMO:PCX-50", "--quantity", "2"}, 2, "", []string{db, "read-only"}, "internal error"},
			} {
				code, out, errs := run(t, append([]string{"--db", db}, step.args...)...)
				errs = unwrap(errs)
				name := strings.Join(step.args[:2], " ")
				if code != step.code {
					t.Errorf("%s: exit %d, want %d\nstderr: %s", name, code, step.code, errs)
				}
				if !strings.Contains(out, step.stdout) {
					t.Errorf("%s: stdout lacks %q:\n%.400s", name, step.stdout, out)
				}
				for _, s := range step.stderr {
					if !strings.Contains(errs, s) {
						t.Errorf("%s: stderr lacks %q:\n%s", name, s, errs)
					}
				}
				if strings.Contains(errs, step.notStderr) {
					t.Errorf("%s: stderr has %q:\n%s", name, step.notStderr, errs)
				}
			}
			if after := fileHash(t, db); after != before {
				t.Errorf("the read-only catalog changed")
			}
		})
	}
}

// readOnlyRunner runs the program in-process for a user whom permissions
// bind, or as user nobody in a child process for root; dir is a folder for
// the catalog that the user (or nobody) may write.
func readOnlyRunner(t *testing.T) (func(t *testing.T, args ...string) (int, string, string), string) {
	if os.Getuid() != 0 {
		dir := t.TempDir()
		return func(t *testing.T, args ...string) (int, string, string) {
			e, out, errb := storeEnv(t, nil)
			code := runCLI(e, args...)
			return code, out.String(), errb.String()
		}, dir
	}
	top, err := os.MkdirTemp("", "cardinal-readonly-")
	if err != nil {
		t.Fatal(err)
	}
	t.Cleanup(func() { os.RemoveAll(top) })
	must(t, os.Chmod(top, 0o755))
	dir := filepath.Join(top, "catalog")
	must(t, os.Mkdir(dir, 0o777))
	must(t, os.Chmod(dir, 0o777))
	self, err := os.Executable()
	if err != nil {
		t.Fatal(err)
	}
	bin := filepath.Join(top, "cardinal.test")
	b, err := os.ReadFile(self)
	if err != nil {
		t.Fatal(err)
	}
	must(t, os.WriteFile(bin, b, 0o755))
	probe := childCommand(bin, top, []string{"version"})
	asNobody(probe)
	if err := probe.Run(); err != nil {
		if pe, ok := err.(*os.PathError); ok && pe.Err == syscall.EPERM {
			t.Skip("running as root, which permissions do not bind, and not allowed to run the program as user nobody: the read-only cases do not apply")
		}
		t.Fatalf("running the program as user nobody: %v", err)
	}
	return func(t *testing.T, args ...string) (int, string, string) {
		c := childCommand(bin, top, args)
		asNobody(c)
		return runChild(t, c)
	}, dir
}

func must(t *testing.T, err error) {
	t.Helper()
	if err != nil {
		t.Fatal(err)
	}
}
