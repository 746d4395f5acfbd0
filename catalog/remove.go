package catalog

import (
	"context"
	"database/sql"
	"errors"

	"cardinal/catalog/record"
)

// Remove deletes the part named SUPPLIER:PART with its surfaces, computed
// columns, warnings and drawer row (foreign keys cascade). It returns the
// drawer row the part had (zero if none), so that the caller can say what
// went with it. A name the catalog does not hold gives a *NotFoundError that
// suggests close names, and changes nothing.
func (s *Store) Remove(ctx context.Context, id string) (_ record.DrawerItem, err error) {
	defer s.classify(&err)
	tx, err := s.db.BeginTx(ctx, nil)
	if err != nil {
		return record.DrawerItem{}, s.wrapWriteError(err)
	}
	defer tx.Rollback()
	pid, err := lookupPart(ctx, tx, id)
	if err != nil {
		return record.DrawerItem{}, err
	}
	var it record.DrawerItem
	err = tx.QueryRowContext(ctx, `SELECT p.supplier, p.part, coalesce(d.quantity, 0), coalesce(d.location, '')
		FROM parts p LEFT JOIN drawer d ON d.part_id = p.id WHERE p.id = ?`, pid).
		Scan(&it.Supplier, &it.Part, &it.Quantity, &it.Location)
	if err != nil && !errors.Is(err, sql.ErrNoRows) {
		return record.DrawerItem{}, err
	}
	if _, err := tx.ExecContext(ctx, "DELETE FROM parts WHERE id = ?", pid); err != nil {
		return record.DrawerItem{}, s.wrapWriteError(err)
	}
	w := newTxWriter(tx)
	w.dropIndex(pid)
	if err := w.flushIndex(ctx); err != nil {
		return record.DrawerItem{}, s.wrapWriteError(err)
	}
	return it, s.wrapWriteError(tx.Commit())
}
