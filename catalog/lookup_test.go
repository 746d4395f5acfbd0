package catalog

import (
	"errors"
	"math"
	"testing"

	"cardinal/catalog/record"
)

func TestPart(t *testing.T) {
	s := newStore(t)
	mustImport(t, s, sampleEntries(t))
	mustImport(t, s, []record.Entry{lens(t, "OTHER", "PCX-50", 25.84, math.Inf(1), 5.3, 25.4, "517642")})
	for _, tc := range []struct {
		name, id, want string
		notFound       bool
	}{
		{"full id", "TEST:PCX-100", "TEST:PCX-100", false},
		{"part alone, one supplier", "DCX-20", "TEST:DCX-20", false},
		{"part alone, two suppliers", "PCX-50", "", true},
		{"case ignored", "test:pcx-100", "TEST:PCX-100", false},
		{"part alone, case ignored", "dcx-20", "TEST:DCX-20", false},
		{"unknown", "TEST:PCX-75", "", true},
	} {
		t.Run(tc.name, func(t *testing.T) {
			e, err := s.Part(ctx, tc.id)
			var nf *NotFoundError
			if tc.notFound {
				if !errors.As(err, &nf) {
					t.Errorf("error %v, want *NotFoundError", err)
				}
				return
			}
			if err != nil || e.Part.ID() != tc.want || len(e.Part.Media) == 0 {
				t.Errorf("Part(%q) = %s, %v", tc.id, e.Part.ID(), err)
			}
		})
	}
}
