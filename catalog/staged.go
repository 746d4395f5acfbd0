package catalog

import (
	"context"
	"database/sql"
	"errors"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"
	"strings"
)

// stageSuffix names the file a new catalog is built in, beside the path
// it goes to (OpenNew).
const stageSuffix = ".importing"

// OpenNew opens the catalog to be created at path by one import: the
// store is built in a file of its own beside path (path + ".importing")
// and the first Import, once committed, puts that file in place at path
// in one step (a hard link, which fails rather than replace a file that
// appeared there meanwhile). Until then there is no catalog at path: an
// import killed at any moment leaves none (and the .importing file, which
// the next OpenNew of the same path leaves alone and which can be
// deleted), and a reader meanwhile finds no catalog there, as before the
// import began.
//
// Building a file no one else can see needs no rollback journal and no
// write-ahead log: its pages are written once, straight to the file, and
// synced once before it is put in place (a 50,000-part import writes
// about 58 MB; with the log it wrote them twice, to the log and again to
// the file at the checkpoint).
//
// When path exists, when the .importing file does (another first import
// is building it, or one was killed), or when the file system cannot
// link, OpenNew and Import do what Open and Import do.
func OpenNew(path string) (*Store, error) {
	if path == "" || path == Memory {
		return Open(path)
	}
	if _, err := os.Lstat(path); !errors.Is(err, fs.ErrNotExist) {
		return Open(path)
	}
	stage := path + stageSuffix
	f, err := os.OpenFile(stage, os.O_RDWR|os.O_CREATE|os.O_EXCL, 0o644)
	if err != nil {
		return Open(path)
	}
	f.Close()
	db, err := sql.Open("sqlite", dsnMode(stage, ""))
	if err != nil {
		removeStage(stage)
		return Open(path)
	}
	s := &Store{db: db, path: path, stage: stage, wait: LockWait()}
	if err := s.prepare(context.Background()); err != nil {
		db.Close()
		removeStage(stage)
		return Open(path)
	}
	return s, nil
}

// StagedBeside is the file a first import builds the catalog at path in
// (OpenNew) when one is there, "" when none is: another import's at work,
// or one left by an import that was stopped.
func StagedBeside(path string) string {
	stage := path + stageSuffix
	if _, err := os.Lstat(stage); err != nil {
		return ""
	}
	return stage
}

// removeStage deletes a file a new catalog was being built in, with the
// files SQLite keeps beside it.
func removeStage(stage string) {
	for _, suffix := range []string{"", "-journal", "-wal", "-shm"} {
		os.Remove(stage + suffix)
	}
}

// buildPragmas are the settings of the connection that writes a catalog
// being built (OpenNew): no journal, no syncs, as nothing else reads the
// file and it is synced once before it is put in place.
var buildPragmas = []string{"PRAGMA journal_mode = OFF", "PRAGMA synchronous = OFF"}

// finishBuild turns on write-ahead logging in the catalog being built, as
// every catalog has it (run on the connection that wrote it, after the
// commit).
func finishBuild(ctx context.Context, conn *sql.Conn) error {
	var mode string
	if err := conn.QueryRowContext(ctx, "PRAGMA journal_mode = WAL").Scan(&mode); err != nil {
		return err
	}
	if !strings.EqualFold(mode, "wal") {
		return fmt.Errorf("cannot use write-ahead logging here (journal mode %s)", mode)
	}
	return nil
}

// publish puts the catalog built beside s.path in place, and reopens the
// store on it. It returns false, with the store opened on whatever is at
// s.path now, when the file could not be put in place (a catalog appeared
// there meanwhile, or the file system has no hard links): the caller then
// imports into that catalog as usual.
func (s *Store) publish() (bool, error) {
	stage := s.stage
	s.stage = ""
	err := s.db.Close()
	if err == nil {
		if _, e := os.Lstat(stage + "-wal"); !errors.Is(e, fs.ErrNotExist) {
			err = fmt.Errorf("the write-ahead log of %s was not checkpointed", stage)
		}
	}
	if err == nil {
		err = syncFile(stage)
	}
	published := err == nil && os.Link(stage, s.path) == nil
	removeStage(stage)
	if published && publishedHook != nil {
		publishedHook(s.path)
	}
	if published {
		// The new name reaches the disk with its directory; a system that
		// cannot sync a directory (Windows) writes it through anyway.
		syncFile(filepath.Dir(s.path))
	}
	o, err := Open(s.path)
	if err != nil {
		return false, err
	}
	s.db, s.upgradedFrom = o.db, o.upgradedFrom
	return published, nil
}

// publishedHook, when set (by tests), is called with the path of a
// catalog just put in place, before the store opens it again.
var publishedHook func(path string)

// syncFile flushes a file or a directory to the disk.
func syncFile(path string) error {
	f, err := os.Open(path)
	if err != nil {
		return err
	}
	err = f.Sync()
	if e := f.Close(); err == nil {
		err = e
	}
	return err
}
