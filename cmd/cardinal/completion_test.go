package main

import (
	"strings"
	"testing"
)

// complete asks the completion machinery (cobra's hidden __complete
// command, which the shell scripts call) for the candidates after args and
// returns them without their descriptions.
func complete(t *testing.T, e *env, args ...string) []string {
	t.Helper()
	out := e.Out.(interface{ String() string })
	if code := runCLI(e, append([]string{"__complete"}, args...)...); code != 0 {
		t.Fatalf("__complete %v: exit %d", args, code)
	}
	var got []string
	for _, l := range strings.Split(strings.TrimSpace(out.String()), "\n") {
		if strings.HasPrefix(l, ":") || l == "" { // the directive line
			continue
		}
		got = append(got, strings.SplitN(l, "\t", 2)[0])
	}
	return got
}

func TestCompletion(t *testing.T) {
	e, _, errb := homeEnv(t)
	for _, args := range [][]string{
		{"find", "--efl", "75", "--beam", "6", "--top", "3"},
		{"find", "--efl", "50", "--top", "2"},
	} {
		if code := runCLI(e, args...); code != 0 {
			t.Fatalf("%v: exit %d\n%s", args, code, errb)
		}
	}
	for _, tc := range []struct {
		name string
		args []string
		want []string // exactly, in order
		has  []string // at least these
	}{
		{"search numbers", []string{"request", ""}, []string{"last", "2", "1"}, nil},
		{"search numbers for show", []string{"searches", "show", ""}, []string{"last", "2", "1"}, nil},
		{"one search only", []string{"draw", "1", ""}, nil, nil},
		{"ranks of a search", []string{"report", "1", "--pick", ""}, []string{"1", "2", "3"}, nil},
		{"format", []string{"find", "--format", ""}, []string{"table", "json", "csv", "md"}, nil},
		{"prefer", []string{"find", "--prefer", ""}, []string{"drawer", "short", "cheap", "sharp", "robust"}, nil},
		{"kind", []string{"catalog", "list", "--kind", ""}, []string{"positive", "negative", "singlet", "cemented", "air-spaced"}, nil},
		{"part names", []string{"inspect", "DEMO:PCX"}, nil, []string{"DEMO:PCX-50", "DEMO:PCX-100"}},
		{"part names for the drawer", []string{"drawer", "set", ""}, nil, []string{"DEMO:ACH-100"}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			got := complete(t, e, tc.args...)
			if tc.has == nil && strings.Join(got, " ") != strings.Join(tc.want, " ") {
				t.Errorf("got %q, want %q", got, tc.want)
			}
			for _, h := range tc.has {
				if !strings.Contains(" "+strings.Join(got, " ")+" ", " "+h+" ") {
					t.Errorf("got %q, want %s among them", got, h)
				}
			}
		})
	}
	// Once the user has a catalog, the demo searches follow as demo:N.
	if code := runCLI(e, "catalog", "import", demoLensesCSV); code != 0 {
		t.Fatalf("import: exit %d\n%s", code, errb)
	}
	if got := complete(t, e, "request", ""); strings.Join(got, " ") != "last demo:2 demo:1" {
		t.Errorf("after the import: %q", got)
	}
	if got := complete(t, e, "request", "demo:1", "--pick", ""); strings.Join(got, " ") != "1 2 3" {
		t.Errorf("ranks of demo:1: %q", got)
	}
	if code := runCLI(e, "completion", "bash"); code != 0 || !strings.Contains(e.Out.(interface{ String() string }).String(), "__complete") {
		t.Errorf("completion bash: exit %d", code)
	}
}
