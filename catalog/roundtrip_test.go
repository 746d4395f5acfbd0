package catalog

import (
	"bytes"
	"math"
	"testing"

	"cardinal/catalog/record"
	"cardinal/importers"
	"cardinal/optics"
)

// richEntries covers every stored field: aspheres, conics, stated values,
// a user glass, a clear aperture, an air-spaced part, text with commas and
// quotes. Invented test data.
func richEntries(t *testing.T, table optics.GlassTable) []record.Entry {
	es := sampleEntries(t)
	asph := lens(t, "TEST", "ASP-20", 11.66, math.Inf(1), 5, 15, "583594")
	asph.Part.ClearAperture = 13.5
	asph.Part.Surfaces[0].Conic = -0.6
	asph.Part.Surfaces[0].Asph = [7]float64{-2.1e-6, -4.5e-9, 1e-12, 0, 0, 0, 3e-25}
	asph.StatedEFL, asph.StatedBFD, asph.StatedEdge, asph.StatedWavelength = 20, 16.84, 2.49, 632.8
	asph.Part.Description = `Molded asphere, "f 20", 15 mm`
	asph.URL, asph.Notes = "https://test.example/asp-20", "aspheric side first, toward the collimated beam"
	user, _ := table.Lookup("test-flint")
	u := lens(t, "TEST", "USER-GLASS", 40, -60, 4, 20, "517642")
	u.Part.Media[0] = user
	air := doublet(t, "TEST", "AIR-PAIR", 60, -60, 80, 4, 2, 25.4, "517642", "air")
	air.Part.Surfaces = append(air.Part.Surfaces, optics.Surface{Radius: -80})
	air.Part.Thickness = append(air.Part.Thickness, 4)
	air.Part.Media = append(air.Part.Media, air.Part.Media[0])
	// Coatings: one stated, one stated as 0 % (not the same as none).
	asph.Part.Coating = optics.Coating{Stated: true, ResidualPct: 0.25}
	air.Part.Coating = optics.Coating{Stated: true}
	return append(es, asph, u, air)
}

func TestExportImportRoundTrip(t *testing.T) {
	s := newStore(t)
	if _, err := s.ImportGlasses(ctx, []importers.Glass{{Name: "test-flint", Formula: "abbe", Coefficients: []float64{1.62, 36.4}}}, false); err != nil {
		t.Fatal(err)
	}
	table, _ := s.Glasses(ctx)
	orig := richEntries(t, table)
	for i := range orig {
		orig[i].Warnings = importers.ComputedWarnings(orig[i])
	}
	mustImport(t, s, orig)
	first, err := s.Entries(ctx, Filter{})
	if err != nil {
		t.Fatal(err)
	}
	var csv bytes.Buffer
	if err := importers.WritePrescriptions(&csv, first); err != nil {
		t.Fatal(err)
	}
	back, err := importers.ReadPrescriptions(bytes.NewReader(csv.Bytes()), "export.csv", table)
	if err != nil {
		t.Fatalf("%v\n%s", err, csv.String())
	}
	// Import of the export into the same catalog changes nothing.
	before := checksum(t, s)
	rep := mustImport(t, s, back)
	if len(rep.Unchanged) != len(orig) || checksum(t, s) != before {
		t.Errorf("re-importing the export: added %v, updated %v", rep.Added, rep.Updated)
	}
	// Into a fresh catalog it reproduces every field.
	s2 := newStore(t)
	if _, err := s2.ImportGlasses(ctx, []importers.Glass{{Name: "test-flint", Formula: "abbe", Coefficients: []float64{1.62, 36.4}}}, false); err != nil {
		t.Fatal(err)
	}
	mustImport(t, s2, back)
	second, _ := s2.Entries(ctx, Filter{})
	byID := map[string]record.Entry{}
	for _, e := range orig {
		byID[e.Part.ID()] = e
	}
	if len(second) != len(orig) {
		t.Fatalf("%d parts after the round trip, want %d", len(second), len(orig))
	}
	for _, got := range second {
		if diff := entryDiff(byID[got.Part.ID()], got); diff != "" {
			t.Errorf("%s: %s", got.Part.ID(), diff)
		}
	}
}

// entryDiff names the first stored field that differs, comparing media by
// name and index.
func entryDiff(a, b record.Entry) string {
	pa, pb := a.Part, b.Part
	switch {
	case pa.Supplier != pb.Supplier || pa.Name != pb.Name || pa.Description != pb.Description:
		return "names or description"
	case pa.Diameter != pb.Diameter || pa.ClearAperture != pb.ClearAperture:
		return "diameter or clear aperture"
	case len(pa.Surfaces) != len(pb.Surfaces):
		return "surface count"
	case a.StatedEFL != b.StatedEFL || a.StatedBFD != b.StatedBFD || a.StatedEdge != b.StatedEdge || a.StatedWavelength != b.StatedWavelength:
		return "stated values"
	case a.Price != b.Price || a.Currency != b.Currency || a.URL != b.URL || a.Notes != b.Notes:
		return "price, currency, url or notes"
	case len(a.Warnings) != len(b.Warnings):
		return "warnings"
	case pa.Coating != pb.Coating:
		return "coating"
	}
	for i := range pa.Surfaces {
		sa, sb := pa.Surfaces[i], pb.Surfaces[i]
		if planeAsInf(sa.Radius) != planeAsInf(sb.Radius) || sa.Conic != sb.Conic || sa.Asph != sb.Asph {
			return "surface " + string(rune('1'+i))
		}
	}
	for i := range pa.Thickness {
		if pa.Thickness[i] != pb.Thickness[i] || pa.Media[i].Name() != pb.Media[i].Name() ||
			pa.Media[i].Index(optics.LineF) != pb.Media[i].Index(optics.LineF) {
			return "thickness or medium " + string(rune('1'+i))
		}
	}
	return ""
}
