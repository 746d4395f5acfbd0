package search

import (
	"math"
	"math/rand/v2"
	"reflect"
	"testing"

	"cardinal/catalog/record"
)

// priced builds an item: a biconvex lens near 100 mm EFL of the given
// centre thickness, price and drawer quantity.
func priced(name string, t, price float64, drawer int) Item {
	return Item{Entry: record.Entry{Part: lens(name, 102, -102, t, 1.5, 20), Price: price, Currency: "XTS"}, Drawer: drawer}
}

// Each preference raises its own term and turns the order of two parts
// that differ in that term.
func TestPreferShiftsRanking(t *testing.T) {
	tests := []struct {
		name           string
		its            []Item
		balanced, pref string // first part under each
		prefer         Prefer
	}{
		{"cheap", []Item{priced("CHEAP", 4, 10, 0), priced("DEAR", 4, 40, 0)}, "CHEAP", "CHEAP", PreferCheap},
		{"short", []Item{priced("THIN", 3, 12, 0), priced("THICK", 15, 6, 0)}, "THICK", "THIN", PreferShort},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			req := focusReq(100)
			req.EFLTol = Tolerance{Value: 10, Percent: true}
			req.Elements = 1
			first := func(p Prefer) string {
				req.Prefer = p
				out := mustFind(t, tt.its, req)
				if len(out.Results) != 2 {
					t.Fatalf("%d results, want 2: %v", len(out.Results), out.Why)
				}
				return out.Results[0].Parts[0].Part
			}
			if got := first(Balanced); got != tt.balanced {
				t.Errorf("balanced: %s first, want %s", got, tt.balanced)
			}
			if got := first(tt.prefer); got != tt.pref {
				t.Errorf("prefer %s: %s first, want %s", tt.prefer, got, tt.pref)
			}
		})
	}
}

// The score of every result is the documented sum (see Weights),
// recomputed here from the result's own figures.
func TestScoreIsDocumentedSum(t *testing.T) {
	its := []Item{priced("A", 4, 10, 0), priced("B", 6, 30, 2), priced("C", 8, 0, 1)}
	its = append(its, Item{Entry: record.Entry{Part: lens("N", -150, 150, 2, 1.5, 20), Price: 20}})
	req := focusReq(160)
	req.EFLTol = Tolerance{Value: 40, Percent: true}
	for _, p := range []Prefer{Balanced, PreferDraw, PreferShort, PreferCheap} {
		req.Prefer = p
		out := mustFind(t, its, req)
		if len(out.Results) < 5 {
			t.Fatalf("%d results", len(out.Results))
		}
		w := WeightsFor(p)
		median := 20.0 // of the stated prices 10, 20, 30
		for _, r := range out.Results {
			want := w.Error*math.Abs(r.Error)/(0.4*160) + w.Envelope*r.Envelope/160 + w.Elements*float64(len(r.Parts)-1)
			toOrder := 0
			for k, u := range r.Parts {
				price, held := 0.0, 0
				for _, it := range its {
					if it.Entry.Part.Name == u.Part {
						price, held = it.Entry.Price, it.Drawer
					}
				}
				if price == 0 {
					price = median
				}
				if len(r.Parts) == 2 && r.Parts[0].Part == r.Parts[1].Part {
					held -= k // the second piece needs a second one in the drawer
				}
				if held < 1 { // only a piece to order is priced
					toOrder++
					want += w.Price * price / median
				}
			}
			if toOrder != r.ToOrder {
				t.Errorf("%s: %d pieces to order, want %d", partsID(r), r.ToOrder, toOrder)
			}
			want += w.Drawer * float64(toOrder)
			checkNear(t, "score of "+partsID(r), r.Score, want, 1e-9, 1e-9)
		}
	}
}

func partsID(r Result) string {
	s := ""
	for _, u := range r.Parts {
		s += u.ID() + " "
	}
	return s
}

// Results do not depend on the order of the catalog: ties fall the same
// way whatever order the parts come in.
func TestRankingDeterministic(t *testing.T) {
	its := demoItems(t)
	req := focusReq(100)
	req.Top = 25
	want := mustFind(t, its, req)
	rng := rand.New(rand.NewPCG(1, 2))
	for k := 0; k < 3; k++ {
		shuffled := append([]Item(nil), its...)
		rng.Shuffle(len(shuffled), func(i, j int) { shuffled[i], shuffled[j] = shuffled[j], shuffled[i] })
		got := mustFind(t, shuffled, req)
		if !reflect.DeepEqual(got.Results, want.Results) {
			t.Fatalf("shuffle %d changes the results:\n%s\nwant\n%s", k, brief(got.Results), brief(want.Results))
		}
	}
}
