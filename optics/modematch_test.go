package optics

import (
	"math"
	"testing"
)

// overlapIntegral computes the power coupling of two fundamental modes
// numerically from its definition, |integral of Ea conj(Eb) dA|^2 over the
// product of the powers (Siegman, Lasers, 1986, ch. 16 on mode
// expansions; the field u(r) = exp(-i k r^2 / (2 q)) of ch. 17), by a
// radial sum: the outside check of Coupling.
func overlapIntegral(a, b GaussianBeam) float64 {
	k := 2 * math.Pi * a.N / (a.Wavelength * 1e-6)
	field := func(q complex128, r float64) complex128 {
		return cmplxExp(complex(0, -k*r*r/2) / q)
	}
	rMax := 8 * math.Max(a.Radius(), b.Radius())
	const n = 20000
	var ov complex128
	var pa, pb float64
	for i := 0; i < n; i++ {
		r := (float64(i) + 0.5) * rMax / n
		ea, eb := field(a.Q, r), field(b.Q, r)
		ov += ea * complex(real(eb), -imag(eb)) * complex(r, 0)
		pa += sqAbs(ea) * r
		pb += sqAbs(eb) * r
	}
	return sqAbs(ov) / (pa * pb)
}

func TestCoupling(t *testing.T) {
	for _, tc := range []struct {
		name   string
		a, b   GaussianBeam
		want   float64 // where the value is known outright
		source string
	}{
		{"same beam", NewGaussianBeam(632.8, 0.3, 5, 1), NewGaussianBeam(632.8, 0.3, 5, 1), 1,
			"identical modes couple fully (common practice)"},
		// Waists 1 and 2 at the same plane: 4 / (1/2 + 2)^2 = 0.64
		// (Kogelnik 1964, from memory; the waist-mismatch term alone).
		{"waist ratio 2", NewGaussianBeam(1064, 0.1, 0, 1), NewGaussianBeam(1064, 0.2, 0, 1), 0.64,
			"Kogelnik 1964, waist mismatch"},
		// Equal waists zR apart: 4 / (4 + 1) = 0.8 (Kogelnik 1964, the
		// axial-offset term lambda dz / (pi w^2) = 1; from memory).
		{"offset one Rayleigh range", NewGaussianBeam(1064, 0.1, 0, 1),
			NewGaussianBeam(1064, 0.1, math.Pi*0.01/1064e-6, 1), 0.8, "Kogelnik 1964, axial offset"},
		{"both mismatched", NewGaussianBeam(800, 0.05, 3, 1), NewGaussianBeam(800, 0.08, -2, 1), -1, ""},
	} {
		t.Run(tc.name, func(t *testing.T) {
			got := Coupling(tc.a, tc.b)
			// The definition of the overlap, computed numerically.
			checkNear(t, "coupling against the overlap integral", got, overlapIntegral(tc.a, tc.b), 1e-6, 0)
			if tc.want >= 0 {
				checkNear(t, "coupling ("+tc.source+")", got, tc.want, 1e-12, 0)
			}
		})
	}
}

func TestModeMatchPlacements(t *testing.T) {
	// Kogelnik and Li, Appl. Opt. 5, 1550 (1966), sec. VI: a lens of focal
	// length f >= f0 = pi w1 w2 / lambda placed d1 after a waist w1 puts a
	// waist w2 at d2 behind it. Each placement must turn the input waist
	// into the output waist exactly through the thin-lens ABCD matrices
	// (Siegman 1986, ch. 20), coupling 1.
	w1, w2, lambda := 0.2, 0.05, 1064.0
	f0 := ModeMatchFocal(w1, w2, lambda)
	checkNear(t, "f0", f0, math.Pi*0.2*0.05/1064e-6, 0, 1e-15)
	for _, f := range []float64{f0, 1.5 * f0, 4 * f0} {
		ps := ModeMatchPlacements(w1, w2, lambda, f)
		if want := map[bool]int{true: 1, false: 2}[f == f0]; len(ps) != want {
			t.Fatalf("f = %g: %d placements, want %d", f, len(ps), want)
		}
		for _, p := range ps {
			in := NewGaussianBeam(lambda, w1, p.D1, 1)
			out := in.Through(Refraction(1/f), 1).Propagate(p.D2)
			checkNear(t, "output waist radius", out.WaistRadius(), w2, 1e-9, 1e-9)
			checkNear(t, "output waist position", out.WaistDistance(), 0, 1e-7, 0)
			checkNear(t, "coupling", Coupling(out, NewGaussianBeam(lambda, w2, 0, 1)), 1, 1e-9, 0)
		}
	}
	if ps := ModeMatchPlacements(w1, w2, lambda, 0.9*f0); ps != nil {
		t.Errorf("below f0: %v, want none", ps)
	}
}
