package catalog

import (
	"context"
	"errors"
	"math"
	"runtime"
	"slices"
	"strings"
	"sync/atomic"

	"cardinal/catalog/record"
	"cardinal/optics"
)

// A piped is a sequence of values worked out ahead, in runs, by
// goroutines on the processors, while its reader takes them in order.
type piped[T any] struct {
	runs  []chan []T
	ahead chan struct{} // a token for each run worked out and not yet read
	done  chan struct{} // closed by stop
	cur   []T
	base  int
}

// pipeRun is the number of values worked out together, and pipeAhead the
// number of runs worked out ahead of the reader at most (so that the
// values are not all held at once).
const (
	pipeRun   = 512
	pipeAhead = 4
)

// pipeline starts working out f(0), ..., f(n-1); at(i) waits for f(i).
// The values must be read in order; stop it when done.
func pipeline[T any](n int, f func(i int) T) *piped[T] {
	p := &piped[T]{runs: make([]chan []T, (n+pipeRun-1)/pipeRun), ahead: make(chan struct{}, pipeAhead),
		done: make(chan struct{})}
	for k := range p.runs {
		p.runs[k] = make(chan []T, 1)
	}
	var next atomic.Int64
	for range max(1, runtime.GOMAXPROCS(0)) {
		go func() {
			for {
				select {
				case p.ahead <- struct{}{}:
				case <-p.done:
					return
				}
				k := int(next.Add(1) - 1)
				if k >= len(p.runs) {
					<-p.ahead
					return
				}
				out := make([]T, min(pipeRun, n-k*pipeRun))
				for j := range out {
					out[j] = f(k*pipeRun + j)
				}
				p.runs[k] <- out
			}
		}()
	}
	return p
}

// stop ends the work of a pipeline whose reader stops early (and does
// nothing after the last value was read).
func (p *piped[T]) stop() { close(p.done) }

// at returns f(i), waiting for it; i must not go back.
func (p *piped[T]) at(i int) *T {
	for i >= p.base+len(p.cur) {
		p.base += len(p.cur)
		p.cur = <-p.runs[p.base/pipeRun]
		<-p.ahead
	}
	return &p.cur[i-p.base]
}

// A newPart is an entry to add under the id chosen for it.
type newPart struct {
	id  int64
	key string // SUPPLIER:PART
	e   *storedEntry
	// src, when set, is the entry not yet checked: writeNewParts checks
	// it and works out *e from it.
	src *record.Entry
}

// errBadEntry says that an entry writeNewParts checked has a problem
// (checkEntry).
var errBadEntry = errors.New("catalog: an entry has a problem")

// newRows is what the catalog stores of a new part besides its
// prescription, worked out ahead of the writer: the values of its rows in
// each table, row after row, and its index record.
type newRows struct {
	parts, surfaces, warnings, computed []any
	record                              []byte
	bad                                 bool // the entry has a problem: no rows
	// fullPart is false when the part states no tolerance and no coating:
	// parts then holds the columns before those, which take their default
	// (NULL). fullSurfaces is false when every surface is a plain sphere
	// or plane (conic and asphere coefficients exactly 0): surfaces then
	// holds part_id, idx, radius_mm, thickness_mm and glass, the others
	// taking their default (0). Fewer values to bind: binding is a third
	// of the time SQLite takes to insert the rows.
	fullPart, fullSurfaces bool
}

// newPartRows works out the rows of a new part.
func newPartRows(np newPart, glasses optics.GlassTable) newRows {
	e, id := np.e, np.id
	p := e.Part
	indexed := e.Entry
	indexed.Part = catalogMedia(p, glasses)
	rec := newIndexRecord(id, indexed)
	r := newRows{record: rec.encode(nil)}
	r.parts = []any{id, p.Supplier, p.Name, p.Description, p.Diameter, p.ClearAperture, kindOf(p),
		nullIfZero(e.StatedEFL), nullIfZero(e.StatedBFD), nullIfZero(e.StatedEdge),
		nullIfZero(e.StatedWavelength), nullIfZero(e.Price), e.Currency, e.URL, e.Notes, e.fingerprint}
	if tail := []any{nullIfZero(e.Tolerances.EFLPct), nullIfZero(e.Tolerances.Thickness), nullIfZero(e.Tolerances.Index),
		nullIfZero(e.Tolerances.RadiusPct), coatingValue(p.Coating)}; slices.ContainsFunc(tail, func(v any) bool { return v != nil }) {
		r.parts, r.fullPart = append(r.parts, tail...), true
	}
	r.fullSurfaces = slices.ContainsFunc(p.Surfaces, func(s optics.Surface) bool {
		return math.Float64bits(s.Conic) != 0 || slices.ContainsFunc(s.Asph[:], func(a float64) bool { return math.Float64bits(a) != 0 })
	})
	r.surfaces = make([]any, 0, 13*len(p.Surfaces))
	for k, s := range p.Surfaces {
		var thickness, glass any
		if k < len(p.Thickness) {
			thickness, glass = p.Thickness[k], mediumName(p.Media[k])
		}
		if !r.fullSurfaces {
			r.surfaces = append(r.surfaces, id, int64(k+1), radiusValue(s.Radius), thickness, glass)
			continue
		}
		r.surfaces = append(r.surfaces, id, int64(k+1), radiusValue(s.Radius), s.Conic,
			s.Asph[0], s.Asph[1], s.Asph[2], s.Asph[3], s.Asph[4], s.Asph[5], s.Asph[6], thickness, glass)
	}
	seq := int64(0)
	for _, list := range []struct {
		msgs     []string
		computed bool
	}{{e.other, false}, {e.computed, true}} {
		for _, m := range list.msgs {
			seq++
			r.warnings = append(r.warnings, id, seq, m, list.computed)
		}
	}
	length, aperture := p.Length(), p.Aperture()
	r.computed = make([]any, 0, 24)
	for _, rev := range []bool{false, true} {
		o := orient(p, rev)
		var efl, bfd, ffd, pp, ppp any
		if !o.Afocal {
			efl, bfd, ffd, pp, ppp = o.EFL, o.BFD, o.FFD, o.P, o.PPrime
		}
		r.computed = append(r.computed, id, o.Reversed, o.Wavelength, o.Power, efl, bfd, ffd, pp, ppp,
			length, p.Diameter, aperture)
	}
	return r
}

// writeNewParts adds the parts, computing their columns on the processors
// and writing every table in multi-row inserts: the same rows writePart
// writes, without its per-part deletes and lookups.
func writeNewParts(ctx context.Context, w *txWriter, parts []newPart, glasses optics.GlassTable, stored int64) (err error) {
	if len(parts) >= bulkParts && int64(len(parts)) >= stored {
		rebuild, err := dropIndexes(ctx, w)
		if err != nil {
			return err
		}
		defer func() {
			for _, q := range rebuild {
				if _, e := w.ExecContext(ctx, q); e != nil && err == nil {
					err = e
				}
			}
		}()
	}
	// The rows are worked out on the other processors while this goroutine
	// writes the ones before them.
	rows := pipeline(len(parts), func(i int) newRows {
		np := parts[i]
		if np.src != nil {
			if len(checkEntry(*np.src, glasses)) > 0 {
				return newRows{bad: true}
			}
			*np.e = newStoredEntry(*np.src)
		}
		return newPartRows(np, glasses)
	})
	defer rows.stop()
	const partCols = `id, supplier, part, description, diameter_mm, clear_aperture_mm, kind,
			stated_efl_mm, stated_bfd_mm, stated_edge_mm, stated_wavelength_nm, price, currency, url, notes, fingerprint`
	ins := []*batch{
		newBatch(w, `INSERT INTO parts (`+partCols+`)`, 16),
		newBatch(w, `INSERT INTO parts (`+partCols+`, efl_tol_pct, thickness_tol_mm, index_tol, radius_tol_pct, residual_reflectance_pct)`, 21),
		newBatch(w, `INSERT INTO surfaces (part_id, idx, radius_mm, thickness_mm, glass)`, 5),
		newBatch(w, `INSERT INTO surfaces (part_id, idx, radius_mm, conic, a4, a6, a8, a10, a12, a14, a16, thickness_mm, glass)`, 13),
		newBatch(w, `INSERT INTO warnings (part_id, seq, message, computed)`, 4),
		newBatch(w, `INSERT INTO computed (part_id, reversed, wavelength_nm, power_per_mm, efl_mm, bfd_mm, ffd_mm,
			p_mm, p_prime_mm, length_mm, diameter_mm, clear_aperture_mm)`, 12),
	}
	partRows, fullParts, surfaces, fullSurfaces, warnings, computed := ins[0], ins[1], ins[2], ins[3], ins[4], ins[5]
	// The two forms of a table's rows take turns, so that its rows go in
	// in the order of their keys.
	partRows.sibling, fullParts.sibling = fullParts, partRows
	surfaces.sibling, fullSurfaces.sibling = fullSurfaces, surfaces
	for _, b := range ins[2:] {
		b.parents = []*batch{partRows, fullParts} // the parts a row refers to go in first
	}
	for i, np := range parts {
		r := rows.at(i)
		if r.bad {
			return errBadEntry
		}
		pb, sb := partRows, surfaces
		if r.fullPart {
			pb = fullParts
		}
		if r.fullSurfaces {
			sb = fullSurfaces
		}
		for _, t := range []struct {
			b    *batch
			vals []any
		}{{pb, r.parts}, {sb, r.surfaces}, {warnings, r.warnings}, {computed, r.computed}} {
			if err := t.b.add(ctx, t.vals...); err != nil {
				return err
			}
		}
		w.putIndex(np.id, r.record)
	}
	for _, b := range ins {
		if err := b.flush(ctx); err != nil {
			return err
		}
	}
	if w.rowsWritten != nil {
		w.rowsWritten()
	}
	return nil
}

// bulkParts is the number of new parts from which an import drops the
// secondary indexes of the computed columns and surfaces and builds them
// again at the end (when it also at least doubles the catalog, whose
// highest part id stored stands for its size): building an
// index from sorted rows is cheaper than inserting into it row by row in
// random order.
var bulkParts = 5000 // a variable for the tests

// dropIndexes drops the secondary indexes of the tables an import fills
// most, and returns the statements that create them again.
func dropIndexes(ctx context.Context, w *txWriter) ([]string, error) {
	rows, err := w.QueryContext(ctx, `SELECT name, sql FROM sqlite_schema
		WHERE type = 'index' AND tbl_name IN ('computed', 'surfaces') AND sql IS NOT NULL`)
	if err != nil {
		return nil, err
	}
	var names, create []string
	for rows.Next() {
		var name, q string
		if err := rows.Scan(&name, &q); err != nil {
			rows.Close()
			return nil, err
		}
		names, create = append(names, name), append(create, q)
	}
	rows.Close()
	if err := rows.Err(); err != nil {
		return nil, err
	}
	for _, n := range names {
		// The names come from the schema itself, quoted as identifiers.
		if _, err := w.ExecContext(ctx, `DROP INDEX "`+strings.ReplaceAll(n, `"`, `""`)+`"`); err != nil {
			return nil, err
		}
	}
	return create, nil
}

// A batch collects the rows of one INSERT and runs them as multi-row
// statements of up to batchRows rows.
type batch struct {
	w       *txWriter
	parents []*batch // flushed before this one
	sibling *batch   // the other form of the same table's rows, flushed before a row is added to this one
	head    string
	cols    int
	rows    int
	args    []any
}

// batchRows keeps a statement's placeholders (rows times columns) well
// under SQLite's limit of 32,766.
const batchRows = 256

func newBatch(w *txWriter, head string, cols int) *batch {
	return &batch{w: w, head: head, cols: cols, args: make([]any, 0, batchRows*cols)}
}

// add adds rows, their values one row after another.
func (b *batch) add(ctx context.Context, vals ...any) error {
	if len(vals)%b.cols != 0 {
		panic("catalog: batch row of the wrong width")
	}
	if len(vals) > 0 && b.sibling != nil {
		if err := b.sibling.flush(ctx); err != nil {
			return err
		}
	}
	for ; len(vals) > 0; vals = vals[b.cols:] {
		b.args = append(b.args, vals[:b.cols]...)
		b.rows++
		if b.rows == batchRows {
			if err := b.flush(ctx); err != nil {
				return err
			}
		}
	}
	return nil
}

func (b *batch) flush(ctx context.Context) error {
	if b.rows == 0 {
		return nil
	}
	for _, p := range b.parents {
		if err := p.flush(ctx); err != nil {
			return err
		}
	}
	row := "(" + placeholders(b.cols) + ")"
	q := b.head + " VALUES " + strings.TrimSuffix(strings.Repeat(row+", ", b.rows), ", ")
	err := b.w.execValues(ctx, q, b.args)
	b.rows, b.args = 0, b.args[:0]
	return err
}
