package importers

import (
	"bytes"
	"strings"
	"testing"

	"cardinal/catalog/record"
)

func TestReadDrawerErrors(t *testing.T) {
	tests := []struct {
		name, rows string
		want       []string
	}{
		{"quantity", "DEMO,A,two\nDEMO,B,1.5\nDEMO,C,",
			[]string{`d.csv:2: quantity: "two" is not a whole number from 0 to 1000000`,
				`d.csv:3: quantity: "1.5" is not a whole number from 0 to 1000000`,
				`d.csv:4: quantity: is empty but required`}},
		{"duplicate", "DEMO,A,1\nDEMO,A,2",
			[]string{"d.csv:3: part: DEMO:A is already on line 2; list each part once"}},
		{"names", ",A,1\nDE:MO,B,1",
			[]string{"d.csv:2: supplier: is empty but required", `d.csv:3: supplier: "DE:MO" may not start with # or hold a colon`}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			items, err := ReadDrawer(strings.NewReader("supplier,part,quantity\n"+tc.rows+"\n"), "d.csv")
			checkErrors(t, err, tc.want)
			if items != nil {
				t.Error("items returned with an error")
			}
		})
	}
}

func TestDrawerRoundTrip(t *testing.T) {
	want := []record.DrawerItem{
		{Supplier: "DEMO", Part: "PCX-50", Quantity: 3, Location: "B2"},
		{Supplier: "FICTA", Part: "ASP-20", Quantity: 0, Location: "cabinet 3, tray \"1\""},
	}
	var buf bytes.Buffer
	if err := WriteDrawer(&buf, want); err != nil {
		t.Fatal(err)
	}
	got, err := ReadDrawer(&buf, "d.csv")
	if err != nil {
		t.Fatal(err)
	}
	for i := range got {
		got[i].Line = 0
	}
	if !equalDrawer(got, want) {
		t.Errorf("round trip:\n got %+v\nwant %+v", got, want)
	}
}
