package catalog

import (
	"context"
	"database/sql"
	"errors"
	"fmt"
	"strings"

	"cardinal/optics"
)

// A GlassAlias is a name some supplier sheets use for a glass, and the
// glass it stands for: a six-digit glass code, a built-in glass or one of
// the user's glasses.
type GlassAlias struct {
	Name, Target string
}

// SetGlassAlias stores an alias, replacing one of the same name (names are
// case-insensitive); replaced says whether it did. The name must not be a
// glass already (air, a six-digit code, a built-in or user glass), and the
// target must be one.
func (s *Store) SetGlassAlias(ctx context.Context, name, target string) (replaced bool, err error) {
	name, target = strings.TrimSpace(name), strings.TrimSpace(target)
	if name == "" || target == "" {
		return false, &AliasError{Name: name, Reason: "give a name and a glass"}
	}
	tx, err := s.db.BeginTx(ctx, nil)
	if err != nil {
		return false, s.wrapWriteError(err)
	}
	defer tx.Rollback()
	glasses, err := readGlassTable(ctx, tx)
	if err != nil {
		return false, err
	}
	if m, err := glasses.Lookup(name); err == nil {
		return false, &AliasError{Name: name, Reason: fmt.Sprintf("is already a glass (%s); an alias must be a new name", m.Name())}
	}
	m, err := glasses.Lookup(target)
	if err != nil {
		return false, &AliasError{Name: name, Reason: fmt.Sprintf("%v; the target must be a six-digit glass code (517642: nd 1.517, Vd 64.2), a built-in glass or one you imported with 'cardinal glass import'", err)}
	}
	var old string
	err = tx.QueryRowContext(ctx, "SELECT target FROM glass_aliases WHERE name = ?", name).Scan(&old)
	if err != nil && !errors.Is(err, sql.ErrNoRows) {
		return false, err
	}
	replaced = err == nil
	if _, err := tx.ExecContext(ctx, `INSERT INTO glass_aliases (name, target) VALUES (?, ?)
		ON CONFLICT (name) DO UPDATE SET name = excluded.name, target = excluded.target`, name, m.Name()); err != nil {
		return false, s.wrapWriteError(err)
	}
	return replaced, s.wrapWriteError(tx.Commit())
}

// RemoveGlassAlias removes an alias; parts imported through it keep their
// glass.
func (s *Store) RemoveGlassAlias(ctx context.Context, name string) error {
	res, err := s.db.ExecContext(ctx, "DELETE FROM glass_aliases WHERE name = ?", strings.TrimSpace(name))
	if err != nil {
		return s.wrapWriteError(err)
	}
	if n, _ := res.RowsAffected(); n == 0 {
		return &NotFoundError{What: "glass alias", Name: name}
	}
	return nil
}

// GlassAliases lists the aliases by name.
func (s *Store) GlassAliases(ctx context.Context) ([]GlassAlias, error) {
	return readAliases(ctx, s.db)
}

func readAliases(ctx context.Context, q querier) ([]GlassAlias, error) {
	rows, err := q.QueryContext(ctx, "SELECT name, target FROM glass_aliases ORDER BY name")
	if err != nil {
		return nil, err
	}
	defer rows.Close()
	var out []GlassAlias
	for rows.Next() {
		var a GlassAlias
		if err := rows.Scan(&a.Name, &a.Target); err != nil {
			return nil, err
		}
		out = append(out, a)
	}
	return out, rows.Err()
}

// addAliases puts each alias into the glass table under its own name, as
// the medium of its target, so a part read through an alias stores the
// target. A glass of the same name wins over an alias; an alias whose
// target is gone is left out.
func addAliases(ctx context.Context, q querier, t optics.GlassTable) error {
	aliases, err := readAliases(ctx, q)
	if err != nil {
		return err
	}
	for _, a := range aliases {
		key := strings.ToLower(a.Name)
		if _, taken := t[key]; taken {
			continue
		}
		if m, err := t.Lookup(a.Target); err == nil {
			t[key] = m
		}
	}
	return nil
}

// An AliasError says why an alias cannot be stored.
type AliasError struct {
	Name, Reason string
}

func (e *AliasError) Error() string { return fmt.Sprintf("glass alias %q: %s", e.Name, e.Reason) }
