package catalog

import (
	"context"
	"database/sql"
	"errors"
	"fmt"
	"math"
	"slices"
	"strings"

	"cardinal/catalog/record"
	"cardinal/importers/parallel"
	"cardinal/optics"
)

// An ImportReport tells what an import did (or would do, in a dry run).
type ImportReport struct {
	Added, Updated, Unchanged []string // SUPPLIER:PART, in file order
	// Warnings are the warnings of every imported row, with its line.
	Warnings []RowError
	DryRun   bool
}

// Import adds new parts and updates the parts of the same supplier and name,
// in one transaction: if any entry is bad, nothing changes and the
// *ImportError lists every problem with its line. A row identical to the
// stored part is left alone, so importing the same file twice changes
// nothing the second time. Media must be known to the catalog's glass table
// (built-in glasses, six-digit codes, air, or the user's glasses). With
// dryRun every check runs and nothing is kept.
//
// The first import into a store of OpenNew builds the catalog and puts it
// in place.
func (s *Store) Import(ctx context.Context, entries []record.Entry, dryRun bool) (_ ImportReport, err error) {
	defer s.classify(&err)
	building := s.stage != "" && !dryRun
	rep, err := s.importTx(ctx, entries, dryRun, building)
	if err != nil || !building {
		return rep, err
	}
	published, err := s.publish()
	switch {
	case err != nil:
		return rep, s.wrapWriteError(err)
	case !published:
		// A catalog appeared at the path meanwhile (or the file could not
		// be linked there): import into it as usual.
		return s.Import(ctx, entries, dryRun)
	}
	return rep, nil
}

// importTx runs an import in one transaction on one connection; building
// is true for the first import into a new catalog (OpenNew), which is
// written without a journal and left in write-ahead logging mode.
func (s *Store) importTx(ctx context.Context, entries []record.Entry, dryRun, building bool) (_ ImportReport, err error) {
	rep := ImportReport{DryRun: dryRun}
	conn, err := s.db.Conn(ctx)
	if err != nil {
		return rep, s.wrapWriteError(err)
	}
	defer conn.Close()
	if building {
		for _, q := range buildPragmas {
			if _, err := conn.ExecContext(ctx, q); err != nil {
				return rep, s.wrapWriteError(err)
			}
		}
	}
	tx, err := conn.BeginTx(ctx, nil)
	if err != nil {
		return rep, s.wrapWriteError(err)
	}
	defer tx.Rollback()
	glasses, err := readGlassTable(ctx, tx)
	if err != nil {
		return rep, err
	}
	w := newConnWriter(conn, tx)
	defer w.close()
	if building {
		// Most of the file is written once the rows are in: the disk takes
		// it while SQLite builds the indexes, so that the sync before the
		// file is put in place (publish) finds little left to write.
		var synced chan struct{}
		w.rowsWritten = func() {
			synced = make(chan struct{})
			go func() {
				defer close(synced)
				syncFile(s.stage)
			}()
		}
		defer func() {
			if synced != nil {
				<-synced
			}
		}()
	}
	// Entries for parts the catalog holds are checked and worked out
	// first; new parts are checked and worked out on the processors while
	// the ones before them are written (writeNewParts). Any problem at all
	// ends the import with every problem listed (checkEntries).
	found, err := storedParts(ctx, w, entries)
	if err != nil {
		return rep, err
	}
	ids := make([]string, len(entries))
	seen := make(map[string]bool, len(entries))
	var known []int // entries of stored parts
	for i := range entries {
		ids[i] = entries[i].Part.ID()
		if seen[ids[i]] {
			return rep, &ImportError{Rows: checkEntries(entries, glasses)}
		}
		seen[ids[i]] = true
		if _, ok := found[ids[i]]; ok {
			known = append(known, i)
		}
	}
	problems := parallel.Map(len(known), func(k int) bool { return len(checkEntry(entries[known[k]], glasses)) > 0 })
	if slices.Contains(problems, true) {
		return rep, &ImportError{Rows: checkEntries(entries, glasses)}
	}
	stored := make([]storedEntry, len(entries))
	parallel.Map(len(known), func(k int) struct{} { stored[known[k]] = newStoredEntry(entries[known[k]]); return struct{}{} })
	var next int64
	if err := tx.QueryRowContext(ctx, "SELECT coalesce(max(id), 0) FROM parts").Scan(&next); err != nil {
		return rep, err
	}
	var fresh []newPart // added parts, written in batches
	for i, id := range ids {
		old, ok := found[id]
		e := stored[i]
		switch {
		case !ok:
			next++
			fresh = append(fresh, newPart{id: next, key: id, e: &stored[i], src: &entries[i]})
			rep.Added = append(rep.Added, id)
		case old.fingerprint == e.fingerprint:
			rep.Unchanged = append(rep.Unchanged, id)
		default:
			if _, err := writePart(ctx, w, old.id, e, glasses); err != nil {
				return rep, s.wrapWriteError(fmt.Errorf("line %d: %s: %w", e.Line, id, err))
			}
			rep.Updated = append(rep.Updated, id)
		}
	}
	// New parts take ids in the order of their names, so that the tables
	// keyed by name grow at their end.
	slices.SortFunc(fresh, func(a, b newPart) int { return strings.Compare(a.key, b.key) })
	for i := range fresh {
		fresh[i].id = next - int64(len(fresh)) + int64(i) + 1
	}
	switch err := writeNewParts(ctx, w, fresh, glasses, next-int64(len(fresh))); {
	case errors.Is(err, errBadEntry):
		return rep, &ImportError{Rows: checkEntries(entries, glasses)}
	case err != nil:
		return rep, s.wrapWriteError(err)
	}
	// Every entry is worked out now.
	for i, id := range ids {
		for _, msg := range stored[i].warnings() {
			rep.Warnings = append(rep.Warnings, RowError{Line: stored[i].Line, ID: id, Reason: msg})
		}
	}
	if err := w.flushIndex(ctx); err != nil {
		return rep, s.wrapWriteError(err)
	}
	if dryRun {
		return rep, nil
	}
	if err := tx.Commit(); err != nil {
		return rep, s.wrapWriteError(err)
	}
	if building {
		w.close() // no statement may be open while the journal mode changes
		return rep, s.wrapWriteError(finishBuild(ctx, conn))
	}
	return rep, nil
}

// A storedPart is the id and fingerprint of a part already stored.
type storedPart struct {
	id          int64
	fingerprint string
}

// storedParts finds the entries' parts already in the catalog, by
// SUPPLIER:PART: one query per entry for a few entries, one scan of the
// parts for many.
func storedParts(ctx context.Context, w *txWriter, entries []record.Entry) (map[string]storedPart, error) {
	out := map[string]storedPart{}
	if len(entries) < 64 {
		for _, e := range entries {
			var p storedPart
			err := w.QueryRowContext(ctx, "SELECT id, fingerprint FROM parts WHERE supplier = ? AND part = ?",
				e.Part.Supplier, e.Part.Name).Scan(&p.id, &p.fingerprint)
			switch {
			case errors.Is(err, sql.ErrNoRows):
			case err != nil:
				return nil, err
			default:
				out[e.Part.ID()] = p
			}
		}
		return out, nil
	}
	rows, err := w.QueryContext(ctx, "SELECT id, supplier, part, fingerprint FROM parts")
	if err != nil {
		return nil, err
	}
	defer rows.Close()
	for rows.Next() {
		var p storedPart
		var sup, part string
		if err := rows.Scan(&p.id, &sup, &part, &p.fingerprint); err != nil {
			return nil, err
		}
		out[sup+":"+part] = p
	}
	return out, rows.Err()
}

type upsertResult int

const (
	unchanged upsertResult = iota
	added
	updated
)

// checkEntries lists every problem in the entries: an invalid prescription,
// a medium the glass table does not know (or knows otherwise), a number that
// is not finite, a part given twice.
func checkEntries(entries []record.Entry, glasses optics.GlassTable) []RowError {
	var bad []RowError
	seen := make(map[string]int, len(entries))
	problems := parallel.Map(len(entries), func(i int) optics.Problems { return checkEntry(entries[i], glasses) })
	for i, e := range entries {
		id := e.Part.ID()
		add := func(field, reason string) {
			bad = append(bad, RowError{Line: e.Line, ID: id, Field: field, Reason: reason})
		}
		if first, ok := seen[id]; ok {
			add("part", givenTwice(first))
		}
		seen[id] = e.Line
		for _, p := range problems[i] {
			add(p.Field, p.Reason)
		}
	}
	return bad
}

// checkEntry returns the problems of one entry, keyed by CSV column name.
func checkEntry(e record.Entry, glasses optics.GlassTable) optics.Problems {
	p := e.Part
	n := len(p.Surfaces)
	if n < 2 || len(p.Thickness) != n-1 || len(p.Media) != n-1 {
		return optics.Problems{{Field: "r2", Reason: fmt.Sprintf("a part needs at least two surfaces and one thickness and material fewer (got %d, %d and %d)", n, len(p.Thickness), len(p.Media))}}
	}
	var ps optics.Problems
	if err := p.Validate(); err != nil {
		var vp optics.Problems
		if !errors.As(err, &vp) {
			return optics.Problems{{Field: "part", Reason: err.Error()}}
		}
		ps = append(ps, vp...)
	}
	for i, m := range p.Media {
		if m != nil {
			ps = append(ps, checkMedium(fmt.Sprintf("glass%d", i+1), m, glasses)...)
		}
	}
	for _, s := range p.Surfaces {
		for _, v := range append([]float64{s.Conic}, s.Asph[:]...) {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				return append(ps, optics.Problem{Field: "asph", Reason: "conic and asphere coefficients must be finite numbers"})
			}
		}
	}
	for _, v := range []struct {
		field string
		v     float64
	}{{"efl", e.StatedEFL}, {"bfd", e.StatedBFD}, {"edge_thickness", e.StatedEdge}, {"stated_wavelength", e.StatedWavelength}, {"price", e.Price}} {
		if math.IsNaN(v.v) || math.IsInf(v.v, 0) {
			ps = append(ps, optics.Problem{Field: v.field, Reason: "must be a finite number"})
		}
	}
	if e.Price < 0 {
		ps = append(ps, optics.Problem{Field: "price", Reason: "cannot be negative"})
	}
	if e.StatedWavelength < 0 {
		ps = append(ps, optics.Problem{Field: "stated_wavelength", Reason: "cannot be negative"})
	}
	return ps
}

// checkMedium makes sure the catalog will find the same medium under its
// name when it reads the part back.
func checkMedium(field string, m optics.Medium, glasses optics.GlassTable) optics.Problems {
	stored, err := glasses.Lookup(m.Name())
	if err != nil {
		return optics.Problems{{Field: field, Reason: err.Error() + "; add it first with 'cardinal glass import'"}}
	}
	a, b := m.Index(Wavelength), stored.Index(Wavelength)
	if math.IsNaN(a) || math.Abs(a-b) > 1e-12*math.Abs(b) {
		return optics.Problems{{Field: field, Reason: fmt.Sprintf("glass %q has index %.6f at the d line here but %.6f in the catalog's glass table", m.Name(), a, b)}}
	}
	return nil
}
