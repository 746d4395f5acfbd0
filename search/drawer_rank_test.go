package search

import (
	"strings"
	"testing"

	"cardinal/catalog/record"
	"cardinal/optics"
)

// scaled is an equiconvex lens of index 1.5 near EFL f whose thickness and
// diameter scale with f, so that two of them have EFLs in the exact ratio
// of their f (a thick lens scaled in every length scales its EFL:
// Hecht, Optics, 5th ed., eq. 6.2, every term a length).
func scaled(name string, f float64, price float64, currency string, drawer int) Item {
	p := lens(name, f, -f, 0.06*f, 1.5, 0.4*f)
	return Item{Entry: record.Entry{Part: p, Price: price, Currency: currency}, Drawer: drawer}
}

func partSet(r Result) string {
	ids := make([]string, len(r.Parts))
	for i, u := range r.Parts {
		ids[i] = u.ID()
	}
	if len(ids) == 2 && ids[1] < ids[0] {
		ids[0], ids[1] = ids[1], ids[0]
	}
	return strings.Join(ids, "+")
}

// The drawer scenario on the demo catalog: a pair that meets but
// ranks fifth when nothing is in the drawer ranks first once both its
// parts are, and says they are at hand.
func TestDrawerPairRanksFirst(t *testing.T) {
	its := demoItems(t)
	for i := range its {
		its[i].Drawer = 0
	}
	req := expandReq(4)
	req.Beam, req.LengthMax, req.Wavelength, req.Top = 2, 150, 632.8, 10
	before := mustFind(t, its, req)
	var pick Result
	for _, r := range before.Results[1:] {
		if len(r.Parts) == 2 && r.Parts[0].ID() != r.Parts[1].ID() && partSet(r) != partSet(before.Results[0]) {
			pick = r
			break
		}
	}
	if pick.Parts == nil {
		t.Fatalf("no second distinct pair: %s", brief(before.Results))
	}
	for i := range its {
		id := its[i].Entry.Part.ID()
		if id == pick.Parts[0].ID() || id == pick.Parts[1].ID() {
			its[i].Drawer = 1
		}
	}
	after := mustFind(t, its, req)
	first := after.Results[0]
	if partSet(first) != partSet(pick) {
		t.Fatalf("with %s in the drawer the first result is %s:%s", partSet(pick), partSet(first), brief(after.Results))
	}
	if !first.InDrawer || first.ToOrder != 0 || len(first.OrderPrices) != 0 {
		t.Errorf("first result: in drawer %v, %d to order, order prices %v; want all at hand", first.InDrawer, first.ToOrder, first.OrderPrices)
	}
	if !strings.Contains(first.Reason, "parts at hand in the drawer") {
		t.Errorf("why %q does not say the parts are at hand", first.Reason)
	}
}

// A purchase outranks the drawer when the drawer's pair is clearly worse:
// a x4 Keplerian expander from parts of 125 and 500 mm is about 6.4
// reference lengths (100 mm) long, one from parts of 25 and 100 mm about
// 1.3. Two median-priced pieces to order cost 3 by default (see Weights),
// so the purchase wins; --prefer drawer (9 for the two pieces) turns it
// back.
func TestPurchaseWinsWhenClearlyBetter(t *testing.T) {
	its := []Item{
		scaled("LONG-A", 125, 20, "XTS", 1), scaled("LONG-B", 500, 20, "XTS", 1),
		scaled("SHORT-A", 25, 20, "XTS", 0), scaled("SHORT-B", 100, 20, "XTS", 0),
	}
	req := expandReq(4)
	req.Form = Keplerian
	first := func(p Prefer) Result {
		req.Prefer = p
		out := mustFind(t, its, req)
		if len(out.Results) == 0 {
			t.Fatalf("nothing found: %v", out.Why)
		}
		return out.Results[0]
	}
	if r := first(Balanced); r.InDrawer || r.ToOrder != 2 {
		t.Errorf("balanced: first %s (to order %d), want the short purchase", partSet(r), r.ToOrder)
	}
	if r := first(PreferDraw); !r.InDrawer {
		t.Errorf("prefer drawer: first %s, want the drawer pair", partSet(r))
	}
}

// A pair that uses one part twice needs two pieces: with one in the drawer
// one is to order, priced once.
func TestSamePartTwiceNeedsTwoPieces(t *testing.T) {
	for _, held := range []int{0, 1, 2} {
		its := []Item{scaled("TWICE", 100, 10, "XTS", held), scaled("OTHER", 300, 99, "XTS", 0)}
		req := focusReq(52.6)
		req.EFLTol = Tolerance{Value: 5, Percent: true}
		out := mustFind(t, its, req)
		found := false
		for _, r := range out.Results {
			if partSet(r) != "TEST:TWICE+TEST:TWICE" {
				continue
			}
			found = true
			if want := 2 - held; r.ToOrder != want {
				t.Errorf("%d held: %d to order, want %d", held, r.ToOrder, want)
			}
			wantOrder := []Amount{}
			if held < 2 {
				wantOrder = []Amount{{Amount: 10 * float64(2-held), Currency: "XTS"}}
			}
			if len(r.OrderPrices) != len(wantOrder) || len(wantOrder) == 1 && !near(r.OrderPrices[0].Amount, wantOrder[0].Amount, 1e-9, 0) {
				t.Errorf("%d held: order prices %v, want %v", held, r.OrderPrices, wantOrder)
			}
			if len(r.Prices) != 1 || !near(r.Prices[0].Amount, 20, 1e-9, 0) {
				t.Errorf("%d held: prices %v, want 20.00 XTS for the two pieces", held, r.Prices)
			}
		}
		if !found {
			t.Fatalf("%d held: no pair of TWICE twice: %s", held, brief(out.Results))
		}
	}
}

// Amounts in different currencies are kept apart, and each price counts
// against the median of its own currency. XTS is the ISO 4217 code for
// tests; XTQ is invented here as a second currency.
func TestPricesPerCurrency(t *testing.T) {
	its := []Item{
		scaled("CHEAP-XTS", 100, 9.5, "XTS", 0), scaled("FILL-XTS", 300, 5, "XTS", 0), scaled("FILL2-XTS", 301, 20, "XTS", 0),
		scaled("CHEAP-XTQ", 100, 21, "XTQ", 0), scaled("FILL-XTQ", 302, 100, "XTQ", 0), scaled("FILL2-XTQ", 303, 200, "XTQ", 0),
	}
	req := focusReq(100)
	req.EFLTol = Tolerance{Value: 3, Percent: true}
	req.Elements = 1
	out := mustFind(t, its, req)
	if len(out.Results) == 0 {
		t.Fatalf("nothing found: %v", out.Why)
	}
	// 21 XTQ is 0.21 of the XTQ median (100), 9.5 XTS the whole XTS median
	// (9.5): the XTQ part ranks first though its number is larger.
	if got := out.Results[0].Parts[0].Part; got != "CHEAP-XTQ" {
		t.Errorf("first %s, want CHEAP-XTQ: %s", got, brief(out.Results))
	}
	req = focusReq(80)
	req.EFLTol = Tolerance{Value: 3, Percent: true}
	req.Elements = 2
	out = mustFind(t, its, req)
	for _, r := range out.Results {
		if partSet(r) != "TEST:CHEAP-XTQ+TEST:FILL-XTS" {
			continue
		}
		want := []Amount{{21, "XTQ"}, {5, "XTS"}}
		if len(r.Prices) != 2 || r.Prices[0] != want[0] || r.Prices[1] != want[1] {
			t.Errorf("prices %v, want %v", r.Prices, want)
		}
		if got := AmountsText(r.Prices); got != "21.00 XTQ + 5.00 XTS" {
			t.Errorf("AmountsText = %q", got)
		}
		return
	}
	t.Fatalf("no pair of CHEAP-XTQ and FILL-XTS: %s", brief(out.Results))
}

var _ = optics.LineD
