package optics

import (
	"math"
	"testing"
)

func TestFresnelReflectance(t *testing.T) {
	// Normal-incidence reflectance ((n - 1)/(n + 1))^2 (Hecht, Optics,
	// 5th ed., sec. 4.6.2; from memory), evaluated by hand: 0.0422 for
	// n = 1.517 and 0.0426 for n = 1.52 (the "about 4 % per uncoated
	// surface" of common practice). The issue quotes 4.26 % for 1.517;
	// that is the value for 1.52.
	checkNear(t, "n=1.517", FresnelReflectance(1, 1.517), 0.04219, 5e-6, 0)
	checkNear(t, "n=1.52", FresnelReflectance(1, 1.52), 0.04258, 5e-6, 0)
	checkNear(t, "symmetric", FresnelReflectance(1.517, 1), FresnelReflectance(1, 1.517), 0, 1e-15)
}

func TestGhostBiconvexSecondSurface(t *testing.T) {
	// Hand computation with reduced ray matrices (Gerrard and Burch,
	// ch. III; reflection at radius R in index n is a mirror of power
	// -2n/R: Siegman, Lasers, 1986, ch. 15): biconvex R1 = 50, R2 = -50,
	// t = 5, n = 1.517, a collimated ray of height 1: refract at surface 1
	// (power 0.01034), go 5/1.517, reflect at surface 2 (power
	// -2 (1.517)(-1/50) = 0.06068), go back 5/1.517, refract at surface 1
	// again: height 0.73866, reduced angle -0.076590, so the ghost focus
	// lies 0.73866 / 0.076590 = 9.644 mm in front of the first vertex.
	p := singlet(50, -50, 5, 1.517, 25)
	in := NewGaussianBeam(632.8, 2, 0, 1) // zR 20 m: geometric focus
	gs := p.System(nil, nil).Ghosts(in)
	if len(gs) != 3 {
		t.Fatalf("%d ghosts, want 2 single and 1 double", len(gs))
	}
	g := gs[1]
	if len(g.Surfaces) != 1 || g.Surfaces[0] != 2 || g.Forward || !g.Real {
		t.Fatalf("ghost %+v, want the real single ghost of surface 2", g)
	}
	checkNear(t, "ghost focus z", g.Z, -9.6443, 0.002, 0)
	checkNear(t, "reflectance", g.Reflectance, FresnelReflectance(1, 1.517), 0, 1e-12)
	// Concentration: R (w_in / w_ghost)^2, the ghost waist of a
	// collimated beam through the ghost's focal length F being
	// lambda F / (pi w) (Siegman 1986, ch. 17, far-field focusing);
	// F = 1 / 0.076590 for a unit ray.
	wg := 632.8e-6 / 0.0765897 / (math.Pi * 2)
	checkNear(t, "ghost waist", g.Radius, wg, 0, 2e-3)
	checkNear(t, "concentration", g.Concentration, g.Reflectance*sq(2/wg), 0, 5e-3)
	if g.Nearest != math.Abs(g.Z) || g.Surface != 1 {
		t.Errorf("nearest surface %d at %g", g.Surface, g.Nearest)
	}
	// The first surface's own ghost: a convex mirror of radius 50 seen
	// from air diverges (virtual focus R/2 behind it), so it is not real.
	if gs[0].Real {
		t.Errorf("surface 1 ghost %+v should be virtual", gs[0])
	}
}

func TestGhostDoubleFlatPlate(t *testing.T) {
	// A flat plate: every reflection is a plane mirror, so a collimated
	// beam is not concentrated: each ghost is at most as intense as its
	// reflectance times the beam (plane mirrors have no power; common
	// practice). With a converging input the double ghost of a plate of
	// thickness t and index n focuses 2 t / n before the main focus (two
	// extra passes of the plate's reduced thickness toward a converging
	// waist; Gerrard and Burch, ch. III).
	plate := System{Surfaces: []Surface{{}, {}}, Gaps: []float64{6}, Media: []Medium{Constant{"n", 1.5}}}
	for _, g := range plate.Ghosts(NewGaussianBeam(1064, 1.5, 0, 1)) {
		if g.Concentration > g.Reflectance*(1+1e-9) {
			t.Errorf("ghost %v of a plate in a collimated beam concentrates %g, reflectance %g", g.Surfaces, g.Concentration, g.Reflectance)
		}
	}
	in := NewGaussianBeam(1064, 0.02, -50, 1) // waist 50 mm past the first face
	plate.Reflectances = []float64{0.01, 0.02}
	gs := plate.Ghosts(in)
	main := 50 + 6*(1-1/1.5) // main waist from the first face (plate shift t (1 - 1/n))
	d := gs[2]
	if !d.Forward || d.Surfaces[0] != 2 || d.Surfaces[1] != 1 {
		t.Fatalf("double ghost %+v", d)
	}
	checkNear(t, "double ghost z", d.Z, main-2*6/1.5, 1e-9, 1e-9)
	checkNear(t, "reflectances as the system states them", d.Reflectance, 0.0002, 0, 1e-12)
	checkNear(t, "waist kept by plane mirrors", d.Radius, 0.02, 0, 1e-9)
}
