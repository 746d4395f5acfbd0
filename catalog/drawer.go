package catalog

import (
	"context"
	"database/sql"
	"errors"
	"fmt"

	"cardinal/catalog/record"
)

// Drawer returns the parts with at least one piece in the drawer, keyed by
// SUPPLIER:PART.
func (s *Store) Drawer(ctx context.Context) (_ map[string]record.DrawerItem, err error) {
	defer s.classify(&err)
	items, err := s.DrawerItems(ctx)
	if err != nil {
		return nil, err
	}
	out := make(map[string]record.DrawerItem, len(items))
	for _, it := range items {
		if it.Quantity > 0 {
			out[it.ID()] = it
		}
	}
	return out, nil
}

// DrawerItems returns every drawer row, those with none left included,
// ordered by supplier and part.
func (s *Store) DrawerItems(ctx context.Context) (_ []record.DrawerItem, err error) {
	defer s.classify(&err)
	rows, err := s.db.QueryContext(ctx, `SELECT p.supplier, p.part, d.quantity, d.location
		FROM drawer d JOIN parts p ON p.id = d.part_id ORDER BY p.supplier, p.part`)
	if err != nil {
		return nil, err
	}
	defer rows.Close()
	var out []record.DrawerItem
	for rows.Next() {
		var it record.DrawerItem
		if err := rows.Scan(&it.Supplier, &it.Part, &it.Quantity, &it.Location); err != nil {
			return nil, err
		}
		out = append(out, it)
	}
	return out, rows.Err()
}

// A DrawerReport tells what a drawer import did (or would do).
type DrawerReport struct {
	Added, Updated, Unchanged []string // SUPPLIER:PART
	DryRun                    bool
}

// ImportDrawer sets the quantity and location of each item's part, in one
// transaction: an item whose part is not in the catalog (the error suggests
// close names), a negative quantity or a part given twice changes nothing,
// and the *ImportError lists every problem with its line. Parts not in the
// list keep their drawer rows.
func (s *Store) ImportDrawer(ctx context.Context, items []record.DrawerItem, dryRun bool) (_ DrawerReport, err error) {
	defer s.classify(&err)
	rep := DrawerReport{DryRun: dryRun}
	tx, err := s.db.BeginTx(ctx, nil)
	if err != nil {
		return rep, s.wrapWriteError(err)
	}
	defer tx.Rollback()
	ids, bad, err := resolveItems(ctx, tx, items)
	if err != nil {
		return rep, err
	}
	if len(bad) > 0 {
		return rep, &ImportError{Rows: bad}
	}
	for i, it := range items {
		what, err := setDrawer(ctx, tx, ids[i], it.Quantity, it.Location)
		if err != nil {
			return rep, s.wrapWriteError(err)
		}
		switch what {
		case added:
			rep.Added = append(rep.Added, it.ID())
		case updated:
			rep.Updated = append(rep.Updated, it.ID())
		default:
			rep.Unchanged = append(rep.Unchanged, it.ID())
		}
	}
	if dryRun {
		return rep, nil
	}
	return rep, s.wrapWriteError(tx.Commit())
}

// resolveItems finds the part id of every item and lists every problem.
func resolveItems(ctx context.Context, tx *sql.Tx, items []record.DrawerItem) ([]int64, []RowError, error) {
	var bad []RowError
	ids := make([]int64, len(items))
	seen := map[string]int{}
	for i, it := range items {
		if first, ok := seen[it.ID()]; ok {
			bad = append(bad, RowError{Line: it.Line, ID: it.ID(), Field: "part", Reason: givenTwice(first)})
		}
		seen[it.ID()] = it.Line
		if it.Quantity < 0 {
			bad = append(bad, RowError{Line: it.Line, ID: it.ID(), Field: "quantity", Reason: fmt.Sprintf("%d is negative", it.Quantity)})
		}
		id, err := partID(ctx, tx, it.Supplier, it.Part)
		var nf *NotFoundError
		switch {
		case errors.As(err, &nf):
			bad = append(bad, RowError{Line: it.Line, ID: it.ID(), Field: "part", Reason: nf.Error()})
		case err != nil:
			return nil, nil, err
		}
		ids[i] = id
	}
	return ids, bad, nil
}

// SetDrawer sets how many of the part named SUPPLIER:PART are in the drawer
// and where; keepLocation leaves a stored location as it is. A part not in
// the catalog gives a *NotFoundError that suggests close names.
func (s *Store) SetDrawer(ctx context.Context, id string, quantity int, location string, keepLocation bool) (_ record.DrawerItem, err error) {
	defer s.classify(&err)
	if quantity < 0 {
		return record.DrawerItem{}, fmt.Errorf("quantity %d is negative", quantity)
	}
	tx, err := s.db.BeginTx(ctx, nil)
	if err != nil {
		return record.DrawerItem{}, s.wrapWriteError(err)
	}
	defer tx.Rollback()
	pid, err := lookupPart(ctx, tx, id)
	if err != nil {
		return record.DrawerItem{}, err
	}
	if keepLocation {
		err := tx.QueryRowContext(ctx, "SELECT location FROM drawer WHERE part_id = ?", pid).Scan(&location)
		if err != nil && !errors.Is(err, sql.ErrNoRows) {
			return record.DrawerItem{}, err
		}
	}
	if _, err := setDrawer(ctx, tx, pid, quantity, location); err != nil {
		return record.DrawerItem{}, s.wrapWriteError(err)
	}
	it := record.DrawerItem{Quantity: quantity, Location: location}
	if err := tx.QueryRowContext(ctx, "SELECT supplier, part FROM parts WHERE id = ?", pid).Scan(&it.Supplier, &it.Part); err != nil {
		return record.DrawerItem{}, err
	}
	return it, s.wrapWriteError(tx.Commit())
}

// setDrawer writes one drawer row unless it holds these values already.
func setDrawer(ctx context.Context, tx *sql.Tx, partID int64, quantity int, location string) (upsertResult, error) {
	var q int
	var loc string
	err := tx.QueryRowContext(ctx, "SELECT quantity, location FROM drawer WHERE part_id = ?", partID).Scan(&q, &loc)
	what := updated
	switch {
	case errors.Is(err, sql.ErrNoRows):
		what = added
	case err != nil:
		return unchanged, err
	case q == quantity && loc == location:
		return unchanged, nil
	}
	_, err = tx.ExecContext(ctx, `INSERT INTO drawer (part_id, quantity, location) VALUES (?, ?, ?)
		ON CONFLICT (part_id) DO UPDATE SET quantity = excluded.quantity, location = excluded.location`,
		partID, quantity, location)
	return what, err
}
