package catalog

import (
	"errors"
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
	id1, err := s.SaveSearch(ctx, "focus", []byte(`{"efl_mm":50}`), []byte(`[]`), at)
	if err != nil {
		t.Fatal(err)
	}
	id2, _ := s.SaveSearch(ctx, "image", []byte(`{"track_mm":200}`), []byte(`[{"part":"TEST:PCX-50"}]`), at.Add(time.Minute))
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
	if !got.At.Equal(at) || string(got.Requirement) != `{"efl_mm":50}` || string(got.Results) != "[]" {
		t.Errorf("search 1 read back as %+v", got)
	}
	if _, err := s.LoadSearch(ctx, "7"); !errors.As(err, &nf) {
		t.Errorf("missing id: %v", err)
	}
	if _, err := s.LoadSearch(ctx, "yesterday"); err == nil || errors.As(err, &nf) {
		t.Errorf("bad ref: %v, want a usage error", err)
	}
}
