package main

import (
	"bytes"
	"context"
	"encoding/csv"
	"encoding/json"
	"errors"
	"math"
	"os"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"testing"

	"cardinal/catalog"
	"cardinal/search"
	"cardinal/search/finite"
	"cardinal/search/purchase"
)

// savedCatalog makes a catalog file from the demo catalog and drawer and
// runs two searches in it: 1 a laser focus (a beam at 1064 nm), 2 an
// imaging relay in the visible without a beam.
func savedCatalog(t *testing.T) string {
	t.Helper()
	path := filepath.Join(t.TempDir(), "catalog.db")
	ctx := context.Background()
	demo, err := catalog.OpenDemo()
	if err != nil {
		t.Fatal(err)
	}
	entries, err := demo.Entries(ctx, catalog.Filter{})
	if err != nil {
		t.Fatal(err)
	}
	drawer, err := demo.DrawerItems(ctx)
	demo.Close()
	if err != nil {
		t.Fatal(err)
	}
	st, err := catalog.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	if _, err := st.Import(ctx, entries, false); err != nil {
		t.Fatal(err)
	}
	if _, err := st.ImportDrawer(ctx, drawer, false); err != nil {
		t.Fatal(err)
	}
	st.Close()
	for _, args := range [][]string{
		{"--efl", "75", "--beam", "6", "--bfd-min", "40", "--wavelength", "1064", "--top", "5"},
		{"--track", "300", "--mag", "-0.36", "--mag-tol", "2%", "--object-height", "5", "--na", "0.02", "--wd-min", "60", "--bfd-min", "15", "--top", "5"},
	} {
		if _, errs, code := findRun(t, path, args...); code != 0 {
			t.Fatalf("find %v: exit %d\n%s", args, code, errs)
		}
	}
	return path
}

// savedResults reads a saved search back as find stored it.
func savedResults(t *testing.T, db, ref string) (search.Requirement, []search.Result) {
	t.Helper()
	st, err := catalog.Open(db)
	if err != nil {
		t.Fatal(err)
	}
	defer st.Close()
	ss, err := st.LoadSearch(context.Background(), ref)
	if err != nil {
		t.Fatal(err)
	}
	var req search.Requirement
	var rs []search.Result
	if err := json.Unmarshal(ss.Requirement, &req); err != nil {
		t.Fatal(err)
	}
	if err := json.Unmarshal(ss.Results, &rs); err != nil {
		t.Fatal(err)
	}
	return req, rs
}

// cmdRun runs a command line against the catalog db and returns stdout,
// stderr and the exit code.
func cmdRun(t *testing.T, db string, args ...string) (string, string, int) {
	t.Helper()
	e, out, errb := storeEnv(t, map[string]string{"CARDINAL_DB": db})
	code := runCLI(e, args...)
	return out.String(), errb.String(), code
}

func TestRequestFlags(t *testing.T) {
	for _, tc := range []struct {
		name string
		args []string
		want func(*requestOptions) bool
		err  string
	}{
		{"picks and former --quantity", []string{"last", "--pick", "1,3", "--quantity", "2", "--format", "csv", "-o", "r.csv", "--force"},
			func(o *requestOptions) bool {
				return o.Search == "last" && slices.Equal(o.Picks, []int{1, 3}) && o.Qty == 2 && o.Format == "csv" && o.Output == "r.csv" && o.Force
			}, ""},
		{"defaults", []string{"17", "--pick", "2"}, func(o *requestOptions) bool { return o.Qty == 1 && o.Format == "table" && o.Output == "" }, ""},
		{"no pick", []string{"last"}, nil, "--pick"},
		{"rank zero", []string{"last", "--pick", "0"}, nil, "ranks start at 1"},
		{"repeated rank", []string{"last", "--pick", "2,2"}, nil, "twice"},
		{"no systems", []string{"last", "--pick", "1", "--quantity", "0"}, nil, "--systems 0"},
		{"unknown format", []string{"last", "--pick", "1", "--format", "xlsx"}, nil, "unknown --format"},
		{"no search", []string{"--pick", "1"}, nil, "accepts 1 arg"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			e, _, _ := testEnv()
			var got *requestOptions
			err := parseWith(newRequestCmd(e, func(o *requestOptions) error { got = o; return nil }), tc.args...)
			checkParse(t, err, tc.err, func() bool { return got != nil && tc.want(got) })
		})
	}
}

// checkParse checks a flag-parsing outcome: an error containing want, or
// none and the options as wanted.
func checkParse(t *testing.T, err error, want string, ok func() bool) {
	t.Helper()
	if want != "" {
		if err == nil || !strings.Contains(err.Error(), want) {
			t.Fatalf("error %v, want one containing %q", err, want)
		}
		return
	}
	if err != nil {
		t.Fatal(err)
	}
	if !ok() {
		t.Error("options not as given")
	}
}

// The request's quantities and money follow from the saved result, the
// catalog's prices and the drawer (hand arithmetic: needed = systems x
// uses, to order = needed - in drawer, line = to order x price).
func TestRunRequestJSON(t *testing.T) {
	db := savedCatalog(t)
	_, rs := savedResults(t, db, "1")
	out, errs, code := cmdRun(t, db, "request", "1", "--pick", "1,3", "--quantity", "2", "--format", "json")
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	var rq purchase.Request
	if err := json.Unmarshal([]byte(out), &rq); err != nil {
		t.Fatalf("%v\n%s", err, out)
	}
	uses := map[string]int{}
	for _, r := range []search.Result{rs[0], rs[2]} {
		for _, u := range r.Parts {
			uses[u.ID()] += 2
		}
	}
	st, err := catalog.Open(db)
	if err != nil {
		t.Fatal(err)
	}
	defer st.Close()
	drawer, err := st.Drawer(context.Background())
	if err != nil {
		t.Fatal(err)
	}
	total := 0.0
	for _, g := range rq.Suppliers {
		for _, l := range g.Lines {
			id := l.Supplier + ":" + l.Part
			en, err := st.Part(context.Background(), id)
			if err != nil {
				t.Fatal(err)
			}
			order := max(0, uses[id]-drawer[id].Quantity)
			if l.Needed != uses[id] || l.InDrawer != drawer[id].Quantity || l.ToOrder != order {
				t.Errorf("%s: needed %d, drawer %d, order %d; want %d, %d, %d", id, l.Needed, l.InDrawer, l.ToOrder, uses[id], drawer[id].Quantity, order)
			}
			if l.LineTotal == nil || math.Abs(*l.LineTotal-float64(order)*en.Price) > 1e-9 {
				t.Errorf("%s: line total %v, want %d x %g", id, l.LineTotal, order, en.Price)
			}
			total += float64(order) * en.Price
		}
	}
	if len(rq.Totals) != 1 || math.Abs(rq.Totals[0].Amount-total) > 1e-9 {
		t.Errorf("totals %v, want %g", rq.Totals, total)
	}
	if len(rq.Cautions) == 0 || len(rq.Solutions) != 2 || rq.Solutions[1].Rank != 3 {
		t.Errorf("cautions %d, solutions %+v", len(rq.Cautions), rq.Solutions)
	}
}

func TestRunRequestFormats(t *testing.T) {
	db := savedCatalog(t)
	for _, tc := range []struct {
		name, format string
		check        func(t *testing.T, out string)
	}{
		{"table", "table", func(t *testing.T, out string) {
			mustContain(t, out, "requirement: image: track 300 mm", "subtotal", "to order")
		}},
		{"md", "md", func(t *testing.T, out string) {
			mustContain(t, out, "- **requirement**: image", "| supplier | part |")
		}},
		{"csv", "csv", func(t *testing.T, out string) {
			rows, err := csv.NewReader(strings.NewReader(out)).ReadAll()
			if err != nil {
				t.Fatal(err)
			}
			if rows[0][0] != "supplier" || rows[1][3] != "1" {
				t.Errorf("rows %q", rows[:2])
			}
			if _, err := strconv.ParseFloat(rows[1][7], 64); err != nil {
				t.Errorf("unit price %q is not a number", rows[1][7])
			}
		}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			out, errs, code := cmdRun(t, db, "request", "last", "--pick", "1", "--format", tc.format)
			if code != 0 {
				t.Fatalf("exit %d: %s", code, errs)
			}
			tc.check(t, out)
			if strings.Contains(out, "laser") {
				t.Error("a visible imaging request without a beam carries the laser cautions")
			}
		})
	}
}

func mustContain(t *testing.T, s string, want ...string) {
	t.Helper()
	for _, w := range want {
		if !strings.Contains(s, w) {
			t.Errorf("output lacks %q:\n%s", w, s)
		}
	}
}

// Errors: a search or a rank that is not there, and a file that exists.
func TestRunRequestErrors(t *testing.T) {
	db := savedCatalog(t)
	file := filepath.Join(t.TempDir(), "request.csv")
	if err := os.WriteFile(file, []byte("keep"), 0o644); err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		name string
		args []string
		code int
		err  string
	}{
		{"unknown search", []string{"request", "99", "--pick", "1"}, exitNotFound, `no saved search 99`},
		{"not a reference", []string{"request", "yesterday", "--pick", "1"}, exitUsage, `give a search number, "last", or demo:N`},
		{"no demo searches", []string{"request", "demo:1", "--pick", "1"}, exitNotFound, "no search has been run on the demo catalog"},
		{"rank not in the search", []string{"request", "1", "--pick", "6"}, exitUsage, "--pick 6: search 1 has 5 results"},
		{"file exists", []string{"request", "1", "--pick", "1", "-o", file}, exitUsage, "add --force"},
		{"forced", []string{"request", "1", "--pick", "1", "--format", "csv", "-o", file, "--force"}, 0, "wrote purchase request"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			_, errs, code := cmdRun(t, db, tc.args...)
			if code != tc.code || !strings.Contains(errs, tc.err) {
				t.Errorf("exit %d, stderr %q; want %d and %q", code, errs, tc.code, tc.err)
			}
		})
	}
	b, _ := os.ReadFile(file)
	if !strings.HasPrefix(string(b), "supplier,part,") {
		t.Errorf("the forced file holds %.40q", b)
	}
}

// A purchase request never holds NaN or an infinity (IEEE Std 754-2019,
// section 3.4; common practice): in every format, one with a total that is
// not finite is refused with an error naming it, and nothing is written.
func TestWriteRequestRefusesNonFinite(t *testing.T) {
	rq := purchase.Request{Search: 3, Totals: []purchase.Money{{Currency: "XTS", Amount: math.Inf(1)}}}
	for _, format := range []string{"table", "md", "csv", "json"} {
		t.Run(format, func(t *testing.T) {
			e, _, _ := testEnv()
			var b bytes.Buffer
			err := writeRequest(e, &b, format, rq)
			var fe *finite.Error
			if !errors.As(err, &fe) || fe.Path != "Totals[0].Amount" || b.Len() > 0 {
				t.Fatalf("got %v and %d bytes, want a *finite.Error at Totals[0].Amount and nothing written", err, b.Len())
			}
			if _, code := describe(err); code != 1 {
				t.Errorf("exit %d: a non-finite figure reaching a writer is a fault of the program (exit 1)", code)
			}
		})
	}
}
