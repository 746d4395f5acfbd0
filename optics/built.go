package optics

import (
	"fmt"
	"math"
)

// Built is the part p, the part the lens l was made from, as one built
// piece departs from it, for a real-ray trace at the lens's wavelength:
// every surface scaled by the focal-length error's factor 1/u (see
// Lens.Matrix), a scaled copy of the surface, so the vertex curvature is
// multiplied by u, the conic kept and each even-asphere coefficient a_2k
// multiplied by u^(2k-1) (the sag z(h) becomes z(u h)/u); each radius then
// times 1 + its own error; each glass element's thickness and index moved
// by their departures. Each glass becomes a constant index at the lens's
// wavelength, so the piece holds at that wavelength only. p is not
// changed; only the values of the departure's Duals are used.
func (l Lens) Built(p Part, d Departure) Part {
	n := len(p.Surfaces)
	if n != len(l.Curv) {
		panic(fmt.Sprintf("optics: part %s has %d surfaces, its lens %d", p.ID(), n, len(l.Curv)))
	}
	u := l.curvatureFactorValue(d.Focal.V) // curvatureFactor(Const(d.Focal.V)).V, without the derivative
	b := p
	b.Surfaces = make([]Surface, n)
	for i, s := range p.Surfaces {
		b.Surfaces[i] = scaledSurface(s, u, radiusError(d, i))
	}
	b.Thickness = append([]float64(nil), p.Thickness...)
	b.Media = make([]Medium, len(p.Media))
	g := 0
	for i, m := range p.Media {
		if !l.Glass[i] {
			b.Media[i] = m
			continue
		}
		dn := 0.0
		if d.Index != nil {
			dn = d.Index[g].V
		}
		if d.Thick != nil {
			b.Thickness[i] += d.Thick[g].V
		}
		b.Media[i] = Constant{Label: m.Name(), N: l.Index[i] + dn}
		g++
	}
	return b
}

// radiusError is the relative error of radius i, 0 when none is given.
func radiusError(d Departure, i int) float64 {
	if d.Radius == nil {
		return 0
	}
	return d.Radius[i].V
}

// scaledSurface is s scaled by 1/u, then its vertex radius times 1 + r.
func scaledSurface(s Surface, u, r float64) Surface {
	out := Surface{Radius: s.Radius, Conic: s.Conic}
	if !s.IsPlane() {
		out.Radius = s.Radius / u * (1 + r)
	}
	for k, a := range s.Asph { // a_(2k+4) h^(2k+4) becomes a u^(2k+3) h^(2k+4)
		out.Asph[k] = a * math.Pow(u, float64(2*k+3))
	}
	return out
}
