package importers

import (
	"errors"
	"fmt"
	"math"
	"os"
	"strings"
	"testing"

	"cardinal/catalog/record"
	"cardinal/optics"
)

const header = "supplier,part,diameter,r1,r2,t1,glass1"

func read(t *testing.T, csv string) ([]record.Entry, error) {
	t.Helper()
	return ReadPrescriptions(strings.NewReader(csv), "lenses.csv", optics.BuiltinGlasses())
}

func TestReadPrescriptionsFields(t *testing.T) {
	in := `# two parts
Supplier,Part,Description,Diameter,Clear_Aperture,R1,R2,R3,T1,T2,Glass1,Glass2,Conic1,Asph1,EFL,BFD,Edge_Thickness,Stated_Wavelength,Price,Currency,URL,Notes
DEMO,ACH,"cemented, crown first",25.4,22,61,-35.06,Plano,6,2.5,517642,620364,,,,,,,68.5,XTS,https://demo.example.com/a,"say ""hi"""
DEMO,ASP,,15,,11.66,-INF,,5,,FUSED-SILICA,,-0.6,"a4 = -2.1e-6, a6=-4.5e-9",,,,632.8,,,,
`
	es, err := read(t, in)
	if err != nil {
		t.Fatal(err)
	}
	if len(es) != 2 {
		t.Fatalf("got %d entries, want 2", len(es))
	}
	a, b := es[0], es[1]
	checks := []struct {
		name      string
		got, want any
	}{
		{"id", a.Part.ID(), "DEMO:ACH"},
		{"description", a.Part.Description, "cemented, crown first"},
		{"clear aperture", a.Part.ClearAperture, 22.0},
		{"surfaces", len(a.Part.Surfaces), 3},
		{"r2", a.Part.Surfaces[1].Radius, -35.06},
		{"plano is a flat", math.IsInf(a.Part.Surfaces[2].Radius, 1), true},
		{"thickness", a.Part.Thickness[1], 2.5},
		{"glass code", a.Part.Media[1].Name(), "620364"},
		{"price", a.Price, 68.5},
		{"currency", a.Currency, "XTS"},
		{"notes", a.Notes, `say "hi"`},
		{"line", a.Line, 3},
		{"-inf is a flat", math.IsInf(b.Part.Surfaces[1].Radius, 1), true},
		{"named glass, any case", b.Part.Media[0].Name(), "fused-silica"},
		{"conic", b.Part.Surfaces[0].Conic, -0.6},
		{"a4", b.Part.Surfaces[0].Asph[0], -2.1e-6},
		{"a6", b.Part.Surfaces[0].Asph[1], -4.5e-9},
		{"stated wavelength", b.StatedWavelength, 632.8},
		{"no warnings", len(a.Warnings) + len(b.Warnings), 0},
	}
	for _, c := range checks {
		if c.got != c.want {
			t.Errorf("%s: got %v, want %v", c.name, c.got, c.want)
		}
	}
}

// Every bad row and cell is reported, each with its line and column.
func TestReadPrescriptionsErrors(t *testing.T) {
	tests := []struct {
		name string
		rows string // after the header line (line 1), from line 2
		want []string
	}{
		{"radius smaller than the semi-diameter (issue 2's example)",
			"DEMO,A,12.7,20,4,3,517642",
			[]string{"lenses.csv:2: r2: radius 4 mm is smaller than the 6.35 mm semi-diameter"}},
		{"every cell of a row",
			"DEMO,A,-1,x,0,0,unobtainium",
			[]string{`lenses.csv:2: diameter: must be positive, not -1 mm`,
				`lenses.csv:2: r1: "x" is not a finite number`,
				`lenses.csv:2: r2: a radius of 0 is not a surface; write inf or plano for a flat`,
				`lenses.csv:2: t1: must be positive, not 0 mm`,
				`lenses.csv:2: glass1: unknown glass "unobtainium": use a six-digit glass code (517642), air, or one of: caf2, fused-silica, sapphire, water`}},
		{"every bad row, good rows between",
			"DEMO,A,25.4,,inf,3,517642\nDEMO,B,25.4,50,inf,3,517642\nDEMO,C,25.4,50,inf,nan,517642\n,D,25.4,50,inf,3,air",
			[]string{`lenses.csv:2: r1: is empty, but the part has 2 surfaces; write inf or plano for a flat`,
				`lenses.csv:4: t1: "nan" is not a finite number`,
				`lenses.csv:5: supplier: is empty but required`,
				`lenses.csv:5: glass1: a part cannot begin or end with air; name the glass of its first and last element`}},
		{"negative edge thickness from Validate",
			"DEMO,A,25.4,15,-15,1,517642", // 1 - 2 (15 - sqrt(15^2 - 12.7^2)) = -13.0363
			[]string{"lenses.csv:2: t1: the element between surfaces 1 and 2 has a negative edge thickness (-13.036 mm) at the 25.4 mm diameter"}},
		{"one surface only", "DEMO,A,25.4,50,,3,517642",
			[]string{"lenses.csv:2: r2: is empty: a part needs at least two surfaces (inf or plano for a flat)"}},
		{"duplicate part", "DEMO,A,25.4,50,inf,3,517642\nDEMO,A,25.4,50,inf,3,517642",
			[]string{"lenses.csv:3: part: DEMO:A is already on line 2; supplier and part together must be unique"}},
		{"colon in supplier", "DE:MO,A,25.4,50,inf,3,517642",
			[]string{`lenses.csv:2: supplier: "DE:MO" holds a colon, which separates supplier from part in SUPPLIER:PART`}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			es, err := read(t, header+"\n"+tc.rows+"\n")
			checkErrors(t, err, tc.want)
			if es != nil {
				t.Errorf("got %d entries with an error, want none", len(es))
			}
		})
	}
}

func TestReadPrescriptionsSurfaceColumns(t *testing.T) {
	h := "supplier,part,diameter,r1,r2,r3,t1,t2,glass1,glass2,conic3,asph1"
	tests := []struct {
		name, row string
		want      []string
	}{
		{"thickness past the last surface", "DEMO,A,25.4,50,inf,,3,2,517642,,,",
			[]string{"lenses.csv:2: t2: is filled but the part has only 2 surfaces (r2 is the last radius given)"}},
		{"conic past the last surface", "DEMO,A,25.4,50,inf,,3,,517642,,-1,",
			[]string{"lenses.csv:2: conic3: is filled but the part has only 2 surfaces (r2 is the last radius given)"}},
		{"missing glass of a doublet", "DEMO,A,25.4,60,-35,-140,6,2.5,517642,,,",
			[]string{"lenses.csv:2: glass2: is empty, but the part has 3 surfaces and needs glass1 to glass2"}},
		{"bad asphere terms", "DEMO,A,25.4,50,inf,,3,,517642,,,a5=1 a4=x a6=1e-9 a6=2e-9",
			[]string{`lenses.csv:2: asph1: "a5=1" is not a term like a4=1.2e-6 (even orders a4 to a16)`,
				`lenses.csv:2: asph1: a4: "x" is not a finite number`,
				`lenses.csv:2: asph1: a6 is given twice`}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			_, err := read(t, h+"\n"+tc.row+"\n")
			checkErrors(t, err, tc.want)
		})
	}
}

// Stated values are checked against the prescription. Expected values come
// from the thick-lens formulas (E. Hecht, Optics, 5th ed., sec. 6.2): for a
// plano-convex lens with its curved side first, f = R/(n-1) and
// BFD = f - t/n; its edge thickness is t - (R - sqrt(R^2 - h^2)) (the sag of
// a sphere, common geometry).
func TestStatedValueWarnings(t *testing.T) {
	const r, th, d, n = 25.84, 5.3, 25.4, 1.517 // glass code 517642: nd = 1.517
	f := r / (n - 1)
	bfd := f - th/n
	edge := th - (r - math.Sqrt(r*r-d*d/4))
	row := func(efl, b, e float64, extra string) string {
		return header + ",efl,bfd,edge_thickness,stated_wavelength\n" +
			strings.Join([]string{"DEMO,PCX,25.4,25.84,inf,5.3,517642", formatFloat(efl), formatFloat(b), formatFloat(e), extra}, ",") + "\n"
	}
	tests := []struct {
		name string
		csv  string
		want []string // substrings, one per warning
	}{
		{"values from the formulas", row(f, bfd, edge, ""), nil},
		{"within 1 %", row(f*1.009, bfd*0.991, edge+0.09, ""), nil},
		{"efl 2 % off", row(f*1.02, bfd, edge, ""), []string{"efl: stated 50.98 mm, but the prescription gives 49.981 mm at 587.6 nm (2 % off"}},
		{"bfd 2 % off", row(f, bfd*1.02, edge, ""), []string{"bfd: stated 47.417 mm, but the prescription gives 46.487 mm"}},
		{"edge 0.2 mm off", row(f, bfd, edge-0.2, ""), []string{"edge_thickness: stated 1.7637 mm, but the prescription gives 1.9637 mm at the 25.4 mm diameter (+0.200 mm"}},
		{"wavelength outside the glass code's fit", row(f, bfd, edge, "1064"),
			[]string{"stated_wavelength: 517642: 1064.0 nm is outside the 400-750 nm range of its dispersion formula",
				"efl: stated 49.981 mm, but the prescription gives 50.815 mm at 1064 nm", "bfd: stated 46.487 mm"}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			es, err := read(t, tc.csv)
			if err != nil {
				t.Fatal(err)
			}
			w := es[0].Warnings
			if len(w) != len(tc.want) {
				t.Fatalf("got warnings %q, want %d", w, len(tc.want))
			}
			for i := range w {
				if !strings.Contains(w[i], tc.want[i]) {
					t.Errorf("warning %q does not contain %q", w[i], tc.want[i])
				}
			}
		})
	}
}

// The computed EFL agrees with the thick-lens lensmaker's equation (Hecht,
// Optics, 5th ed., eq. 6.2):
// 1/f = (n-1) [1/R1 - 1/R2 + (n-1) d / (n R1 R2)], so a biconvex part with
// stated_wavelength 632.8 nm and the fused-silica index there,
// n = 1.45702 (Malitson 1965, from memory), imports without warnings, and a
// 587.6 nm statement of the same value is 0.3 % off, inside the tolerance.
func TestStatedWavelengthUsed(t *testing.T) {
	const r1, r2, d, n = 40.0, -40.0, 6.0, 1.45702
	f := 1 / ((n - 1) * (1/r1 - 1/r2 + (n-1)*d/(n*r1*r2)))
	csv := header + ",efl,stated_wavelength\nDEMO,DCX,25.4,40,-40,6,fused-silica," + formatFloat(f) + ",632.8\n"
	es, err := read(t, csv)
	if err != nil {
		t.Fatal(err)
	}
	got := es[0].Part.System(nil, nil).Cardinal(632.8).EFL
	if math.Abs(got-f) > 2e-4*f { // the index is quoted to 1e-5
		t.Errorf("EFL at 632.8 nm: got %.5f, lensmaker gives %.5f", got, f)
	}
	if len(es[0].Warnings) != 0 {
		t.Errorf("unexpected warnings %q", es[0].Warnings)
	}
}

// The demo file ships with stated values consistent with its prescriptions.
func TestDemoFileImportsCleanly(t *testing.T) {
	f, err := os.Open("../catalog/demo/lenses.csv")
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	file, err := ReadPrescriptionFile(f, "lenses.csv", optics.BuiltinGlasses())
	if err != nil {
		t.Fatal(err)
	}
	if len(file.Warnings) != 0 {
		t.Errorf("file warnings: %v", file.Warnings)
	}
	ids := map[string]bool{}
	for _, e := range file.Rows {
		ids[e.Part.ID()] = true
		if len(e.Warnings) != 0 {
			t.Errorf("%s: %q", e.Part.ID(), e.Warnings)
		}
		if e.StatedEFL == 0 || e.StatedBFD == 0 || e.StatedEdge == 0 {
			t.Errorf("%s: the demo states efl, bfd and edge_thickness for every part", e.Part.ID())
		}
	}
	if !ids["DEMO:PCX-50"] || len(file.Rows) < 10 {
		t.Errorf("demo has %d parts (want about 12, with DEMO:PCX-50)", len(file.Rows))
	}
}

// A file of many rows, read in runs on several goroutines while it is
// read, gives its entries in file order, and every problem, a part given
// twice across runs among them, in line order (invented parts).
func TestReadPrescriptionsManyRows(t *testing.T) {
	const n = 1000 // several runs of streamRun rows
	var good, bad strings.Builder
	for _, b := range []*strings.Builder{&good, &bad} {
		b.WriteString("supplier,part,diameter,r1,r2,t1,glass1\n")
	}
	wantBad := map[int]string{}
	for i := range n {
		line := i + 2
		fmt.Fprintf(&good, "MANY,P%04d,12.7,%d,inf,3,517642\n", i, 20+i)
		switch i {
		case 3, 600:
			fmt.Fprintf(&bad, "MANY,P%04d,12.7,%d,inf,-3,517642\n", i, 20+i) // a negative thickness
			wantBad[line] = "t1"
		case 700:
			fmt.Fprintf(&bad, "MANY,P%04d,12.7,%d,inf,3,517642\n", 2, 20+i) // P0002 again
			wantBad[line] = "part"
		default:
			fmt.Fprintf(&bad, "MANY,P%04d,12.7,%d,inf,3,517642\n", i, 20+i)
		}
	}
	es, err := ReadPrescriptions(strings.NewReader(good.String()), "many.csv", optics.BuiltinGlasses())
	if err != nil || len(es) != n {
		t.Fatalf("%d entries, %v", len(es), err)
	}
	for i, e := range es {
		if e.Line != i+2 || e.Part.Name != fmt.Sprintf("P%04d", i) {
			t.Fatalf("entry %d is %s on line %d", i, e.Part.Name, e.Line)
		}
	}
	_, err = ReadPrescriptions(strings.NewReader(bad.String()), "many.csv", optics.BuiltinGlasses())
	var fe FileErrors
	if !errors.As(err, &fe) || len(fe) != len(wantBad) {
		t.Fatalf("errors %v, want one on each of lines %v", err, wantBad)
	}
	for i, e := range fe {
		if wantBad[e.Line] != e.Column || i > 0 && fe[i-1].Line >= e.Line {
			t.Errorf("error %d: %v; want lines %v in order", i, e, wantBad)
		}
	}
}
