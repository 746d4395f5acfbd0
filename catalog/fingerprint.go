package catalog

import (
	"crypto/sha256"
	"encoding/hex"
	"math"
	"strconv"

	"cardinal/catalog/record"
	"cardinal/optics"
)

// fingerprint is a hash of every field of an entry that the catalog
// stores, so that a re-imported row that has not changed is left alone.
// Floats are written in the shortest form that reads back exactly. The
// warnings that the prescription itself gives are left out: they follow
// from the other fields.
func fingerprint(e record.Entry, otherWarnings []string) string {
	b := make([]byte, 0, 512)
	str := func(s string) { b = append(strconv.AppendQuote(b, s), ',') }
	num := func(v float64) {
		if v == 0 || math.IsInf(v, 0) {
			v = math.Abs(v) // -0 and 0, -Inf and +Inf are stored alike
		}
		b = append(strconv.AppendFloat(b, v, 'g', -1, 64), ',')
	}
	mark := func(s string) { b = append(b, s...) }
	p := e.Part
	str(p.Supplier)
	str(p.Name)
	str(p.Description)
	num(p.Diameter)
	num(p.ClearAperture)
	for i, s := range p.Surfaces {
		mark("|s")
		num(planeAsInf(s.Radius))
		num(s.Conic)
		for _, a := range s.Asph {
			num(a)
		}
		if i < len(p.Thickness) {
			num(p.Thickness[i])
			str(mediumName(p.Media[i]))
		}
	}
	mark("|e")
	for _, v := range []float64{e.StatedEFL, e.StatedBFD, e.StatedEdge, e.StatedWavelength, e.Price} {
		num(v)
	}
	str(e.Currency)
	str(e.URL)
	str(e.Notes)
	if t := e.Tolerances; t != (optics.Tolerances{}) {
		// Only when stated, so that the fingerprints of parts stored before
		// tolerances existed do not change.
		mark("|t")
		for _, v := range []float64{t.EFLPct, t.Thickness, t.Index, t.RadiusPct} {
			num(v)
		}
	}
	if c := p.Coating; c.Stated {
		// Only when stated, as the tolerances.
		mark("|c")
		num(c.ResidualPct)
	}
	for _, w := range otherWarnings {
		str(w)
	}
	sum := sha256.Sum256(b)
	return hex.EncodeToString(sum[:])
}

// planeAsInf stores every plane alike: a radius of 0 or -Inf as +Inf.
func planeAsInf(r float64) float64 {
	if r == 0 || math.IsInf(r, 0) {
		return math.Inf(1)
	}
	return r
}
