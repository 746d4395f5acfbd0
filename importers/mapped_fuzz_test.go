package importers

import (
	"strings"
	"testing"
)

// FuzzReadMapped feeds arbitrary tables (CSV text, or bytes that claim to
// be a workbook) through a mapping: the reader may refuse them, never
// panic, and every entry it returns is a valid part.
func FuzzReadMapped(f *testing.F) {
	f.Add([]byte("p,d,r1,r2,t\nA,1,1,inf,0.25\n"), "lengths: inch\nsupplier = X\npart <- p\ndiameter <- d\nr1 <- r1\nr2 <- r2\nt1 <- t\nglass1 = 517642\n")
	f.Add([]byte("Item;D;R1;R2;CT;S\nA;25,4;50;50;4;biconvex\n"), "delimiter: ;\ndecimal: comma\nradii: magnitudes\nflat: 0, blank\nsupplier = X\npart <- Item\ndiameter <- D\nr1 <- R1\nr2 <- R2\nt1 <- CT\nshape <- S\nglass1 = 517642\n")
	f.Add(buildXLSX(f, "Parts", smallSheet(), nil), smallMapping)
	f.Fuzz(func(t *testing.T, data []byte, mapping string) {
		m, err := ReadMapping(strings.NewReader(mapping), "fuzz.colmap")
		if err != nil {
			return
		}
		got, err := ReadMapped(Source{Name: "fuzz", Data: data}, m, MapOptions{})
		if err != nil {
			return
		}
		for _, e := range got.Rows {
			if verr := e.Part.Validate(); verr != nil {
				t.Errorf("row %d: an invalid part was returned: %v", e.Line, verr)
			}
		}
	})
}
