package catalog

import (
	"testing"

	"cardinal/catalog/record"
	"cardinal/optics"
)

// A part's coating survives the store: stated (0 % included) or not; a
// change of it alone is a change of the part; the table refuses a value
// outside 0 to 100 % even past the program's own checks.
func TestPartCoatingStored(t *testing.T) {
	s := newStore(t)
	a := lens(t, "DEMO", "C1", 100, -100, 5, 25, "517642")
	a.Part.Coating = optics.Coating{Stated: true, ResidualPct: 0.25}
	b := lens(t, "DEMO", "C0", 100, -100, 5, 25, "517642")
	b.Part.Coating = optics.Coating{Stated: true}
	c := lens(t, "DEMO", "BARE", 100, -100, 5, 25, "517642")
	mustImport(t, s, []record.Entry{a, b, c})
	for _, want := range []record.Entry{a, b, c} {
		back, err := s.Part(ctx, want.Part.ID())
		if err != nil {
			t.Fatal(err)
		}
		if back.Part.Coating != want.Part.Coating {
			t.Errorf("%s: read back %+v, want %+v", want.Part.ID(), back.Part.Coating, want.Part.Coating)
		}
	}
	for _, change := range []optics.Coating{{Stated: true, ResidualPct: 0.5}, {}} {
		a.Part.Coating = change
		if rep := mustImport(t, s, []record.Entry{a}); len(rep.Updated) != 1 {
			t.Errorf("coating changed to %+v: %+v, want one part updated", change, rep)
		}
	}
	if _, err := s.db.ExecContext(ctx, "UPDATE parts SET residual_reflectance_pct = 101 WHERE part = 'C1'"); err == nil {
		t.Error("the parts table took a reflectance of 101 %")
	}
}
