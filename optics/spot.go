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
	tr := Traced{Bundle: b, Tracer: t, ImageZ: imageZ, Paths: make([]Path, len(b.Rays))}
	for i, r := range b.Rays {
		tr.Paths[i] = t.Trace(r, imageZ)
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

// BestFocus is the spot on the plane where the RMS radius is least. Along
// straight image-space rays each ray's position is linear in the plane's
// z, so the weighted mean square distance from the centroid is a quadratic
// in z whose minimum is found exactly: with a_i the centred positions on
// the image plane and s_i the centred slopes (K/M, L/M),
// dz = -sum w a.s / sum w s.s (the vertex of that quadratic, derived here;
// the tests check it against a direct scan of planes).
func (tr Traced) BestFocus() Spot {
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
		return tr.SpotAt(tr.ImageZ)
	}
	ma, ms := weightedMean(a, w, sw), weightedMean(sl, w, sw)
	var num, den float64
	for i := range a {
		da, ds := a[i].Sub(ma), sl[i].Sub(ms)
		da.Z, ds.Z = 0, 0
		num += w[i] * da.Dot(ds)
		den += w[i] * ds.Dot(ds)
	}
	if den == 0 {
		return tr.SpotAt(tr.ImageZ)
	}
	return tr.SpotAt(tr.ImageZ - num/den)
}

func weightedMean(v []Vec3, w []float64, sw float64) Vec3 {
	var m Vec3
	for i := range v {
		m = m.Add(v[i].Scale(w[i] / sw))
	}
	return m
}

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
