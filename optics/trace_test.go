package optics

import (
	"fmt"
	"math"
	"math/rand/v2"
	"testing"
)

// surfaceSystem is one refracting surface between two media.
func surfaceSystem(s Surface, n1, n2 float64) System {
	return System{ObjectMedium: Constant{"n1", n1}, ImageMedium: Constant{"n2", n2},
		Surfaces: []Surface{s}}
}

// lineDistance is the distance from point v to the line through p along
// the unit vector d.
func lineDistance(v, p, d Vec3) float64 {
	return cross(v.Sub(p), d).Norm()
}

func TestRefractSnell(t *testing.T) {
	// Snell's law n sin I = n' sin I', with the refracted ray in the plane
	// of incidence (Hecht, Optics, 5th ed., ch. 4), for random
	// directions and normals.
	rng := rand.New(rand.NewPCG(1, 2))
	for i := 0; i < 1000; i++ {
		nrm := Vec3{rng.NormFloat64() * 0.3, rng.NormFloat64() * 0.3, 1}.Unit()
		d := Vec3{rng.NormFloat64() * 0.3, rng.NormFloat64() * 0.3, 1}.Unit()
		n1, n2 := 1+rng.Float64(), 1+rng.Float64()
		dp, ok := refract(d, nrm, n1, n2)
		sinI := cross(d, nrm).Norm()
		if !ok {
			if n1*sinI <= n2 {
				t.Fatalf("total reflection reported with n sin I = %g < n' = %g", n1*sinI, n2)
			}
			continue
		}
		checkNear(t, "|d'|", dp.Norm(), 1, 1e-14, 0)
		checkNear(t, "n' sin I'", n2*cross(dp, nrm).Norm(), n1*sinI, 1e-14, 0)
		checkNear(t, "coplanar", cross(d, nrm).Dot(dp), 0, 1e-14, 0)
		if dp.Dot(nrm) <= 0 {
			t.Fatalf("refracted ray turned back")
		}
	}
}

func cross(a, b Vec3) Vec3 {
	return Vec3{a.Y*b.Z - a.Z*b.Y, a.Z*b.X - a.X*b.Z, a.X*b.Y - a.Y*b.X}
}

func TestRayThroughCentreUndeviated(t *testing.T) {
	// A ray aimed at the centre of curvature meets the sphere along the
	// normal and goes on undeviated (Snell's law with I = 0; e.g. Hecht,
	// Optics, 5th ed., ch. 5).
	rng := rand.New(rand.NewPCG(3, 4))
	for i := 0; i < 500; i++ {
		r := 20 + 200*rng.Float64()
		if i%2 == 1 {
			r = -r
		}
		tr := surfaceSystem(Sphere(r), 1, 1.4+0.5*rng.Float64()).Tracer(LineD)
		start := Vec3{rng.NormFloat64() * 3, rng.NormFloat64() * 3, math.Min(0, r) - 50}
		d := Vec3{Z: r}.Sub(start).Unit()
		p := tr.Trace(Ray{Pos: start, Dir: d}, 10)
		if p.Status != Passed {
			t.Fatalf("R %g: %v", r, p.Err())
		}
		checkNear(t, "deviation", p.Dir.Sub(d).Norm(), 0, 1e-13, 0)
		checkNear(t, "distance from centre", lineDistance(Vec3{Z: r}, p.Image, p.Dir), 0, 1e-10, 0)
	}
}

func TestAplanaticPoints(t *testing.T) {
	// The aplanatic points of a refracting sphere: an object in the medium
	// of index n at R (n + n')/n from the vertex images, at every aperture
	// and with no spherical aberration, to a virtual point R (n + n')/n'
	// from the vertex (Born and Wolf, Principles of Optics, 7th ed.,
	// ch. 4; Welford, Aberrations of Optical Systems, 1986, ch. 7, on
	// aplanatic surfaces). Here the glass is on the object side and the
	// surface bulges toward +z (R < 0).
	for _, tc := range []struct {
		name         string
		r, n, nPrime float64
	}{
		{"n 1.5 into air", -10, 1.5, 1},
		{"n 1.8 into air", -25, 1.8, 1},
		{"n 1.7 into water", -7, 1.7, 1.333},
	} {
		t.Run(tc.name, func(t *testing.T) {
			tr := surfaceSystem(Sphere(tc.r), tc.n, tc.nPrime).Tracer(LineD)
			obj := Vec3{Z: tc.r * (tc.n + tc.nPrime) / tc.n}
			img := Vec3{Z: tc.r * (tc.n + tc.nPrime) / tc.nPrime}
			for _, deg := range []float64{0.01, 1, 5, 10, 20, 30, 34} {
				u := deg * math.Pi / 180
				p := tr.Trace(Ray{Pos: obj, Dir: Vec3{Y: math.Sin(u), Z: math.Cos(u)}}, 0)
				if p.Status != Passed {
					t.Fatalf("%g deg: %v", deg, p.Err())
				}
				checkNear(t, fmt.Sprintf("%g deg: miss of the virtual image", deg), lineDistance(img, p.Image, p.Dir), 0, 1e-12, 0)
			}
		})
	}
}

func TestParaxialLimitBFD(t *testing.T) {
	// Issue 2's check: a ray parallel to the axis traced with exact Snell's
	// law at heights shrinking to zero crosses the axis ever nearer the
	// paraxial back focal point; the gap falls with the square of the
	// height (the paraxial limit: Welford, Aberrations of Optical Systems,
	// 1986, ch. 2; spherical aberration is even in h, lowest term h^2).
	glass, _ := GlassCode("517642")
	for _, tc := range []struct {
		name string
		p    Part
	}{
		{"plano-convex", singletOf(25.8, math.Inf(1), 5.3, glass)},
		{"biconvex", singletOf(51.7, -51.7, 4, glass)},
		{"meniscus", singletOf(20, 60, 3, glass)},
		{"biconcave", singletOf(-40, 40, 2, glass)},
	} {
		t.Run(tc.name, func(t *testing.T) {
			sys := tc.p.System(nil, nil)
			bfd := sys.Cardinal(LineD).BFD()
			tr := sys.Tracer(LineD)
			prev := math.Inf(1)
			for _, h := range []float64{1, 0.1, 0.01, 0.001} {
				p := tr.Trace(Ray{Pos: Vec3{Y: h, Z: -10}, Dir: Vec3{Z: 1}}, 0)
				z := p.Image.Z - p.Image.Y*p.Dir.Z/p.Dir.Y - tr.LastVertex()
				gap := math.Abs(z - bfd)
				if h < 1 && !(gap < prev/50 || gap < 1e-9) {
					t.Errorf("h %g: gap %g did not shrink like h^2 from %g", h, gap, prev)
				}
				prev = gap
			}
			checkNear(t, "gap at h = 0.001", prev, 0, 1e-7, 0)
		})
	}
}

func singletOf(r1, r2, t float64, m Medium) Part {
	return Part{Supplier: "TEST", Name: "S", Diameter: 25.4,
		Surfaces: []Surface{Sphere(r1), Sphere(r2)}, Thickness: []float64{t}, Media: []Medium{m}}
}

func TestCartesianEllipsoid(t *testing.T) {
	// An ellipsoid of eccentricity 1/n (conic k = -1/n^2) brings a
	// collimated beam in air to a perfect focus inside glass of index n, at
	// n R / (n - 1) from the vertex (Descartes' ovals; Hecht, Optics, 5th
	// ed., ch. 5). Exercises the Newton intersection on a conic.
	for _, n := range []float64{1.5, 1.8} {
		r := 20.0
		s := Surface{Radius: r, Conic: -1 / (n * n)}
		tr := surfaceSystem(s, 1, n).Tracer(LineD)
		focus := n * r / (n - 1)
		for _, h := range []float64{0.1, 2, 5, 10, 14} {
			p := tr.Trace(Ray{Pos: Vec3{X: h * 0.6, Y: h * 0.8, Z: -5}, Dir: Vec3{Z: 1}}, focus)
			if p.Status != Passed {
				t.Fatalf("h %g: %v", h, p.Err())
			}
			checkNear(t, "spot height", p.Image.Height(), 0, 1e-10, 0)
		}
	}
}

func TestAsphereIntersection(t *testing.T) {
	// The Newton intersection lands on the surface, and the normal agrees
	// with a central finite difference of the sag (invariant checks).
	s := Surface{Radius: 30, Conic: -0.7, Asph: [7]float64{2e-5, -3e-8, 1e-11}}
	rng := rand.New(rand.NewPCG(5, 6))
	for i := 0; i < 200; i++ {
		p := Vec3{rng.Float64()*10 - 5, rng.Float64()*10 - 5, -3}
		d := Vec3{rng.NormFloat64() * 0.1, rng.NormFloat64() * 0.1, 1}.Unit()
		tt, ok := s.intersect(p, d)
		if !ok {
			t.Fatalf("no intersection from %v along %v", p, d)
		}
		q := p.Add(d.Scale(tt))
		z, _ := s.Sag(q.Height())
		checkNear(t, "on surface", q.Z, z, 1e-12, 0)
		h, eps := q.Height(), 1e-5
		zp, _ := s.Sag(h + eps)
		zm, _ := s.Sag(h - eps)
		slope := (zp - zm) / (2 * eps)
		nrm := s.normal(q)
		checkNear(t, "normal slope", -(nrm.X*q.X+nrm.Y*q.Y)/(h*nrm.Z), slope, 1e-8, 1e-7)
	}
	// A sphere forced through the Newton path matches the closed form.
	sph, tiny := Sphere(25), Surface{Radius: 25, Asph: [7]float64{1e-30}}
	p, d := Vec3{Y: 7, Z: -2}, Vec3{Y: -0.1, Z: 1}.Unit()
	t1, _ := sph.intersect(p, d)
	t2, _ := tiny.intersect(p, d)
	checkNear(t, "Newton on a sphere", t2, t1, 1e-11, 0)
}

func TestRayStatus(t *testing.T) {
	// Rays that cannot pass are reported with the surface where they
	// stopped, never dropped.
	glass := Constant{"g", 1.5}
	lens := singletOf(20, -20, 6, glass)
	sys := lens.System(nil, nil)
	tr := sys.Tracer(LineD)
	for _, tc := range []struct {
		name    string
		sys     System
		ray     Ray
		status  RayStatus
		surface int
	}{
		{"passes", sys, Ray{Vec3{Y: 5, Z: -5}, Vec3{Z: 1}}, Passed, -1},
		{"clipped at the clear aperture", sys, Ray{Vec3{Y: 11.5, Z: -5}, Vec3{Z: 1}}, Clipped, 0},
		{"misses the first sphere", sys, Ray{Vec3{Y: 25, Z: -5}, Vec3{Z: 1}}, Missed, 0},
		{"totally reflected leaving glass",
			surfaceSystem(Sphere(math.Inf(1)), 1.5, 1), Ray{Vec3{Z: -1}, Vec3{Y: 0.8, Z: 0.6}}, TotalReflection, 0},
		{"totally reflected at the second surface",
			singletOf(math.Inf(1), 8, 4, glass).System(nil, nil), Ray{Vec3{Y: 6, Z: -1}, Vec3{Z: 1}}, TotalReflection, 1},
	} {
		t.Run(tc.name, func(t *testing.T) {
			tt := tr
			if tc.sys.Surfaces[0] != sys.Surfaces[0] || len(tc.sys.Surfaces) != 2 {
				tt = tc.sys.Tracer(LineD)
			}
			p := tt.Trace(tc.ray, 30)
			if p.Status != tc.status || p.Surface != tc.surface {
				t.Errorf("got %v at surface %d, want %v at %d", p.Status, p.Surface, tc.status, tc.surface)
			}
		})
	}
}
