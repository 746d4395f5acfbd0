package synth

import "math"

// r20 holds the basic series R20 of preferred numbers in one decade, as
// rounded in ISO 3:1973, table 1 (from memory; each value lies within
// 1.3 % of 10^(i/20), the bound the standard allows, checked in the tests).
var r20 = [20]float64{1.00, 1.12, 1.25, 1.40, 1.60, 1.80, 2.00, 2.24, 2.50, 2.80,
	3.15, 3.55, 4.00, 4.50, 5.00, 5.60, 6.30, 7.10, 8.00, 9.00}

// Series returns the preferred numbers of series R10 or R20 (step 10 or 20
// per decade; ISO 3) from lo to hi inclusive, in increasing order. lo and
// hi are positive; other steps panic.
func Series(r int, lo, hi float64) []float64 {
	if r != 10 && r != 20 {
		panic("synth: Series takes R10 or R20")
	}
	if !(lo > 0) || !(hi >= lo) {
		panic("synth: Series needs 0 < lo <= hi")
	}
	step := 20 / r
	var out []float64
	for dec := math.Floor(math.Log10(lo)) - 1; ; dec++ {
		scale := math.Pow(10, dec)
		for i := 0; i < 20; i += step {
			v := roundTo(r20[i]*scale, scale/100)
			if v > hi*(1+1e-12) {
				return out
			}
			if v >= lo*(1-1e-12) {
				out = append(out, v)
			}
		}
	}
}

// roundTo rounds v to the nearest multiple of q, cleaning the binary
// residue so that 22.4 prints as 22.4.
func roundTo(v, q float64) float64 {
	r := math.Round(v/q) * q
	s := math.Pow(10, math.Max(0, -math.Floor(math.Log10(q))+1))
	return math.Round(r*s) / s
}
