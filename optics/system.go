package optics

import (
	"fmt"
	"math"
)

// A System is a sequence of refracting surfaces between an object-space and
// an image-space medium: one part, or several parts with the gaps between
// them.
type System struct {
	ObjectMedium Medium    // nil means air
	Surfaces     []Surface // in light order
	// Gaps[i] is the axial distance from surface i to surface i+1.
	Gaps []float64
	// Media[i] is the medium between surface i and surface i+1.
	Media       []Medium
	ImageMedium Medium // nil means air
	// SemiApertures[i] is the clear semi-aperture of surface i in mm, for
	// the real-ray tracer; nil or zero means unlimited.
	SemiApertures []float64
	// Reflectances[i] is the power reflectance (a fraction) of surface i as
	// coated; NaN, or an entry past the end (nil: all), means the Fresnel
	// reflectance from the indices on either side. Assemble fills it from
	// the parts' coatings.
	Reflectances []float64
}

// System returns the part alone between the given media (nil for air).
func (p Part) System(objectMedium, imageMedium Medium) System {
	return Assemble(objectMedium, imageMedium, []Part{p}, nil)
}

// Assemble puts parts in a row, gaps[i] of air from the last vertex of part
// i to the first vertex of part i+1, between the given media (nil for air).
func Assemble(objectMedium, imageMedium Medium, parts []Part, gaps []float64) System {
	if len(parts) == 0 || len(gaps) != len(parts)-1 {
		panic(fmt.Sprintf("optics: Assemble needs one gap fewer than parts, got %d parts and %d gaps", len(parts), len(gaps)))
	}
	s := System{ObjectMedium: objectMedium, ImageMedium: imageMedium}
	for i, p := range parts {
		if i > 0 {
			s.Gaps = append(s.Gaps, gaps[i-1])
			s.Media = append(s.Media, Air)
		}
		s.Surfaces = append(s.Surfaces, p.Surfaces...)
		s.Gaps = append(s.Gaps, p.Thickness...)
		s.Media = append(s.Media, p.Media...)
		for range p.Surfaces {
			s.SemiApertures = append(s.SemiApertures, p.Aperture()/2)
		}
	}
	s.Reflectances = reflectancesOf(parts)
	return s
}

// reflectancesOf puts the parts' coated reflectances in a row, NaN for
// every surface without one; nil when no part states a coating.
func reflectancesOf(parts []Part) []float64 {
	var r []float64
	for k, p := range parts {
		pr := p.Reflectances()
		if pr == nil && r == nil {
			continue
		}
		if r == nil {
			for _, q := range parts[:k] {
				for range q.Surfaces {
					r = append(r, math.NaN())
				}
			}
		}
		for i := range p.Surfaces {
			if pr == nil {
				r = append(r, math.NaN())
			} else {
				r = append(r, pr[i])
			}
		}
	}
	return r
}

// Length is the axial distance from the first to the last vertex.
func (s System) Length() float64 {
	l := 0.0
	for _, g := range s.Gaps {
		l += g
	}
	return l
}

// Indices returns the refractive indices at a wavelength: object space,
// then after each surface (the last is image space).
func (s System) Indices(wavelengthNm float64) []float64 {
	if len(s.Gaps) != len(s.Surfaces)-1 || len(s.Media) != len(s.Gaps) {
		panic(fmt.Sprintf("optics: system has %d surfaces, %d gaps and %d media", len(s.Surfaces), len(s.Gaps), len(s.Media)))
	}
	n := make([]float64, len(s.Surfaces)+1)
	n[0] = orAir(s.ObjectMedium).Index(wavelengthNm)
	for i, m := range s.Media {
		n[i+1] = m.Index(wavelengthNm)
	}
	n[len(n)-1] = orAir(s.ImageMedium).Index(wavelengthNm)
	return n
}

// Matrix is the reduced ray-transfer matrix from the first vertex to the
// last vertex at a wavelength.
func (s System) Matrix(wavelengthNm float64) Mat2 {
	n := s.Indices(wavelengthNm)
	m := Identity
	for i, surf := range s.Surfaces {
		m = m.Then(Refraction((n[i+1] - n[i]) * surf.Curvature()))
		if i < len(s.Gaps) {
			m = m.Then(Transfer(s.Gaps[i], n[i+1]))
		}
	}
	return m
}

// RangeWarnings lists the media used outside their dispersion formula's
// range, once each.
func (s System) RangeWarnings(wavelengthNm float64) []string {
	seen := map[string]bool{}
	var w []string
	for _, m := range append([]Medium{orAir(s.ObjectMedium), orAir(s.ImageMedium)}, s.Media...) {
		if msg := RangeWarning(m, wavelengthNm); msg != "" && !seen[msg] {
			seen[msg] = true
			w = append(w, msg)
		}
	}
	return w
}

func orAir(m Medium) Medium {
	if m == nil {
		return Air
	}
	return m
}
