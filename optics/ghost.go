package optics

import (
	"fmt"
	"math"
)

// FresnelReflectance is the power reflectance at normal incidence of the
// boundary between indices n1 and n2, ((n1 - n2) / (n1 + n2))^2 (Fresnel;
// E. Hecht, Optics, 5th ed., sec. 4.6.2; from memory).
func FresnelReflectance(n1, n2 float64) float64 {
	r := (n1 - n2) / (n1 + n2)
	return r * r
}

// Reflection is the reduced ray-transfer matrix of reflection at a surface
// of curvature c met from a medium of index n, the light going on in the
// unfolded direction: a mirror of power -2 n c (A. E. Siegman, Lasers,
// 1986, ch. 15 on ray matrices of curved mirrors, R = 1/c, with the
// medium's index for the reduced form; Gerrard and Burch, ch. III). c is
// the curvature as the light meets it: a concave face has c < 0.
func Reflection(n, c float64) Mat2 { return Refraction(-2 * n * c) }

// A Ghost is the focus of light reflected once back toward the source or
// twice on toward the image, carried paraxially as a Gaussian beam. Lengths
// in mm, positions from the first vertex, positive toward image space.
type Ghost struct {
	// Surfaces are the reflecting surfaces, 1-based in light order: one
	// for a single reflection, the second-met first for a double one
	// (the later surface, then the earlier one).
	Surfaces []int
	// Forward is true for a double reflection (light going on toward the
	// image), false for a single one (going back toward the source).
	Forward bool
	// Real is false when the reflected beam has no waist on its way out:
	// it only diverges and its focus is virtual; Z and Radius are then 0.
	Real bool
	// Z is the waist of the reflected beam (its tightest, where several).
	Z float64
	// Radius is the 1/e^2 radius there.
	Radius float64
	// Reflectance is the product of the reflectances met; Coated says, for
	// each of Surfaces, whether its reflectance is the coating's as stated
	// (System.Reflectances) rather than the Fresnel value from the indices.
	Reflectance float64
	Coated      []bool
	// Concentration is Reflectance times (beam radius at the first vertex
	// over Radius)^2: the peak irradiance of the ghost against the input
	// beam's peak at the first part (transmission losses ignored, so it
	// errs high).
	Concentration float64
	// InGlass: the focus lies inside a part's glass.
	InGlass bool
	// Nearest is the axial distance from the focus to the nearest surface
	// vertex; Surface is that surface, 1-based.
	Nearest float64
	Surface int
}

// leg is one straight stretch of a ghost's path: from vertex at z0 going
// dir (+1 or -1) for length (Inf for the last) in index n.
type leg struct {
	z0, dir, length, n float64
}

// Ghosts finds every single-reflection ghost (one per surface, back toward
// the source) and every double-reflection ghost (one per pair of surfaces,
// on toward the image) of the beam given at the first vertex in object
// space. A surface reflects as s.Reflectances states, or else as the
// Fresnel formula gives from its indices. Each reflection acts as a mirror of power -2 n c (Reflection),
// each refraction as in the forward system; the beam's q is carried through
// every leg of the unfolded path and its waists found where Re q = 0 within
// a leg (Siegman 1986, ch. 20 on the ABCD law).
func (s System) Ghosts(in GaussianBeam) []Ghost {
	n := s.Indices(in.Wavelength)
	if math.Abs(in.N-n[0]) > 1e-9 {
		panic(fmt.Sprintf("optics: beam in index %g, object space has %g", in.N, n[0]))
	}
	vz := make([]float64, len(s.Surfaces))
	for i := 1; i < len(vz); i++ {
		vz[i] = vz[i-1] + s.Gaps[i-1]
	}
	g := ghostFinder{s: s, n: n, vz: vz, in: in}
	var out []Ghost
	for k := range s.Surfaces {
		out = append(out, g.single(k))
	}
	for j := range s.Surfaces {
		for i := 0; i < j; i++ {
			out = append(out, g.double(j, i))
		}
	}
	return out
}

type ghostFinder struct {
	s  System
	n  []float64
	vz []float64
	in GaussianBeam
}

// reflectance is surface k's power reflectance and whether it is a
// coating's as stated.
func (g *ghostFinder) reflectance(k int) (float64, bool) {
	if r := g.s.Reflectances; k < len(r) && !math.IsNaN(r[k]) {
		return r[k], true
	}
	return FresnelReflectance(g.n[k], g.n[k+1]), false
}

func (g *ghostFinder) power(k int) float64 {
	return (g.n[k+1] - g.n[k]) * g.s.Surfaces[k].Curvature()
}

// toSurface carries the input beam forward to just before surface k.
func (g *ghostFinder) toSurface(k int) GaussianBeam {
	b := g.in
	for i := 0; i < k; i++ {
		b = b.Through(Refraction(g.power(i)), g.n[i+1]).Propagate(g.s.Gaps[i])
	}
	return b
}

// back carries a beam just after reflection at surface k (travelling -z in
// index n[k]) back through surfaces k-1 .. stop+1 and returns the legs
// and the beam at the start of each; it ends just before surface stop
// (from behind) when stop >= 0, or out in object space when stop < 0.
func (g *ghostFinder) back(b GaussianBeam, k, stop int, legs *[]leg, qs *[]GaussianBeam) GaussianBeam {
	for i := k - 1; i > stop; i-- {
		*legs, *qs = append(*legs, leg{g.vz[i+1], -1, g.s.Gaps[i], g.n[i+1]}), append(*qs, b)
		b = b.Propagate(g.s.Gaps[i]).Through(Refraction(g.power(i)), g.n[i])
	}
	if stop < 0 {
		*legs, *qs = append(*legs, leg{g.vz[0], -1, math.Inf(1), g.n[0]}), append(*qs, b)
		return b
	}
	*legs, *qs = append(*legs, leg{g.vz[stop+1], -1, g.s.Gaps[stop], g.n[stop+1]}), append(*qs, b)
	return b.Propagate(g.s.Gaps[stop])
}

// single is the ghost of reflection at surface k, back toward the source.
func (g *ghostFinder) single(k int) Ghost {
	b := g.toSurface(k)
	b = b.Through(Reflection(g.n[k], g.s.Surfaces[k].Curvature()), g.n[k])
	var legs []leg
	var qs []GaussianBeam
	g.back(b, k, -1, &legs, &qs)
	r, coated := g.reflectance(k)
	return g.focus(Ghost{Surfaces: []int{k + 1}, Reflectance: r, Coated: []bool{coated}}, legs, qs)
}

// double is the ghost of reflection at surface j, then at surface i < j
// from behind, on toward the image.
func (g *ghostFinder) double(j, i int) Ghost {
	b := g.toSurface(j)
	b = b.Through(Reflection(g.n[j], g.s.Surfaces[j].Curvature()), g.n[j])
	var legs []leg
	var qs []GaussianBeam
	b = g.back(b, j, i, &legs, &qs)
	// From behind, surface i is met with curvature -c in index n[i+1].
	b = b.Through(Reflection(g.n[i+1], -g.s.Surfaces[i].Curvature()), g.n[i+1])
	legs, qs = legs[:0], qs[:0] // the backward legs are the single ghost's
	last := len(g.s.Surfaces) - 1
	for m := i; m < last; m++ {
		legs, qs = append(legs, leg{g.vz[m], 1, g.s.Gaps[m], g.n[m+1]}), append(qs, b)
		b = b.Propagate(g.s.Gaps[m]).Through(Refraction(g.power(m+1)), g.n[m+2])
	}
	legs, qs = append(legs, leg{g.vz[last], 1, math.Inf(1), g.n[last+1]}), append(qs, b)
	rj, cj := g.reflectance(j)
	ri, ci := g.reflectance(i)
	return g.focus(Ghost{Surfaces: []int{j + 1, i + 1}, Forward: true,
		Reflectance: rj * ri, Coated: []bool{cj, ci}}, legs, qs)
}

// focus finds the tightest waist along the legs and fills the ghost's
// position and concentration.
func (g *ghostFinder) focus(gh Ghost, legs []leg, qs []GaussianBeam) Ghost {
	for k, l := range legs {
		t := -real(qs[k].Q)
		if !(t >= 0 && t <= l.length) {
			continue
		}
		w := qs[k].WaistRadius()
		if gh.Real && w >= gh.Radius {
			continue
		}
		gh.Real, gh.Radius, gh.Z = true, w, l.z0+l.dir*t
		gh.InGlass = l.n > 1.01 && !math.IsInf(l.length, 1)
	}
	if !gh.Real {
		return gh
	}
	gh.Concentration = gh.Reflectance * sq(g.in.Radius()/gh.Radius)
	gh.Nearest = math.Inf(1)
	for i, z := range g.vz {
		if d := math.Abs(gh.Z - z); d < gh.Nearest {
			gh.Nearest, gh.Surface = d, i+1
		}
	}
	return gh
}
