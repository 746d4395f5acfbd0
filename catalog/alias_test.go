package catalog

import (
	"errors"
	"reflect"
	"testing"

	"cardinal/catalog/record"
	"cardinal/importers"
	"cardinal/optics"
)

func TestGlassAliases(t *testing.T) {
	s := newStore(t)
	// An invented melt given by nd and Vd, imported as a user's glass.
	melt := importers.Glass{Name: "melt-7a", Formula: "abbe", Coefficients: []float64{1.5172, 64.1}}
	if _, err := s.ImportGlasses(ctx, []importers.Glass{melt}, false); err != nil {
		t.Fatal(err)
	}
	steps := []struct {
		name, alias, target string
		replaced            bool
		wantErr             bool
	}{
		{"to a code", "Vellum Crown", "517642", false, false},
		{"again, other case", "VELLUM crown", "620364", true, false},
		{"to a built-in", "Silica Clear", "Fused-Silica", false, false},
		{"to a user glass", "Melt Seven", "MELT-7A", false, false},
		{"name is a built-in", "caf2", "517642", false, true},
		{"name is a code", "589613", "517642", false, true},
		{"name is a user glass", "melt-7a", "517642", false, true},
		{"unknown target", "Mystery", "nothing-like-it", false, true},
		{"target is an alias", "Second Name", "Vellum Crown", false, true},
		{"empty", "", "517642", false, true},
	}
	for _, st := range steps {
		t.Run(st.name, func(t *testing.T) {
			replaced, err := s.SetGlassAlias(ctx, st.alias, st.target)
			var ae *AliasError
			if st.wantErr != (err != nil) || err != nil && !errors.As(err, &ae) {
				t.Fatalf("err %v, want error %v (an *AliasError)", err, st.wantErr)
			}
			if replaced != st.replaced {
				t.Errorf("replaced %v, want %v", replaced, st.replaced)
			}
		})
	}
	got, err := s.GlassAliases(ctx)
	want := []GlassAlias{{"Melt Seven", "melt-7a"}, {"Silica Clear", "fused-silica"}, {"VELLUM crown", "620364"}}
	if err != nil || !reflect.DeepEqual(got, want) {
		t.Errorf("aliases %+v (%v), want %+v", got, err, want)
	}
	table, err := s.Glasses(ctx)
	if err != nil {
		t.Fatal(err)
	}
	for alias, target := range map[string]string{"vellum crown": "620364", "silica clear": "fused-silica", "melt seven": "melt-7a"} {
		m, err := table.Lookup(alias)
		if err != nil || m.Name() != target {
			t.Errorf("Lookup(%q) = %v, %v; want the medium %s", alias, m, err, target)
		}
	}
	// A part imported through an alias stores the target.
	e := lens(t, "DEMO", "A", 50, -50, 4, 25, "517642")
	e.Part.Media[0] = mustLookup(t, table, "Melt Seven")
	if _, err := s.Import(ctx, []record.Entry{e}, false); err != nil {
		t.Fatal(err)
	}
	stored, _ := s.Entries(ctx, Filter{})
	if n := stored[0].Part.Media[0].Name(); n != "melt-7a" {
		t.Errorf("stored glass %q, want melt-7a", n)
	}
	if err := s.RemoveGlassAlias(ctx, "melt seven"); err != nil {
		t.Fatal(err)
	}
	var nf *NotFoundError
	if err := s.RemoveGlassAlias(ctx, "melt seven"); !errors.As(err, &nf) {
		t.Errorf("removing it twice: %v, want a NotFoundError", err)
	}
}

func mustLookup(t *testing.T, table optics.GlassTable, name string) optics.Medium {
	t.Helper()
	m, err := table.Lookup(name)
	if err != nil {
		t.Fatal(err)
	}
	return m
}
