package catalog

import (
	"cmp"
	"context"
	"database/sql"
	"fmt"
	"slices"
	"strings"

	"cardinal/catalog/record"
	"cardinal/optics"
)

// An Index is the search index of a catalog as read: every part's record
// in the order of its name (SUPPLIER:PART), with the drawer quantities, and
// the catalog snapshot it came from held open so that full prescriptions
// read later (Entries) are of the same catalog. Close it when done.
type Index struct {
	Parts []IndexPart
	// Glasses are the media the parts use, numbered as IndexPart.Glass
	// numbers them; Media holds them resolved in the catalog's glass table.
	Glasses []string
	Media   []optics.Medium
	tx      *sql.Tx
}

// IndexOptions narrow what SearchIndex reads. The zero value reads every
// part.
type IndexOptions struct {
	InDrawer bool // only the parts with at least one piece in the drawer
}

// SearchIndex reads the search index: one sequential read of the index
// table (a few large rows, each the records of thousands of parts), one
// of the drawer and one of the user's glasses, inside one read
// transaction that the Index keeps until Close.
func (s *Store) SearchIndex(ctx context.Context, o IndexOptions) (*Index, error) {
	tx, err := s.db.BeginTx(ctx, &sql.TxOptions{ReadOnly: true})
	if err != nil {
		return nil, err
	}
	ix := &Index{tx: tx}
	if err := ix.read(ctx, o); err != nil {
		tx.Rollback()
		return nil, err
	}
	return ix, nil
}

// Close ends the read transaction.
func (ix *Index) Close() error {
	if ix.tx == nil {
		return nil
	}
	err := ix.tx.Rollback()
	ix.tx = nil
	return err
}

func (ix *Index) read(ctx context.Context, o IndexOptions) error {
	var n int
	// The count sizes the slices, so that 200,000 records are not copied
	// over and over while the slice grows.
	if err := ix.tx.QueryRowContext(ctx, "SELECT coalesce(sum(parts), 0) FROM search_index").Scan(&n); err != nil {
		return err
	}
	drawer, err := readQuantities(ctx, ix.tx)
	if err != nil {
		return err
	}
	if o.InDrawer {
		n = min(n, len(drawer))
	}
	if err := ix.readRecords(ctx, n, drawer, o.InDrawer); err != nil {
		return err
	}
	glasses, err := readGlassTable(ctx, ix.tx)
	if err != nil {
		return err
	}
	ix.Media = make([]optics.Medium, len(ix.Glasses))
	for i, g := range ix.Glasses {
		if ix.Media[i], err = glasses.Lookup(g); err != nil {
			return fmt.Errorf("search index: %w", err)
		}
	}
	return nil
}

// readRecords decodes every record into ix.Parts, in the order of the
// parts' names; n is their number.
func (ix *Index) readRecords(ctx context.Context, n int, drawer map[int64]int, inDrawer bool) error {
	rows, err := ix.tx.QueryContext(ctx, "SELECT records FROM search_index ORDER BY chunk")
	if err != nil {
		return err
	}
	defer rows.Close()
	ix.Parts = make([]IndexPart, 0, n)
	d := newIndexDecoder(n)
	keep := func(p *IndexPart) bool {
		p.Quantity = drawer[p.ID]
		return !inDrawer || p.Quantity > 0
	}
	var chunk sql.RawBytes
	for rows.Next() {
		if err := rows.Scan(&chunk); err != nil {
			return err
		}
		if ix.Parts, err = d.decodeChunk(chunk, ix.Parts, keep); err != nil {
			return err
		}
	}
	if err := rows.Err(); err != nil {
		return err
	}
	ix.Glasses = d.glasses
	// The chunks hold the parts in the order of their ids, which is the
	// order of their names for the parts of one import; sort only when
	// later imports interleaved them.
	byName := func(a, b IndexPart) int { return compareIDs(a.Supplier, a.Name, b.Supplier, b.Name) }
	if !slices.IsSortedFunc(ix.Parts, byName) {
		slices.SortFunc(ix.Parts, byName)
	}
	return nil
}

// compareIDs compares SUPPLIER:PART of two parts as strings (the order of
// their names everywhere in the catalog), without building them.
func compareIDs(as, an, bs, bn string) int {
	if as == bs {
		return strings.Compare(an, bn)
	}
	la, lb := len(as)+1+len(an), len(bs)+1+len(bn)
	for i := range min(la, lb) {
		if ca, cb := idByte(as, an, i), idByte(bs, bn, i); ca != cb {
			return cmp.Compare(ca, cb)
		}
	}
	return cmp.Compare(la, lb)
}

// idByte is byte i of supplier + ":" + name.
func idByte(supplier, name string, i int) byte {
	switch {
	case i < len(supplier):
		return supplier[i]
	case i == len(supplier):
		return ':'
	default:
		return name[i-len(supplier)-1]
	}
}

// readQuantities returns the drawer quantities by part id.
func readQuantities(ctx context.Context, q querier) (map[int64]int, error) {
	rows, err := q.QueryContext(ctx, "SELECT part_id, quantity FROM drawer WHERE quantity > 0")
	if err != nil {
		return nil, err
	}
	defer rows.Close()
	out := map[int64]int{}
	for rows.Next() {
		var id int64
		var n int
		if err := rows.Scan(&id, &n); err != nil {
			return nil, err
		}
		out[id] = n
	}
	return out, rows.Err()
}

// Entries reads the full prescriptions of the parts with these ids, from
// the snapshot the index was read from, keyed by id.
func (ix *Index) Entries(ctx context.Context, ids []int64) (map[int64]record.Entry, error) {
	if ix.tx == nil {
		panic("catalog: Index.Entries after Close")
	}
	out := make(map[int64]record.Entry, len(ids))
	if len(ids) == 0 {
		return out, nil
	}
	glasses, err := readGlassTable(ctx, ix.tx)
	if err != nil {
		return nil, err
	}
	args := make([]any, len(ids))
	for i, id := range ids {
		args[i] = id
	}
	entries, got, err := readEntries(ctx, ix.tx, "p.id IN ("+placeholders(len(ids))+")", args, glasses)
	if err != nil {
		return nil, err
	}
	for i, id := range got {
		out[id] = entries[i]
	}
	return out, nil
}
