package catalog

import (
	"context"
	"embed"
	"fmt"
	"io/fs"
	"sort"
)

// The schema migrations, numbered from 1 in their file names
// (0001_init.sql, 0002_...). Migration i brings the schema from version i-1
// to version i; PRAGMA user_version holds the version of a file.
//
//go:embed migrations/*.sql
var migrationFS embed.FS

var migrations = loadMigrations()

func loadMigrations() []string {
	names, err := fs.Glob(migrationFS, "migrations/*.sql")
	if err != nil {
		panic("catalog: " + err.Error())
	}
	sort.Strings(names)
	out := make([]string, len(names))
	for i, n := range names {
		if want := fmt.Sprintf("migrations/%04d_", i+1); len(n) < len(want) || n[:len(want)] != want {
			panic(fmt.Sprintf("catalog: migration %s is out of sequence, want %s*.sql", n, want))
		}
		b, err := migrationFS.ReadFile(n)
		if err != nil {
			panic("catalog: " + err.Error())
		}
		out[i] = string(b)
	}
	return out
}

// SchemaVersion is the schema version this program writes.
func SchemaVersion() int { return len(migrations) }

// migrate applies the migrations after version, each in its own
// transaction together with the new user_version, so that a failure leaves
// the file at the last complete version.
func (s *Store) migrate(ctx context.Context, version int) error {
	for i := version; i < len(migrations); i++ {
		if err := s.applyMigration(ctx, i+1, migrations[i]); err != nil {
			return err
		}
	}
	return nil
}

func (s *Store) applyMigration(ctx context.Context, version int, script string) error {
	tx, err := s.db.BeginTx(ctx, nil)
	if err != nil {
		return err
	}
	defer tx.Rollback()
	// Another process may have applied it while this one waited for the lock.
	var current int
	if err := tx.QueryRowContext(ctx, "PRAGMA user_version").Scan(&current); err != nil {
		return err
	}
	if current >= version {
		return nil
	}
	if _, err := tx.ExecContext(ctx, script); err != nil {
		return fmt.Errorf("migration %d: %w", version, err)
	}
	// PRAGMA takes no placeholders; version is our own integer.
	if _, err := tx.ExecContext(ctx, fmt.Sprintf("PRAGMA user_version = %d", version)); err != nil {
		return fmt.Errorf("migration %d: %w", version, err)
	}
	return tx.Commit()
}
