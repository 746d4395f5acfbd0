package optics

import (
	"errors"
	"math"

	"gonum.org/v1/gonum/mat"
)

// CollimatedWavefront is the RMS wavefront error, in waves, of a nearly
// collimated output (a beam expander): a collimated on-axis beam of the
// given diameter is traced with real rays (Hexapolar, 12 rings) to the
// plane of the last vertex, and the optical path of each ray there, as a
// function of its height (x, y), is fitted by piston, tilt and defocus
// a + b x + c y + d (x^2 + y^2); the weighted RMS of what is left is the
// wavefront error (Welford, Aberrations of Optical Systems, 1986, ch. 6:
// the optical path difference, with defocus removed, is the aberration;
// the paths to a plane stand for the wavefront to second order in the ray
// angles, which are small behind an expander). The defocus is removed
// because the gap that collimates a Gaussian beam leaves a small one on
// purpose.
func (s System) CollimatedWavefront(beam, wavelengthNm float64) (float64, error) {
	obj := Object{Z: math.Inf(-1), Aperture: Aperture{Beam: beam}}
	b, err := s.Bundle(obj, 0, wavelengthNm, Hexapolar(12))
	if err != nil {
		return 0, err
	}
	tr := s.Tracer(wavelengthNm)
	tr.Unclipped = true
	traced := tr.TraceBundle(b, 0)
	var rows [][4]float64
	var opl, w []float64
	for i, p := range traced.Paths {
		if p.Status != Passed {
			continue
		}
		x, y := p.Image.X, p.Image.Y
		rows = append(rows, [4]float64{1, x, y, x*x + y*y})
		opl = append(opl, p.OPL)
		w = append(w, b.Points[i].Weight)
	}
	if len(rows) < 8 {
		return 0, errors.New("too few rays pass the expander to measure its wavefront")
	}
	a := mat.NewDense(len(rows), 4, nil)
	v := mat.NewVecDense(len(rows), nil)
	for i, r := range rows {
		sw := math.Sqrt(w[i])
		for j := range r {
			a.Set(i, j, sw*r[j])
		}
		v.SetVec(i, sw*(opl[i]-opl[0]))
	}
	var coef mat.VecDense
	if err := coef.SolveVec(a, v); err != nil {
		return 0, err
	}
	var ss, sw float64
	for i, r := range rows {
		fit := 0.0
		for j := range r {
			fit += coef.AtVec(j) * r[j]
		}
		ss += w[i] * sq(opl[i]-opl[0]-fit)
		sw += w[i]
	}
	return math.Sqrt(ss/sw) / (wavelengthNm * 1e-6), nil
}
