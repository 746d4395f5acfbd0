package catalog

import (
	"math"
	"reflect"
	"strings"
	"testing"

	"cardinal/catalog/record"
)

func TestFilter(t *testing.T) {
	s := newStore(t)
	mustImport(t, s, sampleEntries(t))
	if _, err := s.ImportDrawer(ctx, []record.DrawerItem{
		{Supplier: "TEST", Part: "PCX-50", Quantity: 2, Location: "A1"},
		{Supplier: "OTHER", Part: "FS-200", Quantity: 0, Location: "A2"},
	}, false); err != nil {
		t.Fatal(err)
	}
	// Focal lengths of the sample parts, by the thin-lens-plus-thickness
	// formula (Hecht, Optics, 5th ed., eq. 6.2) at the glass-code indices:
	// PCX-50 49.98, PCX-100 99.96, DCX-20 about 20.4, PCV-50 -49.98,
	// ACH-100 about 100, FS-200 about 200 mm.
	inf := math.Inf(1)
	tests := []struct {
		name string
		f    Filter
		want []string
	}{
		{"everything", Filter{}, []string{"OTHER:ACH-100", "OTHER:FS-200", "TEST:DCX-20", "TEST:PCV-50", "TEST:PCX-100", "TEST:PCX-50"}},
		{"EFL 45 to 55", Filter{EFL: Range{45, 55}}, []string{"TEST:PCX-50"}},
		{"EFL 90 to 110", Filter{EFL: Range{90, 110}}, []string{"OTHER:ACH-100", "TEST:PCX-100"}},
		{"negative EFL", Filter{EFL: Range{-inf, 0}}, []string{"TEST:PCV-50"}},
		{"EFL above 150", Filter{EFL: Range{150, inf}}, []string{"OTHER:FS-200"}},
		{"diameter up to 25.4", Filter{Diameter: Range{0, 25.4}}, []string{"OTHER:ACH-100", "TEST:DCX-20", "TEST:PCV-50", "TEST:PCX-100", "TEST:PCX-50"}},
		{"diameter at least 30", Filter{Diameter: Range{30, inf}}, []string{"OTHER:FS-200"}},
		{"supplier", Filter{Suppliers: []string{"OTHER"}}, []string{"OTHER:ACH-100", "OTHER:FS-200"}},
		{"positive singlets of TEST", Filter{Suppliers: []string{"TEST"}, Kinds: []string{"positive", "singlet"}}, []string{"TEST:DCX-20", "TEST:PCX-100", "TEST:PCX-50"}},
		{"negative", Filter{Kinds: []string{"negative"}}, []string{"TEST:PCV-50"}},
		{"cemented", Filter{Kinds: []string{"Cemented"}}, []string{"OTHER:ACH-100"}},
		{"in drawer (a zero quantity is not)", Filter{InDrawer: true}, []string{"TEST:PCX-50"}},
		{"by id", Filter{IDs: []string{"TEST:PCV-50", "OTHER:FS-200"}}, []string{"OTHER:FS-200", "TEST:PCV-50"}},
		{"nothing", Filter{EFL: Range{1000, 2000}}, nil},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			rows, err := s.Computed(ctx, tc.f)
			if err != nil {
				t.Fatal(err)
			}
			if got := ids(rows); !reflect.DeepEqual(got, tc.want) && !(len(got) == 0 && len(tc.want) == 0) {
				t.Errorf("Computed: %v, want %v", got, tc.want)
			}
			es, err := s.Entries(ctx, tc.f)
			if err != nil {
				t.Fatal(err)
			}
			var got []string
			for _, e := range es {
				got = append(got, e.Part.ID())
			}
			if !reflect.DeepEqual(got, tc.want) {
				t.Errorf("Entries: %v, want %v", got, tc.want)
			}
		})
	}
}

func TestFilterErrors(t *testing.T) {
	s := newStore(t)
	for _, tc := range []struct {
		name string
		f    Filter
		want string
	}{
		{"empty range", Filter{EFL: Range{50, 40}}, "EFL range 50:40 is empty"},
		{"unknown kind", Filter{Kinds: []string{"spherical"}}, `unknown kind "spherical"`},
	} {
		t.Run(tc.name, func(t *testing.T) {
			if _, err := s.Computed(ctx, tc.f); err == nil || !strings.Contains(err.Error(), tc.want) {
				t.Errorf("error %v, want %q", err, tc.want)
			}
		})
	}
}

func TestEFLQueryUsesIndex(t *testing.T) {
	s := newStore(t)
	mustImport(t, s, sampleEntries(t))
	for _, tc := range []struct {
		name    string
		f       Filter
		index   string
		analyze bool
	}{
		{"EFL range", Filter{EFL: Range{40, 60}}, "computed_efl", false},
		{"diameter range", Filter{Diameter: Range{10, 13}}, "computed_diameter", false},
		{"EFL range after ANALYZE", Filter{EFL: Range{40, 60}}, "computed_efl", true},
		// With a supplier too the planner may prefer the supplier's index;
		// either way no table is scanned ("" below).
		{"EFL range and a supplier", Filter{EFL: Range{40, 60}, Suppliers: []string{"TEST"}}, "", true},
	} {
		t.Run(tc.name, func(t *testing.T) {
			if tc.analyze {
				if _, err := s.db.Exec("ANALYZE"); err != nil {
					t.Fatal(err)
				}
			}
			where, args, err := tc.f.where()
			if err != nil {
				t.Fatal(err)
			}
			// The query of Computed, asked for its plan (SQLite, "EXPLAIN
			// QUERY PLAN", sqlite.org/eqp.html).
			rows, err := s.db.Query("EXPLAIN QUERY PLAN "+computedQuery(where), args...)
			if err != nil {
				t.Fatal(err)
			}
			defer rows.Close()
			var plan []string
			for rows.Next() {
				var id, parent, notused int
				var detail string
				rows.Scan(&id, &parent, &notused, &detail)
				plan = append(plan, detail)
			}
			joined := strings.Join(plan, "; ")
			if strings.Contains(joined, "SCAN ") {
				t.Errorf("plan %q scans a table", joined)
			}
			if tc.index != "" && !strings.Contains(joined, "SEARCH c USING INDEX "+tc.index) {
				t.Errorf("plan %q does not search computed by %s", joined, tc.index)
			}
		})
	}
}
