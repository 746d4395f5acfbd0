package catalog

import (
	"context"
	"database/sql"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"strings"

	"modernc.org/sqlite"
	sqlite3 "modernc.org/sqlite/lib"
)

// applicationID marks a database file as a cardinal catalog (PRAGMA
// application_id; "CARD" in ASCII). Migration 1 sets it.
const applicationID = 0x43415244

// Memory is the path that opens a fresh, private in-memory catalog.
const Memory = ":memory:"

// A Store is an open catalog: the user's parts, glasses, drawer and saved
// searches in one SQLite file. It is safe for use by several goroutines.
type Store struct {
	db   *sql.DB
	path string
}

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
	db, err := sql.Open("sqlite", dsn(path))
	if err != nil {
		return nil, fmt.Errorf("opening catalog %s: %w", path, err)
	}
	if path == Memory {
		// Every new connection to ":memory:" is a new, empty database: keep one.
		db.SetMaxOpenConns(1)
	}
	s := &Store{db: db, path: path}
	if err := s.prepare(context.Background()); err != nil {
		db.Close()
		return nil, err
	}
	return s, nil
}

// Close closes the database.
func (s *Store) Close() error { return s.db.Close() }

// dsn is the connection string for modernc.org/sqlite. Foreign keys are on
// for every connection so that removing a part removes its surfaces,
// computed columns, warnings and drawer row with it, and so that no row can
// point at a part that is not there. busy_timeout lets a second writer wait
// for the first instead of failing; write transactions begin IMMEDIATE so
// that two importers queue up rather than fail half-way with a stale
// snapshot (read transactions stay deferred).
func dsn(path string) string {
	q := "?_pragma=foreign_keys(1)&_pragma=busy_timeout(10000)&_pragma=cache_size(-65536)&_pragma=temp_store(2)&_pragma=mmap_size(268435456)&_txlock=immediate"
	if path == Memory {
		return Memory + q
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
	if err := s.migrate(ctx, version); err != nil {
		return s.wrapWriteError(err)
	}
	if s.path == Memory {
		return nil
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

// wrapWriteError turns SQLite's failures to open or write the file into
// messages that say what to do.
func (s *Store) wrapWriteError(err error) error {
	if err == nil {
		return nil
	}
	var se *sqlite.Error
	if errors.As(err, &se) {
		switch se.Code() & 0xff {
		case sqlite3.SQLITE_READONLY, sqlite3.SQLITE_PERM, sqlite3.SQLITE_CANTOPEN:
			return &OpenError{Path: s.path, Reason: "cannot be created or written here (read-only location or no permission); choose a writable path with --db or CARDINAL_DB", Err: err}
		case sqlite3.SQLITE_NOTADB:
			return &OpenError{Path: s.path, Reason: "is not a cardinal catalog (not an SQLite database); choose another file with --db or CARDINAL_DB", Err: err}
		case sqlite3.SQLITE_CORRUPT:
			return &OpenError{Path: s.path, Reason: "is damaged (SQLite reports corruption); restore it from a backup or an export", Err: err}
		}
	}
	return fmt.Errorf("catalog %s: %w", s.path, err)
}
