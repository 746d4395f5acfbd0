package catalog

import (
	"context"
	"database/sql"

	"cardinal/optics"
)

// toleranceKeys are the settings keys of the default part tolerances.
var toleranceKeys = []string{"efl_tol_pct", "thickness_tol_mm", "index_tol", "radius_tol_pct"}

func toleranceFields(t *optics.Tolerances) []*float64 {
	return []*float64{&t.EFLPct, &t.Thickness, &t.Index, &t.RadiusPct}
}

// PartTolerances returns the catalog's tolerances for a part that states
// none: those set with SetPartTolerances, the rest from
// optics.DefaultTolerances.
func (s *Store) PartTolerances(ctx context.Context) (optics.Tolerances, error) {
	t := optics.DefaultTolerances
	fs := toleranceFields(&t)
	for i, k := range toleranceKeys {
		var v float64
		err := s.db.QueryRowContext(ctx, "SELECT value FROM settings WHERE key = ?", k).Scan(&v)
		switch {
		case err == sql.ErrNoRows:
		case err != nil:
			return optics.Tolerances{}, err
		default:
			*fs[i] = v
		}
	}
	return t, nil
}

// SetPartTolerances stores the catalog's tolerances for a part that states
// none; every field is stored, zero included (a radius tolerance of 0 is
// none).
func (s *Store) SetPartTolerances(ctx context.Context, t optics.Tolerances) error {
	if err := t.Validate(); err != nil {
		return err
	}
	tx, err := s.db.BeginTx(ctx, nil)
	if err != nil {
		return s.wrapWriteError(err)
	}
	defer tx.Rollback()
	for i, v := range toleranceFields(&t) {
		if _, err := tx.ExecContext(ctx, "INSERT INTO settings (key, value) VALUES (?, ?) ON CONFLICT (key) DO UPDATE SET value = excluded.value",
			toleranceKeys[i], *v); err != nil {
			return s.wrapWriteError(err)
		}
	}
	return s.wrapWriteError(tx.Commit())
}
