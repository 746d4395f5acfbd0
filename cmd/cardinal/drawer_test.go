package main

import (
	"path/filepath"
	"strings"
	"testing"
)

func TestDrawerSetFlags(t *testing.T) {
	for _, tc := range []struct {
		name         string
		args         []string
		quantity     int
		location     string
		keepLocation bool
		err          string
	}{
		{"quantity and location", []string{"DEMO:PCX-50", "--quantity", "3", "--location", "B2"}, 3, "B2", false, ""},
		{"quantity only keeps the location", []string{"DEMO:PCX-50", "--quantity", "0"}, 0, "", true, ""},
		{"empty location clears it", []string{"DEMO:PCX-50", "--quantity", "1", "--location", ""}, 1, "", false, ""},
		{"quantity as the second argument", []string{"DEMO:PCX-50", "2", "--location", "A1"}, 2, "A1", false, ""},
		{"the same quantity twice", []string{"DEMO:PCX-50", "2", "--quantity", "2"}, 2, "", true, ""},
		{"two quantities", []string{"DEMO:PCX-50", "2", "--quantity", "3"}, 0, "", false, "given twice"},
		{"second argument not a number", []string{"DEMO:PCX-50", "two"}, 0, "", false, "whole number"},
		{"no quantity", []string{"DEMO:PCX-50"}, 0, "", false, "drawer set DEMO:PCX-50 N"},
		{"negative", []string{"DEMO:PCX-50", "--quantity", "-1"}, 0, "", false, ">= 0"},
		{"not a number", []string{"DEMO:PCX-50", "--quantity", "two"}, 0, "", false, "invalid argument"},
		{"no part", []string{"--quantity", "1"}, 0, "", false, "accepts between 1 and 2 arg"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			e, _, _ := storeEnv(t, nil)
			var got *drawerSetOptions
			err := parseWith(newDrawerSetCmd(e, func(o *drawerSetOptions) error { got = o; return nil }), tc.args...)
			if tc.err != "" {
				if err == nil || !strings.Contains(err.Error(), tc.err) {
					t.Errorf("error %v, want %q", err, tc.err)
				}
				return
			}
			if err != nil || got.Quantity != tc.quantity || got.Location != tc.location || got.KeepLocation != tc.keepLocation {
				t.Errorf("%+v, %v", got, err)
			}
		})
	}
}

func TestRunDrawerCommands(t *testing.T) {
	db := filepath.Join(t.TempDir(), "c.db")
	e, out, errb := storeEnv(t, map[string]string{"CARDINAL_DB": db})
	drawer := writeFile(t, "d.csv", "supplier,part,quantity,location\nDEMO,PCX-50,2,A1\nDEMO,DCX-75,1,A2\n")
	unknown := writeFile(t, "u.csv", "supplier,part,quantity,location\nDEMO,PCX-50,2,A1\nDEMO,PCX-5O,1,A2\n")
	for _, tc := range []struct {
		name   string
		args   []string
		code   int
		stdout string
		stderr string
	}{
		{"list of a named catalog not there yet", []string{"drawer", "list"}, exitNotFound, "", "does not exist; create it"},
		{"set without a catalog", []string{"drawer", "set", "DEMO:PCX-50", "--quantity", "1"}, exitNotFound, "", "no catalog at"},
		{"import the parts", []string{"catalog", "import", demoLensesCSV}, 0, "13 added", ""},
		{"drawer import", []string{"drawer", "import", drawer}, 0, "drawer entries: 2 added", ""},
		{"an unknown part changes nothing", []string{"drawer", "import", unknown}, exitUsage, "", "u.csv:3: DEMO:PCX-5O: part: no part"},
		{"set", []string{"drawer", "set", "DEMO:PCX-50", "--quantity", "5"}, 0, "DEMO:PCX-50: 5 in the drawer at A1", ""},
		{"set unknown", []string{"drawer", "set", "DEMO:PCX-55", "--quantity", "1"}, exitNotFound, "", "did you mean"},
		{"list", []string{"drawer", "list", "--format", "csv"}, 0, "supplier,part,quantity,location\nDEMO,DCX-75,1,A2\nDEMO,PCX-50,5,A1\n", ""},
		{"list in drawer", []string{"catalog", "list", "--in-drawer", "--format", "csv"}, 0, "DEMO,DCX-75,", ""},
	} {
		t.Run(tc.name, func(t *testing.T) {
			code := runCLI(e, tc.args...)
			if code != tc.code || !strings.Contains(out.String(), tc.stdout) || !strings.Contains(unwrap(errb.String()), tc.stderr) {
				t.Errorf("exit %d, stdout %q, stderr %q; want %d, %q, %q", code, out, errb, tc.code, tc.stdout, tc.stderr)
			}
		})
	}
}
