package optics

import (
	"math"
	"testing"
)

// A ball lens of every common stock diameter from 0.5 to 25.4 mm (common
// practice) is a legal part whose radii equal its semi-diameter, and its
// EFL is the textbook ball-lens formula EFL = n D / (4 (n - 1)), measured
// from the centre of the ball (thick-lens formula with R1 = -R2 = D/2 and
// t = D; Hecht, Optics, 5th ed., sec. 6.2, from memory). The principal
// planes of a ball both lie at its centre, so the EFL is also the distance
// from the centre to the back focal point (same source).
func TestBallLens(t *testing.T) {
	const n = 1.517 // glass code 517642 (nd 1.517), as in the CSV row of issue 10
	for _, d := range []float64{0.5, 1, 1.5, 2, 2.5, 3, 4, 5, 6, 8, 10, 12, 15, 20, 25, 25.4} {
		r := d / 2
		ball := Part{Supplier: "TEST", Name: "BALL", Diameter: d,
			Surfaces: []Surface{Sphere(r), Sphere(-r)}, Thickness: []float64{d}, Media: []Medium{Constant{"n", n}}}
		if err := ball.Validate(); err != nil {
			t.Errorf("D %g mm: %v", d, err)
			continue
		}
		c := ball.System(Air, Air).Cardinal(LineD)
		want := n * d / (4 * (n - 1))
		if math.Abs(c.EFL-want) > 1e-9*want {
			t.Errorf("D %g mm: EFL %.12g, ball-lens formula %.12g", d, c.EFL, want)
		}
		// Back focal distance from the last vertex: EFL - D/2.
		if bfd := want - r; math.Abs(c.FPrime-bfd) > 1e-9*want {
			t.Errorf("D %g mm: BFD %.12g, want EFL - D/2 = %.12g", d, c.FPrime, bfd)
		}
		if et, err := ball.EdgeThickness(); err != nil || math.IsNaN(et) || et < 0 {
			t.Errorf("D %g mm: edge thickness %g, %v", d, et, err)
		}
	}
}
