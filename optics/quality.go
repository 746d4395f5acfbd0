package optics

import (
	"errors"
	"fmt"
	"math"
	"slices"
	"sync"
)

// Conditions say how to judge a system's image: the object, the field
// edge, the band and the image plane. The zero value of each optional
// field is documented beside it.
type Conditions struct {
	Object Object
	// Field is the field edge: object height in mm for a finite object,
	// field angle in degrees for an object at infinity; 0 judges on axis
	// only.
	Field float64
	// Reference is the wavelength of the spot and wavefront figures, nm;
	// 0 means the d line.
	Reference float64
	// Band lists the wavelengths for the colour figures; empty means the
	// reference wavelength alone.
	Band []float64
	// ImageZ is the image plane from the last vertex, used when
	// FixedImage is true; otherwise the plane is the paraxial image at the
	// reference wavelength.
	ImageZ     float64
	FixedImage bool
	// Rings is the number of hexapolar rings per bundle; 0 means 12
	// (468 rays).
	Rings int
}

// Quality holds the real-ray figures of a system under given conditions.
// Lengths are in mm.
type Quality struct {
	Wavelength float64 // the reference wavelength, nm
	ImageZ     float64 // the image plane, from the last vertex
	Focus      Focus   // the marginal ray against the paraxial focus
	// Axis is the on-axis spot at its best focus; AxisAtImage the same
	// bundle on the image plane.
	Axis, AxisAtImage Spot
	// Edge is the field-edge spot on the axis's best-focus plane (zero
	// when Field is 0).
	Edge Spot
	// BestFocusShift is Axis.Z - ImageZ.
	BestFocusShift float64
	AiryRadius     float64
	// Wavefront is the on-axis RMS wavefront error against the best
	// reference sphere (tilt and defocus removed).
	Wavefront Wavefront
	// Verdict judges every field point at every band wavelength on one
	// common image plane; DiffractionLimited is Verdict.Limited.
	Verdict            Verdict
	DiffractionLimited bool
	Colour             Chromatic
	// Seidel holds the third-order sums at the reference wavelength, with
	// colour between the band's shortest and longest wavelengths.
	Seidel   Seidel
	Warnings []string
}

// Assess traces the system under the conditions and gathers the figures
// a ranking needs: spot on axis and at the field edge, Airy radius,
// wavefront, colour and the Seidel estimate.
func (s System) Assess(c Conditions) (Quality, error) {
	wl := c.Reference
	if wl == 0 {
		wl = LineD
	}
	card := s.Cardinal(wl)
	if card.Afocal {
		return Quality{}, errAfocal
	}
	q := Quality{Wavelength: wl, ImageZ: c.ImageZ}
	if !c.FixedImage {
		z, _, st := card.Image(c.Object.Z)
		if st != Solved {
			return Quality{}, fmt.Errorf("the paraxial image is %v", st)
		}
		q.ImageZ = z
	}
	w := assessPool.Get().(*assessWork)
	defer w.done()
	tracer := w.tracer(s, wl)
	axis, err := q.axis(s, c, tracer, w)
	if err != nil {
		return Quality{}, err
	}
	edge, err := q.edge(s, c, tracer, w)
	if err != nil {
		return Quality{}, err
	}
	if q.Verdict, err = s.verdict(c, wl, axis, edge, q.Wavefront, w); err != nil {
		return Quality{}, err
	}
	q.DiffractionLimited = q.Verdict.Limited
	return q, q.colour(s, c, wl)
}

func rings(c Conditions) int {
	if c.Rings > 0 {
		return c.Rings
	}
	return 12
}

// assessWork is the scratch space of one Assess: the rays, paths and ray
// ends of every bundle it traces, kept in a pool so that the real-ray
// stage's workers reuse them from one system to the next rather than
// allocate them for each. Nothing Assess returns refers to it.
type assessWork struct {
	rays  slab[Ray]
	paths slab[Path]
	ends  slab[rayEnd]
}

var assessPool = sync.Pool{New: func() any { return new(assessWork) }}

// done hands the scratch space back to the pool.
func (w *assessWork) done() {
	w.rays.used, w.paths.used, w.ends.used = 0, 0, 0
	assessPool.Put(w)
}

// tracer is the system's tracer at the wavelength, without the points on
// the surfaces (no figure of Assess reads them).
func (w *assessWork) tracer(s System, wl float64) *Tracer {
	t := s.Tracer(wl)
	t.NoPoints = true
	return t
}

// trace traces the bundle from the field point through the pupil points
// to the image plane at imageZ, in the scratch space.
func (w *assessWork) trace(s System, t *Tracer, obj Object, field float64, points []PupilPoint, imageZ float64) (Traced, error) {
	b, err := s.bundleInto(obj, field, t.Wavelength, points, w.rays.take(len(points)))
	if err != nil {
		return Traced{}, err
	}
	return t.traceBundleInto(b, imageZ, w.paths.take(len(points))), nil
}

// A slab hands out slices it keeps from one use to the next.
type slab[T any] struct {
	bufs [][]T
	used int
}

// take is the next slice of the slab, n long, its contents left over from
// an earlier use.
func (s *slab[T]) take(n int) []T {
	if s.used == len(s.bufs) {
		s.bufs = append(s.bufs, nil)
	}
	b := slices.Grow(s.bufs[s.used][:0], n)[:n]
	s.bufs[s.used] = b
	s.used++
	return b
}

// axis fills the on-axis figures and returns the traced bundle.
func (q *Quality) axis(s System, c Conditions, t *Tracer, w *assessWork) (Traced, error) {
	wl := t.Wavelength
	tr, err := w.trace(s, t, c.Object, 0, hexapolar(rings(c)), q.ImageZ)
	if err != nil {
		return Traced{}, err
	}
	q.noteLost("on axis", tr)
	q.AxisAtImage, q.Axis = tr.SpotAt(q.ImageZ), tr.BestFocus()
	if q.Axis.Passed == 0 {
		return Traced{}, errors.New("no ray on axis reaches the image")
	}
	q.BestFocusShift = q.Axis.Z - q.ImageZ
	if q.Focus, err = s.MarginalFocus(c.Object, wl); err != nil {
		return Traced{}, err
	}
	q.AiryRadius = AiryRadius(wl, q.Focus.NA)
	centre := Vec3{X: q.Axis.CentroidX, Y: q.Axis.CentroidY, Z: tr.Tracer.LastVertex() + q.Axis.Z}
	if q.Wavefront, err = tr.BestWavefront(centre); err != nil {
		return Traced{}, err
	}
	return tr, nil
}

// edge fills the field-edge spot on the on-axis best-focus plane and
// returns the traced bundle; nil without a field.
func (q *Quality) edge(s System, c Conditions, t *Tracer, w *assessWork) (*Traced, error) {
	if c.Field == 0 {
		return nil, nil
	}
	tr, err := w.trace(s, t, c.Object, c.Field, hexapolar(rings(c)), q.ImageZ)
	if err != nil {
		return nil, err
	}
	q.noteLost("at the field edge", tr)
	q.Edge = tr.SpotAt(q.Axis.Z)
	if q.Edge.Passed == 0 {
		return nil, errors.New("no ray from the field edge reaches the image")
	}
	return &tr, nil
}

// colour fills the band figures and the Seidel sums.
func (q *Quality) colour(s System, c Conditions, wl float64) error {
	band := c.Band
	if len(band) == 0 {
		band = []float64{wl}
	}
	var err error
	if q.Colour, err = s.Chromatic(c.Object, c.Field, band, q.ImageZ); err != nil {
		return err
	}
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, w := range band {
		lo, hi = math.Min(lo, w), math.Max(hi, w)
	}
	q.Seidel, err = s.Seidel(c.Object, c.Field, wl, lo, hi)
	return err
}

// noteLost adds a warning for each kind of ray loss in the bundle.
func (q *Quality) noteLost(where string, tr Traced) {
	counts := map[[2]int]int{}
	for _, p := range tr.Paths {
		if p.Status != Passed {
			counts[[2]int{int(p.Status), p.Surface}]++
		}
	}
	for st := Missed; st <= Clipped; st++ {
		for i := range tr.Tracer.Vertex {
			if n := counts[[2]int{int(st), i}]; n > 0 {
				q.Warnings = append(q.Warnings, fmt.Sprintf("%s, %d of %d rays stop at surface %d: %v", where, n, len(tr.Paths), i+1, st))
			}
		}
	}
}
