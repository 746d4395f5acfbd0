package catalog

import (
	"context"
	"math"

	"cardinal/catalog/record"
	"cardinal/importers"
	"cardinal/optics"
)

// A storedEntry is an entry as the catalog stores it: its warnings split
// into those the prescription gives (importers.ComputedWarnings, worked out
// again when a glass changes) and the others, and its fingerprint.
type storedEntry struct {
	record.Entry
	other, computed []string
	fingerprint     string
}

func newStoredEntry(e record.Entry) storedEntry {
	s := storedEntry{Entry: e, computed: importers.ComputedWarnings(e)}
	s.other = otherWarnings(e.Warnings, s.computed)
	s.fingerprint = fingerprint(e, s.other)
	return s
}

// warnings are all the stored warnings, in the order stored.
func (s storedEntry) warnings() []string {
	return append(append([]string{}, s.other...), s.computed...)
}

// writePart stores an entry inside tx: a new part when id is 0, otherwise
// the part with that id replaced (its drawer row is kept). Its surfaces,
// warnings and computed columns are written anew, and its search index
// record kept for flushIndex.
// It returns the part id.
func writePart(ctx context.Context, tx *txWriter, id int64, e storedEntry, glasses optics.GlassTable) (int64, error) {
	p := e.Part
	cols := []any{p.Description, p.Diameter, p.ClearAperture, kindOf(p),
		nullIfZero(e.StatedEFL), nullIfZero(e.StatedBFD), nullIfZero(e.StatedEdge),
		nullIfZero(e.StatedWavelength), nullIfZero(e.Price), e.Currency, e.URL, e.Notes, e.fingerprint,
		nullIfZero(e.Tolerances.EFLPct), nullIfZero(e.Tolerances.Thickness), nullIfZero(e.Tolerances.Index),
		nullIfZero(e.Tolerances.RadiusPct), coatingValue(p.Coating)}
	if id == 0 {
		res, err := tx.exec(ctx, `INSERT INTO parts (supplier, part, description, diameter_mm,
			clear_aperture_mm, kind, stated_efl_mm, stated_bfd_mm, stated_edge_mm, stated_wavelength_nm,
			price, currency, url, notes, fingerprint, efl_tol_pct, thickness_tol_mm, index_tol, radius_tol_pct,
			residual_reflectance_pct) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
			append([]any{p.Supplier, p.Name}, cols...)...)
		if err != nil {
			return 0, err
		}
		if id, err = res.LastInsertId(); err != nil {
			return 0, err
		}
	} else {
		_, err := tx.exec(ctx, `UPDATE parts SET description = ?, diameter_mm = ?,
			clear_aperture_mm = ?, kind = ?, stated_efl_mm = ?, stated_bfd_mm = ?, stated_edge_mm = ?,
			stated_wavelength_nm = ?, price = ?, currency = ?, url = ?, notes = ?, fingerprint = ?,
			efl_tol_pct = ?, thickness_tol_mm = ?, index_tol = ?, radius_tol_pct = ?,
			residual_reflectance_pct = ? WHERE id = ?`, append(cols, id)...)
		if err != nil {
			return 0, err
		}
		for _, table := range []string{"surfaces", "warnings"} {
			if _, err := tx.exec(ctx, "DELETE FROM "+table+" WHERE part_id = ?", id); err != nil {
				return 0, err
			}
		}
	}
	if err := writeSurfaces(ctx, tx, id, p); err != nil {
		return 0, err
	}
	if err := writeWarnings(ctx, tx, id, e.other, false); err != nil {
		return 0, err
	}
	if err := writeWarnings(ctx, tx, id, e.computed, true); err != nil {
		return 0, err
	}
	if err := writeComputed(ctx, tx, id, p); err != nil {
		return 0, err
	}
	indexed := e.Entry
	indexed.Part = catalogMedia(p, glasses)
	writeIndexRow(tx, id, indexed)
	return id, nil
}

func writeSurfaces(ctx context.Context, tx *txWriter, id int64, p optics.Part) error {
	for i, s := range p.Surfaces {
		var thickness, glass any
		if i < len(p.Thickness) {
			thickness, glass = p.Thickness[i], mediumName(p.Media[i])
		}
		_, err := tx.exec(ctx, `INSERT INTO surfaces (part_id, idx, radius_mm, conic,
			a4, a6, a8, a10, a12, a14, a16, thickness_mm, glass)
			VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
			id, i+1, radiusValue(s.Radius), s.Conic,
			s.Asph[0], s.Asph[1], s.Asph[2], s.Asph[3], s.Asph[4], s.Asph[5], s.Asph[6],
			thickness, glass)
		if err != nil {
			return err
		}
	}
	return nil
}

// writeWarnings appends warnings to the part's list.
func writeWarnings(ctx context.Context, tx *txWriter, id int64, warnings []string, computed bool) error {
	for _, w := range warnings {
		if _, err := tx.exec(ctx, `INSERT INTO warnings (part_id, seq, message, computed)
			VALUES (?, (SELECT coalesce(max(seq), 0) + 1 FROM warnings WHERE part_id = ?), ?, ?)`,
			id, id, w, computed); err != nil {
			return err
		}
	}
	return nil
}

// otherWarnings are the entry's warnings that comparing stated with computed
// values does not give (importers.ComputedWarnings): they are kept as they
// are when a glass changes.
func otherWarnings(warnings, computed []string) []string {
	given := map[string]bool{}
	for _, w := range computed {
		given[w] = true
	}
	var out []string
	for _, w := range warnings {
		if !given[w] {
			out = append(out, w)
		}
	}
	return out
}

// writeComputed replaces the part's computed columns in both orientations.
func writeComputed(ctx context.Context, tx *txWriter, id int64, p optics.Part) error {
	if _, err := tx.exec(ctx, "DELETE FROM computed WHERE part_id = ?", id); err != nil {
		return err
	}
	for _, rev := range []bool{false, true} {
		o := orient(p, rev)
		var efl, bfd, ffd, pp, ppp any
		if !o.Afocal {
			efl, bfd, ffd, pp, ppp = o.EFL, o.BFD, o.FFD, o.P, o.PPrime
		}
		_, err := tx.exec(ctx, `INSERT INTO computed (part_id, reversed, wavelength_nm,
			power_per_mm, efl_mm, bfd_mm, ffd_mm, p_mm, p_prime_mm, length_mm, diameter_mm,
			clear_aperture_mm) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
			id, rev, o.Wavelength, o.Power, efl, bfd, ffd, pp, ppp, p.Length(), p.Diameter, p.Aperture())
		if err != nil {
			return err
		}
	}
	return nil
}

// nullIfZero stores an unstated value (zero) as NULL.
func nullIfZero(v float64) any {
	if v == 0 {
		return nil
	}
	return v
}

// coatingValue stores a coating not stated as NULL, a stated one (0
// included) as its percentage.
func coatingValue(c optics.Coating) any {
	if !c.Stated {
		return nil
	}
	return c.ResidualPct
}

// radiusValue stores a plane (radius 0 or infinite) as NULL.
func radiusValue(r float64) any {
	if r == 0 || math.IsInf(r, 0) {
		return nil
	}
	return r
}

func mediumName(m optics.Medium) string {
	if m == nil {
		return ""
	}
	return m.Name()
}
