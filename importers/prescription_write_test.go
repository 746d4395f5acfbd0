package importers

import (
	"bytes"
	"math"
	"math/rand/v2"
	"os"
	"reflect"
	"strings"
	"testing"

	"cardinal/catalog/record"
	"cardinal/optics"
)

// roundTrip writes entries and reads them back.
func roundTrip(t *testing.T, entries []record.Entry) []record.Entry {
	t.Helper()
	var buf bytes.Buffer
	if err := WritePrescriptions(&buf, entries); err != nil {
		t.Fatal(err)
	}
	back, err := ReadPrescriptions(&buf, "written.csv", optics.BuiltinGlasses())
	if err != nil {
		t.Fatalf("reading what was written: %v\n%s", err, buf.String())
	}
	return back
}

// sameEntries compares field for field, except the source line.
func sameEntries(t *testing.T, got, want []record.Entry) {
	t.Helper()
	if len(got) != len(want) {
		t.Fatalf("got %d entries, want %d", len(got), len(want))
	}
	for i := range got {
		g, w := got[i], want[i]
		g.Line, w.Line = 0, 0
		if !reflect.DeepEqual(g, w) {
			t.Errorf("entry %d differs after the round trip:\n got %+v\nwant %+v", i, g, w)
		}
	}
}

func TestRoundTripDemo(t *testing.T) {
	data, err := os.ReadFile("../catalog/demo/lenses.csv")
	if err != nil {
		t.Fatal(err)
	}
	want, err := read(t, string(data))
	if err != nil {
		t.Fatal(err)
	}
	sameEntries(t, roundTrip(t, want), want)
}

// Random valid entries with full-precision floats and awkward text survive
// writing and reading.
func TestRoundTripRandom(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	glasses := []string{"517642", "620364", "fused-silica", "caf2", "sapphire"}
	texts := []string{"", "plain", "comma, inside", `quote " inside`, "two\nlines", "µm and ° signs", "# not a comment"}
	table := optics.BuiltinGlasses()
	var entries []record.Entry
	for i := range 200 {
		n := 2 + rng.IntN(MaxSurfaces-1)
		p := optics.Part{Supplier: "S" + formatFloat(float64(i%7)), Name: "P" + formatFloat(float64(i)),
			Description: texts[rng.IntN(len(texts))], Diameter: 5 + 45*rng.Float64()}
		if rng.IntN(2) == 0 {
			p.ClearAperture = p.Diameter * (0.5 + 0.5*rng.Float64())
		}
		for j := range n {
			s := optics.Surface{Radius: math.Inf(1)}
			if rng.IntN(4) > 0 {
				s.Radius = (p.Diameter*2 + 500*rng.Float64()) * float64(1-2*rng.IntN(2))
			}
			if rng.IntN(5) == 0 {
				s.Conic = -2 * rng.Float64()
				s.Asph[0] = 1e-6 * rng.NormFloat64()
				s.Asph[6] = 1e-20 * rng.NormFloat64()
			}
			p.Surfaces = append(p.Surfaces, s)
			if j < n-1 {
				p.Thickness = append(p.Thickness, 3+10*rng.Float64())
				m, _ := table.Lookup(glasses[rng.IntN(len(glasses))])
				p.Media = append(p.Media, m)
			}
		}
		if err := p.Validate(); err != nil {
			continue // a random shape too thin at the edge
		}
		e := record.Entry{Part: p, Price: math.Round(1000*rng.Float64()) / 100, Currency: "XTS",
			URL: "https://demo.example.com/" + p.Name, Notes: texts[rng.IntN(len(texts))]}
		if rng.IntN(3) == 0 {
			e.StatedWavelength = 400 + 300*rng.Float64()
		}
		e.Warnings = ComputedWarnings(e)
		entries = append(entries, e)
	}
	if len(entries) < 100 {
		t.Fatalf("only %d random parts were valid; the generator needs fixing", len(entries))
	}
	sameEntries(t, roundTrip(t, entries), entries)
}

func TestWritePrescriptionsRefuses(t *testing.T) {
	glass, _ := optics.GlassCode("517642")
	seven := optics.Part{Supplier: "DEMO", Name: "SEVEN", Diameter: 10}
	for range 7 {
		seven.Surfaces = append(seven.Surfaces, optics.Sphere(math.Inf(1)))
	}
	for range 6 {
		seven.Thickness = append(seven.Thickness, 1)
		seven.Media = append(seven.Media, glass)
	}
	tests := []struct {
		name string
		part optics.Part
		want string
	}{
		{"too many surfaces", seven, "writing DEMO:SEVEN: 7 surfaces; the prescription CSV holds 2 to 6"},
		{"missing material", optics.Part{Supplier: "DEMO", Name: "X", Surfaces: make([]optics.Surface, 2), Thickness: []float64{1}, Media: []optics.Medium{nil}},
			"writing DEMO:X: glass1 has no material"},
		{"comment-like supplier", optics.Part{Supplier: "#DEMO", Name: "X", Surfaces: make([]optics.Surface, 2), Thickness: []float64{1}, Media: []optics.Medium{glass}},
			"writing #DEMO:X: a supplier name starting with # would read back as a comment line"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			err := WritePrescriptions(&bytes.Buffer{}, []record.Entry{{Part: tc.part}})
			if err == nil || err.Error() != tc.want {
				t.Errorf("got %v, want %q", err, tc.want)
			}
		})
	}
}

func TestWritePrescriptionsColumns(t *testing.T) {
	es, err := read(t, "supplier,part,diameter,r1,r2,t1,glass1,conic1,asph2\nDEMO,A,10,20,inf,2,517642,0,a4=0\n")
	if err != nil {
		t.Fatal(err)
	}
	var buf bytes.Buffer
	if err := WritePrescriptions(&buf, es); err != nil {
		t.Fatal(err)
	}
	want := "supplier,part,description,diameter,clear_aperture,r1,r2,t1,glass1,efl,bfd,edge_thickness,stated_wavelength,price,currency,url,notes\n" +
		"DEMO,A,,10,,20,inf,2,517642,,,,,,,,\n"
	if got := buf.String(); got != want {
		t.Errorf("got\n%s\nwant\n%s", got, want)
	}
	if strings.Contains(buf.String(), "conic") {
		t.Error("zero conics need no column")
	}
}
