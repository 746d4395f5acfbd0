package optics

import (
	"fmt"
	"math"
)

// A Coating is what is stated of the anti-reflection coating of a part:
// one residual reflectance for every surface of the part that borders air
// (its two outer surfaces, and the faces of any air space inside it). A
// cemented surface, glass against glass, is not coated; its reflectance
// comes from the indices. The zero Coating states nothing: every surface
// then reflects as the Fresnel formula gives from its indices.
type Coating struct {
	// Stated is true when the part's coating is given; ResidualPct then
	// holds, 0 included.
	Stated bool
	// ResidualPct is the power reflectance of each coated surface at
	// normal incidence, in percent (0 to 100), at the wavelength the
	// coating is made for; it is used as given at every wavelength.
	ResidualPct float64
}

// Validate reports a stated reflectance that is not a finite percentage
// from 0 to 100.
func (c Coating) Validate() error {
	if c.Stated && !(c.ResidualPct >= 0 && c.ResidualPct <= 100) {
		return Problem{"residual_reflectance", fmt.Sprintf("%g %% must be a percentage from 0 to 100", c.ResidualPct)}
	}
	return nil
}

// Reflectances gives, for each surface of the part, the power reflectance
// (a fraction) of its coating, or NaN where the surface is not coated or
// the part states no coating (the Fresnel value from the indices applies
// there): nil when the part states none.
func (p Part) Reflectances() []float64 {
	if !p.Coating.Stated {
		return nil
	}
	n := len(p.Surfaces)
	r := make([]float64, n)
	for i := range r {
		r[i] = math.NaN()
		outer := i == 0 || i == n-1
		if outer || isAir(p.Media[i-1]) || isAir(p.Media[i]) {
			r[i] = p.Coating.ResidualPct / 100
		}
	}
	return r
}

func isAir(m Medium) bool { return m != nil && m.Name() == Air.Name() }
