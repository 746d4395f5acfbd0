package catalog

import (
	"math"
	"math/rand/v2"
	"testing"

	"cardinal/catalog/record"
	"cardinal/importers"
	"cardinal/optics"
)

// constantGlass is a user glass of one index at every wavelength.
func constantGlass(name string, n float64) importers.Glass {
	return importers.Glass{Name: name, Formula: "constant", Coefficients: []float64{n}, Source: "test"}
}

// singletOf builds a singlet entry in a medium of the glass table.
func singletOf(supplier, name string, r1, r2, thick, diameter float64, m optics.Medium) record.Entry {
	return record.Entry{Part: optics.Part{Supplier: supplier, Name: name, Diameter: diameter,
		Surfaces: []optics.Surface{{Radius: r1}, {Radius: r2}}, Thickness: []float64{thick}, Media: []optics.Medium{m}}}
}

// thickLens is the thick-lens focal length and principal-point positions
// in air (Hecht, Optics, 5th ed., sec. 6.2.1, eqs. 6.2-6.4):
// 1/f = (n-1) [1/R1 - 1/R2 + (n-1) d / (n R1 R2)],
// h1 = -f (n-1) d / (n R2) from the first vertex,
// h2 = -f (n-1) d / (n R1) from the second.
func thickLens(r1, r2, d, n float64) (f, h1, h2 float64) {
	f = 1 / ((n - 1) * (1/r1 - 1/r2 + (n-1)*d/(n*r1*r2)))
	return f, -f * (n - 1) * d / (n * r2), -f * (n - 1) * d / (n * r1)
}

func TestComputedColumnsMatchThickLens(t *testing.T) {
	s := newStore(t)
	if _, err := s.ImportGlasses(ctx, []importers.Glass{constantGlass("test-crown", 1.52)}, false); err != nil {
		t.Fatal(err)
	}
	table, _ := s.Glasses(ctx)
	m, _ := table.Lookup("test-crown")
	rng := rand.New(rand.NewPCG(1, 2))
	type lensArgs struct{ r1, r2, d float64 }
	var es []record.Entry
	var args []lensArgs
	for i := 0; i < 60; i++ {
		r := func() float64 { return math.Copysign(15+300*rng.Float64(), rng.Float64()-0.5) }
		a := lensArgs{r(), r(), 1 + 6*rng.Float64()}
		e := singletOf("RAND", string(rune('A'+i/26))+string(rune('a'+i%26)), a.r1, a.r2, a.d, 20, m)
		if f, _, _ := thickLens(a.r1, a.r2, a.d, 1.52); math.Abs(f) > 1e5 || e.Part.Validate() != nil {
			continue // nearly afocal, or no edge left at this diameter
		}
		es = append(es, e)
		args = append(args, a)
	}
	if len(es) < 30 {
		t.Fatalf("only %d physical lenses drawn", len(es))
	}
	mustImport(t, s, es)
	check := func(n float64) {
		t.Helper()
		rows, err := s.Computed(ctx, Filter{})
		if err != nil || len(rows) != len(es) {
			t.Fatalf("%d rows, %v", len(rows), err)
		}
		for i, row := range rows { // ordered by part name, the order built
			a := args[i]
			f, h1, h2 := thickLens(a.r1, a.r2, a.d, n)
			fw, rv := row.Forward, row.Reversed
			for _, c := range []struct {
				what      string
				got, want float64
			}{
				{"EFL", fw.EFL, f},
				{"power", fw.Power, 1 / f},
				{"P", fw.P, h1},
				{"P'", fw.PPrime, h2},
				{"BFD", fw.BFD, f + h2},
				{"FFD", fw.FFD, -f + h1},
				// Turned around, the lens has the same EFL and its front and
				// back points swap with their signs (symmetry of the thick
				// lens: R1, R2 -> -R2, -R1 in the same formulas).
				{"reversed EFL", rv.EFL, f},
				{"reversed BFD", rv.BFD, f - h1},
				{"reversed FFD", rv.FFD, -f - h2},
				{"reversed P'", rv.PPrime, -h1},
			} {
				if !near(c.got, c.want, 1e-9, 1e-9) {
					t.Errorf("%s n=%g: %s = %.12g, want %.12g", row.ID(), n, c.what, c.got, c.want)
				}
			}
			if row.Length != a.d || row.Diameter != 20 || row.ClearAperture != 18 || fw.Wavelength != optics.LineD {
				t.Errorf("%s: length %g, diameter %g, clear aperture %g, wavelength %g", row.ID(), row.Length, row.Diameter, row.ClearAperture, fw.Wavelength)
			}
		}
	}
	check(1.52)
	// A glass edited and imported again recomputes every part that uses it.
	rep, err := s.ImportGlasses(ctx, []importers.Glass{constantGlass("test-crown", 1.7)}, false)
	if err != nil {
		t.Fatal(err)
	}
	if len(rep.Updated) != 1 || len(rep.Recomputed) != len(es) {
		t.Errorf("glass report: updated %v, %d parts recomputed; want 1 and %d", rep.Updated, len(rep.Recomputed), len(es))
	}
	check(1.7)
}

func TestComputedEqualsOptics(t *testing.T) {
	// The stored columns are what package optics gives directly, for
	// every kind of part (cemented, fused silica, 6-digit codes).
	s := newStore(t)
	es := sampleEntries(t)
	mustImport(t, s, es)
	rows, _ := s.Computed(ctx, Filter{})
	byID := map[string]PartRow{}
	for _, r := range rows {
		byID[r.ID()] = r
	}
	for _, e := range es {
		r := byID[e.Part.ID()]
		for _, o := range []Orientation{r.Forward, r.Reversed} {
			p := e.Part
			if o.Reversed {
				p = p.Reversed()
			}
			c := p.System(nil, nil).Cardinal(optics.LineD)
			if o.EFL != c.EFL || o.BFD != c.BFD() || o.FFD != c.FFD() || o.P != c.P || o.PPrime != c.PPrime || o.Power != c.Power {
				t.Errorf("%s reversed=%v: stored %+v, optics gives EFL %g BFD %g FFD %g P %g P' %g", e.Part.ID(), o.Reversed, o, c.EFL, c.BFD(), c.FFD(), c.P, c.PPrime)
			}
		}
		if r.Kind != map[bool]string{true: Cemented, false: Singlet}[len(e.Part.Surfaces) == 3] {
			t.Errorf("%s: kind %s", e.Part.ID(), r.Kind)
		}
	}
}

func TestAfocalPart(t *testing.T) {
	// A thick meniscus with R2 = R1 - (n-1) d / n has zero power (Hecht,
	// Optics, 5th ed., eq. 6.2 with 1/f = 0): stored with no focal values.
	s := newStore(t)
	table := optics.BuiltinGlasses()
	m, _ := table.Lookup("517642")
	n, d, r1 := m.Index(optics.LineD), 10.0, 50.0
	e := singletOf("TEST", "AFOCAL", r1, r1-(n-1)*d/n, d, 20, m)
	mustImport(t, s, []record.Entry{e})
	rows, _ := s.Computed(ctx, Filter{})
	if !rows[0].Forward.Afocal || rows[0].Forward.EFL != 0 || rows[0].Forward.Power != 0 {
		t.Errorf("afocal part stored as %+v", rows[0].Forward)
	}
	got, _ := s.Computed(ctx, Filter{EFL: Range{-1e6, 1e6}})
	if len(got) != 0 {
		t.Errorf("an EFL range selects the afocal part")
	}
}
