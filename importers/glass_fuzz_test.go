package importers

import (
	"bytes"
	"errors"
	"os"
	"reflect"
	"testing"
)

// FuzzReadGlasses shows that no input makes the glass reader panic, that a
// refusal is a non-empty FileErrors, and that every glass it accepts gives
// a finite index of at least 1 across its band and survives a write and a
// second read unchanged.
func FuzzReadGlasses(f *testing.F) {
	demo, err := os.ReadFile("../catalog/demo/glasses.csv")
	if err != nil {
		f.Fatal(err)
	}
	for _, seed := range []string{
		string(demo),
		"name,formula,coefficients\nk7x,abbe,1.5111 60.4\n",
		"name,formula,coefficients,min_nm,max_nm,source\nc1,cauchy,1.45 0.004 0.0001,400,1000,\"A, B\"\nn1,constant,1.33,,,\n",
		"NAME,Formula,COEFFICIENTS\n'=x,sellmeier,1.03 0.006 0.23 0.02 1.01 103.5\n",
		"name,formula,coefficients\ns,sellmeier,1 0.3\n", // a pole at 548 nm
		"name,formula,coefficients\nq,cauchy,1e308 1e308\n",
		"\uFEFF# comment\nname,formula,coefficients\n\"a\nb\",abbe,1.9 20\n",
		"name,formula\n\xff,abbe\n",
	} {
		f.Add([]byte(seed))
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		glasses, err := ReadGlasses(bytes.NewReader(data), "fuzz.csv")
		if err != nil {
			var fe FileErrors
			if !errors.As(err, &fe) || len(fe) == 0 {
				t.Fatalf("error %v (%T) is not a non-empty FileErrors", err, err)
			}
			return
		}
		for _, g := range glasses {
			finiteIndex(t, g)
		}
		var buf bytes.Buffer
		if err := WriteGlasses(&buf, glasses); err != nil {
			t.Fatalf("writing what was read: %v", err) // the reader refuses a name the writer would
		}
		again, err := ReadGlasses(&buf, "again.csv")
		if err != nil {
			t.Fatalf("reading what was written: %v\n%s", err, buf.String())
		}
		if len(again) != len(glasses) {
			t.Fatalf("%d glasses, %d after the round trip", len(glasses), len(again))
		}
		for i := range again {
			again[i].Line = glasses[i].Line
			if !reflect.DeepEqual(again[i], glasses[i]) {
				t.Fatalf("glass %d changed:\n%+v\n%+v", i, glasses[i], again[i])
			}
		}
	})
}

// finiteIndex samples an accepted glass's index densely over its band (its
// formula's own, else F to C as Validate checks it) and fails on a value
// that is not a number from 1 to MaxIndex.
func finiteIndex(t *testing.T, g Glass) {
	t.Helper()
	m := g.Medium()
	lo, hi := m.Range()
	if lo == 0 && hi == 0 {
		lo, hi = 486.1327, 656.2725 // the F and C lines (common practice)
	}
	for k := 0; k <= 64; k++ {
		wl := lo + (hi-lo)*float64(k)/64
		if n := m.Index(wl); !(n >= 1 && n <= MaxIndex) {
			t.Fatalf("glass %+v accepted, but its index at %.3f nm is %v", g, wl, n)
		}
	}
}

// FuzzGlassNumbers writes a glass row from fuzzed numbers (a formula, up to
// six coefficients, a band) and reads it: a glass accepted gives a finite
// index from 1 to MaxIndex across its band, so nothing downstream divides
// by a pole or overflows. The
// byte-level FuzzReadGlasses rarely reaches such numbers.
func FuzzGlassNumbers(f *testing.F) {
	// Seeds: a crown glass's three-term Sellmeier (common practice: the
	// form of Schott's data sheets, coefficients from memory), a Cauchy,
	// an Abbe pair, and numbers at the edges of float64.
	f.Add(uint8(0), uint8(6), 1.04, 0.006, 0.23, 0.02, 1.01, 103.5, 0.0, 0.0)
	f.Add(uint8(1), uint8(3), 1.45, 0.004, 0.0001, 0.0, 0.0, 0.0, 400.0, 1000.0)
	f.Add(uint8(3), uint8(2), 1.5168, 64.17, 0.0, 0.0, 0.0, 0.0, 0.0, 0.0)
	f.Add(uint8(2), uint8(1), 1e308, 0.0, 0.0, 0.0, 0.0, 0.0, 1e-300, 1e300)
	f.Add(uint8(0), uint8(2), -1e-300, -1e300, 0.0, 0.0, 0.0, 0.0, 5.0, 6.0)
	f.Fuzz(func(t *testing.T, formula, n uint8, c1, c2, c3, c4, c5, c6, lo, hi float64) {
		cs := []float64{c1, c2, c3, c4, c5, c6}[:1+int(n)%6]
		text := ""
		for i, c := range cs {
			if i > 0 {
				text += " "
			}
			text += formatFloat(c)
		}
		row := "name,formula,coefficients,min_nm,max_nm\ng," + Formulas()[int(formula)%len(Formulas())] + "," + text + "," + optionalFloat(lo) + "," + optionalFloat(hi) + "\n"
		glasses, err := ReadGlasses(bytes.NewReader([]byte(row)), "fuzz.csv")
		if err != nil {
			return
		}
		finiteIndex(t, glasses[0])
	})
}
