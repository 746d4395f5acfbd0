package plots

import (
	"math"
	"testing"

	"cardinal/search/solution/solutiontest"
)

// The RMS radius on a shifted plane, from the rays' positions and slopes
// on the traced plane, equals the RMS radius of the rays traced afresh to
// that plane (straight rays in the last medium; an invariant of the
// tracer, no published value needed), and best focus is the least of it.
func TestThroughFocusMatchesATraceToTheShiftedPlane(t *testing.T) {
	for _, kind := range []string{"focus", "image"} {
		s := solutiontest.Solve(t, solutiontest.Requirements()[kind])[0]
		sp, err := NewSpots(s, PlotOptions{Rings: 8, Field: 1})
		if err != nil {
			t.Fatal(err)
		}
		for _, dz := range []float64{-0.4, sp.BestFocus, 0.25} {
			moved := s
			moved.ImageZ += dz
			again, err := NewSpots(moved, PlotOptions{Rings: 8, Wavelengths: sp.Wavelengths, Field: 1})
			if err != nil {
				t.Fatal(err)
			}
			for k := range sp.Sets {
				got, want := sp.RMSAt(k, dz), again.Sets[k].RMS
				if math.Abs(got-want) > 1e-6*math.Max(1, want) {
					t.Errorf("%s, set %d, %+.3f mm: RMS %.6f µm from the slopes, %.6f µm traced", kind, k, dz, got, want)
				}
			}
		}
		best := sp.RMSAt(0, sp.BestFocus)
		for _, d := range []float64{-0.01, 0.01} {
			if sp.RMSAt(0, sp.BestFocus+d) < best {
				t.Errorf("%s: the spot %+.2f mm from best focus is smaller than at best focus", kind, d)
			}
		}
		if dz, rms := sp.ThroughFocus(0); len(dz) != throughSamples || math.Abs(rms[throughSamples/2]-best) > 1e-9 {
			t.Errorf("%s: the through-focus curve does not centre on best focus", kind)
		}
	}
}
