package importers

import (
	"bytes"
	"errors"
	"os"
	"reflect"
	"testing"

	"cardinal/optics"
)

// FuzzReadPrescriptions shows that no input makes the reader panic, that a
// failed read always explains itself with FileErrors, and that whatever
// reads cleanly survives a write and a second read unchanged.
func FuzzReadPrescriptions(f *testing.F) {
	demo, err := os.ReadFile("../catalog/demo/lenses.csv")
	if err != nil {
		f.Fatal(err)
	}
	for _, seed := range []string{
		string(demo),
		header + "\nDEMO,A,12.7,20,4,3,517642\n",
		"supplier,part,diameter,r1,r2,r3,t1,t2,glass1,glass2,conic1,asph1\nDEMO,A,25.4,60,-35,-140,6,2.5,517642,620364,-1,a4=1e-6\n",
		"\uFEFF# c\nSUPPLIER,part,diameter,r1,r2,t1,glass1\n\"D\"\"E\",\"P\nQ\",10,inf,-20,2,caf2\n",
		"supplier,part\n\xff\n",
		"a,\"b\nc",
	} {
		f.Add([]byte(seed))
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		glasses := optics.BuiltinGlasses()
		entries, err := ReadPrescriptions(bytes.NewReader(data), "fuzz.csv", glasses)
		if err != nil {
			var fe FileErrors
			if !errors.As(err, &fe) || len(fe) == 0 {
				t.Fatalf("error %v (%T) is not a non-empty FileErrors", err, err)
			}
			return
		}
		var buf bytes.Buffer
		if err := WritePrescriptions(&buf, entries); err != nil {
			t.Fatalf("writing what was read: %v", err)
		}
		again, err := ReadPrescriptions(&buf, "again.csv", glasses)
		if err != nil {
			t.Fatalf("reading what was written: %v\n%s", err, buf.String())
		}
		if len(again) != len(entries) {
			t.Fatalf("%d entries, %d after the round trip", len(entries), len(again))
		}
		for i := range again {
			again[i].Line = entries[i].Line
			if !reflect.DeepEqual(again[i], entries[i]) {
				t.Fatalf("entry %d changed:\n%+v\n%+v", i, entries[i], again[i])
			}
		}
	})
}
