package importers

import (
	"strings"
	"testing"

	"cardinal/optics"
)

// The coating column is read as stated (0 included, a trailing % allowed),
// an empty cell as not stated, and written back so that it reads the same.
func TestCoatingColumn(t *testing.T) {
	csv := `supplier,part,diameter,r1,r2,t1,glass1,residual_reflectance
DEMO,A,25,100,-100,5,517642,0.25%
DEMO,B,25,100,-100,5,517642,
DEMO,C,25,100,-100,5,517642,0
DEMO,D,25,100,-100,5,517642,100
`
	es, err := read(t, csv)
	if err != nil {
		t.Fatal(err)
	}
	want := []optics.Coating{{Stated: true, ResidualPct: 0.25}, {}, {Stated: true}, {Stated: true, ResidualPct: 100}}
	for i, e := range es {
		if e.Part.Coating != want[i] {
			t.Errorf("%s: coating %+v, want %+v", e.Part.ID(), e.Part.Coating, want[i])
		}
	}
	sameEntries(t, roundTrip(t, es), es)
	// Without the column every part reads as uncoated, and the writer
	// leaves the column out.
	es, err = read(t, "supplier,part,diameter,r1,r2,t1,glass1\nDEMO,A,25,100,-100,5,517642\n")
	if err != nil || es[0].Part.Coating.Stated {
		t.Fatalf("no column: %+v, %v", es, err)
	}
	var b strings.Builder
	if err := WritePrescriptions(&b, es); err != nil || strings.Contains(b.String(), CoatingColumn) {
		t.Errorf("an uncoated catalog was written with the coating column (%v):\n%s", err, b.String())
	}
}

// A bad coating cell names the file, line and column.
func TestCoatingColumnErrors(t *testing.T) {
	for _, cell := range []string{"-0.5", "101", "100.0001%", "NaN", "inf", "1e400", "x", "%"} {
		t.Run(cell, func(t *testing.T) {
			csv := "supplier,part,diameter,r1,r2,t1,glass1,residual_reflectance\n" +
				"DEMO,A,25,100,-100,5,517642,0.5\nDEMO,B,25,100,-100,5,517642," + cell + "\n"
			_, err := read(t, csv)
			want := "lenses.csv:3: residual_reflectance: "
			if err == nil || !strings.Contains(err.Error(), want) || !strings.Contains(err.Error(), "0 to 100") {
				t.Errorf("error %v, want one containing %q and the range", err, want)
			}
		})
	}
}

// A spreadsheet column mapped to the coating column reads as the neutral
// column does (decimal comma and % allowed), and a bad cell names its cell;
// lengths in inches do not scale it (a reflectance is not a length).
func TestCoatingMapped(t *testing.T) {
	m := readMap(t, "lengths: inch\ndecimal: comma\ndelimiter: ;\nsupplier = X\npart <- p\ndiameter <- d\nr1 <- r1\nr2 <- r2\nt1 <- t\nglass1 = 517642\nresidual_reflectance <- R avg (%)\n")
	src := Source{Name: "in.csv", Data: []byte("p;d;r1;r2;t;R avg (%)\nA;1;1;inf;0,25;0,5\nB;1;1;inf;0,25;\nC;1;1;inf;0,25;0,3%\n")}
	got, err := ReadMapped(src, m, MapOptions{})
	if err != nil {
		t.Fatal(err)
	}
	want := []optics.Coating{{Stated: true, ResidualPct: 0.5}, {}, {Stated: true, ResidualPct: 0.3}}
	for i, e := range got.Rows {
		if e.Part.Coating != want[i] {
			t.Errorf("%s: %+v, want %+v", e.Part.ID(), e.Part.Coating, want[i])
		}
	}
	src.Data = []byte("p;d;r1;r2;t;R avg (%)\nA;1;1;inf;0,25;120\n")
	if _, err := ReadMapped(src, m, MapOptions{}); err == nil || !strings.Contains(err.Error(), "residual_reflectance") || !strings.Contains(err.Error(), "0 to 100") {
		t.Errorf("120 %%: error %v, want one naming the column and the range", err)
	}
}
