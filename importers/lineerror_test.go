package importers

import "testing"

func TestLineErrorFormat(t *testing.T) {
	tests := []struct {
		name string
		err  LineError
		want string
	}{
		{"cell", LineError{"lenses.csv", 14, "r2", "radius 4 mm is smaller than the 6.35 mm semi-diameter"},
			"lenses.csv:14: r2: radius 4 mm is smaller than the 6.35 mm semi-diameter"},
		{"row", LineError{"a.csv", 3, "", "bad row"}, "a.csv:3: bad row"},
		{"file", LineError{"a.csv", 0, "", "no header line"}, "a.csv: no header line"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			if got := tc.err.Error(); got != tc.want {
				t.Errorf("got %q, want %q", got, tc.want)
			}
		})
	}
	fe := FileErrors{tests[0].err, tests[1].err}
	if got, want := fe.Error(), tests[0].want+"\n"+tests[1].want; got != want {
		t.Errorf("FileErrors: got %q, want %q", got, want)
	}
}
