package catalog

import (
	"context"
	"database/sql"
	"embed"
	"fmt"
	"io/fs"
	"sort"
	"strings"
)

// The schema migrations, numbered from 1 in their file names
// (0001_init.sql, 0002_...). Migration i brings the schema from version i-1
// to version i; PRAGMA user_version holds the version of a file.
//
//go:embed migrations/*.sql
var migrationFS embed.FS

var migrations = loadMigrations()

// A migration is one numbered script, and the name it has after its
// number (search_index.sql).
type migration struct {
	name, script string
}

// migrationHooks run after the script of every migration whose name
// contains their key, in the same transaction: the work SQL alone cannot
// do. A migration that empties search_index (its name containing
// "search_index") has the index rebuilt from the readable tables.
var migrationHooks = map[string]func(context.Context, *sql.Tx) error{
	"search_index": rebuildIndex,
}

func loadMigrations() []migration {
	names, err := fs.Glob(migrationFS, "migrations/*.sql")
	if err != nil {
		panic("catalog: " + err.Error())
	}
	sort.Strings(names)
	out := make([]migration, len(names))
	for i, n := range names {
		want := fmt.Sprintf("migrations/%04d_", i+1)
		if len(n) < len(want) || n[:len(want)] != want {
			panic(fmt.Sprintf("catalog: migration %s is out of sequence, want %s*.sql", n, want))
		}
		b, err := migrationFS.ReadFile(n)
		if err != nil {
			panic("catalog: " + err.Error())
		}
		out[i] = migration{name: n[len(want):], script: string(b)}
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

func (s *Store) applyMigration(ctx context.Context, version int, m migration) error {
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
	if _, err := tx.ExecContext(ctx, m.script); err != nil {
		return fmt.Errorf("migration %d: %w", version, err)
	}
	for key, hook := range migrationHooks {
		if strings.Contains(m.name, key) {
			if err := hook(ctx, tx); err != nil {
				return fmt.Errorf("migration %d: %w", version, err)
			}
		}
	}
	// PRAGMA takes no placeholders; version is our own integer.
	if _, err := tx.ExecContext(ctx, fmt.Sprintf("PRAGMA user_version = %d", version)); err != nil {
		return fmt.Errorf("migration %d: %w", version, err)
	}
	return tx.Commit()
}
