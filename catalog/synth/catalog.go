package synth

import (
	"math"
	"math/rand/v2"

	"cardinal/catalog/record"
)

// Catalog returns n invented stock parts, the same for the same seed: a
// random draw of kinds, glasses, stock diameters and R20 focal lengths from
// 10 to 1000 mm (positive and negative), from the two invented suppliers of
// the demo (DEMO and TARNWICK), with part numbers unique across the catalog.
// A draw that gives no sensible part is drawn again. The parts come in the
// order drawn. n < 0 panics.
func Catalog(seed uint64, n int) []record.Entry {
	if n < 0 {
		panic("synth: Catalog needs n >= 0")
	}
	// The stream constant is arbitrary; PCG's output for a given seed pair
	// is fixed by its algorithm, so catalogs do not change between releases.
	src := rand.NewPCG(seed, 0x5eed_ca7a_1065)
	d := drawer{src: src, used: map[string]int{}}
	out := make([]record.Entry, 0, n)
	for len(out) < n {
		e, ok := d.next()
		if ok {
			out = append(out, e)
		}
	}
	return out
}

// drawer draws random specs and names them uniquely.
type drawer struct {
	src  *rand.PCG
	used map[string]int // base part ID -> variants used
}

// kindWeights favour the kinds a catalog has most of (plano-convex and
// achromats), in Kind order.
var kindWeights = [numKinds]int{25, 10, 8, 8, 12, 8, 6, 23}

// singletGlasses and achromatPairs are what draws choose from; the first
// entries are repeated to come up more often.
var (
	singletGlasses = []string{"517642", "517642", "517642", "589613", "589613", "620364",
		"755276", "785258", "847238", "fused-silica", "fused-silica", "caf2", "sapphire"}
	achromatPairs = [][2]string{{"517642", "620364"}, {"517642", "620364"}, {"589613", "755276"},
		{"517642", "785258"}, {"589613", "847238"}, {"517642", "847238"}}
	focalSeries = Series(20, 10, 1000)
)

// next draws one spec; ok is false when it gives no sensible part.
func (d *drawer) next() (record.Entry, bool) {
	s := demoSupplier
	if d.intn(2) == 1 {
		s = tarnwick
	}
	sp := Spec{Kind: d.kind(), Diameter: s.diameters[d.skewed(len(s.diameters))],
		EFL: focalSeries[d.intn(len(focalSeries))]}
	if !sp.Kind.Positive() {
		sp.EFL = -sp.EFL
	}
	if sp.Kind == Achromat {
		pair := achromatPairs[d.intn(len(achromatPairs))]
		sp.Glass, sp.Flint = pair[0], pair[1]
	} else {
		sp.Glass = singletGlasses[d.intn(len(singletGlasses))]
	}
	if !sensible(sp) {
		return record.Entry{}, false
	}
	base := s.partName(sp)
	id := s.name + ":" + base
	e, err := s.entry(sp, base, d.used[id])
	if err != nil {
		return record.Entry{}, false
	}
	d.used[id]++
	return e, true
}

func (d *drawer) kind() Kind {
	total := 0
	for _, w := range kindWeights {
		total += w
	}
	r := d.intn(total)
	for k, w := range kindWeights {
		if r < w {
			return Kind(k)
		}
		r -= w
	}
	panic("synth: kind weights")
}

// skewed draws an index below n, index i with weight n - i.
func (d *drawer) skewed(n int) int {
	r := d.intn(n * (n + 1) / 2)
	for i := 0; ; i++ {
		if r < n-i {
			return i
		}
		r -= n - i
	}
}

// intn is uniform in [0, n) from the raw 64-bit output (the modulo bias is
// below 2^-50 for the small n used here).
func (d *drawer) intn(n int) int { return int(d.src.Uint64() % uint64(n)) }

// minFocalRatio is the fastest |EFL|/diameter stocked for each kind, and
// maxFocalRatio the slowest (common practice: stock lenses are rarely faster
// than f/1, achromats than f/2, menisci than f/1.5).
var minFocalRatio = [numKinds]float64{1, 0.8, 1, 1.5, 0.9, 0.6, 1.8, 1.8}

const maxFocalRatio = 80

// sensible tells whether a spec is a part a supplier would stock.
func sensible(sp Spec) bool {
	r := math.Abs(sp.EFL) / sp.Diameter
	return r >= minFocalRatio[sp.Kind] && r <= maxFocalRatio
}
