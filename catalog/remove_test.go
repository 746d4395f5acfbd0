package catalog

import (
	"errors"
	"testing"
)

func TestRemove(t *testing.T) {
	s := newStore(t)
	mustImport(t, s, sampleEntries(t))
	s.SetDrawer(ctx, "TEST:PCX-50", 2, "A1", false)
	before := checksum(t, s)
	var nf *NotFoundError
	if _, err := s.Remove(ctx, "TEST:PCX-5"); !errors.As(err, &nf) || len(nf.Suggestions) == 0 {
		t.Errorf("unknown part: %v, want suggestions", err)
	}
	if checksum(t, s) != before {
		t.Error("removing an unknown part changed the tables")
	}
	it, err := s.Remove(ctx, "TEST:PCX-50")
	if err != nil || it.Quantity != 2 {
		t.Fatalf("%+v, %v", it, err)
	}
	// Foreign keys cascade: no row anywhere still names the part.
	for _, table := range []string{"surfaces", "computed", "warnings", "drawer"} {
		var n int
		s.db.QueryRow("SELECT count(*) FROM " + table + " WHERE part_id NOT IN (SELECT id FROM parts)").Scan(&n)
		if n != 0 {
			t.Errorf("%d orphan rows in %s", n, table)
		}
	}
	rows, _ := s.Computed(ctx, Filter{})
	if len(rows) != len(sampleEntries(t))-1 {
		t.Errorf("%d parts left", len(rows))
	}
}
