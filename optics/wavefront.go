package optics

import (
	"errors"
	"math"

	"gonum.org/v1/gonum/mat"
)

// MarechalRMS is the RMS wavefront error, in waves, at or below which a
// system counts as diffraction limited: Marechal's criterion, Strehl ratio
// about 0.8 at lambda/14 RMS (A. Marechal, Rev. Opt. 26, 257 (1947); Born
// and Wolf, Principles of Optics, 7th ed., ch. 9; 0.07 is common practice).
const MarechalRMS = 0.07

// A Wavefront is the optical path difference of a traced bundle against a
// reference sphere.
type Wavefront struct {
	Centre Vec3    // centre of the reference sphere (the image point)
	Radius float64 // radius of the reference sphere, mm
	// RMS and PV are the root-mean-square (pupil-area weighted) and
	// peak-to-valley path differences in waves, piston removed.
	RMS, PV float64
	Rays    int // rays that reached the reference sphere
}

// DiffractionLimited tells whether the RMS wavefront error meets the
// Marechal criterion.
func (w Wavefront) DiffractionLimited() bool { return w.RMS <= MarechalRMS }

// Wavefront measures the optical path from the object (or the incoming
// plane wavefront) to the reference sphere centred on the image point
// centre and passing through the axial point of the paraxial exit pupil
// (Welford, Aberrations of Optical Systems, 1986, ch. 6, on the wavefront
// aberration and the reference sphere), for every passed ray.
func (tr Traced) Wavefront(centre Vec3) (Wavefront, error) {
	opd, w, r, err := tr.opd(centre)
	if err != nil {
		return Wavefront{}, err
	}
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

// opd returns the path to the reference sphere for each passed ray that
// meets it, with the ray's pupil weight, and the sphere's radius.
func (tr Traced) opd(centre Vec3) (opd, w []float64, radius float64, err error) {
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
		s := -b - math.Sqrt(disc) // the crossing on the pupil side of the centre
		opd = append(opd, p.OPL+nImage*s)
		w = append(w, tr.Points[i].Weight)
	}
	if len(opd) < 3 {
		return nil, nil, 0, errors.New("too few rays reach the reference sphere to measure the wavefront")
	}
	return opd, w, radius, nil
}

// referenceRadius is the distance from the centre to the axial point of
// the paraxial exit pupil, or to the last vertex when the exit pupil is at
// infinity or on the image.
func (tr Traced) referenceRadius(centre Vec3) float64 {
	last := tr.Tracer.LastVertex()
	if z, ok := tr.Tracer.System.exitPupil(tr.Object.Stop, tr.Tracer.N); ok {
		if r := centre.Sub(Vec3{Z: last + z}).Norm(); r > 1e-3 {
			return r
		}
	}
	return math.Max(centre.Sub(Vec3{Z: last}).Norm(), 1e-3)
}

// exitPupil is the paraxial image of the stop in image space, from the last
// vertex: with [A B; C D] the reduced matrix from the stop's vertex to the
// last vertex, the image of the stop plane lies at -n' B / D (Gerrard and
// Burch, ch. III). It is false when the exit pupil is at infinity.
func (s System) exitPupil(stop int, n []float64) (float64, bool) {
	m := Identity
	for i := stop; i < len(s.Surfaces); i++ {
		m = m.Then(Refraction((n[i+1] - n[i]) * s.Surfaces[i].Curvature()))
		if i < len(s.Gaps) {
			m = m.Then(Transfer(s.Gaps[i], n[i+1]))
		}
	}
	if math.Abs(m.D) < 1e-12 {
		return 0, false
	}
	return -n[len(n)-1] * m.B / m.D, true
}

// BestWavefront moves the reference sphere's centre from start to the
// point that minimises the RMS wavefront error, removing wavefront tilt
// and defocus. Moving the centre by delta changes each ray's path
// difference by -n' d.delta to first order (d the ray's unit direction;
// Welford, Aberrations of Optical Systems, 1986, ch. 6, on the shift of
// the reference sphere), so delta follows from a weighted least-squares
// fit, refined twice.
func (tr Traced) BestWavefront(start Vec3) (Wavefront, error) {
	centre := start
	for iter := 0; iter < 3; iter++ {
		delta, err := tr.centreShift(centre)
		if err != nil {
			return Wavefront{}, err
		}
		centre = centre.Add(delta)
	}
	return tr.Wavefront(centre)
}

// centreShift fits opd_i = p - n' d_i.delta by weighted least squares
// (singular-value decomposition, so that a bundle confined to one plane
// leaves the unmeasurable components at zero).
func (tr Traced) centreShift(centre Vec3) (Vec3, error) {
	opd, w, _, err := tr.opd(centre)
	if err != nil {
		return Vec3{}, err
	}
	dirs := tr.sphereDirs(centre)
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
	return solveLeastSquares(a, b)
}

// sphereDirs lists the image-space directions of the rays that opd keeps,
// in the same order.
func (tr Traced) sphereDirs(centre Vec3) []Vec3 {
	radius := tr.referenceRadius(centre)
	var d []Vec3
	for _, p := range tr.Paths {
		if p.Status != Passed {
			continue
		}
		v := p.Image.Sub(centre)
		b := v.Dot(p.Dir)
		if b*b-v.Dot(v)+radius*radius >= 0 {
			d = append(d, p.Dir)
		}
	}
	return d
}

func solveLeastSquares(a *mat.Dense, b *mat.VecDense) (Vec3, error) {
	var svd mat.SVD
	if !svd.Factorize(a, mat.SVDThin) {
		return Vec3{}, errors.New("the wavefront fit did not converge")
	}
	rank := svd.Rank(1e-10)
	if rank == 0 {
		return Vec3{}, nil
	}
	var x mat.VecDense
	svd.SolveVecTo(&x, b, rank)
	return Vec3{x.AtVec(0), x.AtVec(1), x.AtVec(2)}, nil
}
