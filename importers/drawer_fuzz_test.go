package importers

import (
	"bytes"
	"errors"
	"os"
	"reflect"
	"testing"
)

// FuzzReadDrawer shows that no input makes the drawer reader panic, that a
// refusal is a non-empty FileErrors, that every accepted row has a
// supplier, a part and a quantity >= 0, and that what it accepts survives a
// write and a second read unchanged.
func FuzzReadDrawer(f *testing.F) {
	demo, err := os.ReadFile("../catalog/demo/drawer.csv")
	if err != nil {
		f.Fatal(err)
	}
	for _, seed := range []string{
		string(demo),
		"supplier,part,quantity\nDEMO,PCX-50,0\n",
		"Location,QUANTITY,part,supplier\n\"cabinet 3, tray 1\",+2,P,S\n",
		"supplier,part,quantity,location\nS,=1+1,1,-2+3\nS,P,1,'@x\n",
		"supplier,part,quantity\nS,P,-1\nS,P,1e3\n",
		"\uFEFF# c\nsupplier,part,quantity\n\"a\"\"b\",\"p\nq\",99999999999999999999\n",
		"supplier,part,quantity\n\xff,P,1\n",
	} {
		f.Add([]byte(seed))
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		items, err := ReadDrawer(bytes.NewReader(data), "fuzz.csv")
		if err != nil {
			var fe FileErrors
			if !errors.As(err, &fe) || len(fe) == 0 {
				t.Fatalf("error %v (%T) is not a non-empty FileErrors", err, err)
			}
			return
		}
		for _, d := range items {
			if d.Supplier == "" || d.Part == "" || d.Quantity < 0 {
				t.Fatalf("accepted %+v", d)
			}
		}
		var buf bytes.Buffer
		if err := WriteDrawer(&buf, items); err != nil {
			t.Fatalf("writing what was read: %v", err) // the reader refuses a supplier the writer would
		}
		again, err := ReadDrawer(&buf, "again.csv")
		if err != nil {
			t.Fatalf("reading what was written: %v\n%s", err, buf.String())
		}
		if len(again) != len(items) {
			t.Fatalf("%d items, %d after the round trip", len(items), len(again))
		}
		for i := range again {
			again[i].Line = items[i].Line
			if !reflect.DeepEqual(again[i], items[i]) {
				t.Fatalf("item %d changed:\n%+v\n%+v", i, items[i], again[i])
			}
		}
	})
}
