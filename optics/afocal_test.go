package optics

import "testing"

func TestCollimatedWavefront(t *testing.T) {
	// A plane-parallel plate leaves a collimated beam collimated and
	// unaberrated (every ray crosses the same glass path; common
	// practice): no wavefront error.
	plate := System{Surfaces: []Surface{{}, {}}, Gaps: []float64{8}, Media: []Medium{Constant{"n", 1.5}}}
	rms, err := plate.CollimatedWavefront(10, 632.8)
	if err != nil {
		t.Fatal(err)
	}
	checkNear(t, "plate", rms, 0, 1e-9, 0)
	// A Keplerian pair of biconvex lenses at its afocal gap has spherical
	// aberration that grows as the fourth power of the beam radius
	// (primary spherical aberration W040 rho^4; Welford, Aberrations of
	// Optical Systems, 1986, ch. 7): doubling the beam multiplies the
	// defocus-removed RMS by about 16 while it is small.
	a := singlet(51.68, -51.68, 4, 1.517, 25) // f about 50 mm
	c := a.System(nil, nil).Cardinal(632.8)
	// Principal points 2f apart: the vertex gap is 2f - P + P'.
	sys := Assemble(nil, nil, []Part{a, a}, []float64{2*c.EFL - c.P + c.PPrime})
	small, err := sys.CollimatedWavefront(2, 632.8)
	if err != nil {
		t.Fatal(err)
	}
	large, err := sys.CollimatedWavefront(4, 632.8)
	if err != nil {
		t.Fatal(err)
	}
	if !(small > 0) {
		t.Fatalf("no aberration found for a biconvex Keplerian pair (%g waves)", small)
	}
	checkNear(t, "fourth-power growth", large/small, 16, 0, 0.05)
}
