package catalog

import (
	"context"
	"database/sql"
	"errors"
	"fmt"
	"math"

	"cardinal/importers"
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
func (s *Store) Import(ctx context.Context, entries []importers.Entry, dryRun bool) (ImportReport, error) {
	rep := ImportReport{DryRun: dryRun}
	tx, err := s.db.BeginTx(ctx, nil)
	if err != nil {
		return rep, s.wrapWriteError(err)
	}
	defer tx.Rollback()
	glasses, err := readGlassTable(ctx, tx)
	if err != nil {
		return rep, err
	}
	if bad := checkEntries(entries, glasses); len(bad) > 0 {
		return rep, &ImportError{Rows: bad}
	}
	w := newTxWriter(tx)
	for _, en := range entries {
		e := newStoredEntry(en)
		what, err := upsert(ctx, w, e, glasses)
		if err != nil {
			return rep, s.wrapWriteError(fmt.Errorf("line %d: %s: %w", e.Line, e.Part.ID(), err))
		}
		switch what {
		case added:
			rep.Added = append(rep.Added, e.Part.ID())
		case updated:
			rep.Updated = append(rep.Updated, e.Part.ID())
		default:
			rep.Unchanged = append(rep.Unchanged, e.Part.ID())
		}
		for _, w := range e.warnings() {
			rep.Warnings = append(rep.Warnings, RowError{Line: e.Line, ID: e.Part.ID(), Reason: w})
		}
	}
	if dryRun {
		return rep, nil
	}
	return rep, s.wrapWriteError(tx.Commit())
}

type upsertResult int

const (
	unchanged upsertResult = iota
	added
	updated
)

// upsert stores one entry unless the stored part is identical.
func upsert(ctx context.Context, tx *txWriter, e storedEntry, glasses optics.GlassTable) (upsertResult, error) {
	var id int64
	var fp string
	err := tx.QueryRowContext(ctx, "SELECT id, fingerprint FROM parts WHERE supplier = ? AND part = ?",
		e.Part.Supplier, e.Part.Name).Scan(&id, &fp)
	switch {
	case errors.Is(err, sql.ErrNoRows):
		_, err = writePart(ctx, tx, 0, e, glasses)
		return added, err
	case err != nil:
		return unchanged, err
	case fp == e.fingerprint:
		return unchanged, nil
	}
	_, err = writePart(ctx, tx, id, e, glasses)
	return updated, err
}

// checkEntries lists every problem in the entries: an invalid prescription,
// a medium the glass table does not know (or knows otherwise), a number that
// is not finite, a part given twice.
func checkEntries(entries []importers.Entry, glasses optics.GlassTable) []RowError {
	var bad []RowError
	seen := map[string]int{}
	for _, e := range entries {
		id := e.Part.ID()
		add := func(field, reason string) {
			bad = append(bad, RowError{Line: e.Line, ID: id, Field: field, Reason: reason})
		}
		if first, ok := seen[id]; ok {
			add("part", givenTwice(first))
		}
		seen[id] = e.Line
		for _, p := range checkEntry(e, glasses) {
			add(p.Field, p.Reason)
		}
	}
	return bad
}

// checkEntry returns the problems of one entry, keyed by CSV column name.
func checkEntry(e importers.Entry, glasses optics.GlassTable) optics.Problems {
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
