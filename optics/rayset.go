package optics

import (
	"fmt"
	"math"
	"slices"
	"sort"
	"sync"

	"gonum.org/v1/gonum/integrate/quad"
)

// A PupilPoint is a point of the entrance pupil in coordinates normalised
// to its radius (X, Y in the unit disc, Y along the field) with Weight, the
// share of the pupil's area it stands for (the weights of a set sum to 1).
type PupilPoint struct{ X, Y, Weight float64 }

// Hexapolar returns rings of 6, 12, ..., 6 rings points (3 rings
// (rings + 1) in all: 468 for 12 rings). Ring k carries 6k points evenly
// spaced in azimuth; the ring radii and weights are the Gauss-Legendre
// nodes and weights in rho^2 (the pupil's area variable), so that weighted
// sums integrate polynomial aberrations over the disc exactly up to
// rho^(4 rings - 2) in radius and azimuthal order below 6 (Abramowitz and
// Stegun, Handbook of Mathematical Functions, 1964, sec. 25.4, with the
// change of variable t = rho^2). Nodes from gonum's quad.Legendre. The
// outermost ring lies just inside the pupil's edge; use Bundle.Marginal
// for the edge ray itself.
func Hexapolar(rings int) []PupilPoint { return slices.Clone(hexapolar(rings)) }

// hexapolar is Hexapolar shared: worked out once for each number of rings
// up to maxSharedRings and kept; the caller must not change it.
func hexapolar(rings int) []PupilPoint {
	if rings > maxSharedRings {
		return newHexapolar(rings)
	}
	if v, ok := sharedRings.Load(rings); ok {
		return v.([]PupilPoint)
	}
	v, _ := sharedRings.LoadOrStore(rings, newHexapolar(rings))
	return v.([]PupilPoint)
}

// maxSharedRings bounds the ring counts hexapolar keeps (the real-ray
// stage uses 12, find's spots of simulated builds 4).
const maxSharedRings = 64

var sharedRings sync.Map // rings -> []PupilPoint

func newHexapolar(rings int) []PupilPoint {
	if rings < 1 {
		panic(fmt.Sprintf("optics: Hexapolar needs at least one ring, got %d", rings))
	}
	t := make([]float64, rings)
	wt := make([]float64, rings)
	quad.Legendre{}.FixedLocations(t, wt, 0, 1)
	sort.Sort(byFirst{t, wt})
	pts := make([]PupilPoint, 0, 3*rings*(rings+1))
	for k := 1; k <= rings; k++ {
		r, w := math.Sqrt(t[k-1]), wt[k-1]/float64(6*k)
		for j := 0; j < 6*k; j++ {
			a := 2 * math.Pi * float64(j) / float64(6*k)
			pts = append(pts, PupilPoint{X: r * math.Sin(a), Y: r * math.Cos(a), Weight: w})
		}
	}
	return pts
}

// byFirst sorts two slices together by the first.
type byFirst struct{ a, b []float64 }

func (s byFirst) Len() int           { return len(s.a) }
func (s byFirst) Less(i, j int) bool { return s.a[i] < s.a[j] }
func (s byFirst) Swap(i, j int) {
	s.a[i], s.a[j] = s.a[j], s.a[i]
	s.b[i], s.b[j] = s.b[j], s.b[i]
}

// SquareGrid returns the points of an n by n grid across the pupil's
// diameter that fall inside the unit disc, with equal weights.
func SquareGrid(n int) []PupilPoint {
	if n < 2 {
		panic(fmt.Sprintf("optics: SquareGrid needs n >= 2, got %d", n))
	}
	var pts []PupilPoint
	step := 2 / float64(n)
	for i := 0; i < n; i++ {
		for j := 0; j < n; j++ {
			x, y := -1+step*(float64(i)+0.5), -1+step*(float64(j)+0.5)
			if x*x+y*y <= 1 {
				pts = append(pts, PupilPoint{X: x, Y: y})
			}
		}
	}
	return normalise(pts)
}

// MeridionalFan returns n points evenly spaced along the pupil's y
// diameter from -1 to 1, for ray-fan plots and drawings.
func MeridionalFan(n int) []PupilPoint {
	if n < 2 {
		panic(fmt.Sprintf("optics: MeridionalFan needs n >= 2, got %d", n))
	}
	pts := make([]PupilPoint, n)
	for i := range pts {
		pts[i].Y = -1 + 2*float64(i)/float64(n-1)
	}
	return normalise(pts)
}

func normalise(pts []PupilPoint) []PupilPoint {
	for i := range pts {
		pts[i].Weight = 1 / float64(len(pts))
	}
	return pts
}

// A Bundle is a set of rays from one field point that fill the paraxial
// entrance pupil.
type Bundle struct {
	Object Object
	// Field is the object height in mm for a finite object, or the field
	// angle in degrees for an object at infinity, along +y.
	Field      float64
	Wavelength float64 // nm
	Pupil      Pupil
	Points     []PupilPoint
	Rays       []Ray // Rays[i] passes through Points[i] of the pupil
}

// Bundle builds the rays from a field point through the given pupil
// points. For a finite object the rays start at the object point; for an
// object at infinity they start on the plane wavefront through the
// pupil's centre, so that their optical paths start equal.
func (s System) Bundle(obj Object, field, wavelengthNm float64, points []PupilPoint) (Bundle, error) {
	return s.bundleInto(obj, field, wavelengthNm, points, make([]Ray, len(points)))
}

// bundleInto is Bundle with the rays written into rays (as long as
// points).
func (s System) bundleInto(obj Object, field, wavelengthNm float64, points []PupilPoint, rays []Ray) (Bundle, error) {
	p, err := s.EntrancePupil(obj, wavelengthNm)
	if err != nil {
		return Bundle{}, err
	}
	if obj.AtInfinity() && math.Abs(field) >= 90 {
		return Bundle{}, fmt.Errorf("field angle %g degrees: must lie within +-90", field)
	}
	b := Bundle{Object: obj, Field: field, Wavelength: wavelengthNm, Pupil: p, Points: points, Rays: rays}
	for i, q := range points {
		b.Rays[i] = b.ray(q)
	}
	return b, nil
}

// ray is the ray of the bundle through pupil point q.
func (b Bundle) ray(q PupilPoint) Ray {
	centre := Vec3{Z: b.Pupil.Z}
	e := Vec3{X: q.X * b.Pupil.Radius, Y: q.Y * b.Pupil.Radius, Z: b.Pupil.Z}
	if b.Object.AtInfinity() {
		a := b.Field * math.Pi / 180
		d := Vec3{Y: math.Sin(a), Z: math.Cos(a)}
		return Ray{Pos: e.Sub(d.Scale(e.Sub(centre).Dot(d))), Dir: d}
	}
	o := Vec3{Y: b.Field, Z: b.Object.Z}
	return Ray{Pos: o, Dir: e.Sub(o).Unit()}
}

// Chief returns the ray through the centre of the pupil.
func (b Bundle) Chief() Ray { return b.ray(PupilPoint{}) }

// Marginal returns the meridional ray through the top of the pupil (y = 1).
func (b Bundle) Marginal() Ray { return b.ray(PupilPoint{Y: 1}) }
