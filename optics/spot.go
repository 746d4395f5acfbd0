package optics

import (
	"fmt"
	"math"
)

// Traced is a bundle traced to an image plane.
type Traced struct {
	Bundle
	Tracer *Tracer
	// ImageZ is the image plane's position from the last vertex.
	ImageZ float64
	Paths  []Path // Paths[i] is the trace of Bundle.Rays[i]
}

// TraceBundle traces every ray of the bundle to the image plane at imageZ
// from the last vertex.
func (t *Tracer) TraceBundle(b Bundle, imageZ float64) Traced {
	if b.Wavelength != t.Wavelength {
		panic(fmt.Sprintf("optics: bundle at %g nm traced at %g nm", b.Wavelength, t.Wavelength))
	}
	return t.traceBundleInto(b, imageZ, make([]Path, len(b.Rays)))
}

// traceBundleInto is TraceBundle with the paths written into paths (as
// long as the bundle's rays); the points of all the rays share one array.
func (t *Tracer) traceBundleInto(b Bundle, imageZ float64, paths []Path) Traced {
	tr := Traced{Bundle: b, Tracer: t, ImageZ: imageZ, Paths: paths}
	var pts []Vec3
	n := len(t.Vertex)
	if !t.NoPoints {
		pts = make([]Vec3, len(b.Rays)*n)
	}
	for i, r := range b.Rays {
		var own []Vec3
		if pts != nil {
			own = pts[i*n : i*n : (i+1)*n]
		}
		tr.Paths[i] = t.trace(r, imageZ, own)
	}
	return tr
}

// Lost counts the rays that did not pass, by status.
func (tr Traced) Lost() map[RayStatus]int {
	lost := map[RayStatus]int{}
	for _, p := range tr.Paths {
		if p.Status != Passed {
			lost[p.Status]++
		}
	}
	return lost
}

// A Spot is the pattern of ray intersections on one image plane.
type Spot struct {
	Z                    float64 // the plane, from the last vertex, mm
	Passed, Lost         int     // rays that reached it and rays that did not
	CentroidX, CentroidY float64 // pupil-area-weighted mean position, mm
	// RMS is the root-mean-square distance from the centroid, weighting
	// each ray by its share of the pupil's area (mm).
	RMS float64
	Max float64 // the largest distance of a ray from the centroid, mm
}

// SpotAt is the spot on the plane at z from the last vertex, the passed
// rays carried along their image-space directions.
func (tr Traced) SpotAt(z float64) Spot {
	s := Spot{Z: z}
	var sw, sx, sy float64
	for i := range tr.Paths {
		p := &tr.Paths[i]
		if p.Status != Passed {
			s.Lost++
			continue
		}
		s.Passed++
		q := tr.Tracer.at(p, z)
		w := tr.Points[i].Weight
		sw, sx, sy = sw+w, sx+w*q.X, sy+w*q.Y
	}
	if s.Passed == 0 || sw == 0 {
		return s
	}
	s.CentroidX, s.CentroidY = sx/sw, sy/sw
	var ss float64
	for i := range tr.Paths {
		if p := &tr.Paths[i]; p.Status == Passed {
			q := tr.Tracer.at(p, z) // the same point again: cheaper than keeping them all
			d2 := sq(q.X-s.CentroidX) + sq(q.Y-s.CentroidY)
			ss += tr.Points[i].Weight * d2
			s.Max = max(s.Max, math.Sqrt(d2)) // the builtin: math.Max's result, without a call
		}
	}
	s.RMS = math.Sqrt(ss / sw)
	return s
}

// BestFocus is the spot on the plane where the RMS radius is least. Along
// straight image-space rays each ray's position is linear in the plane's
// z, so the weighted mean square distance from the centroid is a quadratic
// in z whose minimum is found exactly: with a_i the centred positions on
// the image plane and s_i the centred slopes (K/M, L/M),
// dz = -sum w a.s / sum w s.s (the vertex of that quadratic, derived here;
// the tests check it against a direct scan of planes).
func (tr Traced) BestFocus() Spot {
	z, ok := tr.bestFocusZ()
	if !ok {
		return tr.SpotAt(tr.ImageZ)
	}
	return tr.SpotAt(z)
}

// bestFocusZ is the plane of BestFocus, false when fewer than two rays
// passed or their slopes are all alike. It passes over the rays three
// times (total weight, weighted means, then the sums) rather than keep
// copies of them.
func (tr Traced) bestFocusZ() (float64, bool) {
	var sw float64
	n := 0
	for i := range tr.Paths {
		if tr.Paths[i].Status == Passed {
			sw += tr.Points[i].Weight
			n++
		}
	}
	if n < 2 {
		return 0, false
	}
	var ma, ms Vec3 // the weighted means of the positions and the slopes
	for i := range tr.Paths {
		if p := &tr.Paths[i]; p.Status == Passed {
			f := tr.Points[i].Weight / sw
			ma, ms = ma.Add(p.Image.Scale(f)), ms.Add(slope(p).Scale(f))
		}
	}
	var num, den float64
	for i := range tr.Paths {
		if p := &tr.Paths[i]; p.Status == Passed {
			w := tr.Points[i].Weight
			da, ds := p.Image.Sub(ma), slope(p).Sub(ms)
			da.Z, ds.Z = 0, 0
			num += w * da.Dot(ds)
			den += w * ds.Dot(ds)
		}
	}
	if den == 0 {
		return 0, false
	}
	return tr.ImageZ - num/den, true
}

// slope is the ray's image-space slope (K/M, L/M).
func slope(p *Path) Vec3 { return Vec3{X: p.Dir.X / p.Dir.Z, Y: p.Dir.Y / p.Dir.Z} }

func sq(x float64) float64 { return x * x }

// AiryRadius is the radius of the first dark ring of the Airy pattern,
// 1.22 lambda / (2 NA') = 0.61 lambda / NA', in mm, for a wavelength in nm
// and the image-space numerical aperture NA' = n' sin U' (G. B. Airy,
// Trans. Camb. Phil. Soc. 5, 283 (1835); Born and Wolf, Principles of
// Optics, 7th ed., ch. 8).
func AiryRadius(wavelengthNm, naImage float64) float64 {
	if !(naImage > 0) {
		panic(fmt.Sprintf("optics: Airy radius needs a positive NA, got %g", naImage))
	}
	return 0.61 * wavelengthNm * 1e-6 / naImage
}
