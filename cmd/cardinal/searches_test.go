package main

import (
	"bytes"
	"encoding/json"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// homeEnv is an env whose catalog lives in a fresh HOME: no catalog of the
// user's until one is imported, the demo catalog kept beside it.
func homeEnv(t *testing.T) (*env, *bytes.Buffer, *bytes.Buffer) {
	t.Helper()
	return storeEnv(t, nil)
}

// unwrap joins the continuation lines of notes wrapped to the width
// (indented by two spaces) to the line they continue.
func unwrap(s string) string { return strings.ReplaceAll(s, "\n  ", " ") }

// withoutLines drops the lines of s (unwrapped) that start with any of the
// prefixes.
func withoutLines(s string, prefixes ...string) string {
	var keep []string
	for _, l := range strings.SplitAfter(unwrap(s), "\n") {
		drop := false
		for _, p := range prefixes {
			drop = drop || strings.HasPrefix(l, p)
		}
		if !drop {
			keep = append(keep, l)
		}
	}
	return strings.Join(keep, "")
}

// `searches show` prints a saved search byte for byte as find printed it,
// in every format: stdout, the notes, cautions and misses on stderr, and
// the exit code.
func TestSearchesShowAsFindPrinted(t *testing.T) {
	type run struct {
		name   string
		args   []string
		format string
		out    []string // output flags given to find and show alike
	}
	var runs []run
	rich := []string{"--efl", "100", "--beam", "10", "--field-angle", "1", "--band", "486.1,587.6,656.3", "--top", "4", "--power", "0.5"}
	for _, f := range formats { // a focus with real-ray figures, pairs and laser cautions
		runs = append(runs, run{"focus-" + f, rich, f, nil})
	}
	runs = append(runs, run{"focus-wide", rich, "table", []string{"--wide"}},
		run{"focus-columns", rich, "csv", []string{"--columns", "rank,parts,efl_mm"}})
	for _, f := range []string{"table", "json"} { // nothing met: why and misses
		runs = append(runs, run{"none-" + f, []string{"--efl", "75", "--length-max", "0.8"}, f, nil})
	}
	if !testing.Short() {
		runs = append(runs,
			run{"image-md", []string{"--track", "300", "--mag", "-0.36", "--mag-tol", "2%", "--object-height", "5", "--na", "0.02", "--wd-min", "60", "--bfd-min", "15", "--top", "5"}, "md", nil},
			run{"expand-csv", []string{"--expand", "5", "--expand-tol", "2%", "--beam", "2", "--galilean", "--length-max", "150", "--top", "3"}, "csv", nil})
	}
	e, out, errb := homeEnv(t)
	for _, r := range runs {
		t.Run(r.name, func(t *testing.T) {
			code := runCLI(e, append(append(append([]string{"find"}, r.args...), "--format", r.format), r.out...)...)
			found, foundErr := out.String(), errb.String()
			if code != exitOK && code != exitNoResult {
				t.Fatalf("find: exit %d\n%s", code, foundErr)
			}
			if strings.TrimSpace(found) == "" && r.format != "table" {
				t.Fatalf("find printed nothing in %s", r.format)
			}
			showCode := runCLI(e, append([]string{"searches", "show", "last", "--format", r.format}, r.out...)...)
			if showCode != code {
				t.Errorf("show: exit %d, find exited %d\n%s", showCode, code, errb)
			}
			if out.String() != found {
				t.Errorf("show prints\n%s\nfind printed\n%s", out, found)
			}
			banner := "cardinal: no catalog at "
			wantErr := withoutLines(foundErr, banner, "saved as search ")
			gotErr := withoutLines(errb.String(), banner, "search ")
			if gotErr != wantErr {
				t.Errorf("show's stderr\n%s\nfind's\n%s", gotErr, wantErr)
			}
			if !strings.Contains(errb.String(), "on the demo catalog: ") {
				t.Errorf("show does not say which search it is:\n%s", errb)
			}
		})
	}
}

// A saved search listed, noted and removed; once the user imports a
// catalog, the searches run on the demo catalog stay listed and reachable
// as demo:N by request, draw, report and show, and the error for a number
// the user's catalog lacks says so.
func TestSearchesListNoteRemove(t *testing.T) {
	e, out, errb := homeEnv(t)
	for _, args := range [][]string{
		{"find", "--efl", "75", "--beam", "6", "--bfd-min", "40", "--top", "3"},
		{"find", "--expand", "4", "--expand-tol", "3%", "--top", "2"},
		{"find", "--efl", "60", "--top", "2"},
	} {
		if code := runCLI(e, args...); code != 0 {
			t.Fatalf("%v: exit %d\n%s", args, code, errb)
		}
	}
	for _, tc := range []struct {
		args []string
		code int
		err  string
	}{
		{[]string{"searches", "note", "1", "relay", "for", "the", "=bench"}, 0, "noted search 1: relay for the =bench"},
		{[]string{"searches", "note", "2", "beam", "expander", "trial"}, 0, "noted search 2"},
		{[]string{"searches", "note", "2", "--clear"}, 0, "removed the note of search 2"},
		{[]string{"searches", "remove", "last"}, 0, "removed search 3"},
		{[]string{"searches", "remove", "3"}, exitNotFound, "no saved search 3"},
		{[]string{"searches", "note", "7", "x"}, exitNotFound, "no saved search 7"},
	} {
		if code := runCLI(e, tc.args...); code != tc.code || !strings.Contains(errb.String(), tc.err) {
			t.Errorf("%v: exit %d, stderr %q; want %d and %q", tc.args, code, errb, tc.code, tc.err)
		}
	}
	rows := listSearches(t, e, out, errb)
	if len(rows) != 2 || rows[0].Search != "1" || rows[0].Note != "relay for the =bench" || rows[0].Results != 3 ||
		rows[0].Kind != "focus" || rows[0].Catalog != "demo" || !strings.HasPrefix(rows[0].Words, "focus: EFL 75 mm") ||
		rows[1].Kind != "expand" || rows[1].Note != "" || rows[1].Results != 2 || rows[1].CreatedAt != "2025-01-02T03:04:05Z" {
		t.Fatalf("list %+v", rows)
	}
	// The CSV keeps a note that looks like a formula as text.
	if runCLI(e, "searches", "list", "--format", "csv") != 0 || !strings.Contains(out.String(), ",relay for the =bench\n") ||
		!strings.HasPrefix(out.String(), "search,created_at,kind,requirement_text,result_count,catalog,note\n") {
		t.Errorf("csv list:\n%s", out)
	}

	// The user imports a catalog of their own and searches in it.
	if code := runCLI(e, "catalog", "import", demoLensesCSV); code != 0 {
		t.Fatalf("import: exit %d\n%s", code, errb)
	}
	if code := runCLI(e, "find", "--efl", "100", "--top", "2"); code != 0 || !strings.Contains(errb.String(), "saved as search 1\n") {
		t.Fatalf("find in the user's catalog: exit %d\n%s", code, errb)
	}
	rows = listSearches(t, e, out, errb)
	if len(rows) != 3 || rows[0].Search != "1" || rows[0].Catalog != "yours" || rows[1].Search != "demo:1" || rows[2].Search != "demo:2" ||
		rows[1].Catalog != "demo" || rows[1].Note != "relay for the =bench" {
		t.Fatalf("list after the import %+v", rows)
	}
	if !strings.Contains(unwrap(errb.String()), "use them as demo:NUMBER") {
		t.Errorf("the list does not say where the demo searches went:\n%s", errb)
	}
	if code := runCLI(e, "request", "2", "--pick", "1"); code != exitNotFound || !strings.Contains(unwrap(errb.String()), "the 2 searches run on the demo catalog before you imported your own are reached as demo:NUMBER") {
		t.Errorf("request 2: exit %d, %s", code, errb)
	}
	dir := t.TempDir()
	for _, args := range [][]string{
		{"request", "demo:1", "--pick", "1", "--format", "json"},
		{"draw", "demo:1", "--pick", "1", "-o", filepath.Join(dir, "layout.svg")},
		{"report", "demo:last", "--pick", "1,2", "-o", filepath.Join(dir, "report.html")},
		{"searches", "show", "demo:2", "--format", "md"},
	} {
		if code := runCLI(e, args...); code != 0 {
			t.Errorf("%v: exit %d\n%s", args, code, errb)
		}
	}
	if runCLI(e, "request", "demo:1", "--pick", "1", "--format", "json"); !strings.Contains(out.String(), `"part": "`) {
		t.Errorf("request demo:1 holds no parts:\n%s", out)
	}
	if b, err := os.ReadFile(filepath.Join(dir, "layout.svg")); err != nil || !bytes.Contains(b, []byte("<svg")) {
		t.Errorf("draw demo:1 wrote no drawing: %v", err)
	}
	if code := runCLI(e, "searches", "remove", "demo:2"); code != 0 || len(listSearches(t, e, out, errb)) != 2 {
		t.Errorf("removing demo:2: exit %d", code)
	}
}

// listSearches runs `searches list --format json` and reads the rows.
func listSearches(t *testing.T, e *env, out, errb *bytes.Buffer) []searchRow {
	t.Helper()
	if code := runCLI(e, "searches", "list", "--format", "json"); code != 0 {
		t.Fatalf("list: exit %d\n%s", code, errb)
	}
	var rows []searchRow
	if err := json.Unmarshal(out.Bytes(), &rows); err != nil {
		t.Fatalf("list JSON: %v\n%s", err, out)
	}
	return rows
}

func TestSearchesFlags(t *testing.T) {
	long := strings.Repeat("x", maxNote+1)
	for _, tc := range []struct {
		args []string
		err  string // "" for none
	}{
		{[]string{"list", "--format", "xml"}, `unknown --format "xml"`},
		{[]string{"list", "7"}, "unknown command"},
		{[]string{"show"}, "accepts 1 arg"},
		{[]string{"show", "1", "--format", "yaml"}, `unknown --format "yaml"`},
		{[]string{"note", "1"}, "give the note after the search number"},
		{[]string{"note", "1", "x", "--clear"}, "not both"},
		{[]string{"note", "1", long}, fmt.Sprintf("keep it to %d", maxNote)},
		{[]string{"note", "1", "two\nlines"}, "one line"},
		{[]string{"note", "yesterday", "x"}, `search "yesterday": give a search number`},
		{[]string{"remove", "1", "soon"}, `search "soon": give a search number`},
		{[]string{"show", "demo:x"}, `search "demo:x"`},
	} {
		t.Run(strings.Join(tc.args, " "), func(t *testing.T) {
			e, _, errb := homeEnv(t)
			code := runCLI(e, append([]string{"searches"}, tc.args...)...)
			if code != exitUsage || !strings.Contains(errb.String(), tc.err) {
				t.Errorf("exit %d, stderr %q; want %d and %q", code, errb, exitUsage, tc.err)
			}
		})
	}
}
