package plots

import (
	"math"

	"cardinal/optics"
	"cardinal/search/solution"
)

// fanSamples is the number of rays across the pupil in each ray fan.
const fanSamples = 41

// set traces one field point at one wavelength: the hexapolar spot and the
// two fans, relative to the reference chief ray ref.
func (sp Spots) set(sys optics.System, s solution.Solution, o PlotOptions, field, wl float64, ref optics.Path) (SpotSet, error) {
	set := SpotSet{Field: field, Wavelength: wl}
	rings := o.Rings
	if rings == 0 {
		rings = 12
	}
	tr := sys.Tracer(wl)
	b, err := sys.Bundle(s.Object(), field, wl, optics.Hexapolar(rings))
	if err != nil {
		return SpotSet{}, err
	}
	for i, r := range b.Rays {
		p := tr.Trace(r, imagePlane(s))
		if p.Status != optics.Passed {
			set.Lost++
			continue
		}
		set.Passed++
		x, y := sp.coords(p, ref)
		set.X, set.Y, set.W = append(set.X, x), append(set.Y, y), append(set.W, b.Points[i].Weight)
		dx, dy := 0.0, 0.0
		if !sp.Angular {
			dx, dy = p.Dir.X/p.Dir.Z-ref.Dir.X/ref.Dir.Z, p.Dir.Y/p.Dir.Z-ref.Dir.Y/ref.Dir.Z
		}
		set.DX, set.DY = append(set.DX, dx), append(set.DY, dy)
	}
	set.RMS = weightedRMS(set.X, set.Y, set.W)
	sag := make([]optics.PupilPoint, fanSamples)
	for i, q := range optics.MeridionalFan(fanSamples) {
		sag[i] = optics.PupilPoint{X: q.Y, Weight: q.Weight}
	}
	for _, fan := range []struct {
		pts               []optics.PupilPoint
		pupil, err, slope *[]float64
		meridional        bool
	}{{optics.MeridionalFan(fanSamples), &set.MerPupil, &set.MerError, &set.MerSlope, true}, {sag, &set.SagPupil, &set.SagError, &set.SagSlope, false}} {
		fb, err := sys.Bundle(s.Object(), field, wl, fan.pts)
		if err != nil {
			return SpotSet{}, err
		}
		for i, r := range fb.Rays {
			p := tr.Trace(r, imagePlane(s))
			if p.Status != optics.Passed {
				continue
			}
			x, y := sp.coords(p, ref)
			dx, dy := 0.0, 0.0
			if !sp.Angular {
				dx, dy = p.Dir.X/p.Dir.Z-ref.Dir.X/ref.Dir.Z, p.Dir.Y/p.Dir.Z-ref.Dir.Y/ref.Dir.Z
			}
			if fan.meridional {
				*fan.pupil, *fan.err, *fan.slope = append(*fan.pupil, fan.pts[i].Y), append(*fan.err, y), append(*fan.slope, dy)
			} else {
				*fan.pupil, *fan.err, *fan.slope = append(*fan.pupil, fan.pts[i].X), append(*fan.err, x), append(*fan.slope, dx)
			}
		}
	}
	return set, nil
}

// weightedRMS is the root-mean-square distance of the points from their
// weighted centroid.
func weightedRMS(x, y, w []float64) float64 {
	var sw, sx, sy float64
	for i := range x {
		sw, sx, sy = sw+w[i], sx+w[i]*x[i], sy+w[i]*y[i]
	}
	if sw == 0 {
		return 0
	}
	cx, cy := sx/sw, sy/sw
	var ss float64
	for i := range x {
		ss += w[i] * ((x[i]-cx)*(x[i]-cx) + (y[i]-cy)*(y[i]-cy))
	}
	return math.Sqrt(ss / sw)
}

// airy is the Airy radius at the reference wavelength in the figures'
// unit: 0.61 lambda / NA' on the image plane (optics.AiryRadius), or for
// an afocal solution the angle 1.22 lambda / D of the first dark ring for
// an output beam of diameter D (Born and Wolf, Principles of Optics, 7th
// ed., sec. 8.5.2). Zero when it cannot be found.
func (sp Spots) airy(sys optics.System, s solution.Solution, wl float64) float64 {
	if !sp.Angular {
		f, err := sys.MarginalFocus(s.Object(), wl)
		if err != nil || !(f.NA > 0) {
			return 0
		}
		return 1e3 * optics.AiryRadius(wl, f.NA)
	}
	b, err := sys.Bundle(s.Object(), 0, wl, []optics.PupilPoint{{Y: 1}})
	if err != nil {
		return 0
	}
	p := sys.Tracer(wl).Trace(b.Rays[0], 0)
	if p.Status != optics.Passed {
		return 0
	}
	d := 2 * math.Abs(p.Points[len(p.Points)-1].Y)
	return 1e6 * math.Asin(math.Min(1, 1.22*wl*1e-6/d))
}
