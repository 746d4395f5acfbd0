package optics

import (
	"errors"
	"math"
	"slices"
	"sync"

	"gonum.org/v1/gonum/blas"
	"gonum.org/v1/gonum/blas/blas64"
	"gonum.org/v1/gonum/lapack"
	"gonum.org/v1/gonum/lapack/lapack64"
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
	ws := getFit()
	defer putFit(ws)
	return tr.wavefront(ws, centre)
}

// wavefront is Wavefront with scratch space ws.
func (tr Traced) wavefront(ws *fitWork, centre Vec3) (Wavefront, error) {
	r, err := tr.opd(ws, centre)
	if err != nil {
		return Wavefront{}, err
	}
	opd, w := ws.opd, ws.w
	wf := Wavefront{Centre: centre, Radius: r, Rays: len(opd)}
	lambda := tr.Wavelength * 1e-6
	var sw, mean float64
	lo, hi := math.Inf(1), math.Inf(-1)
	for i, v := range opd {
		sw, mean = sw+w[i], mean+w[i]*v
		lo, hi = min(lo, v), max(hi, v)
	}
	mean /= sw
	var ss float64
	for i, v := range opd {
		ss += w[i] * sq(v-mean)
	}
	wf.RMS, wf.PV = math.Sqrt(ss/sw)/lambda, (hi-lo)/lambda
	return wf, nil
}

// fitWork is the scratch space of a wavefront and its fit, kept in a pool
// so that the real-ray stage's workers reuse it from one system to the
// next: the path differences, weights and directions of the rays that meet
// the reference sphere, the least-squares system and its factorisation.
type fitWork struct {
	opd, w  []float64
	dirs    []Vec3
	a, b    []float64
	factors []float64 // the matrix as the factorisation overwrites it
	u, work []float64
	vt      [9]float64
	s       [3]float64
}

var fitPool = sync.Pool{New: func() any { return new(fitWork) }}

func getFit() *fitWork  { return fitPool.Get().(*fitWork) }
func putFit(w *fitWork) { fitPool.Put(w) }

// opd puts into ws the path to the reference sphere of each passed ray
// that meets it, with the ray's pupil weight and image-space direction,
// and returns the sphere's radius.
func (tr Traced) opd(ws *fitWork, centre Vec3) (radius float64, err error) {
	radius = tr.referenceRadius(centre)
	nImage := tr.Tracer.N[len(tr.Tracer.N)-1]
	ws.opd, ws.w, ws.dirs = ws.opd[:0], ws.w[:0], ws.dirs[:0]
	for i := range tr.Paths {
		p := &tr.Paths[i]
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
		ws.opd = append(ws.opd, p.OPL+nImage*s)
		ws.w = append(ws.w, tr.Points[i].Weight)
		ws.dirs = append(ws.dirs, p.Dir)
	}
	if len(ws.opd) < 3 {
		return 0, errors.New("too few rays reach the reference sphere to measure the wavefront")
	}
	return radius, nil
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
	ws := getFit()
	defer putFit(ws)
	centre := start
	for iter := 0; iter < 3; iter++ {
		delta, err := tr.centreShift(ws, centre)
		if err != nil {
			return Wavefront{}, err
		}
		centre = centre.Add(delta)
	}
	return tr.wavefront(ws, centre)
}

// centreShift fits opd_i = p - n' d_i.delta by weighted least squares
// (singular-value decomposition, so that a bundle confined to one plane
// leaves the unmeasurable components at zero).
func (tr Traced) centreShift(ws *fitWork, centre Vec3) (Vec3, error) {
	if _, err := tr.opd(ws, centre); err != nil {
		return Vec3{}, err
	}
	opd, w, dirs := ws.opd, ws.w, ws.dirs
	nImage := tr.Tracer.N[len(tr.Tracer.N)-1]
	var sw, mo float64
	var md Vec3
	for i := range opd {
		sw, mo, md = sw+w[i], mo+w[i]*opd[i], md.Add(dirs[i].Scale(w[i]))
	}
	mo, md = mo/sw, md.Scale(1/sw)
	n := len(opd)
	ws.a, ws.b = slices.Grow(ws.a[:0], 3*n)[:3*n], slices.Grow(ws.b[:0], n)[:n]
	for i := range opd {
		sw := math.Sqrt(w[i])
		d := dirs[i].Sub(md).Scale(-nImage * sw)
		ws.a[3*i], ws.a[3*i+1], ws.a[3*i+2] = d.X, d.Y, d.Z
		ws.b[i] = sw * (opd[i] - mo)
	}
	return ws.solve(n)
}

// solve is the least-squares solution of the n x 3 system held in ws.a
// (by rows) and ws.b through the thin singular-value decomposition,
// singular values below 1e-10 of the largest left out (G. H. Golub and
// C. F. Van Loan, Matrix Computations, 4th ed., Johns Hopkins 2013, sec.
// 5.5, the rank-deficient least-squares problem; from memory). It makes
// the LAPACK and BLAS calls gonum's mat.SVD makes for Factorize(a,
// SVDThin), Rank(1e-10) and SolveVecTo, in the same order on the same
// numbers (a test compares the two with ==), but in ws's own arrays
// rather than new ones for every fit.
func (ws *fitWork) solve(n int) (Vec3, error) {
	ws.factors = append(ws.factors[:0], ws.a[:3*n]...)
	ws.u = slices.Grow(ws.u[:0], 3*n)[:3*n]
	a := blas64.General{Rows: n, Cols: 3, Stride: 3, Data: ws.factors}
	u := blas64.General{Rows: n, Cols: 3, Stride: 3, Data: ws.u}
	vt := blas64.General{Rows: 3, Cols: 3, Stride: 3, Data: ws.vt[:]}
	s := ws.s[:]
	query := []float64{0}
	lapack64.Gesvd(lapack.SVDStore, lapack.SVDStore, a, u, vt, s, query, -1)
	lwork := int(query[0])
	ws.work = slices.Grow(ws.work[:0], lwork)[:lwork]
	if !lapack64.Gesvd(lapack.SVDStore, lapack.SVDStore, a, u, vt, s, ws.work, lwork) {
		return Vec3{}, errors.New("the wavefront fit did not converge")
	}
	rank := len(s)
	for i, v := range s {
		if v <= 1e-10*s[0] {
			rank = i
			break
		}
	}
	if rank == 0 {
		return Vec3{}, nil
	}
	var c, y, x [3]float64 // x = V S^-1 U^T b over the first rank singular values
	blas64.Gemv(blas.Trans, 1, u, blas64.Vector{N: n, Inc: 1, Data: ws.b[:n]}, 0, blas64.Vector{N: 3, Inc: 1, Data: c[:]})
	for i := 0; i < rank; i++ {
		y[i] = c[i] / s[i]
	}
	vtr := blas64.General{Rows: rank, Cols: 3, Stride: 3, Data: ws.vt[:(rank-1)*3+3]}
	blas64.Gemv(blas.Trans, 1, vtr, blas64.Vector{N: rank, Inc: 1, Data: y[:rank]}, 0, blas64.Vector{N: 3, Inc: 1, Data: x[:]})
	return Vec3{x[0], x[1], x[2]}, nil
}
