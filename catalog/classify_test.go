package catalog

import (
	"slices"
	"testing"
)

// The tables a fresh catalog holds are the ones the migrations are read
// to leave behind (created, dropped and renamed in order).
func TestTablesOfMatchesAFreshCatalog(t *testing.T) {
	s := newStore(t)
	rows, err := s.db.Query("SELECT lower(name) FROM sqlite_schema WHERE type = 'table' AND name NOT LIKE 'sqlite_%'")
	if err != nil {
		t.Fatal(err)
	}
	defer rows.Close()
	var have []string
	for rows.Next() {
		var n string
		if err := rows.Scan(&n); err != nil {
			t.Fatal(err)
		}
		have = append(have, n)
	}
	want := tablesOf(len(migrations))
	slices.Sort(have)
	slices.Sort(want)
	if !slices.Equal(have, want) {
		t.Errorf("tables %v, the migrations say %v", have, want)
	}
}
