package catalog

import (
	"bytes"
	"io"
	"math"
	"os"
	"path/filepath"
	"reflect"
	"testing"

	"cardinal/catalog/record"
	"cardinal/catalog/synth"
	"cardinal/importers"
	"cardinal/optics"
)

// indexRows returns the stored index, record by record, keyed by
// SUPPLIER:PART.
func indexRows(t *testing.T, s *Store) map[string][]byte {
	t.Helper()
	rows, err := s.db.QueryContext(ctx, "SELECT id_key, record FROM search_index")
	if err != nil {
		t.Fatal(err)
	}
	defer rows.Close()
	out := map[string][]byte{}
	for rows.Next() {
		var k string
		var r []byte
		if err := rows.Scan(&k, &r); err != nil {
			t.Fatal(err)
		}
		out[k] = r
	}
	return out
}

// sameAsRebuilt fails unless the stored index is, byte for byte, the one
// rebuilt from scratch from the readable tables, and holds every part.
func sameAsRebuilt(t *testing.T, s *Store, step string) {
	t.Helper()
	kept := indexRows(t, s)
	if err := s.RebuildIndex(ctx); err != nil {
		t.Fatal(err)
	}
	fresh := indexRows(t, s)
	var parts int
	s.db.QueryRowContext(ctx, "SELECT count(*) FROM parts").Scan(&parts)
	if len(fresh) != parts {
		t.Fatalf("%s: rebuilt index has %d records for %d parts", step, len(fresh), parts)
	}
	if len(kept) != len(fresh) {
		t.Fatalf("%s: index kept in step has %d records, rebuilt %d", step, len(kept), len(fresh))
	}
	for k, r := range fresh {
		if !bytes.Equal(kept[k], r) {
			t.Errorf("%s: record of %s differs from the rebuilt one", step, k)
		}
	}
}

// The index is never stale: after an import, a changed glass, a removed
// part, an updated part and a drawer change it equals the index rebuilt
// from scratch.
func TestIndexKeptInStep(t *testing.T) {
	s := newStore(t)
	if _, err := s.ImportGlasses(ctx, []importers.Glass{constantGlass("test-crown", 1.52)}, false); err != nil {
		t.Fatal(err)
	}
	table, _ := s.Glasses(ctx)
	crown, _ := table.Lookup("test-crown")
	es := append(sampleEntries(t),
		singletOf("TEST", "TC-40", 41.2, math.Inf(1), 4, 25.4, crown),
		singletOf("TEST", "TC-BI", 60, -60, 5, 25.4, crown))
	mustImport(t, s, es)
	sameAsRebuilt(t, s, "import")
	before := indexRows(t, s)["TEST:TC-40"]

	if _, err := s.ImportGlasses(ctx, []importers.Glass{constantGlass("test-crown", 1.6)}, false); err != nil {
		t.Fatal(err)
	}
	sameAsRebuilt(t, s, "glass changed")
	if bytes.Equal(before, indexRows(t, s)["TEST:TC-40"]) {
		t.Error("the record of a part in the changed glass did not change")
	}
	if _, err := s.Remove(ctx, "TEST:PCX-50"); err != nil {
		t.Fatal(err)
	}
	sameAsRebuilt(t, s, "part removed")
	if _, ok := indexRows(t, s)["TEST:PCX-50"]; ok {
		t.Error("the removed part is still in the index")
	}
	changed := es[1]
	changed.Price = 99
	mustImport(t, s, []record.Entry{changed})
	sameAsRebuilt(t, s, "part updated")
	coated := es[2]
	coated.Part.Coating = optics.Coating{Stated: true, ResidualPct: 0.4}
	if rep := mustImport(t, s, []record.Entry{coated}); len(rep.Updated) != 1 {
		t.Errorf("a coating stated: %+v, want the part updated", rep)
	}
	sameAsRebuilt(t, s, "coating stated")
	if _, err := s.SetDrawer(ctx, "TEST:DCX-20", 3, "A1", false); err != nil {
		t.Fatal(err)
	}
	sameAsRebuilt(t, s, "drawer set")
}

// A record taken apart gives back what was put in.
func TestIndexRecordRoundTrip(t *testing.T) {
	es := sampleEntries(t)
	asph := es[0]
	asph.Part.Surfaces = []optics.Surface{{Radius: 20, Conic: -0.6, Asph: [7]float64{1e-6, -2e-9}}, {Radius: math.Inf(1)}}
	es = append(es, asph)
	for _, e := range es {
		r := newIndexRecord(42, e)
		var got IndexPart
		var names []string
		intern := func(b []byte) uint16 { names = append(names, string(b)); return uint16(len(names) - 1) }
		if _, err := decodeRecord(r.encode(nil), &got, intern, func(b []byte) string { return string(b) }, nil); err != nil {
			t.Fatalf("%s: %v", e.Part.ID(), err)
		}
		want := r.IndexPart
		want.Glass = []uint16{}
		for i := range r.glasses {
			want.Glass = append(want.Glass, uint16(i))
		}
		if !reflect.DeepEqual(got, want) || !reflect.DeepEqual(names, r.glasses) {
			t.Errorf("%s:\n got %+v %v\nwant %+v %v", e.Part.ID(), got, names, want, r.glasses)
		}
		// A cut record is refused, never read short.
		b := r.encode(nil)
		if _, err := decodeRecord(b[:len(b)-3], &got, intern, func(b []byte) string { return string(b) }, nil); err == nil {
			t.Errorf("%s: a cut record was read", e.Part.ID())
		}
	}
}

// Cardinal points from the index's paraxial prescription equal, to the
// last bit, those of the full prescription, at the d line (the stored
// matrix) and at other wavelengths; and the focal length agrees with the
// thick-lens formula (Hecht, Optics, 5th ed., sec. 6.2.1, eq. 6.2) for the
// singlets.
func TestIndexMatrixAt(t *testing.T) {
	s := newStore(t)
	mustImport(t, s, synth.Catalog(3, 300))
	ix, err := s.SearchIndex(ctx, IndexOptions{})
	if err != nil {
		t.Fatal(err)
	}
	defer ix.Close()
	full, err := ix.Entries(ctx, partIDs(ix.Parts))
	if err != nil {
		t.Fatal(err)
	}
	singlets := 0
	for _, lambda := range []float64{optics.LineD, 486.1327, 632.8, 1064} {
		n := make([]float64, len(ix.Media))
		for i, m := range ix.Media {
			n[i] = m.Index(lambda)
		}
		for i := range ix.Parts {
			q := &ix.Parts[i]
			part := full[q.ID].Part
			want := part.System(nil, nil).Matrix(lambda)
			if got := q.MatrixAt(n, 1); got != want {
				t.Fatalf("%s at %g nm: matrix %+v, full prescription %+v", q.PartID(), lambda, got, want)
			}
			if lambda == optics.LineD && q.Matrix != want {
				t.Fatalf("%s: stored matrix %+v, full prescription %+v", q.PartID(), q.Matrix, want)
			}
			if len(q.Radii) == 2 {
				singlets++
				f, _, _ := thickLens(q.Radii[0], q.Radii[1], q.Thickness[0], n[q.Glass[0]])
				if got := -1 / q.MatrixAt(n, 1).C; !near(got, f, 1e-9, 1e-9) {
					t.Errorf("%s at %g nm: EFL %g, thick-lens formula %g", q.PartID(), lambda, got, f)
				}
			}
		}
	}
	if singlets == 0 {
		t.Error("no singlet checked against the thick-lens formula")
	}
}

func partIDs(ps []IndexPart) []int64 {
	ids := make([]int64, len(ps))
	for i := range ps {
		ids[i] = ps[i].ID
	}
	return ids
}

// SearchIndex reads the parts in the order of their names, with their
// drawer quantities, and only the drawer's with InDrawer.
func TestSearchIndexRead(t *testing.T) {
	s := newStore(t)
	mustImport(t, s, sampleEntries(t))
	if _, err := s.SetDrawer(ctx, "OTHER:FS-200", 2, "", false); err != nil {
		t.Fatal(err)
	}
	ix, err := s.SearchIndex(ctx, IndexOptions{})
	if err != nil {
		t.Fatal(err)
	}
	var got []string
	for _, p := range ix.Parts {
		got = append(got, p.PartID())
		if want := map[bool]int{true: 2}[p.PartID() == "OTHER:FS-200"]; p.Quantity != want {
			t.Errorf("%s: quantity %d, want %d", p.PartID(), p.Quantity, want)
		}
	}
	ix.Close()
	want := []string{"OTHER:ACH-100", "OTHER:FS-200", "TEST:DCX-20", "TEST:PCV-50", "TEST:PCX-100", "TEST:PCX-50"}
	if !reflect.DeepEqual(got, want) {
		t.Errorf("order %v, want %v", got, want)
	}
	ix, err = s.SearchIndex(ctx, IndexOptions{InDrawer: true})
	if err != nil {
		t.Fatal(err)
	}
	defer ix.Close()
	if len(ix.Parts) != 1 || ix.Parts[0].PartID() != "OTHER:FS-200" {
		t.Errorf("drawer only: %d parts", len(ix.Parts))
	}
}

// A catalog written by the previous version (schema 1, no search index;
// testdata/schema1.db was written by cardinal at schema 1 from the demo's
// lenses.csv and glasses.csv) is upgraded on opening: the index is built,
// and equals one rebuilt from scratch.
func TestMigrationBuildsIndex(t *testing.T) {
	path := filepath.Join(t.TempDir(), "old.db")
	copyFile(t, "testdata/schema1.db", path)
	s, err := Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer s.Close()
	var version int
	s.db.QueryRowContext(ctx, "PRAGMA user_version").Scan(&version)
	if version != SchemaVersion() {
		t.Errorf("schema %d after opening, want %d", version, SchemaVersion())
	}
	if n := len(indexRows(t, s)); n != 13 {
		t.Errorf("%d index records after the migration, want the file's 13 parts", n)
	}
	sameAsRebuilt(t, s, "migration")
}

func copyFile(t *testing.T, from, to string) {
	t.Helper()
	in, err := os.Open(from)
	if err != nil {
		t.Fatal(err)
	}
	defer in.Close()
	out, err := os.Create(to)
	if err != nil {
		t.Fatal(err)
	}
	if _, err := io.Copy(out, in); err != nil {
		t.Fatal(err)
	}
	if err := out.Close(); err != nil {
		t.Fatal(err)
	}
}

// An import large enough to drop and build again the secondary indexes
// stores the same rows and leaves the same schema as one that inserts
// into them.
func TestBulkImportSameAsRowByRow(t *testing.T) {
	schema := func(s *Store) string {
		var out string
		rows, err := s.db.QueryContext(ctx, "SELECT name || ': ' || coalesce(sql, '') FROM sqlite_schema ORDER BY name")
		if err != nil {
			t.Fatal(err)
		}
		defer rows.Close()
		for rows.Next() {
			var line string
			rows.Scan(&line)
			out += line + "\n"
		}
		return out
	}
	es := synth.Catalog(5, 40)
	row := newStore(t)
	mustImport(t, row, es)
	bulk := newStore(t)
	defer func(n int) { bulkParts = n }(bulkParts)
	bulkParts = 1
	mustImport(t, bulk, es)
	if a, b := schema(row), schema(bulk); a != b {
		t.Errorf("schema after a bulk import:\n%s\nafter row by row:\n%s", b, a)
	}
	if checksum(t, row) != checksum(t, bulk) {
		t.Error("a bulk import stored other rows than a row-by-row one")
	}
	sameAsRebuilt(t, bulk, "bulk import")
}
