package synth

import (
	"math"
	"testing"
)

func TestSeries(t *testing.T) {
	tests := []struct {
		name   string
		r      int
		lo, hi float64
		want   []float64
	}{
		// ISO 3, series R10 and R20 (from memory): 1, 1.25, 1.6, 2, 2.5,
		// 3.15, 4, 5, 6.3, 8 and the values between them.
		{"R10 one decade", 10, 10, 100, []float64{10, 12.5, 16, 20, 25, 31.5, 40, 50, 63, 80, 100}},
		{"R20 around 200", 20, 150, 400, []float64{160, 180, 200, 224, 250, 280, 315, 355, 400}},
		{"R10 below one", 10, 0.5, 1.3, []float64{0.5, 0.63, 0.8, 1, 1.25}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			got := Series(tc.r, tc.lo, tc.hi)
			if len(got) != len(tc.want) {
				t.Fatalf("Series(%d, %g, %g) = %v, want %v", tc.r, tc.lo, tc.hi, got, tc.want)
			}
			for i := range got {
				if got[i] != tc.want[i] {
					t.Errorf("Series(%d, %g, %g)[%d] = %v, want %v", tc.r, tc.lo, tc.hi, i, got[i], tc.want[i])
				}
			}
		})
	}
}

// TestSeriesNearTheory checks each rounded R20 number against the
// theoretical value 10^(i/20): ISO 3 rounds within -1.01 % and +1.26 %
// (from memory).
func TestSeriesNearTheory(t *testing.T) {
	got := Series(20, 10, 1000)
	if len(got) != 41 {
		t.Fatalf("R20 from 10 to 1000 has %d numbers, want 41", len(got))
	}
	for i, v := range got {
		theory := 10 * math.Pow(10, float64(i)/20)
		if d := v/theory - 1; d < -0.0101 || d > 0.0126 {
			t.Errorf("R20 number %d: %g is %.2f %% from 10^(%d/20) = %.4g", i, v, 100*d, i, theory)
		}
	}
}
