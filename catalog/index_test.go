package catalog

import (
	"bytes"
	"database/sql"
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"
	"reflect"
	"slices"
	"strings"
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
	out := map[string][]byte{}
	for _, chunk := range indexChunks(t, s) {
		recs, err := splitChunk(chunk)
		if err != nil {
			t.Fatal(err)
		}
		for _, r := range recs {
			var p IndexPart
			name, err := newIndexDecoder(1).decodeRecord(r, &p)
			if err != nil {
				t.Fatal(err)
			}
			out[p.Supplier+":"+string(name)] = r
		}
	}
	return out
}

// indexChunks returns the stored chunks by number.
func indexChunks(t *testing.T, s *Store) map[int64][]byte {
	t.Helper()
	rows, err := s.db.QueryContext(ctx, "SELECT chunk, parts, records FROM search_index")
	if err != nil {
		t.Fatal(err)
	}
	defer rows.Close()
	out := map[int64][]byte{}
	for rows.Next() {
		var c int64
		var n int
		var r []byte
		if err := rows.Scan(&c, &n, &r); err != nil {
			t.Fatal(err)
		}
		if recs, err := splitChunk(r); err != nil || len(recs) != n {
			t.Fatalf("chunk %d: %d records (%v), its parts column says %d", c, len(recs), err, n)
		}
		out[c] = r
	}
	return out
}

// sameAsRebuilt fails unless the stored index is, byte for byte, the one
// rebuilt from scratch from the readable tables, and holds every part.
func sameAsRebuilt(t *testing.T, s *Store, step string) {
	t.Helper()
	kept, keptChunks := indexRows(t, s), indexChunks(t, s)
	if err := s.RebuildIndex(ctx); err != nil {
		t.Fatal(err)
	}
	fresh, freshChunks := indexRows(t, s), indexChunks(t, s)
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
	if len(keptChunks) != len(freshChunks) {
		t.Errorf("%s: %d chunks kept in step, %d rebuilt", step, len(keptChunks), len(freshChunks))
	}
	for c, r := range freshChunks {
		if !bytes.Equal(keptChunks[c], r) {
			t.Errorf("%s: chunk %d differs from the rebuilt one", step, c)
		}
	}
}

// The index is never stale: after an import, a changed glass, a removed
// part, an updated part and a drawer change it equals the index rebuilt
// from scratch; with chunks of 4,096 part ids (all parts in one) and of 2
// (changes that fall in several chunks, a chunk emptied).
func TestIndexKeptInStep(t *testing.T) {
	for _, shift := range []int{12, 1} {
		t.Run(fmt.Sprint(1<<shift), func(t *testing.T) {
			defer func(s int) { chunkShift = s }(chunkShift)
			chunkShift = shift
			indexKeptInStep(t)
		})
	}
}

func indexKeptInStep(t *testing.T) {
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
	for _, id := range []string{"TEST:PCX-100", "TEST:DCX-20"} {
		if _, err := s.Remove(ctx, id); err != nil {
			t.Fatal(err)
		}
	}
	sameAsRebuilt(t, s, "two parts removed")
	if _, ok := indexRows(t, s)["TEST:DCX-20"]; ok {
		t.Error("a removed part is still in the index")
	}
}

// Parts added by a later import, whose names fall between those stored,
// are read in the order of SUPPLIER:PART as strings (a supplier that
// begins with another's name included: "AB-" sorts before "AB:").
func TestSearchIndexOrderAfterImports(t *testing.T) {
	s := newStore(t)
	mustImport(t, s, sampleEntries(t))
	inf := math.Inf(1)
	mustImport(t, s, []record.Entry{
		lens(t, "TEST", "PCX-75", 38.76, inf, 4, 25.4, "517642"),
		lens(t, "OTHER-B", "PCX-10", 5.17, inf, 2, 6, "517642"),
		lens(t, "AAA", "PCX-20", 10.34, inf, 2.5, 12.7, "517642"),
		lens(t, "OTHER", "ACH-050", 25.84, inf, 5.3, 25.4, "517642"),
	})
	ix, err := s.SearchIndex(ctx, IndexOptions{})
	if err != nil {
		t.Fatal(err)
	}
	defer ix.Close()
	var got []string
	for _, p := range ix.Parts {
		got = append(got, p.PartID())
	}
	want := slices.Clone(got)
	slices.Sort(want) // the order of the strings themselves
	if !reflect.DeepEqual(got, want) || len(got) != 10 {
		t.Errorf("order %v, want %v", got, want)
	}
	if i, j := slices.Index(got, "OTHER-B:PCX-10"), slices.Index(got, "OTHER:ACH-050"); i > j {
		t.Errorf("OTHER-B:PCX-10 at %d after OTHER:ACH-050 at %d", i, j)
	}
}

func TestCompareIDs(t *testing.T) {
	ids := [][2]string{{"AB", "X"}, {"AB-", "X"}, {"AB", ""}, {"A", "B:X"}, {"ABC", "A"}, {"AB", "XY"}, {"", "Z"}, {"AB", "X"}}
	for _, a := range ids {
		for _, b := range ids {
			want := strings.Compare(a[0]+":"+a[1], b[0]+":"+b[1])
			if got := compareIDs(a[0], a[1], b[0], b[1]); got != want {
				t.Errorf("compareIDs(%q, %q) = %d, want %d", a, b, got, want)
			}
		}
	}
}

// An import that updates parts (in multi-row statements, under the ids
// they have) leaves every table as an import of the changed parts into a
// new catalog does, keeps the drawer, and leaves the index in step.
func TestImportUpdatesSameAsFresh(t *testing.T) {
	es := synth.Catalog(5, 60)
	for i := 1; i < len(es); i += 3 {
		es[i].StatedEFL = 1234 // far from the prescription's: a warning to write again
	}
	changed := slices.Clone(es)
	for i := range changed {
		switch i % 3 {
		case 0:
			changed[i].Price += 1
		case 1:
			changed[i].Part.Thickness = slices.Clone(changed[i].Part.Thickness)
			changed[i].Part.Thickness[0] *= 1.1
			changed[i].Notes = "thicker"
		}
	}
	s := newStore(t)
	mustImport(t, s, es)
	id := changed[1].Part.ID()
	if _, err := s.SetDrawer(ctx, id, 2, "B1", false); err != nil {
		t.Fatal(err)
	}
	rep := mustImport(t, s, changed)
	if len(rep.Updated) != 40 || len(rep.Unchanged) != 20 || len(rep.Warnings) < 20 {
		t.Fatalf("updated %d, unchanged %d, %d warnings; want 40, 20 and at least 20", len(rep.Updated), len(rep.Unchanged), len(rep.Warnings))
	}
	sameAsRebuilt(t, s, "parts updated")
	fresh := newStore(t)
	mustImport(t, fresh, changed)
	if _, err := fresh.SetDrawer(ctx, id, 2, "B1", false); err != nil {
		t.Fatal(err)
	}
	if checksum(t, s) != checksum(t, fresh) {
		t.Error("the updated catalog differs from the changed parts imported afresh")
	}
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
		d := newIndexDecoder(1)
		name, err := d.decodeRecord(r.encode(nil), &got)
		if err != nil {
			t.Fatalf("%s: %v", e.Part.ID(), err)
		}
		got.Name = string(name)
		want := r.IndexPart
		want.Glass = []uint16{}
		for i := range r.glasses {
			want.Glass = append(want.Glass, uint16(i))
		}
		if !reflect.DeepEqual(got, want) || !reflect.DeepEqual(d.glasses, r.glasses) {
			t.Errorf("%s:\n got %+v %v\nwant %+v %v", e.Part.ID(), got, d.glasses, want, r.glasses)
		}
		// A cut record is refused, never read short.
		b := r.encode(nil)
		if _, err := d.decodeRecord(b[:len(b)-3], &got); err == nil {
			t.Errorf("%s: a cut record was read", e.Part.ID())
		}
		if _, err := d.decodeChunk(encodeChunk([][]byte{b})[:len(b)], nil, func(*IndexPart) bool { return true }); err == nil {
			t.Errorf("%s: a cut chunk was read", e.Part.ID())
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

// A catalog written by the version before chunks (schema 6, one index row
// per part; testdata/schema6.db was written by cardinal at schema 6 from
// the demo's glasses.csv and lenses.csv, with 2 pieces of DEMO:PCX-50 in
// the drawer) is upgraded on opening: the chunks hold the same records the
// rows held, equal to those rebuilt from scratch, and the index reads.
func TestMigrationToChunks(t *testing.T) {
	path := filepath.Join(t.TempDir(), "old.db")
	copyFile(t, "testdata/schema6.db", path)
	old := map[string][]byte{}
	db, err := sql.Open("sqlite", path)
	if err != nil {
		t.Fatal(err)
	}
	rows, err := db.Query("SELECT id_key, record FROM search_index")
	if err != nil {
		t.Fatal(err)
	}
	for rows.Next() {
		var k string
		var r []byte
		if err := rows.Scan(&k, &r); err != nil {
			t.Fatal(err)
		}
		old[k] = r
	}
	rows.Close()
	db.Close()
	if len(old) != 13 {
		t.Fatalf("the schema 6 file holds %d index rows, want 13", len(old))
	}
	s, err := Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer s.Close()
	if got := indexRows(t, s); !reflect.DeepEqual(got, old) {
		t.Errorf("after the migration the index holds %d records, not the %d the rows held", len(got), len(old))
	}
	sameAsRebuilt(t, s, "migration from schema 6")
	ix, err := s.SearchIndex(ctx, IndexOptions{InDrawer: true})
	if err != nil {
		t.Fatal(err)
	}
	defer ix.Close()
	if len(ix.Parts) != 1 || ix.Parts[0].PartID() != "DEMO:PCX-50" || ix.Parts[0].Quantity != 2 {
		t.Errorf("the drawer's parts after the migration: %+v", ix.Parts)
	}
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
