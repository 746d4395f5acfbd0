package catalog

import (
	"errors"
	"reflect"
	"strings"
	"testing"

	"cardinal/catalog/record"
)

func TestImportDrawer(t *testing.T) {
	s := newStore(t)
	mustImport(t, s, sampleEntries(t))
	items := []record.DrawerItem{
		{Supplier: "TEST", Part: "PCX-50", Quantity: 2, Location: "A1", Line: 2},
		{Supplier: "OTHER", Part: "ACH-100", Quantity: 0, Location: "A2", Line: 3},
	}
	rep, err := s.ImportDrawer(ctx, items, false)
	if err != nil || len(rep.Added) != 2 {
		t.Fatalf("%+v, %v", rep, err)
	}
	d, _ := s.Drawer(ctx)
	if len(d) != 1 || d["TEST:PCX-50"].Quantity != 2 || d["TEST:PCX-50"].Location != "A1" {
		t.Errorf("Drawer %+v, want TEST:PCX-50 only (ACH-100 has none left)", d)
	}
	all, _ := s.DrawerItems(ctx)
	if len(all) != 2 {
		t.Errorf("DrawerItems %+v, want both rows", all)
	}
	before := checksum(t, s)
	rep, _ = s.ImportDrawer(ctx, items, false)
	if len(rep.Unchanged) != 2 || checksum(t, s) != before {
		t.Errorf("re-import %+v", rep)
	}
}

func TestImportDrawerAllOrNothing(t *testing.T) {
	s := newStore(t)
	mustImport(t, s, sampleEntries(t))
	before := checksum(t, s)
	items := []record.DrawerItem{
		{Supplier: "TEST", Part: "PCX-50", Quantity: 2, Line: 2},
		{Supplier: "TEST", Part: "PCX-55", Quantity: 1, Line: 3},
		{Supplier: "TEST", Part: "PCV-50", Quantity: -1, Line: 4},
		{Supplier: "TEST", Part: "PCX-50", Quantity: 1, Line: 5},
	}
	_, err := s.ImportDrawer(ctx, items, false)
	var ie *ImportError
	if !errors.As(err, &ie) {
		t.Fatalf("error %v, want *ImportError", err)
	}
	var lines []int
	for _, r := range ie.Rows {
		lines = append(lines, r.Line)
	}
	if !reflect.DeepEqual(lines, []int{3, 4, 5}) {
		t.Errorf("problems on lines %v, want [3 4 5]: %v", lines, err)
	}
	if !strings.Contains(ie.Rows[0].Reason, "did you mean TEST:PCX-50") {
		t.Errorf("unknown part: %q, want a suggestion", ie.Rows[0].Reason)
	}
	if checksum(t, s) != before {
		t.Error("a failed drawer import changed the tables")
	}
}

func TestSetDrawer(t *testing.T) {
	s := newStore(t)
	mustImport(t, s, sampleEntries(t))
	it, err := s.SetDrawer(ctx, "TEST:PCX-50", 3, "B2", false)
	if err != nil || it.Quantity != 3 || it.Location != "B2" || it.Supplier != "TEST" {
		t.Fatalf("%+v, %v", it, err)
	}
	// Only the quantity: the location stays.
	it, _ = s.SetDrawer(ctx, "PCX-50", 1, "", true)
	if it.Quantity != 1 || it.Location != "B2" {
		t.Errorf("after a quantity change: %+v", it)
	}
	var nf *NotFoundError
	if _, err := s.SetDrawer(ctx, "TEST:PCX-5O", 1, "", true); !errors.As(err, &nf) || len(nf.Suggestions) == 0 || nf.Suggestions[0] != "TEST:PCX-50" {
		t.Errorf("unknown part: %v", err)
	}
	if _, err := s.SetDrawer(ctx, "TEST:PCX-50", -2, "", true); err == nil {
		t.Error("a negative quantity was accepted")
	}
}
