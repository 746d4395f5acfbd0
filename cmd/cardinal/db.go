package main

import (
	"context"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"strings"

	"github.com/spf13/cobra"

	"cardinal/catalog"
	"cardinal/catalog/record"
)

// addDBFlag adds the persistent --db flag every command reads.
func addDBFlag(root *cobra.Command) {
	root.PersistentFlags().String("db", "", "catalog file (default: $CARDINAL_DB, else $XDG_DATA_HOME/cardinal/catalog.db, else ~/.local/share/cardinal/catalog.db)")
}

// dbFlag reads the persistent --db flag of the command line, "" if unset
// or if the command runs without the root command (in tests).
func dbFlag(cmd *cobra.Command) string {
	if f := cmd.Flag("db"); f != nil {
		return f.Value.String()
	}
	return ""
}

// A catalogLocation is where the catalog file is, and whether the user
// named it (--db or CARDINAL_DB) or it is the default in the data directory.
type catalogLocation struct {
	Path     string
	Explicit bool
}

// locateCatalog finds the catalog file: --db, then $CARDINAL_DB, then
// $XDG_DATA_HOME/cardinal/catalog.db, then ~/.local/share/cardinal/catalog.db
// (XDG Base Directory Specification 0.8: data files go under
// $XDG_DATA_HOME, by default $HOME/.local/share; a relative
// XDG_DATA_HOME is ignored).
func locateCatalog(flag string, e *env) (catalogLocation, error) {
	if flag != "" {
		return catalogLocation{flag, true}, nil
	}
	if p := e.Getenv("CARDINAL_DB"); p != "" {
		return catalogLocation{p, true}, nil
	}
	if d := e.Getenv("XDG_DATA_HOME"); filepath.IsAbs(d) {
		return catalogLocation{filepath.Join(d, "cardinal", "catalog.db"), false}, nil
	}
	if h := e.Getenv("HOME"); h != "" {
		return catalogLocation{filepath.Join(h, ".local", "share", "cardinal", "catalog.db"), false}, nil
	}
	return catalogLocation{}, usageErrorf("no place for the catalog: neither --db, CARDINAL_DB, XDG_DATA_HOME nor HOME is set; give --db PATH")
}

// exists tells whether the catalog file is there.
func (l catalogLocation) exists() (bool, error) {
	_, err := os.Stat(l.Path)
	if errors.Is(err, fs.ErrNotExist) {
		return false, nil
	}
	if err != nil {
		return false, &catalog.OpenError{Path: l.Path, Reason: "cannot be reached; check the path and its permissions", Err: err}
	}
	return true, nil
}

// openForRead opens the user's catalog or, when there is none yet at the
// default location, the built-in demo catalog, saying so in one line on
// stderr. A catalog the user named (--db or CARDINAL_DB) must exist: read
// commands never create one. Every read command (list, export, find,
// inspect PART) opens the catalog this way; it writes nothing to a file
// that is not a catalog yet, and opens read only what the user may not
// write.
func openForRead(flag string, e *env) (*catalog.Store, error) {
	loc, err := locateCatalog(flag, e)
	if err != nil {
		return nil, err
	}
	ok, err := loc.exists()
	if err != nil {
		return nil, err
	}
	if !ok && !loc.Explicit {
		notef(e, "cardinal: no catalog at %s yet: using the built-in demo catalog (invented parts); add your own with 'cardinal catalog import FILE'\n", loc.Path)
		return openDemo(loc, e)
	}
	return upgraded(e)(catalog.OpenRead(loc.Path))
}

// openDemo opens the demo catalog kept beside where the user's catalog
// would be (demo-VERSION.db), so that searches run on it last until the
// next command; where no file can be written there, an in-memory one.
func openDemo(loc catalogLocation, e *env) (*catalog.Store, error) {
	path := keptDemoPath(loc)
	if prepareDir(loc) == nil {
		if s, err := catalog.OpenDemoAt(path); err == nil {
			return s, nil
		}
	}
	notef(e, "cardinal: cannot keep the demo catalog at %s: searches on it last for this run only\n", path)
	return catalog.OpenDemo()
}

// openForWrite opens the user's catalog to change it. With create, a
// missing file is created (and the default data directory with it);
// otherwise a missing file is an error, so that a command with nothing to
// change leaves no empty catalog behind.
func openForWrite(flag string, e *env, create bool) (*catalog.Store, error) {
	return openWriting(flag, e, create, catalog.Open)
}

// openForCreate opens the catalog an import of parts writes to, creating
// it when missing as catalog.OpenNew does: built beside its place and put
// there once the import is done.
func openForCreate(flag string, e *env) (*catalog.Store, error) {
	return openWriting(flag, e, true, catalog.OpenNew)
}

// openWriting is openForWrite opening a missing catalog with create.
func openWriting(flag string, e *env, create bool, open func(string) (*catalog.Store, error)) (*catalog.Store, error) {
	loc, err := locateCatalog(flag, e)
	if err != nil {
		return nil, err
	}
	ok, err := loc.exists()
	if err != nil {
		return nil, err
	}
	if !ok && !create {
		return nil, &cmdError{exitNotFound, errNoCatalog{loc.Path}}
	}
	if !ok {
		if err := prepareDir(loc); err != nil {
			return nil, err
		}
		if p := catalog.StagedBeside(loc.Path); p != "" {
			notef(e, "cardinal: %s is there: another import is building this catalog, or one was stopped before it finished; this one creates the catalog in place (delete that file when no import is running)\n", p)
		}
		return upgraded(e)(open(loc.Path))
	}
	return upgraded(e)(catalog.Open(loc.Path))
}

// upgraded says on stderr when opening a catalog brought a file written by
// an older version up to date, which takes a few seconds for a large
// catalog, once.
func upgraded(e *env) func(*catalog.Store, error) (*catalog.Store, error) {
	return func(st *catalog.Store, err error) (*catalog.Store, error) {
		if err == nil && st.UpgradedFrom() > 0 {
			notef(e, "cardinal: brought the catalog %s up to this version's layout (schema %d to %d), once: it stays readable by this version and newer ones only\n",
				st.Path(), st.UpgradedFrom(), catalog.SchemaVersion())
		}
		return st, err
	}
}

// errNoCatalog says that the catalog to change does not exist yet.
type errNoCatalog struct{ path string }

func (e errNoCatalog) Error() string {
	return fmt.Sprintf("no catalog at %s yet: import one first with 'cardinal catalog import FILE'", e.path)
}

// prepareDir creates the default data directory; a directory the user
// named must exist already.
func prepareDir(loc catalogLocation) error {
	dir := filepath.Dir(loc.Path)
	if !loc.Explicit {
		if err := os.MkdirAll(dir, 0o755); err != nil {
			return usageErrorf("cannot create the catalog directory %s: %v; give another place with --db or CARDINAL_DB", dir, err)
		}
		return nil
	}
	st, err := os.Stat(dir)
	if err != nil || !st.IsDir() {
		return usageErrorf("catalog %s: the directory %s does not exist; create it or choose another path", loc.Path, dir)
	}
	return nil
}

// catalogError returns the catalog's error as it is: its typed errors
// map to exit codes in one place (errors.go, describe).
func catalogError(err error) error { return err }

// importErrorf reports the rows that stopped an import, one per line as
// FILE:LINE: SUPPLIER:PART: column: reason, and that nothing changed.
func importErrorf(file string, err error) error {
	var ie *catalog.ImportError
	if !errors.As(err, &ie) {
		return catalogError(err)
	}
	lines := make([]string, len(ie.Rows))
	for i, r := range ie.Rows {
		r2 := r
		r2.Line = 0
		lines[i] = fmt.Sprintf("%s:%d: %s", file, r.Line, r2.Error())
	}
	return usageErrorf("%s: %d problem(s); nothing was changed. Fix these and import again:\n%s", file, len(lines), strings.Join(lines, "\n"))
}

// readInputFile reads a file to import; "-" is standard input.
func readInputFile(name string, e *env) ([]byte, error) {
	var b []byte
	var err error
	if name == "-" {
		b, err = io.ReadAll(e.In)
	} else {
		b, err = os.ReadFile(name)
	}
	switch {
	case errors.Is(err, fs.ErrNotExist):
		return nil, notFoundErrorf("%s: no such file", name)
	case err != nil:
		return nil, &cmdError{exitUsage, fmt.Errorf("%s: cannot be read (%w); check the path and its permissions", name, err)}
	}
	return b, nil
}

// catalogEntries reads the named parts from the catalog opened for
// reading, in the order given, by the part-name rules of
// catalog.ResolvePart (the same as inspect --file --part); every name the
// catalog lacks is reported with close names.
func catalogEntries(flag string, e *env, names []string) ([]record.Entry, error) {
	s, err := e.stores().Read(flag)
	if err != nil {
		return nil, err
	}
	defer s.Close()
	ctx := context.Background()
	ids, err := s.PartNames(ctx)
	if err != nil {
		return nil, catalogError(err)
	}
	picked, missing := catalog.ResolveParts(names, ids, "")
	if len(missing) > 0 {
		return nil, partsNotFound(missing)
	}
	out := make([]record.Entry, len(picked))
	for i, j := range picked {
		if out[i], err = s.Part(ctx, ids[j]); err != nil {
			return nil, catalogError(err)
		}
	}
	return out, nil
}
