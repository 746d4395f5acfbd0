package catalog

import (
	"context"
	"database/sql"
	"fmt"
	"math"
	"sort"

	"cardinal/catalog/record"
	"cardinal/optics"
)

// querier is what reading needs of a *sql.DB or *sql.Tx.
type querier interface {
	QueryContext(ctx context.Context, query string, args ...any) (*sql.Rows, error)
	QueryRowContext(ctx context.Context, query string, args ...any) *sql.Row
}

// Entries returns the full prescriptions of the parts the filter selects,
// ordered by supplier and part, with their media resolved in the catalog's
// glass table and their stored warnings. All of it is read from one
// snapshot of the catalog.
func (s *Store) Entries(ctx context.Context, f Filter) (_ []record.Entry, err error) {
	defer s.classify(&err)
	tx, err := s.db.BeginTx(ctx, &sql.TxOptions{ReadOnly: true})
	if err != nil {
		return nil, err
	}
	defer tx.Rollback()
	glasses, err := readGlassTable(ctx, tx)
	if err != nil {
		return nil, err
	}
	where, args, err := f.where()
	if err != nil {
		return nil, err
	}
	entries, _, err := readEntries(ctx, tx, where, args, glasses)
	return entries, err
}

// readEntries reads the parts matching where (over p, c and d), their
// surfaces and their warnings. ids[i] is the id of entries[i].
func readEntries(ctx context.Context, q querier, where string, args []any, glasses optics.GlassTable) (entries []record.Entry, ids []int64, err error) {
	entries, ids, err = readPartRows(ctx, q, where, args)
	if err != nil {
		return nil, nil, err
	}
	index := make(map[int64]int, len(ids))
	for i, id := range ids {
		index[id] = i
	}
	sub := "SELECT p.id" + filteredParts + "WHERE " + where
	if where == "1" {
		sub = "SELECT id FROM parts" // every part: no join needed
	}
	if err := readSurfaces(ctx, q, sub, args, entries, index, glasses); err != nil {
		return nil, nil, err
	}
	warnings, err := readWarnings(ctx, q, sub, args)
	if err != nil {
		return nil, nil, err
	}
	for id, w := range warnings {
		entries[index[id]].Warnings = w
	}
	sortByID(entries, ids)
	return entries, ids, nil
}

// sortByID orders entries (and their ids with them) by supplier and part:
// sorting here is cheaper than reading the parts in index order.
func sortByID(entries []record.Entry, ids []int64) {
	order := make([]int, len(entries))
	for i := range order {
		order[i] = i
	}
	sort.Slice(order, func(a, b int) bool {
		pa, pb := &entries[order[a]].Part, &entries[order[b]].Part
		if pa.Supplier != pb.Supplier {
			return pa.Supplier < pb.Supplier
		}
		return pa.Name < pb.Name
	})
	e2 := make([]record.Entry, len(entries))
	i2 := make([]int64, len(ids))
	for i, o := range order {
		e2[i], i2[i] = entries[o], ids[o]
	}
	copy(entries, e2)
	copy(ids, i2)
}

func readPartRows(ctx context.Context, q querier, where string, args []any) ([]record.Entry, []int64, error) {
	// A migration before the tolerance (0005) or coating (0006) columns
	// existed may read parts too (the search index rebuild of 0002): they
	// read as not stated.
	has, err := partColumns(ctx, q)
	if err != nil {
		return nil, nil, err
	}
	tols := "NULL, NULL, NULL, NULL"
	if has["efl_tol_pct"] {
		tols = "p.efl_tol_pct, p.thickness_tol_mm, p.index_tol, p.radius_tol_pct"
	}
	coat := ", NULL"
	if has["residual_reflectance_pct"] {
		coat = ", p.residual_reflectance_pct"
	}
	rows, err := q.QueryContext(ctx, `SELECT p.id, p.supplier, p.part, p.description, p.diameter_mm,
		p.clear_aperture_mm, p.stated_efl_mm, p.stated_bfd_mm, p.stated_edge_mm, p.stated_wavelength_nm,
		p.price, p.currency, p.url, p.notes, `+tols+coat+filteredParts+"WHERE "+where+" ORDER BY p.id", args...)
	if err != nil {
		return nil, nil, err
	}
	defer rows.Close()
	var entries []record.Entry
	var ids []int64
	for rows.Next() {
		var e record.Entry
		var id int64
		var efl, bfd, edge, wl, price, tEFL, tThick, tIndex, tRadius, coating sql.NullFloat64
		p := &e.Part
		if err := rows.Scan(&id, &p.Supplier, &p.Name, &p.Description, &p.Diameter, &p.ClearAperture,
			&efl, &bfd, &edge, &wl, &price, &e.Currency, &e.URL, &e.Notes, &tEFL, &tThick, &tIndex, &tRadius, &coating); err != nil {
			return nil, nil, err
		}
		e.Tolerances = optics.Tolerances{EFLPct: tEFL.Float64, Thickness: tThick.Float64, Index: tIndex.Float64, RadiusPct: tRadius.Float64}
		p.Coating = optics.Coating{Stated: coating.Valid, ResidualPct: coating.Float64}
		e.StatedEFL, e.StatedBFD, e.StatedEdge = efl.Float64, bfd.Float64, edge.Float64
		e.StatedWavelength, e.Price = wl.Float64, price.Float64
		entries, ids = append(entries, e), append(ids, id)
	}
	return entries, ids, rows.Err()
}

// partColumns is the set of the parts table's column names.
func partColumns(ctx context.Context, q querier) (map[string]bool, error) {
	rows, err := q.QueryContext(ctx, "SELECT name FROM pragma_table_info('parts')")
	if err != nil {
		return nil, err
	}
	defer rows.Close()
	has := map[string]bool{}
	for rows.Next() {
		var n string
		if err := rows.Scan(&n); err != nil {
			return nil, err
		}
		has[n] = true
	}
	return has, rows.Err()
}

// readSurfaces fills in the surfaces, thicknesses and media of the parts
// whose ids the subquery sub selects.
func readSurfaces(ctx context.Context, q querier, sub string, args []any, entries []record.Entry, index map[int64]int, glasses optics.GlassTable) error {
	rows, err := q.QueryContext(ctx, `SELECT part_id, idx, radius_mm, conic, a4, a6, a8, a10, a12, a14, a16,
		thickness_mm, glass FROM surfaces WHERE part_id IN (`+sub+`) ORDER BY part_id, idx`, args...)
	if err != nil {
		return err
	}
	defer rows.Close()
	for rows.Next() {
		var id int64
		var idx int
		var radius, thickness sql.NullFloat64
		var glass sql.NullString
		var s optics.Surface
		a := &s.Asph
		if err := rows.Scan(&id, &idx, &radius, &s.Conic, &a[0], &a[1], &a[2], &a[3], &a[4], &a[5], &a[6], &thickness, &glass); err != nil {
			return err
		}
		s.Radius = math.Inf(1)
		if radius.Valid {
			s.Radius = radius.Float64
		}
		p := &entries[index[id]].Part
		p.Surfaces = append(p.Surfaces, s)
		if !thickness.Valid {
			continue
		}
		m, err := glasses.Lookup(glass.String)
		if err != nil {
			return fmt.Errorf("part %s: glass%d: %w", p.ID(), idx, err)
		}
		p.Thickness = append(p.Thickness, thickness.Float64)
		p.Media = append(p.Media, m)
	}
	return rows.Err()
}

// readWarnings returns the stored warnings of the parts the subquery sub
// selects, in order, by part id.
func readWarnings(ctx context.Context, q querier, sub string, args []any) (map[int64][]string, error) {
	rows, err := q.QueryContext(ctx, `SELECT part_id, message FROM warnings WHERE part_id IN (`+sub+`)
		ORDER BY part_id, seq`, args...)
	if err != nil {
		return nil, err
	}
	defer rows.Close()
	out := map[int64][]string{}
	for rows.Next() {
		var id int64
		var msg string
		if err := rows.Scan(&id, &msg); err != nil {
			return nil, err
		}
		out[id] = append(out[id], msg)
	}
	return out, rows.Err()
}
