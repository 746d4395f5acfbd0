package importers

import (
	"bytes"
	"math"
	"reflect"
	"strings"
	"testing"

	"cardinal/optics"
)

const glassHeader = "name,formula,coefficients,min_nm,max_nm,source\n"

// Each formula gives published indices. Sources beside each case.
func TestGlassIndices(t *testing.T) {
	csv := glassHeader +
		// I. H. Malitson, J. Opt. Soc. Am. 55, 1205 (1965): B1 C1 B2 C2 B3 C3
		// with C = (0.0684043 um)^2, (0.1162414 um)^2, (9.896161 um)^2.
		"silica,Sellmeier,0.6961663 0.004679148 0.4079426 0.01351206 0.8974794 97.934,210,3710,Malitson 1965\n" +
		// Two-term Cauchy fit of a borosilicate crown, A = 1.5046,
		// B = 0.00420 um^2, n = A + B/lambda^2 with lambda in um (a
		// textbook example, from memory: no published table is cited for
		// these two constants).
		"crown,cauchy,1.5046 0.00420,,,textbook fit\n" +
		"oil,constant,1.515,,,immersion oil nd (common practice)\n" +
		"flint,abbe,1.62 36.4,,,\n"
	gs, err := ReadGlasses(strings.NewReader(csv), "glasses.csv")
	if err != nil {
		t.Fatal(err)
	}
	m := map[string]optics.Medium{}
	for _, g := range gs {
		m[g.Name] = g.Medium()
	}
	tests := []struct {
		name  string
		glass string
		nm    float64
		want  float64
		tol   float64
	}{
		// Malitson 1965, table values for fused silica.
		{"silica F", "silica", optics.LineF, 1.46313, 1e-5},
		{"silica d", "silica", optics.LineD, 1.45846, 1e-5},
		{"silica C", "silica", optics.LineC, 1.45637, 1e-5},
		// The formula itself at the d line: 1.5046 + 0.00420/0.5875618^2 =
		// 1.516766 (Cauchy's two-term formula, worked by hand); nd of the
		// borosilicate crown it fits is 1.5168 (from memory).
		{"crown d by the formula", "crown", optics.LineD, 1.5046 + 0.00420/(0.5875618*0.5875618), 1e-12},
		{"crown d", "crown", optics.LineD, 1.5168, 3e-4},
		{"oil anywhere", "oil", 1000, 1.515, 0},
		// The abbe formula reproduces nd exactly (its definition).
		{"flint d", "flint", optics.LineD, 1.62, 1e-12},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			if got := m[tc.glass].Index(tc.nm); math.Abs(got-tc.want) > tc.tol {
				t.Errorf("n(%g nm) = %.6f, want %.6f +- %g", tc.nm, got, tc.want, tc.tol)
			}
		})
	}
	// Abbe number definition: Vd = (nd - 1)/(nF - nC) (common practice).
	fl := m["flint"]
	if vd := (fl.Index(optics.LineD) - 1) / (fl.Index(optics.LineF) - fl.Index(optics.LineC)); math.Abs(vd-36.4) > 1e-9 {
		t.Errorf("flint Vd = %.6f, want 36.4", vd)
	}
	if lo, hi := m["silica"].Range(); lo != 210 || hi != 3710 {
		t.Errorf("silica range %g-%g, want 210-3710", lo, hi)
	}
}

func TestReadGlassesErrors(t *testing.T) {
	tests := []struct {
		name, rows string
		want       []string
	}{
		{"unknown formula", "g,polynomial,1 2,,,",
			[]string{`g.csv:2: coefficients: formula "polynomial" is not one of sellmeier, cauchy, constant, abbe`}},
		{"odd sellmeier count", "g,sellmeier,1 0.01 2,,,",
			[]string{"g.csv:2: coefficients: sellmeier takes pairs B1 C1 B2 C2 ..., not 3 numbers"}},
		{"pole inside the range", "g,sellmeier,1.03 0.25,400,1100,",
			[]string{"g.csv:2: coefficients: C1 = 0.25 um^2 puts a pole of the formula at 500.0 nm, inside 400-1100 nm; check the order B1 C1 B2 C2 ..."}},
		{"index below 1", "g,cauchy,0.5,,,",
			[]string{"g.csv:2: coefficients: the index at 552.4 nm is 0.5, not a number from 1 to 10; check the coefficients and their order"}},
		{"half a range", "g,constant,1.5,400,,",
			[]string{"g.csv:2: max_nm: the range 400-0 nm must satisfy 0 < min_nm < max_nm (leave both empty for none)"}},
		{"reserved names", "air,constant,1,,,\n517642,constant,1.5,,,",
			[]string{"g.csv:2: name: air is built in and cannot be redefined",
				`g.csv:3: name: "517642" is a six-digit glass code, which the program reads as nd and Vd; give the glass a name`}},
		{"duplicate name, any case", "Crown,constant,1.5,,,\ncrown,constant,1.5,,,",
			[]string{"g.csv:3: name: crown is already on line 2; names must be unique (case does not count)"}},
		{"bad number", "g,cauchy,1.5 x,,,",
			[]string{`g.csv:2: coefficients: "x" is not a finite number; separate the coefficients with spaces`}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			gs, err := ReadGlasses(strings.NewReader(glassHeader+tc.rows+"\n"), "g.csv")
			checkErrors(t, err, tc.want)
			if gs != nil {
				t.Error("glasses returned with an error")
			}
		})
	}
}

func TestGlassRoundTrip(t *testing.T) {
	want := []Glass{
		{Name: "silica", Formula: "sellmeier", Coefficients: []float64{0.6961663, 0.004679148, 0.4079426, 0.01351206, 0.8974794, 97.934}, MinNm: 210, MaxNm: 3710, Source: "Malitson, J. Opt. Soc. Am. 55, 1205 (1965)"},
		{Name: "my crown", Formula: "abbe", Coefficients: []float64{1.5168, 64.17}, Source: "datasheet, \"rev B\""},
		{Name: "oil", Formula: "constant", Coefficients: []float64{1.515}, MinNm: 400, MaxNm: 700},
		{Name: "fit", Formula: "cauchy", Coefficients: []float64{1.4580, 0.00354, 1.0 / 3}},
	}
	var buf bytes.Buffer
	if err := WriteGlasses(&buf, want); err != nil {
		t.Fatal(err)
	}
	got, err := ReadGlasses(&buf, "g.csv")
	if err != nil {
		t.Fatal(err)
	}
	for i := range got {
		got[i].Line = 0
	}
	if !reflect.DeepEqual(got, want) {
		t.Errorf("round trip:\n got %+v\nwant %+v", got, want)
	}
}
