package main

import (
	"encoding/json"
	"testing"
)

func TestCatalogTolerancesFlags(t *testing.T) {
	for _, tc := range []struct {
		name string
		args []string
		want func(*catalogTolerancesOptions) bool
		err  string
	}{
		{"show", nil, func(o *catalogTolerancesOptions) bool { return !o.changesAny }, ""},
		{"set", []string{"--efl-tol", "2%", "--radius-tol", "0", "--thickness-tol", "0.2"},
			func(o *catalogTolerancesOptions) bool {
				return o.changesAny && o.eflPct == 2 && o.radiusPct == 0 && o.Thickness == 0.2
			}, ""},
		{"zero efl", []string{"--efl-tol", "0"}, nil, "--efl-tol"},
		{"huge efl", []string{"--efl-tol", "60%"}, nil, "below 50"},
		{"negative thickness", []string{"--thickness-tol", "-1"}, nil, "--thickness-tol"},
		{"index too large", []string{"--index-tol", "0.6"}, nil, "--index-tol"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			e, _, _ := testEnv()
			var got *catalogTolerancesOptions
			err := parseWith(newCatalogTolerancesCmd(e, func(o *catalogTolerancesOptions) error { got = o; return nil }), tc.args...)
			checkParse(t, err, tc.err, func() bool { return got != nil && tc.want(got) })
		})
	}
}

// What is set is shown, and find records it as the part defaults of its
// build study.
func TestRunCatalogTolerances(t *testing.T) {
	db := savedCatalog(t)
	if _, errs, code := cmdRun(t, db, "catalog", "tolerances", "--efl-tol", "2%", "--index-tol", "0.002"); code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	out, errs, code := cmdRun(t, db, "catalog", "tolerances", "--format", "json")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	var got map[string]float64
	if err := json.Unmarshal([]byte(out), &got); err != nil {
		t.Fatal(err)
	}
	want := map[string]float64{"efl_tol_pct": 2, "thickness_tol_mm": 0.1, "index_tol": 0.002, "radius_tol_pct": 0}
	for k, v := range want {
		if got[k] != v {
			t.Errorf("%s = %g, want %g", k, got[k], v)
		}
	}
	if _, errs, code := findRun(t, db, "--efl", "75", "--top", "1"); code != 0 {
		t.Fatalf("find: exit %d: %s", code, errs)
	}
	req, _ := savedResults(t, db, "last")
	if d := req.Build.PartDefaults; d.EFLPct != 2 || d.Index != 0.002 {
		t.Errorf("find's part defaults %+v", d)
	}
}
