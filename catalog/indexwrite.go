package catalog

import (
	"context"
	"database/sql"
	"errors"
	"maps"
	"slices"

	"cardinal/catalog/record"
	"cardinal/optics"
)

// The search index is written by the same transactions that write what it
// is derived from: writePart (import), writeNewParts (the batched
// import), recomputeUsing (a changed glass), Remove and rebuildIndex
// (migrations). Each collects its records in its txWriter (putIndex,
// dropIndex) and calls flushIndex before it commits, which rewrites the
// chunks the changed parts fall in. Nothing else writes parts, surfaces
// or glasses.

// putIndex keeps the record of part id, to be written by flushIndex.
func (w *txWriter) putIndex(id int64, rec []byte) {
	if w.index == nil {
		w.index = map[int64][]byte{}
	}
	w.index[id] = rec
}

// dropIndex marks the record of part id (a part removed) to be taken out
// by flushIndex.
func (w *txWriter) dropIndex(id int64) { w.putIndex(id, nil) }

// flushIndex rewrites every chunk that holds a record put or dropped since
// the last flush: the records kept, put and not dropped, in the order of
// their ids.
func (w *txWriter) flushIndex(ctx context.Context) error {
	ids := slices.Sorted(maps.Keys(w.index))
	for len(ids) > 0 {
		c := chunkOf(ids[0])
		n := 1
		for n < len(ids) && chunkOf(ids[n]) == c {
			n++
		}
		if err := w.rewriteChunk(ctx, c, ids[:n]); err != nil {
			return err
		}
		ids = ids[n:]
	}
	clear(w.index)
	return nil
}

// rewriteChunk writes chunk c anew with the changes to the parts ids
// (sorted, all in c).
func (w *txWriter) rewriteChunk(ctx context.Context, c int64, ids []int64) error {
	var stored []byte
	err := w.QueryRowContext(ctx, "SELECT records FROM search_index WHERE chunk = ?", c).Scan(&stored)
	if err != nil && !errors.Is(err, sql.ErrNoRows) {
		return err
	}
	var old [][]byte
	if stored != nil {
		if old, err = splitChunk(stored); err != nil {
			return err
		}
	}
	// Merge the stored records with the changes, both in the order of ids.
	out := make([][]byte, 0, len(old)+len(ids))
	k := 0
	for _, rec := range old {
		id, err := recordID(rec)
		if err != nil {
			return err
		}
		for ; k < len(ids) && ids[k] < id; k++ {
			if r := w.index[ids[k]]; r != nil {
				out = append(out, r)
			}
		}
		if k < len(ids) && ids[k] == id {
			if r := w.index[id]; r != nil {
				out = append(out, r)
			}
			k++
			continue
		}
		out = append(out, rec)
	}
	for ; k < len(ids); k++ {
		if r := w.index[ids[k]]; r != nil {
			out = append(out, r)
		}
	}
	if len(out) == 0 {
		_, err := w.exec(ctx, "DELETE FROM search_index WHERE chunk = ?", c)
		return err
	}
	_, err = w.exec(ctx, "INSERT OR REPLACE INTO search_index (chunk, parts, records) VALUES (?, ?, ?)",
		c, len(out), encodeChunk(out))
	return err
}

// writeIndexRow keeps the record of part id, whose media must be those of
// the catalog's glass table (catalogMedia), for flushIndex.
func writeIndexRow(w *txWriter, id int64, e record.Entry) {
	r := newIndexRecord(id, e)
	w.putIndex(id, r.encode(nil))
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

// rebuildIndex writes the search index anew from the readable tables. A
// search_index table of the shape before chunks (migration 2, on the way
// to a later migration that replaces it and rebuilds) is left alone.
func rebuildIndex(ctx context.Context, tx *sql.Tx) error {
	var chunked int
	if err := tx.QueryRowContext(ctx,
		"SELECT count(*) FROM pragma_table_info('search_index') WHERE name = 'records'").Scan(&chunked); err != nil {
		return err
	}
	if chunked == 0 {
		return nil
	}
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
		writeIndexRow(w, ids[i], e)
	}
	return w.flushIndex(ctx)
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
