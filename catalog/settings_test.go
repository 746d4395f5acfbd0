package catalog

import (
	"context"
	"testing"

	"cardinal/catalog/record"
	"cardinal/optics"
)

// The default part tolerances start as the program's and keep what is set.
func TestPartTolerancesSetting(t *testing.T) {
	ctx := context.Background()
	s := newStore(t)
	got, err := s.PartTolerances(ctx)
	if err != nil {
		t.Fatal(err)
	}
	if got != optics.DefaultTolerances {
		t.Errorf("fresh catalog: %+v, want the program's defaults %+v", got, optics.DefaultTolerances)
	}
	set := optics.Tolerances{EFLPct: 2, Thickness: 0.2, Index: 0.0005, RadiusPct: 0.3}
	if err := s.SetPartTolerances(ctx, set); err != nil {
		t.Fatal(err)
	}
	if got, _ = s.PartTolerances(ctx); got != set {
		t.Errorf("after setting: %+v, want %+v", got, set)
	}
	if err := s.SetPartTolerances(ctx, optics.Tolerances{EFLPct: -1}); err == nil {
		t.Error("a negative tolerance was stored")
	}
}

// A part's stated tolerances survive the store; a change of them alone is
// a change of the part.
func TestPartTolerancesStored(t *testing.T) {
	ctx := context.Background()
	s := newStore(t)
	e := lens(t, "DEMO", "T1", 100, -100, 5, 25, "517642")
	e.Tolerances = optics.Tolerances{EFLPct: 2, Index: 0.0005}
	if _, err := s.Import(ctx, []record.Entry{e}, false); err != nil {
		t.Fatal(err)
	}
	back, err := s.Part(ctx, "DEMO:T1")
	if err != nil {
		t.Fatal(err)
	}
	if back.Tolerances != e.Tolerances {
		t.Errorf("read back %+v, want %+v", back.Tolerances, e.Tolerances)
	}
	e.Tolerances.EFLPct = 3
	rep, err := s.Import(ctx, []record.Entry{e}, false)
	if err != nil {
		t.Fatal(err)
	}
	if len(rep.Updated) != 1 {
		t.Errorf("changing the tolerance alone: %+v, want one part updated", rep)
	}
}
