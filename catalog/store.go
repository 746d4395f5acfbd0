package catalog

import (
	"context"
	"database/sql"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"strings"
	"sync/atomic"
	"syscall"
	"time"
)

// applicationID marks a database file as a cardinal catalog (PRAGMA
// application_id; "CARD" in ASCII). Migration 1 sets it.
const applicationID = 0x43415244

// Memory is the path that opens a fresh, private in-memory catalog.
const Memory = ":memory:"

// A Store is an open catalog: the user's parts, glasses, drawer and saved
// searches in one SQLite file. It is safe for use by several goroutines.
type Store struct {
	db       *sql.DB
	path     string
	wait     time.Duration // how long a write waits for another writer
	readOnly bool
	reading  bool // opened by OpenRead: never creates a schema
	// stage is the file a new catalog is built in until its first import
	// puts it in place at path (OpenNew); "" for every other store.
	stage string
	// upgradedFrom is the schema version the file had when this store
	// brought it up to date, 0 when it did not.
	upgradedFrom int
}

// UpgradedFrom is the schema version of a catalog written by an older
// version of the program that opening it brought up to date (the
// migrations, among them rebuilding the search index, run once, in the
// open); 0 when the file was current or new.
func (s *Store) UpgradedFrom() int { return s.upgradedFrom }

// Path is the file the store was opened from, or Memory.
func (s *Store) Path() string { return s.path }

// Open opens the catalog file at path, creating it if it does not exist and
// bringing its schema up to date. It refuses, changing nothing, a file that is
// not a cardinal catalog and one written by a newer version of the program.
// Memory opens a fresh in-memory catalog.
func Open(path string) (*Store, error) {
	if path == "" {
		return nil, errors.New("catalog: no database path given")
	}
	if path != Memory {
		if err := checkFile(path); err != nil {
			return nil, err
		}
	}
	return openWith(path, "", false)
}

// openWith opens the file with the dsnMode given; reading is true for
// OpenRead (a file without a catalog yet is refused, not created).
func openWith(path, mode string, reading bool) (*Store, error) {
	db, err := sql.Open("sqlite", dsnMode(path, mode))
	if err != nil {
		return nil, fmt.Errorf("opening catalog %s: %w", path, err)
	}
	if path == Memory {
		// Every new connection to ":memory:" is a new, empty database: keep one.
		db.SetMaxOpenConns(1)
	}
	s := &Store{db: db, path: path, readOnly: mode != "", reading: reading, wait: LockWait()}
	if err := s.prepare(context.Background()); err != nil {
		db.Close()
		return nil, err
	}
	return s, nil
}

// Close closes the database (and deletes the file of a new catalog whose
// import did not complete: OpenNew).
func (s *Store) Close() error {
	err := s.db.Close()
	if s.stage != "" {
		removeStage(s.stage)
		s.stage = ""
	}
	return err
}

// dsn is the connection string for modernc.org/sqlite. Foreign keys are on
// for every connection so that removing a part removes its surfaces,
// computed columns, warnings and drawer row with it, and so that no row can
// point at a part that is not there. busy_timeout lets a second writer wait
// for the first instead of failing; write transactions begin IMMEDIATE so
// that two importers queue up rather than fail half-way with a stale
// snapshot (read transactions stay deferred). The page cache is SQLite's
// default (about 2 MiB) and the file is not memory-mapped: a 64 MiB cache
// cost about 1 s of system time to free after a 50,000-part import, and a
// 256 MiB mapping added 17 MiB (50,000 parts) to 70 MiB (200,000) to the
// resident memory of a find, for no CPU saved (DEVELOPERS.md, "Speed").
func dsn(path string) string {
	return dsnMode(path, "")
}

// DefaultLockWait is how long a write waits for another writer (an import
// in another process) to finish before it gives up with a *BusyError,
// unless SetLockWait says otherwise.
const DefaultLockWait = 30 * time.Second

// lockWait is the wait of the stores opened from now on, in nanoseconds.
var lockWait atomic.Int64

func init() { lockWait.Store(int64(DefaultLockWait)) }

// LockWait is how long a write of a store opened now waits for another
// writer before it gives up with a *BusyError.
func LockWait() time.Duration { return time.Duration(lockWait.Load()) }

// SetLockWait sets how long the writes of the stores opened from now on
// wait for another writer (the command line's CARDINAL_LOCK_WAIT); a
// store keeps the wait it was opened with.
func SetLockWait(d time.Duration) { lockWait.Store(int64(max(d, 0))) }

// dsnMode adds mode to the connection string: "" read-write, "ro" read
// only, "ro-immutable" read only without locks for a file in a folder no
// one can write (SQLite's immutable URI parameter).
func dsnMode(path, mode string) string {
	q := fmt.Sprintf("?_pragma=foreign_keys(1)&_pragma=busy_timeout(%d)&_pragma=temp_store(2)&_txlock=immediate", LockWait().Milliseconds())
	if path == Memory {
		return Memory + q
	}
	switch mode {
	case "ro":
		q += "&mode=ro"
	case "ro-immutable":
		q += "&mode=ro&immutable=1"
	}
	// A file: URI, so that '?' and '#' in a file name are escaped, not parsed.
	r := strings.NewReplacer("%", "%25", "?", "%3f", "#", "%23")
	return "file:" + r.Replace(path) + q
}

// checkFile refuses, before SQLite touches it, a path that is a directory or
// a file that is not an SQLite database.
func checkFile(path string) error {
	f, err := os.Open(path)
	if errors.Is(err, fs.ErrNotExist) {
		return nil
	}
	if err != nil {
		return fmt.Errorf("opening catalog %s: %w", path, err)
	}
	defer f.Close()
	st, err := f.Stat()
	if err != nil {
		return fmt.Errorf("opening catalog %s: %w", path, err)
	}
	if st.IsDir() {
		return &OpenError{Path: path, Reason: "is a directory; give the path of a catalog file"}
	}
	if !st.Mode().IsRegular() {
		return &OpenError{Path: path, Reason: "is not a regular file (a device or pipe); give the path of a catalog file"}
	}
	head := make([]byte, 16)
	n, err := io.ReadFull(f, head)
	if n == 0 {
		return nil // an empty file becomes a new catalog
	}
	if err != nil || string(head) != "SQLite format 3\x00" {
		return &OpenError{Path: path, Reason: "is not a cardinal catalog (not an SQLite database at all); choose another file with --db or CARDINAL_DB"}
	}
	return nil
}

// prepare checks that the database is ours and not newer, runs the
// migrations it lacks, and turns on write-ahead logging.
func (s *Store) prepare(ctx context.Context) error {
	version, err := s.checkOwner(ctx)
	if err != nil {
		return err
	}
	if err := s.checkTables(ctx, version); err != nil {
		return err
	}
	switch {
	case s.reading && version == 0:
		return &OpenError{Path: s.path, Missing: true, Reason: "holds no catalog yet (an SQLite file without tables); create one there with 'cardinal catalog import FILE'"}
	case s.readOnly && version < len(migrations):
		return &OpenError{Path: s.path, ReadOnly: true, Reason: fmt.Sprintf("was written by an older version of cardinal (schema %d of %d) and is read-only here; run any cardinal command on it once with write access to bring it up to date", version, len(migrations))}
	case s.readOnly:
		return nil // read only: the journal mode is the file's own
	}
	if err := s.migrate(ctx, version); err != nil {
		return s.wrapWriteError(err)
	}
	if version > 0 && version < len(migrations) {
		s.upgradedFrom = version
	}
	if s.path == Memory || s.stage != "" {
		return nil // a catalog being built turns WAL on when done (finishBuild)
	}
	// WAL lets readers see the last committed catalog while an import
	// writes the next one: a list during an import shows the old or the
	// new catalog, never half of each, and neither waits for the other.
	var mode string
	if err := s.db.QueryRowContext(ctx, "PRAGMA journal_mode = WAL").Scan(&mode); err != nil {
		return s.wrapWriteError(err)
	}
	if !strings.EqualFold(mode, "wal") {
		return &OpenError{Path: s.path, Reason: "cannot use write-ahead logging here (journal mode " + mode + "); put the catalog on a local disk"}
	}
	return nil
}

// checkOwner reads the application id and schema version and refuses a
// database that is not ours or is newer than this program.
func (s *Store) checkOwner(ctx context.Context) (version int, err error) {
	var app int64
	if err := s.db.QueryRowContext(ctx, "PRAGMA application_id").Scan(&app); err != nil {
		return 0, s.wrapWriteError(err)
	}
	if err := s.db.QueryRowContext(ctx, "PRAGMA user_version").Scan(&version); err != nil {
		return 0, s.wrapWriteError(err)
	}
	if app == 0 && version == 0 {
		var n int
		if err := s.db.QueryRowContext(ctx, "SELECT count(*) FROM sqlite_schema").Scan(&n); err != nil {
			return 0, s.wrapWriteError(err)
		}
		if n > 0 {
			return 0, &OpenError{Path: s.path, Reason: "is an SQLite database of another program, not a cardinal catalog; choose another file with --db or CARDINAL_DB"}
		}
		return 0, nil
	}
	if app != applicationID {
		return 0, &OpenError{Path: s.path, Reason: fmt.Sprintf("is an SQLite database of another program (application id %#x), not a cardinal catalog; choose another file with --db or CARDINAL_DB", app)}
	}
	if version > len(migrations) {
		return 0, &OpenError{Path: s.path, Reason: fmt.Sprintf("was written by a newer version of cardinal (schema %d; this program knows up to %d); upgrade cardinal to use it", version, len(migrations))}
	}
	return version, nil
}

// checkTables refuses a catalog that lacks a table its schema version
// should hold (a damaged or hand-edited file), before any query fails on
// it half-way.
func (s *Store) checkTables(ctx context.Context, version int) error {
	rows, err := s.db.QueryContext(ctx, "SELECT lower(name) FROM sqlite_schema WHERE type = 'table'")
	if err != nil {
		return s.wrapWriteError(err)
	}
	defer rows.Close()
	have := map[string]bool{}
	for rows.Next() {
		var n string
		if err := rows.Scan(&n); err != nil {
			return s.wrapWriteError(err)
		}
		have[n] = true
	}
	if err := rows.Err(); err != nil {
		return s.wrapWriteError(err)
	}
	for _, t := range tablesOf(version) {
		if !have[t] {
			return &OpenError{Path: s.path, Reason: "is damaged: its table " + t + " is missing; restore it from a backup or an export, or import your data into a new catalog"}
		}
	}
	return nil
}

// OpenRead opens an existing catalog file for reading, writing nothing
// to a file that is not a cardinal catalog yet: a missing or empty file,
// or an SQLite database without tables, is an *OpenError with Missing
// set. A catalog the user may not write (its file or folder read-only)
// opens read only; then SaveSearch fails with an *OpenError with
// ReadOnly set, and everything else works. A writable catalog of an older
// schema is brought up to date as Open does.
func OpenRead(path string) (*Store, error) {
	st, err := os.Stat(path)
	switch {
	case errors.Is(err, fs.ErrNotExist):
		return nil, &OpenError{Path: path, Missing: true, Reason: "does not exist; create it with 'cardinal catalog import FILE' (with the same --db or CARDINAL_DB), or leave both unset to use the demo catalog", Err: err}
	case err != nil:
		return nil, &OpenError{Path: path, Reason: "cannot be read (" + err.Error() + "); check its permissions or give another path with --db", Err: err}
	case st.Mode().IsRegular() && st.Size() == 0:
		return nil, &OpenError{Path: path, Missing: true, Reason: "is an empty file, not a catalog yet; create one there with 'cardinal catalog import FILE'"}
	}
	if err := checkFile(path); err != nil {
		return nil, err
	}
	if writable(path) && writable(filepath.Dir(path)) {
		return openWith(path, "", true)
	}
	s, err := openWith(path, "ro", true)
	if err != nil {
		s, err = openWith(path, "ro-immutable", true)
	}
	if err == nil {
		s.readOnly = true
	}
	return s, err
}

// writable tells whether this process may write path (access(2)).
func writable(path string) bool {
	return syscall.Access(path, 2) == nil // W_OK
}

// ReadOnly tells whether the store was opened read only (OpenRead on a
// catalog the user may not write).
func (s *Store) ReadOnly() bool { return s.readOnly }
