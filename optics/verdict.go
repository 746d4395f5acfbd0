package optics

import "math"

// The words of a diffraction-limited verdict: yes, or the first of the
// checks below that fails.
const (
	LimitedYes       = "yes"
	LimitedOnAxis    = "no: on axis"
	LimitedFieldEdge = "no: field edge"
	LimitedColour    = "no: colour"
)

// A Judged is one field point at one wavelength on the verdict's common
// image plane.
type Judged struct {
	Edge       bool    // the field edge; false on axis
	Wavelength float64 // nm
	RMS        float64 // RMS wavefront error, waves of this wavelength
}

// A Verdict says whether the image is diffraction limited at every field
// point and every wavelength judged, on one image plane shared by all of
// them, and if not, which fails first:
//
//   - on axis: the on-axis bundle at the reference wavelength exceeds
//     MarechalRMS even at its own best focus (the Wavefront of Quality);
//   - field edge: at the reference wavelength, no plane holds both the
//     axis and the field edge within MarechalRMS;
//   - colour: no plane holds every field point at every band wavelength
//     within MarechalRMS.
//
// The common plane is the one that makes the worst RMS wavefront error
// over every field point and wavelength least ("one best focus shared by
// all"). Each field point is referred to one image point for every
// wavelength: on the axis for the axis, and the centroid of the reference
// wavelength's spot on that plane for the field edge, so that a lateral
// colour counts against the other wavelengths; the path differences at
// each wavelength are in waves of that wavelength.
type Verdict struct {
	Limited bool
	Why     string // LimitedYes or one of the LimitedOn... words
	// PlaneZ is the common image plane, from the last vertex.
	PlaneZ float64
	// Judged lists every field point at every wavelength judged, the
	// axis first, on the common plane.
	Judged []Judged
	// Worst is the largest RMS of Judged, waves.
	Worst float64
}

// bundleAt is one traced bundle of the verdict, its passed rays kept in
// the form the wavefront on a moved reference sphere needs.
type bundleAt struct {
	tr     Traced
	edge   bool
	ref    bool // the reference wavelength
	rays   []rayEnd
	n      float64 // image-space index
	last   float64 // last vertex
	pupil  float64 // exit pupil from the last vertex
	pupilK bool    // the exit pupil is finite
	// c0 and slope give the centroid of the spot on the plane at z from
	// the last vertex, c0 + slope (z - imageZ): rays are straight in image
	// space.
	c0, slope Vec3
}

// rayEnd is one passed ray: its point on the image plane, direction, path
// length to that point and pupil weight.
type rayEnd struct {
	p, d   Vec3
	opl, w float64
}

func newBundleAt(tr Traced, edge, ref bool, ends []rayEnd) bundleAt {
	b := bundleAt{tr: tr, edge: edge, ref: ref, rays: ends[:0], n: tr.Tracer.N[len(tr.Tracer.N)-1], last: tr.Tracer.LastVertex()}
	b.pupil, b.pupilK = tr.Tracer.System.exitPupil(tr.Object.Stop, tr.Tracer.N)
	var sw float64
	for i := range tr.Paths {
		p := &tr.Paths[i]
		if p.Status != Passed {
			continue
		}
		w := tr.Points[i].Weight
		b.rays = append(b.rays, rayEnd{p: p.Image, d: p.Dir, opl: p.OPL, w: w})
		sw += w
		b.c0 = b.c0.Add(p.Image.Scale(w))
		b.slope = b.slope.Add(Vec3{X: p.Dir.X / p.Dir.Z, Y: p.Dir.Y / p.Dir.Z}.Scale(w))
	}
	if sw > 0 {
		b.c0, b.slope = b.c0.Scale(1/sw), b.slope.Scale(1/sw)
	}
	return b
}

// centroid is the spot's centroid on the plane at z from the last vertex.
func (b *bundleAt) centroid(z float64) (float64, float64) {
	dz := b.last + z - b.c0.Z
	return b.c0.X + b.slope.X*dz, b.c0.Y + b.slope.Y*dz
}

// rms is the RMS wavefront error in waves against the reference sphere
// centred at c, as Traced.Wavefront measures it (the same sphere through
// the exit pupil's axial point and the same path differences), in one
// pass with no allocation; +Inf when fewer than three rays meet the
// sphere.
func (b *bundleAt) rms(c Vec3) float64 {
	radius := 0.0
	if b.pupilK {
		radius = c.Sub(Vec3{Z: b.last + b.pupil}).Norm()
	}
	if radius <= 1e-3 {
		radius = math.Max(c.Sub(Vec3{Z: b.last}).Norm(), 1e-3)
	}
	var sw, s1, s2, off float64
	k := 0
	r2 := radius * radius
	for i := range b.rays {
		r := &b.rays[i]
		v := r.p.Sub(c)
		bb := v.Dot(r.d)
		disc := bb*bb - v.Dot(v) + r2
		if disc < 0 {
			continue
		}
		opd := r.opl + b.n*(-bb-math.Sqrt(disc))
		if k == 0 {
			off = opd // an offset keeps the sums of squares exact enough
		}
		x := opd - off
		sw, s1, s2 = sw+r.w, s1+r.w*x, s2+r.w*x*x
		k++
	}
	if k < 3 || sw == 0 {
		return math.Inf(1)
	}
	m := s1 / sw
	return math.Sqrt(max(s2/sw-m*m, 0)) / (b.tr.Wavelength * 1e-6)
}

// verdict judges the traced bundles: axis and edge (edge may be nil) at
// the reference wavelength wl, whose on-axis best wavefront is axisBest,
// and the same field points traced here at the other band wavelengths, in
// the scratch space w.
func (s System) verdict(c Conditions, wl float64, axis Traced, edge *Traced, axisBest Wavefront, w *assessWork) (Verdict, error) {
	bs := []bundleAt{newBundleAt(axis, false, true, w.ends.take(len(axis.Paths)))}
	if edge != nil {
		bs = append(bs, newBundleAt(*edge, true, true, w.ends.take(len(edge.Paths))))
	}
	for _, bw := range c.Band {
		if math.Abs(bw-wl) <= 0.05 {
			continue // the reference, already traced
		}
		fields := []float64{0}
		if edge != nil {
			fields = append(fields, c.Field)
		}
		t := w.tracer(s, bw)
		for k, f := range fields {
			tr, err := w.trace(s, t, c.Object, f, hexapolar(rings(c)), axis.ImageZ)
			if err != nil {
				return Verdict{}, err
			}
			bs = append(bs, newBundleAt(tr, k == 1, false, w.ends.take(len(tr.Paths))))
		}
	}
	lo, hi := focusBracket(bs)
	v := Verdict{Limited: true, Why: LimitedYes}
	z, worst := bestShared(bs, lo, hi)
	v.PlaneZ, v.Worst = z, worst
	for i := range bs {
		v.Judged = append(v.Judged, Judged{Edge: bs[i].edge, Wavelength: bs[i].tr.Wavelength, RMS: rmsAt(bs, i, z)})
	}
	switch {
	case axisBest.RMS > MarechalRMS:
		v.Why = LimitedOnAxis
	case edge != nil && sharedWorst(bs, lo, hi, func(b bundleAt) bool { return b.ref }, worst) > MarechalRMS:
		v.Why = LimitedFieldEdge
	case worst > MarechalRMS:
		v.Why = LimitedColour
	}
	v.Limited = v.Why == LimitedYes
	return v, nil
}

// focusBracket is a range of planes that holds the best focus of every
// bundle: their least-RMS-spot planes, widened by half their spread and a
// tenth of a millimetre each side.
func focusBracket(bs []bundleAt) (float64, float64) {
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, b := range bs {
		z := b.tr.BestFocus().Z
		lo, hi = math.Min(lo, z), math.Max(hi, z)
	}
	pad := 0.5*(hi-lo) + 0.1
	return lo - pad, hi + pad
}

// sharedWorst is the least, over planes, of the worst RMS of the bundles
// keep selects; all is that of every bundle (bestShared's), returned
// without a second search when keep selects them all.
func sharedWorst(bs []bundleAt, lo, hi float64, keep func(bundleAt) bool, all float64) float64 {
	var sel []bundleAt
	for _, b := range bs {
		if keep(b) {
			sel = append(sel, b)
		}
	}
	if len(sel) == len(bs) {
		return all // the same search over the same bundles in the same order
	}
	_, w := bestShared(sel, lo, hi)
	return w
}

// bestShared finds the plane in [lo, hi] where the worst RMS wavefront
// error of the bundles is least, by golden-section search (Press et al.,
// Numerical Recipes, 3rd ed., sec. 10.2): the worst of functions each
// unimodal in the plane's position, as defocus is, is unimodal too.
func bestShared(bs []bundleAt, lo, hi float64) (float64, float64) {
	f := func(z float64) float64 {
		w := 0.0
		for i := range bs {
			w = max(w, rmsAt(bs, i, z))
		}
		return w
	}
	g := (math.Sqrt(5) - 1) / 2
	a, b := lo, hi
	x1, x2 := b-g*(b-a), a+g*(b-a)
	f1, f2 := f(x1), f(x2)
	for i := 0; i < 60 && b-a > 1e-5; i++ { // 10 nm, far below any depth of focus
		if f1 <= f2 {
			b, x2, f2 = x2, x1, f1
			x1 = b - g*(b-a)
			f1 = f(x1)
		} else {
			a, x1, f1 = x1, x2, f2
			x2 = a + g*(b-a)
			f2 = f(x2)
		}
	}
	z := (a + b) / 2
	return z, f(z)
}

// rmsAt is bundle i's RMS wavefront error, in its waves, against a sphere
// centred on plane z at its field point's image point: the axis, or the
// centroid of the reference wavelength's spot of the same field point. A
// bundle whose rays miss the sphere counts as failing (+Inf).
func rmsAt(bs []bundleAt, i int, z float64) float64 {
	b := &bs[i]
	centre := Vec3{Z: b.last + z}
	if b.edge {
		for k := range bs {
			if bs[k].edge && bs[k].ref {
				centre.X, centre.Y = bs[k].centroid(z)
			}
		}
	}
	return b.rms(centre)
}
