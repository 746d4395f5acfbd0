package catalog

import (
	"errors"
	"fmt"
	"regexp"
	"slices"
	"strings"
	"time"

	"modernc.org/sqlite"
	sqlite3 "modernc.org/sqlite/lib"
)

// A BusyError says that another program holds the catalog's write lock
// (another import, usually) past the wait allowed (LockWait); nothing was
// changed.
type BusyError struct {
	Path string
	Wait time.Duration // how long the write waited
	Err  error
}

func (e *BusyError) Error() string {
	return fmt.Sprintf("catalog %s is busy: another cardinal command (an import?) is writing it and did not finish within %s; nothing was changed here: retry when it has finished", e.Path, e.Wait)
}
func (e *BusyError) Unwrap() error { return e.Err }

// classify turns the SQLite failures of a store method into the typed
// errors that name the file and say what to do: a busy lock, a damaged
// or foreign file, a file that cannot be written. Others keep the path.
func (s *Store) classify(errp *error) {
	err := *errp
	if err == nil {
		return
	}
	var (
		oe *OpenError
		nf *NotFoundError
		ie *ImportError
		be *BusyError
		re *RefError
	)
	if errors.As(err, &oe) || errors.As(err, &nf) || errors.As(err, &ie) || errors.As(err, &be) || errors.As(err, &re) {
		return
	}
	*errp = s.wrapWriteError(err)
}

// sqliteCode is the primary result code of an SQLite error, 0 for others.
func sqliteCode(err error) int {
	var se *sqlite.Error
	if errors.As(err, &se) {
		return se.Code() & 0xff
	}
	return 0
}

// wrapWriteError turns SQLite's failures to open, read or write the file
// into messages that say what to do.
func (s *Store) wrapWriteError(err error) error {
	if err == nil {
		return nil
	}
	switch sqliteCode(err) {
	case sqlite3.SQLITE_BUSY, sqlite3.SQLITE_LOCKED:
		return &BusyError{Path: s.path, Wait: s.wait, Err: err}
	case sqlite3.SQLITE_READONLY, sqlite3.SQLITE_PERM, sqlite3.SQLITE_CANTOPEN:
		return &OpenError{Path: s.path, Reason: "cannot be created or written here (read-only location or no permission); choose a writable path with --db or CARDINAL_DB", Err: err, ReadOnly: true}
	case sqlite3.SQLITE_NOTADB:
		return &OpenError{Path: s.path, Reason: "is not a cardinal catalog (not an SQLite database); choose another file with --db or CARDINAL_DB", Err: err}
	case sqlite3.SQLITE_CORRUPT:
		return &OpenError{Path: s.path, Reason: "is damaged (SQLite reports corruption); restore it from a backup or an export, or import your data into a new catalog", Err: err}
	case sqlite3.SQLITE_IOERR:
		return &OpenError{Path: s.path, Reason: "cannot be read or written (input/output error from the disk or device); give the path of a catalog file on a working disk", Err: err}
	case sqlite3.SQLITE_FULL:
		return &OpenError{Path: s.path, Reason: "cannot grow: the disk is full; free space and retry (nothing was changed)", Err: err}
	}
	return fmt.Errorf("catalog %s: %w", s.path, err)
}

// tablesOf lists the tables the migrations up to version leave behind:
// each CREATE TABLE adds one, DROP TABLE removes it, ALTER TABLE ...
// RENAME TO renames it.
func tablesOf(version int) []string {
	var ts []string
	for _, m := range migrations[:min(version, len(migrations))] {
		for _, st := range tableStatement.FindAllStringSubmatch(m.script, -1) {
			verb, name, to := strings.ToUpper(st[1]), strings.ToLower(st[2]), strings.ToLower(st[3])
			switch {
			case strings.HasPrefix(verb, "CREATE"):
				ts = append(ts, name)
			case strings.HasPrefix(verb, "DROP"):
				ts = slices.DeleteFunc(ts, func(t string) bool { return t == name })
			case to != "":
				for i := range ts {
					if ts[i] == name {
						ts[i] = to
					}
				}
			}
		}
	}
	return ts
}

var tableStatement = regexp.MustCompile(`(?i)(CREATE TABLE|DROP TABLE|ALTER TABLE)\s+(?:IF (?:NOT )?EXISTS\s+)?(\w+)(?:\s+RENAME TO\s+(\w+))?`)
