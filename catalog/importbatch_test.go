package catalog

import (
	"testing"

	"cardinal/catalog/record"
	"cardinal/optics"
)

// formsEntries are parts in every form writeNewParts inserts, their names
// in an order that makes the forms alternate: plain, aspheric, with
// tolerances, with a coating, with a conic only (invented parts and
// values).
func formsEntries(t *testing.T) []record.Entry {
	var es []record.Entry
	for i, form := range []string{"plain", "asphere", "tolerance", "plain", "coating", "conic", "plain", "asphere", "coating"} {
		e := lens(t, "FORMS", string(rune('A'+i))+"-"+form, 30+float64(i), -80, 4, 25.4, "517642")
		switch form {
		case "asphere":
			e.Part.Surfaces[0].Conic = -0.6
			e.Part.Surfaces[0].Asph = [7]float64{1e-6, -2e-9}
		case "conic":
			e.Part.Surfaces[1].Conic = -1
		case "tolerance":
			e.Tolerances = optics.Tolerances{EFLPct: 2, Thickness: 0.1}
		case "coating":
			e.Part.Coating = optics.Coating{Stated: true, ResidualPct: 0.5}
			if i == 8 {
				e.Part.Coating.ResidualPct = 0 // stated as 0: still stored
			}
		}
		e.Line = i + 2
		es = append(es, e)
	}
	return es
}

// The rows the import's multi-row inserts give new parts, in their narrow
// forms too (no tolerance and no coating: the columns left to their
// default; spherical surfaces: conic and coefficients left to their
// default), are the rows and value types writePart gives the same parts
// when an import replaces them one by one.
func TestNewPartRowsAsReplaced(t *testing.T) {
	es := formsEntries(t)
	fresh := newStore(t)
	mustImport(t, fresh, es)
	replaced := newStore(t)
	old := make([]record.Entry, len(es))
	copy(old, es)
	for i := range old {
		old[i].Part.Description = "before"
	}
	mustImport(t, replaced, old)
	if rep := mustImport(t, replaced, es); len(rep.Updated) != len(es) {
		t.Fatalf("%d of %d parts replaced", len(rep.Updated), len(es))
	}
	if checksum(t, fresh) != checksum(t, replaced) {
		t.Error("new parts are stored otherwise than the same parts replaced")
	}
	var full int
	if err := fresh.db.QueryRowContext(ctx, `SELECT count(*) FROM surfaces WHERE conic <> 0 OR a4 <> 0`).Scan(&full); err != nil || full != 3 {
		t.Errorf("%d surfaces with a conic or asphere stored, want 3 (%v)", full, err)
	}
}
