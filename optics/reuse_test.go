package optics

import (
	"errors"
	"math"
	"reflect"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// The real-ray figures are worked out in reused scratch space, without a
// copy of each ray, and traces for Assess keep no surface points. These
// tests hold the figures to what the straightforward forms below give
// (the forms the package used before), compared with ==: the same
// floating-point operations must give the same numbers (an invariant,
// not a tolerance).

// refSpotAt is SpotAt keeping every point.
func refSpotAt(tr Traced, z float64) Spot {
	s := Spot{Z: z}
	var sw, sx, sy float64
	pts := make([]Vec3, len(tr.Paths))
	for i, p := range tr.Paths {
		if p.Status != Passed {
			s.Lost++
			continue
		}
		s.Passed++
		pts[i] = tr.Tracer.At(p, z)
		w := tr.Points[i].Weight
		sw, sx, sy = sw+w, sx+w*pts[i].X, sy+w*pts[i].Y
	}
	if s.Passed == 0 || sw == 0 {
		return s
	}
	s.CentroidX, s.CentroidY = sx/sw, sy/sw
	var ss float64
	for i, p := range tr.Paths {
		if p.Status == Passed {
			d2 := sq(pts[i].X-s.CentroidX) + sq(pts[i].Y-s.CentroidY)
			ss += tr.Points[i].Weight * d2
			s.Max = math.Max(s.Max, math.Sqrt(d2))
		}
	}
	s.RMS = math.Sqrt(ss / sw)
	return s
}

// refBestFocus is BestFocus on copies of the passed rays.
func refBestFocus(tr Traced) Spot {
	var sw float64
	var a, sl []Vec3
	var w []float64
	for i, p := range tr.Paths {
		if p.Status == Passed {
			a = append(a, p.Image)
			sl = append(sl, Vec3{X: p.Dir.X / p.Dir.Z, Y: p.Dir.Y / p.Dir.Z})
			w = append(w, tr.Points[i].Weight)
			sw += tr.Points[i].Weight
		}
	}
	if len(a) < 2 {
		return refSpotAt(tr, tr.ImageZ)
	}
	mean := func(v []Vec3) Vec3 {
		var m Vec3
		for i := range v {
			m = m.Add(v[i].Scale(w[i] / sw))
		}
		return m
	}
	ma, ms := mean(a), mean(sl)
	var num, den float64
	for i := range a {
		da, ds := a[i].Sub(ma), sl[i].Sub(ms)
		da.Z, ds.Z = 0, 0
		num += w[i] * da.Dot(ds)
		den += w[i] * ds.Dot(ds)
	}
	if den == 0 {
		return refSpotAt(tr, tr.ImageZ)
	}
	return refSpotAt(tr, tr.ImageZ-num/den)
}

// refOPD is the path to the reference sphere, with weights and directions,
// in fresh slices.
func refOPD(tr Traced, centre Vec3) (opd, w []float64, dirs []Vec3, radius float64) {
	radius = tr.referenceRadius(centre)
	nImage := tr.Tracer.N[len(tr.Tracer.N)-1]
	for i, p := range tr.Paths {
		if p.Status != Passed {
			continue
		}
		v := p.Image.Sub(centre)
		b := v.Dot(p.Dir)
		disc := b*b - v.Dot(v) + radius*radius
		if disc < 0 {
			continue
		}
		opd = append(opd, p.OPL+nImage*(-b-math.Sqrt(disc)))
		w = append(w, tr.Points[i].Weight)
		dirs = append(dirs, p.Dir)
	}
	return opd, w, dirs, radius
}

// refBestWavefront is BestWavefront with a new matrix and factorisation
// at every step.
func refBestWavefront(tr Traced, start Vec3) (Wavefront, error) {
	centre := start
	for iter := 0; iter < 3; iter++ {
		opd, w, dirs, _ := refOPD(tr, centre)
		if len(opd) < 3 {
			return Wavefront{}, errors.New("too few rays")
		}
		nImage := tr.Tracer.N[len(tr.Tracer.N)-1]
		var sw, mo float64
		var md Vec3
		for i := range opd {
			sw, mo, md = sw+w[i], mo+w[i]*opd[i], md.Add(dirs[i].Scale(w[i]))
		}
		mo, md = mo/sw, md.Scale(1/sw)
		a := mat.NewDense(len(opd), 3, nil)
		b := mat.NewVecDense(len(opd), nil)
		for i := range opd {
			sw := math.Sqrt(w[i])
			d := dirs[i].Sub(md).Scale(-nImage * sw)
			a.SetRow(i, []float64{d.X, d.Y, d.Z})
			b.SetVec(i, sw*(opd[i]-mo))
		}
		var svd mat.SVD
		if !svd.Factorize(a, mat.SVDThin) {
			return Wavefront{}, errors.New("no convergence")
		}
		if rank := svd.Rank(1e-10); rank > 0 {
			var x mat.VecDense
			svd.SolveVecTo(&x, b, rank)
			centre = centre.Add(Vec3{x.AtVec(0), x.AtVec(1), x.AtVec(2)})
		}
	}
	opd, w, _, r := refOPD(tr, centre)
	wf := Wavefront{Centre: centre, Radius: r, Rays: len(opd)}
	lambda := tr.Wavelength * 1e-6
	var sw, mean float64
	lo, hi := math.Inf(1), math.Inf(-1)
	for i, v := range opd {
		sw, mean = sw+w[i], mean+w[i]*v
		lo, hi = math.Min(lo, v), math.Max(hi, v)
	}
	mean /= sw
	var ss float64
	for i, v := range opd {
		ss += w[i] * sq(v-mean)
	}
	wf.RMS, wf.PV = math.Sqrt(ss/sw)/lambda, (hi-lo)/lambda
	return wf, nil
}

// reuseSystems are systems with aberrations of every kind: a strong
// singlet (spherical), the same off axis (coma, astigmatism), a finite
// object, a pair, and bundles that lose rays to the clear aperture.
func reuseSystems(t *testing.T) []struct {
	name  string
	sys   System
	obj   Object
	field float64
} {
	t.Helper()
	pcx, ach := plano51AndAchromat()
	crown, _ := GlassCode("517642")
	small := singletOf(20, -20, 5, crown)
	small.Diameter = 8
	inf := func(beam float64) Object { return Object{Z: math.Inf(-1), Aperture: Aperture{Beam: beam}} }
	return []struct {
		name  string
		sys   System
		obj   Object
		field float64
	}{
		{"plano-convex on axis", pcx.System(nil, nil), inf(20), 0},
		{"plano-convex at 3 degrees", pcx.System(nil, nil), inf(12), 3},
		{"finite object", pcx.System(nil, nil), Object{Z: -150, Aperture: Aperture{NA: 0.05}}, 4},
		{"pair", Assemble(nil, nil, []Part{pcx, ach}, []float64{5}), inf(10), 1},
		{"clipped", small.System(nil, nil), inf(9), 2},
	}
}

func TestFiguresInScratchSpaceAreTheSame(t *testing.T) {
	for _, c := range reuseSystems(t) {
		t.Run(c.name, func(t *testing.T) {
			for _, noPoints := range []bool{false, true} {
				b, err := c.sys.Bundle(c.obj, c.field, LineD, Hexapolar(9))
				if err != nil {
					t.Fatal(err)
				}
				tc := c.sys.Tracer(LineD)
				tc.NoPoints = noPoints
				z, _, _ := c.sys.Cardinal(LineD).Image(c.obj.Z)
				tr := tc.TraceBundle(b, z)
				for _, dz := range []float64{-0.3, 0, 0.7} {
					if got, want := tr.SpotAt(z+dz), refSpotAt(tr, z+dz); got != want {
						t.Errorf("SpotAt(%g): %+v, want %+v", dz, got, want)
					}
				}
				best := tr.BestFocus()
				if want := refBestFocus(tr); best != want {
					t.Errorf("BestFocus: %+v, want %+v", best, want)
				}
				start := Vec3{X: best.CentroidX, Y: best.CentroidY, Z: tc.LastVertex() + best.Z}
				for k := 0; k < 2; k++ { // the second time in scratch space the first left behind
					got, err := tr.BestWavefront(start)
					want, werr := refBestWavefront(tr, start)
					if (err == nil) != (werr == nil) || got != want {
						t.Errorf("BestWavefront: %+v (%v), want %+v (%v)", got, err, want, werr)
					}
				}
				for i, p := range tr.Paths {
					if noPoints && p.Points != nil {
						t.Fatalf("ray %d keeps %d points with NoPoints", i, len(p.Points))
					}
					if want := tc.Trace(b.Rays[i], z); !noPoints && !reflect.DeepEqual(p, want) {
						t.Fatalf("ray %d traced in a bundle %+v, alone %+v", i, p, want)
					}
				}
			}
		})
	}
}

func TestAssessRepeats(t *testing.T) {
	// Assess reuses its scratch space from call to call: the same system
	// and conditions give the same figures whatever was assessed before.
	sys := reuseSystems(t)
	c := func(k int) Conditions {
		return Conditions{Object: sys[k].obj, Field: sys[k].field, Band: []float64{LineF, LineD, LineC}}
	}
	first := make([]Quality, len(sys))
	for k := range sys {
		q, err := sys[k].sys.Assess(c(k))
		if err != nil {
			t.Fatalf("%s: %v", sys[k].name, err)
		}
		first[k] = q
	}
	for k := len(sys) - 1; k >= 0; k-- {
		q, _ := sys[k].sys.Assess(c(k))
		if !reflect.DeepEqual(q, first[k]) {
			t.Errorf("%s: assessed again %+v, first %+v", sys[k].name, q, first[k])
		}
	}
}

// refTrace is Trace from the surfaces' own methods at every crossing.
func refTrace(t *Tracer, r Ray, imageZ float64) Path {
	p := Path{Surface: -1, Points: make([]Vec3, 0, len(t.Vertex))}
	pos, dir := r.Pos, r.Dir.Unit()
	for i := range t.Vertex {
		surf := t.System.Surfaces[i]
		origin := Vec3{Z: t.Vertex[i]}
		local := pos.Sub(origin)
		s, ok := surf.intersect(local, dir)
		if !ok || (i > 0 && s < -newtonTol) {
			p.Status, p.Surface, p.Dir = Missed, i, dir
			return p
		}
		q := local.Add(dir.Scale(s))
		hit := q.Add(origin)
		if refClipped(t, i, q.Height()) {
			p.Status, p.Surface, p.Dir = Clipped, i, dir
			p.Points = append(p.Points, hit)
			return p
		}
		p.Points = append(p.Points, hit)
		p.OPL += t.N[i] * s
		d, ok := refract(dir, surf.normal(q), t.N[i], t.N[i+1])
		if !ok {
			p.Status, p.Surface, p.Dir = TotalReflection, i, dir
			return p
		}
		p.Dir = d.Unit()
		pos, dir = hit, p.Dir
	}
	s := (t.LastVertex() + imageZ - pos.Z) / dir.Z
	p.Image = pos.Add(dir.Scale(s))
	p.OPL += t.N[len(t.N)-1] * s
	return p
}

func TestTraceIsTheSurfacesOwn(t *testing.T) {
	// The tracer keeps each surface's curvature, kind and index ratio
	// from ray to ray; a trace must stay the one the surfaces' own
	// methods give, compared with ==, spheres, planes and aspheres, lost
	// rays included.
	glass, _ := GlassCode("517642")
	asph := Surface{Radius: 25, Conic: -0.6, Asph: [7]float64{2e-6, -1e-9}}
	asphPart := Part{Supplier: "T", Name: "ASPH", Diameter: 25, Surfaces: []Surface{asph, Sphere(math.Inf(1))},
		Thickness: []float64{6}, Media: []Medium{glass}}
	cases := reuseSystems(t)
	cases = append(cases, struct {
		name  string
		sys   System
		obj   Object
		field float64
	}{"asphere", asphPart.System(nil, nil), Object{Z: math.Inf(-1), Aperture: Aperture{Beam: 20}}, 2})
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			for _, wl := range []float64{LineF, LineD, LineC} {
				b, err := c.sys.Bundle(c.obj, c.field, wl, Hexapolar(10))
				if err != nil {
					t.Fatal(err)
				}
				tc := c.sys.Tracer(wl)
				for _, unclipped := range []bool{false, true} {
					tc.Unclipped = unclipped
					for i, r := range b.Rays {
						if got, want := tc.Trace(r, 50), refTrace(tc, r, 50); !reflect.DeepEqual(got, want) {
							t.Fatalf("ray %d at %g nm, unclipped %v: %+v, want %+v", i, wl, unclipped, got, want)
						}
					}
				}
			}
		})
	}
}

// refClipped tells whether a ray at height h on surface i falls outside
// the clear semi-aperture, from the system's semi-apertures.
func refClipped(t *Tracer, i int, h float64) bool {
	sa := t.System.SemiApertures
	return !t.Unclipped && i < len(sa) && sa[i] > 0 && h > sa[i]*(1+1e-12)
}
