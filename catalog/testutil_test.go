package catalog

import (
	"context"
	"crypto/sha256"
	"database/sql"
	"encoding/hex"
	"fmt"
	"io"
	"math"
	"strings"
	"testing"

	"cardinal/catalog/record"
	"cardinal/optics"
)

var ctx = context.Background()

// newStore opens a fresh in-memory catalog for one test.
func newStore(t *testing.T) *Store {
	t.Helper()
	s, err := Open(Memory)
	if err != nil {
		t.Fatal(err)
	}
	t.Cleanup(func() { s.Close() })
	return s
}

// near reports whether got is within abs or rel of want.
func near(got, want, abs, rel float64) bool {
	d := math.Abs(got - want)
	return d <= abs || d <= rel*math.Abs(want)
}

// lens builds an entry for a singlet of the given glass (a name the
// built-in glass table knows) in air.
func lens(t *testing.T, supplier, name string, r1, r2, thick, diameter float64, glass string) record.Entry {
	t.Helper()
	m, err := optics.BuiltinGlasses().Lookup(glass)
	if err != nil {
		t.Fatal(err)
	}
	return record.Entry{Part: optics.Part{Supplier: supplier, Name: name, Diameter: diameter,
		Surfaces:  []optics.Surface{{Radius: r1}, {Radius: r2}},
		Thickness: []float64{thick},
		Media:     []optics.Medium{m}}}
}

// doublet builds a cemented doublet entry.
func doublet(t *testing.T, supplier, name string, r1, r2, r3, t1, t2, diameter float64, g1, g2 string) record.Entry {
	t.Helper()
	e := lens(t, supplier, name, r1, r2, t1, diameter, g1)
	m, err := optics.BuiltinGlasses().Lookup(g2)
	if err != nil {
		t.Fatal(err)
	}
	e.Part.Surfaces = append(e.Part.Surfaces, optics.Surface{Radius: r3})
	e.Part.Thickness = append(e.Part.Thickness, t2)
	e.Part.Media = append(e.Part.Media, m)
	return e
}

// sampleEntries is a small mixed catalog: positive and negative singlets,
// a cemented doublet, two suppliers. Prescriptions are invented test data.
func sampleEntries(t *testing.T) []record.Entry {
	inf := math.Inf(1)
	es := []record.Entry{
		lens(t, "TEST", "PCX-50", 25.84, inf, 5.3, 25.4, "517642"),
		lens(t, "TEST", "PCX-100", 51.68, inf, 3.6, 25.4, "517642"),
		lens(t, "TEST", "DCX-20", 20.5, -20.5, 4, 12.7, "517642"),
		lens(t, "TEST", "PCV-50", -25.84, inf, 3, 25.4, "517642"),
		doublet(t, "OTHER", "ACH-100", 60.46, -35.06, -138.46, 6, 2.5, 25.4, "517642", "620364"),
		lens(t, "OTHER", "FS-200", 91.7, inf, 4, 50.8, "fused-silica"),
	}
	for i := range es {
		es[i].Line = i + 2
		es[i].Price = 20 + float64(i)
		es[i].Currency = "XTS"
	}
	return es
}

// mustImport imports entries and fails the test on error.
func mustImport(t *testing.T, s *Store, es []record.Entry) ImportReport {
	t.Helper()
	rep, err := s.Import(ctx, es, false)
	if err != nil {
		t.Fatal(err)
	}
	return rep
}

// checksum hashes the contents of every table in primary-key order, so
// that two calls give the same string only if no row changed.
func checksum(t *testing.T, s *Store) string {
	t.Helper()
	h := sha256.New()
	for _, table := range []string{"parts", "surfaces", "glasses", "computed", "warnings", "drawer", "searches", "search_index"} {
		cols := writeRows(t, s.db, "SELECT * FROM "+table+" ORDER BY 1, 2", h)
		fmt.Fprintf(h, "table %s %s\n", table, strings.Join(cols, ","))
	}
	var pv int
	s.db.QueryRowContext(ctx, "PRAGMA user_version").Scan(&pv)
	fmt.Fprintf(h, "version %d", pv)
	return hex.EncodeToString(h.Sum(nil))
}

// writeRows writes every row q selects to w, one line each (%#v of its
// values, so that a value's type counts too), and returns the columns.
func writeRows(t *testing.T, db *sql.DB, q string, w io.Writer) []string {
	t.Helper()
	rows, err := db.QueryContext(ctx, q)
	if err != nil {
		t.Fatal(err)
	}
	defer rows.Close()
	cols, _ := rows.Columns()
	vals := make([]any, len(cols))
	ptrs := make([]any, len(cols))
	for i := range vals {
		ptrs[i] = &vals[i]
	}
	for rows.Next() {
		if err := rows.Scan(ptrs...); err != nil {
			t.Fatal(err)
		}
		fmt.Fprintf(w, "%#v\n", vals)
	}
	if err := rows.Err(); err != nil {
		t.Fatal(err)
	}
	return cols
}

func ids(rows []PartRow) []string {
	out := make([]string, len(rows))
	for i, r := range rows {
		out[i] = r.ID()
	}
	return out
}
