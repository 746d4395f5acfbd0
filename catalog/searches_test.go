package catalog

import (
	"database/sql"
	"errors"
	"path/filepath"
	"slices"
	"testing"
	"time"
)

func TestSaveLoadSearch(t *testing.T) {
	s := newStore(t)
	var nf *NotFoundError
	if _, err := s.LoadSearch(ctx, "last"); !errors.As(err, &nf) {
		t.Errorf("no searches yet: %v, want *NotFoundError", err)
	}
	at := time.Date(2025, 3, 1, 12, 30, 0, 5, time.FixedZone("X", 3600))
	id1, err := s.SaveSearch(ctx, SavedSearch{Kind: "focus", Requirement: []byte(`{"efl_mm":50}`), Results: []byte(`[]`), At: at})
	if err != nil {
		t.Fatal(err)
	}
	id2, _ := s.SaveSearch(ctx, SavedSearch{Kind: "image", Requirement: []byte(`{"track_mm":200}`),
		Results: []byte(`[{"part":"TEST:PCX-50"}]`), Outcome: []byte(`{"why":["x"]}`), Count: 1, At: at.Add(time.Minute)})
	for _, tc := range []struct {
		ref  string
		id   int64
		kind string
	}{{"last", id2, "image"}, {"1", id1, "focus"}, {" 2 ", id2, "image"}} {
		got, err := s.LoadSearch(ctx, tc.ref)
		if err != nil || got.ID != tc.id || got.Kind != tc.kind {
			t.Errorf("LoadSearch(%q) = %+v, %v", tc.ref, got, err)
		}
	}
	got, _ := s.LoadSearch(ctx, "1")
	if !got.At.Equal(at) || string(got.Requirement) != `{"efl_mm":50}` || string(got.Results) != "[]" || string(got.Outcome) != "{}" {
		t.Errorf("search 1 read back as %+v", got)
	}
	got, _ = s.LoadSearch(ctx, "2")
	if string(got.Outcome) != `{"why":["x"]}` || got.Count != 1 {
		t.Errorf("search 2 read back as %+v", got)
	}
	if _, err := s.LoadSearch(ctx, "7"); !errors.As(err, &nf) {
		t.Errorf("missing id: %v", err)
	}
	var re *RefError
	for _, ref := range []string{"yesterday", "0", "-1"} {
		if _, err := s.LoadSearch(ctx, ref); !errors.As(err, &re) {
			t.Errorf("bad ref %q: %v, want a *RefError", ref, err)
		}
	}
}

// Listing, noting and removing; a removed search's number is never given
// again, not even when it was the latest.
func TestListNoteRemoveSearches(t *testing.T) {
	s := newStore(t)
	at := time.Date(2025, 3, 1, 12, 30, 0, 0, time.UTC)
	for i, kind := range []string{"focus", "image", "expand"} {
		if _, err := s.SaveSearch(ctx, SavedSearch{Kind: kind, Requirement: []byte(`{}`), Results: []byte(`[]`), Count: i, At: at}); err != nil {
			t.Fatal(err)
		}
	}
	if err := s.NoteSearch(ctx, 2, "relay for the bench camera"); err != nil {
		t.Fatal(err)
	}
	if err := s.RemoveSearch(ctx, 3); err != nil {
		t.Fatal(err)
	}
	var nf *NotFoundError
	if err := s.RemoveSearch(ctx, 3); !errors.As(err, &nf) {
		t.Errorf("removing twice: %v, want *NotFoundError", err)
	}
	if err := s.NoteSearch(ctx, 9, "x"); !errors.As(err, &nf) {
		t.Errorf("noting a missing search: %v, want *NotFoundError", err)
	}
	id, err := s.SaveSearch(ctx, SavedSearch{Kind: "focus", Requirement: []byte(`{}`), Results: []byte(`[]`), At: at})
	if err != nil || id != 4 {
		t.Errorf("next search after removing the latest got id %d (%v), want 4", id, err)
	}
	list, err := s.Searches(ctx)
	if err != nil {
		t.Fatal(err)
	}
	var ids []int64
	for _, ss := range list {
		ids = append(ids, ss.ID)
	}
	if !slices.Equal(ids, []int64{1, 2, 4}) || list[1].Note != "relay for the bench camera" || list[1].Count != 1 || list[1].Kind != "image" || !list[1].At.Equal(at) {
		t.Errorf("list %+v", list)
	}
}

func TestPartNames(t *testing.T) {
	s := newStore(t)
	if _, err := s.Import(ctx, sampleEntries(t), false); err != nil {
		t.Fatal(err)
	}
	names, err := s.PartNames(ctx)
	want := []string{"OTHER:ACH-100", "OTHER:FS-200", "TEST:DCX-20", "TEST:PCV-50", "TEST:PCX-100", "TEST:PCX-50"}
	if err != nil || !slices.Equal(names, want) {
		t.Errorf("PartNames = %v, %v; want %v", names, err, want)
	}
}

// A file written at schema version 1 keeps its saved searches through
// the later migrations (0004_search_notes counts their results).
func TestSearchesMigrated(t *testing.T) {
	path := filepath.Join(t.TempDir(), "v1.db")
	db, err := sql.Open("sqlite", dsn(path))
	if err != nil {
		t.Fatal(err)
	}
	for _, q := range []string{migrations[0].script, "PRAGMA user_version = 1",
		`INSERT INTO searches (id, kind, requirement, results, created_at) VALUES (5, 'focus', '{}', '[{"rank":1},{"rank":2}]', '2025-01-02T03:04:05Z')`} {
		if _, err := db.Exec(q); err != nil {
			t.Fatal(err)
		}
	}
	db.Close()
	s, err := Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer s.Close()
	list, err := s.Searches(ctx)
	if err != nil || len(list) != 1 || list[0].ID != 5 || list[0].Count != 2 || list[0].Note != "" {
		t.Fatalf("after migration: %+v, %v", list, err)
	}
	if err := s.RemoveSearch(ctx, 5); err != nil {
		t.Fatal(err)
	}
	id, err := s.SaveSearch(ctx, SavedSearch{Kind: "focus", Requirement: []byte(`{}`), Results: []byte(`[]`), At: time.Now()})
	if err != nil || id != 6 {
		t.Errorf("first search after the migrated one: id %d, %v; want 6", id, err)
	}
}
