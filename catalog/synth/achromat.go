package synth

import (
	"errors"
	"math"
)

// achromatize corrects the thin-lens achromat for its real thicknesses: it
// bends the flint's last surface until the thick doublet has the same power
// at the F and C lines (the definition of an achromat: the C and F foci
// coincide; Hecht, Optics, 5th ed., ch. 6), re-solving the thicknesses and the
// power each time. The thin-lens split is already close, so a few Newton
// steps on that one curvature suffice.
func (l *layout) achromatize(phi, diameter float64) error {
	colour := func() float64 { return l.powerAt(l.scale, l.nF) - l.powerAt(l.scale, l.nC) }
	for range 12 {
		g := colour()
		if math.Abs(g) <= 1e-9*math.Abs(phi) {
			return nil
		}
		// The derivative at fixed thicknesses and scale, by a forward
		// difference; c3 enters the powers linearly, so it is exact.
		h := 1e-3 * math.Abs(l.c[1])
		l.c[2] += h
		dg := (colour() - g) / h
		l.c[2] -= h
		if dg == 0 {
			break
		}
		l.c[2] -= g / dg
		if err := l.solve(phi, diameter); err != nil {
			return err
		}
	}
	if math.Abs(colour()) > 1e-6*math.Abs(phi) {
		return errors.New("the achromat does not converge to equal F and C powers")
	}
	return nil
}
