package optics

import (
	"math"
	"testing"
)

// near reports whether got is within an absolute tolerance abs or a relative
// tolerance rel of want.
func near(got, want, abs, rel float64) bool {
	d := math.Abs(got - want)
	return d <= abs || d <= rel*math.Abs(want)
}

func checkNear(t *testing.T, what string, got, want, abs, rel float64) {
	t.Helper()
	if !near(got, want, abs, rel) {
		t.Errorf("%s = %.12g, want %.12g (abs %g, rel %g)", what, got, want, abs, rel)
	}
}

// singlet builds a lens of constant index n in air.
func singlet(r1, r2, t, n, diameter float64) Part {
	return Part{Supplier: "TEST", Name: "S", Diameter: diameter,
		Surfaces:  []Surface{Sphere(r1), Sphere(r2)},
		Thickness: []float64{t},
		Media:     []Medium{Constant{Label: "n", N: n}}}
}

func cmplxExp(z complex128) complex128 {
	return complex(math.Exp(real(z))*math.Cos(imag(z)), math.Exp(real(z))*math.Sin(imag(z)))
}

func sqAbs(z complex128) float64 { return real(z)*real(z) + imag(z)*imag(z) }
