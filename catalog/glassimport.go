package catalog

import (
	"context"
	"database/sql"
	"fmt"

	"cardinal/importers"
)

// A GlassReport tells what a glass import did (or would do, in a dry run).
type GlassReport struct {
	Added, Updated, Unchanged []string // glass names
	// Recomputed lists the parts (SUPPLIER:PART) whose computed columns
	// were worked out again because a glass they use changed.
	Recomputed []string
	DryRun     bool
}

// ImportGlasses adds the user's glasses and updates those of the same name
// (names are case-insensitive), then recomputes every part that uses a
// changed glass, all in one transaction: a list with any bad glass changes
// nothing and returns an *ImportError naming every one. With dryRun the
// report is worked out and nothing is kept.
func (s *Store) ImportGlasses(ctx context.Context, glasses []importers.Glass, dryRun bool) (_ GlassReport, err error) {
	defer s.classify(&err)
	rep := GlassReport{DryRun: dryRun}
	if bad := checkGlasses(glasses); len(bad) > 0 {
		return rep, &ImportError{Rows: bad}
	}
	rows := make([]glassRow, len(glasses))
	for i, g := range glasses {
		r, err := encodeGlass(g)
		if err != nil {
			return rep, fmt.Errorf("line %d: glass %s: %w", g.Line, g.Name, err)
		}
		rows[i] = r
	}
	tx, err := s.db.BeginTx(ctx, nil)
	if err != nil {
		return rep, s.wrapWriteError(err)
	}
	defer tx.Rollback()
	var changed []string
	for _, r := range rows {
		old, found, err := storedGlass(ctx, tx, r.name)
		if err != nil {
			return rep, err
		}
		switch {
		case found && old == r:
			rep.Unchanged = append(rep.Unchanged, r.name)
			continue
		case found:
			rep.Updated = append(rep.Updated, r.name)
		default:
			rep.Added = append(rep.Added, r.name)
		}
		changed = append(changed, r.name)
		if _, err := tx.ExecContext(ctx, `INSERT INTO glasses (name, formula, coefficients, min_nm, max_nm, source)
			VALUES (?, ?, ?, ?, ?, ?) ON CONFLICT (name) DO UPDATE SET name = excluded.name,
			formula = excluded.formula, coefficients = excluded.coefficients, min_nm = excluded.min_nm,
			max_nm = excluded.max_nm, source = excluded.source`,
			r.name, r.formula, r.coefficients, r.min, r.max, r.source); err != nil {
			return rep, s.wrapWriteError(err)
		}
	}
	if rep.Recomputed, err = recomputeUsing(ctx, tx, changed); err != nil {
		return rep, err
	}
	if dryRun {
		return rep, nil
	}
	return rep, s.wrapWriteError(tx.Commit())
}

// recomputeUsing works out again the computed columns and the computed
// warnings of every part that uses one of the named glasses, and returns
// those parts' ids.
func recomputeUsing(ctx context.Context, tx *sql.Tx, names []string) ([]string, error) {
	if len(names) == 0 {
		return nil, nil
	}
	glasses, err := readGlassTable(ctx, tx)
	if err != nil {
		return nil, err
	}
	w := newTxWriter(tx)
	args := make([]any, len(names))
	for i, n := range names {
		args[i] = n
	}
	where := "p.id IN (SELECT part_id FROM surfaces WHERE glass IN (" + placeholders(len(names)) + "))"
	entries, ids, err := readEntries(ctx, tx, where, args, glasses)
	if err != nil {
		return nil, err
	}
	var out []string
	for i, e := range entries {
		if err := writeComputed(ctx, w, ids[i], e.Part); err != nil {
			return nil, err
		}
		if _, err := w.exec(ctx, "DELETE FROM warnings WHERE part_id = ? AND computed = 1", ids[i]); err != nil {
			return nil, err
		}
		if err := writeWarnings(ctx, w, ids[i], importers.ComputedWarnings(e), true); err != nil {
			return nil, err
		}
		writeIndexRow(w, ids[i], e)
		out = append(out, e.Part.ID())
	}
	return out, w.flushIndex(ctx)
}

// givenTwice says that a name or part appears twice in one file.
func givenTwice(firstLine int) string {
	if firstLine > 0 {
		return fmt.Sprintf("given twice (first on line %d)", firstLine)
	}
	return "given twice"
}
