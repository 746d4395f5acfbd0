package synth

import (
	"fmt"
	"math"
	"math/rand/v2"

	"cardinal/catalog/record"
	"cardinal/optics"
)

// A line is one product line of a supplier: one kind in one glass (pair),
// at some diameters, over a range of a preferred-number focal series.
type line struct {
	s            supplier
	kind         Kind
	glass, flint string
	diameters    []float64
	r            int     // focal series R10 or R20
	lo, hi       float64 // |EFL| range, mm
}

// demoLines is the invented demo scenario: an inch-sized supplier (DEMO)
// and a metric one (TARNWICK), each with the lines a stock catalog has.
var demoLines = []line{
	{demoSupplier, PlanoConvex, "517642", "", []float64{25.4}, 20, 10, 1000},
	{demoSupplier, PlanoConvex, "517642", "", []float64{12.7, 50.8}, 10, 10, 1000},
	{demoSupplier, PlanoConvex, "fused-silica", "", []float64{25.4}, 10, 10, 1000},
	{demoSupplier, Biconvex, "517642", "", []float64{12.7, 25.4}, 10, 10, 1000},
	{demoSupplier, BestForm, "517642", "", []float64{25.4}, 10, 10, 1000},
	{demoSupplier, PositiveMeniscus, "517642", "", []float64{25.4}, 10, 10, 1000},
	{demoSupplier, PlanoConcave, "517642", "", []float64{12.7, 25.4}, 10, 10, 1000},
	{demoSupplier, Biconcave, "517642", "", []float64{25.4}, 10, 10, 1000},
	{demoSupplier, NegativeMeniscus, "517642", "", []float64{25.4}, 10, 10, 1000},
	{demoSupplier, Achromat, "517642", "620364", []float64{25.4}, 20, 10, 1000},
	{demoSupplier, Achromat, "517642", "620364", []float64{12.7, 50.8}, 10, 10, 1000},
	{demoSupplier, Achromat, "517642", "785258", []float64{25.4}, 10, 10, 1000},
	{tarnwick, PlanoConvex, "589613", "", []float64{6, 25}, 10, 10, 500},
	{tarnwick, PlanoConvex, "caf2", "", []float64{25}, 10, 25, 500},
	{tarnwick, PlanoConvex, "sapphire", "", []float64{12}, 10, 10, 200},
	{tarnwick, Biconvex, "755276", "", []float64{30}, 10, 10, 500},
	{tarnwick, PlanoConcave, "589613", "", []float64{12, 25}, 10, 10, 500},
	{tarnwick, Biconcave, "fused-silica", "", []float64{25}, 10, 10, 500},
	{tarnwick, Achromat, "589613", "755276", []float64{12, 25, 50}, 10, 10, 1000},
	{tarnwick, Achromat, "589613", "847238", []float64{25}, 10, 10, 500},
}

// Demo returns the built-in demo catalog: the keep entries first, as they
// are, then every sensible part of every product line of demoLines, in line
// order, then diameter, then focal length, leaving out those that repeat a
// kept part (same supplier, glasses, diameter and form, EFL within 1 %).
// With no keep entries it includes DEMO:PCX-50, the 50 mm plano-convex
// lens of 25.4 mm in glass 517642 that the documentation uses as its
// example part; the demo file keeps the DEMO parts of lenses.csv.
func Demo(keep []record.Entry) []record.Entry {
	out := append([]record.Entry(nil), keep...)
	for _, l := range demoLines {
		for _, d := range l.diameters {
			for _, f := range Series(l.r, l.lo, l.hi) {
				sp := Spec{Kind: l.kind, Glass: l.glass, Flint: l.flint, Diameter: d, EFL: f}
				if !l.kind.Positive() {
					sp.EFL = -f
				}
				if !sensible(sp) {
					continue
				}
				e, err := l.s.entry(sp, l.s.partName(sp), 0)
				if err != nil || repeats(e, keep) {
					continue // too strong or too thick for the diameter, or kept already
				}
				out = append(out, e)
			}
		}
	}
	return out
}

// repeats tells whether e is the same product as one of the kept entries,
// or has the same part number.
func repeats(e record.Entry, keep []record.Entry) bool {
	for _, k := range keep {
		if k.Part.ID() == e.Part.ID() || sameProduct(k.Part, e.Part) {
			return true
		}
	}
	return false
}

// sameProduct compares supplier, diameter, glasses, the signs of the
// curvatures and the d-line EFL within 1 %.
func sameProduct(a, b optics.Part) bool {
	if a.Supplier != b.Supplier || a.Diameter != b.Diameter || len(a.Surfaces) != len(b.Surfaces) {
		return false
	}
	for i := range a.Media {
		if a.Media[i].Name() != b.Media[i].Name() {
			return false
		}
	}
	for i := range a.Surfaces {
		if sign(a.Surfaces[i].Curvature()) != sign(b.Surfaces[i].Curvature()) {
			return false
		}
	}
	fa := a.System(nil, nil).Cardinal(optics.LineD).EFL
	fb := b.System(nil, nil).Cardinal(optics.LineD).EFL
	return math.Abs(fa-fb) <= 0.01*math.Abs(fa)
}

func sign(v float64) int {
	switch {
	case v > 0:
		return 1
	case v < 0:
		return -1
	}
	return 0
}

// DemoDrawer returns the demo lab drawer: a few dozen parts of the demo
// catalog with a quantity and a place ("B2": drawer B, slot 2), picked by a
// fixed pseudo-random sequence, DEMO:PCX-50 first.
func DemoDrawer(entries []record.Entry) []record.DrawerItem {
	src := rand.NewPCG(2026, 0xd7a3e7)
	var items []record.DrawerItem
	taken := map[string]bool{}
	add := func(e record.Entry) {
		n := len(items)
		items = append(items, record.DrawerItem{Supplier: e.Part.Supplier, Part: e.Part.Name,
			Quantity: 1 + int(src.Uint64()%4), Location: fmt.Sprintf("%c%d", 'A'+n/8, 1+n%8)})
		taken[e.Part.ID()] = true
	}
	for _, e := range entries {
		if e.Part.ID() == "DEMO:PCX-50" {
			add(e)
		}
	}
	for len(items) < 32 && len(taken) < len(entries) {
		e := entries[src.Uint64()%uint64(len(entries))]
		if !taken[e.Part.ID()] {
			add(e)
		}
	}
	return items
}
