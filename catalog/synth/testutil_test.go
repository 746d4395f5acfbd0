package synth

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
		t.Errorf("%s = %.10g, want %.10g (abs %g, rel %g)", what, got, want, abs, rel)
	}
}
