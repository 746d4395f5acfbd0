package catalog

import (
	"context"
	"database/sql"
)

// A PartRow is what the catalog stores about a part apart from its
// prescription: the computed columns in both orientations, the drawer and
// the warnings. It is what `cardinal catalog list` shows.
type PartRow struct {
	Supplier, Part, Description string
	Kind                        string  // Singlet, Cemented or AirSpaced
	Diameter                    float64 // mm
	ClearAperture               float64 // mm, as used: stated, or 90 % of the diameter
	Length                      float64 // first to last vertex, mm
	Forward, Reversed           Orientation
	Quantity                    int    // pieces in the drawer
	Location                    string // where in the drawer
	Warnings                    []string
}

// ID returns SUPPLIER:PART.
func (r PartRow) ID() string { return r.Supplier + ":" + r.Part }

// Computed returns the stored computed columns of the parts the filter
// selects, ordered by supplier and part, from one snapshot of the catalog.
func (s *Store) Computed(ctx context.Context, f Filter) (_ []PartRow, err error) {
	defer s.classify(&err)
	where, args, err := f.where()
	if err != nil {
		return nil, err
	}
	tx, err := s.db.BeginTx(ctx, &sql.TxOptions{ReadOnly: true})
	if err != nil {
		return nil, err
	}
	defer tx.Rollback()
	out, ids, err := readComputed(ctx, tx, where, args)
	if err != nil {
		return nil, err
	}
	warnings, err := readWarnings(ctx, tx, "SELECT p.id"+filteredParts+"WHERE "+where, args)
	if err != nil {
		return nil, err
	}
	for i, id := range ids {
		out[i].Warnings = warnings[id]
	}
	return out, nil
}

// computedQuery selects the rows of Computed that match where.
func computedQuery(where string) string {
	return `SELECT p.id, p.supplier, p.part, p.description, p.kind,
		c.diameter_mm, c.clear_aperture_mm, c.length_mm, coalesce(d.quantity, 0), coalesce(d.location, ''),
		c.wavelength_nm, c.power_per_mm, c.efl_mm, c.bfd_mm, c.ffd_mm, c.p_mm, c.p_prime_mm,
		r.wavelength_nm, r.power_per_mm, r.efl_mm, r.bfd_mm, r.ffd_mm, r.p_mm, r.p_prime_mm` +
		filteredParts + `JOIN computed r ON r.part_id = p.id AND r.reversed = 1
		WHERE ` + where + ` ORDER BY p.supplier, p.part`
}

func readComputed(ctx context.Context, q querier, where string, args []any) ([]PartRow, []int64, error) {
	rows, err := q.QueryContext(ctx, computedQuery(where), args...)
	if err != nil {
		return nil, nil, err
	}
	defer rows.Close()
	var out []PartRow
	var ids []int64
	for rows.Next() {
		var r PartRow
		var id int64
		var f, b orientationScan
		if err := rows.Scan(append([]any{&id, &r.Supplier, &r.Part, &r.Description, &r.Kind,
			&r.Diameter, &r.ClearAperture, &r.Length, &r.Quantity, &r.Location},
			append(f.dest(), b.dest()...)...)...); err != nil {
			return nil, nil, err
		}
		r.Forward, r.Reversed = f.orientation(false), b.orientation(true)
		out, ids = append(out, r), append(ids, id)
	}
	return out, ids, rows.Err()
}

// orientationScan receives one orientation's columns.
type orientationScan struct {
	wavelength, power        float64
	efl, bfd, ffd, p, pPrime sql.NullFloat64
}

func (o *orientationScan) dest() []any {
	return []any{&o.wavelength, &o.power, &o.efl, &o.bfd, &o.ffd, &o.p, &o.pPrime}
}

func (o *orientationScan) orientation(reversed bool) Orientation {
	return Orientation{Reversed: reversed, Wavelength: o.wavelength, Power: o.power,
		Afocal: !o.efl.Valid, EFL: o.efl.Float64, BFD: o.bfd.Float64, FFD: o.ffd.Float64,
		P: o.p.Float64, PPrime: o.pPrime.Float64}
}
