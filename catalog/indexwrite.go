package catalog

import (
	"context"
	"database/sql"

	"cardinal/catalog/record"
	"cardinal/optics"
)

// The search index is written by the same transactions that write what it
// is derived from: writePart (import), recomputeUsing (a changed glass) and
// rebuildIndex (migrations); removing a part removes its record through
// the foreign key. Nothing else writes parts, surfaces or glasses.

// indexRowSQL stores one record, replacing the part's old one.
const indexRowSQL = "INSERT OR REPLACE INTO search_index (id_key, part_id, record) VALUES (?, ?, ?)"

// writeIndexRow stores the record of part id, whose media must be those
// of the catalog's glass table (catalogMedia).
func writeIndexRow(ctx context.Context, tx *txWriter, id int64, e record.Entry) error {
	r := newIndexRecord(id, e)
	_, err := tx.exec(ctx, indexRowSQL, e.Part.ID(), id, r.encode(nil))
	return err
}

// catalogMedia returns the part with each medium replaced by the one the
// glass table holds under its name: the medium a search reads back.
// checkMedium has made sure the table knows every name.
func catalogMedia(p optics.Part, glasses optics.GlassTable) optics.Part {
	media := make([]optics.Medium, len(p.Media))
	for i, m := range p.Media {
		media[i] = m
		if m == nil {
			continue
		}
		if g, err := glasses.Lookup(m.Name()); err == nil {
			media[i] = g
		}
	}
	p.Media = media
	return p
}

// rebuildIndex writes the search index anew from the readable tables.
func rebuildIndex(ctx context.Context, tx *sql.Tx) error {
	if _, err := tx.ExecContext(ctx, "DELETE FROM search_index"); err != nil {
		return err
	}
	glasses, err := readGlassTable(ctx, tx)
	if err != nil {
		return err
	}
	entries, ids, err := readEntries(ctx, tx, "1", nil, glasses)
	if err != nil {
		return err
	}
	w := newTxWriter(tx)
	for i, e := range entries {
		if err := writeIndexRow(ctx, w, ids[i], e); err != nil {
			return err
		}
	}
	return nil
}

// RebuildIndex writes the search index anew from the parts, surfaces and
// glasses, in one transaction. The program keeps the index in step by
// itself; this is for a catalog whose tables were edited by hand in the
// sqlite3 shell.
func (s *Store) RebuildIndex(ctx context.Context) error {
	tx, err := s.db.BeginTx(ctx, nil)
	if err != nil {
		return s.wrapWriteError(err)
	}
	defer tx.Rollback()
	if err := rebuildIndex(ctx, tx); err != nil {
		return s.wrapWriteError(err)
	}
	return s.wrapWriteError(tx.Commit())
}
