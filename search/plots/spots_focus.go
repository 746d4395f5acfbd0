package plots

import (
	"math"
)

// throughSamples is the number of focus planes a through-focus curve has.
const throughSamples = 41

// focusMoments are the weighted second moments of a spot about its
// centroid and of the rays' slopes about theirs: the RMS radius on a plane
// dz mm past the one traced is exactly
// sqrt(xx + 2 dz xa + dz^2 aa), because each ray's position moves
// linearly with dz, x(dz) = x + dz a (straight rays in the last medium).
type focusMoments struct{ xx, xa, aa float64 }

// moments gathers a set's moments, positions in µm and slopes in µm per
// mm of defocus.
func (s SpotSet) moments() focusMoments {
	var sw, cx, cy, ca, cb float64
	for i := range s.X {
		sw += s.W[i]
		cx, cy = cx+s.W[i]*s.X[i], cy+s.W[i]*s.Y[i]
		ca, cb = ca+s.W[i]*s.DX[i], cb+s.W[i]*s.DY[i]
	}
	if sw == 0 {
		return focusMoments{}
	}
	cx, cy, ca, cb = cx/sw, cy/sw, ca/sw, cb/sw
	var m focusMoments
	for i := range s.X {
		x, y, a, b := s.X[i]-cx, s.Y[i]-cy, 1000*(s.DX[i]-ca), 1000*(s.DY[i]-cb)
		m.xx += s.W[i] * (x*x + y*y)
		m.xa += s.W[i] * (x*a + y*b)
		m.aa += s.W[i] * (a*a + b*b)
	}
	m.xx, m.xa, m.aa = m.xx/sw, m.xa/sw, m.aa/sw
	return m
}

// rmsAt is the RMS radius, µm, dz mm past the traced plane.
func (m focusMoments) rmsAt(dz float64) float64 {
	return math.Sqrt(math.Max(0, m.xx+2*dz*m.xa+dz*dz*m.aa))
}

// best is the shift, mm, of the plane of least RMS radius: the vertex of
// the quadratic, or 0 when the slopes do not spread.
func (m focusMoments) best() float64 {
	if !(m.aa > 0) {
		return 0
	}
	return -m.xa / m.aa
}

// RMSAt is the RMS spot radius, µm, of set k on a plane dz mm past the
// image plane it was traced to.
func (sp Spots) RMSAt(k int, dz float64) float64 { return sp.Sets[k].moments().rmsAt(dz) }

// bestFocus is the shift from the image plane, mm (positive away from
// the lens), where the on-axis spot at the reference wavelength is least;
// 0 for an afocal solution.
func (sp Spots) bestFocus() float64 {
	if sp.Angular || len(sp.Sets) == 0 {
		return 0
	}
	return sp.Sets[0].moments().best()
}

// FocusRange is the half-width, mm, of the through-focus curves about
// best focus: where the on-axis reference spot has grown to about three
// times the larger of its best RMS radius and the Airy radius.
func (sp Spots) FocusRange() float64 {
	if sp.Angular || len(sp.Sets) == 0 {
		return 0
	}
	m := sp.Sets[0].moments()
	if !(m.aa > 0) {
		return 1
	}
	blur := math.Max(m.rmsAt(m.best()), sp.Airy)
	return 3 * math.Max(blur, 1e-3) / math.Sqrt(m.aa)
}

// ThroughFocus samples set k's RMS radius over the focus range about best
// focus: the shifts from best focus (mm) and the radii (µm).
func (sp Spots) ThroughFocus(k int) (dz, rms []float64) {
	m := sp.Sets[k].moments()
	r := sp.FocusRange()
	for i := 0; i < throughSamples; i++ {
		d := -r + 2*r*float64(i)/float64(throughSamples-1)
		dz, rms = append(dz, d), append(rms, m.rmsAt(sp.BestFocus+d))
	}
	return dz, rms
}

// shifted are set k's spot points on the plane dz mm past the traced one,
// relative to the reference chief ray there, µm.
func (sp Spots) shifted(k int, dz float64) (x, y []float64) {
	s := sp.Sets[k]
	x, y = make([]float64, len(s.X)), make([]float64, len(s.Y))
	for i := range s.X {
		x[i], y[i] = s.X[i]+1000*dz*s.DX[i], s.Y[i]+1000*dz*s.DY[i]
	}
	return x, y
}
