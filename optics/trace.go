package optics

import "fmt"

// A Ray is a straight line in object space: a point and a unit direction
// (direction cosines K, L, M). Rays travel toward +z.
type Ray struct {
	Pos, Dir Vec3
}

// RayStatus tells how a ray ended.
type RayStatus int

const (
	// Passed: the ray went through every surface to the image plane.
	Passed RayStatus = iota
	// Missed: the ray does not meet the surface (or meets it only behind
	// the previous one, past the edge of the part).
	Missed
	// TotalReflection: the ray is totally internally reflected.
	TotalReflection
	// Clipped: the ray meets the surface outside its clear semi-aperture.
	Clipped
)

func (s RayStatus) String() string {
	return [...]string{"passed", "missed", "total internal reflection", "outside the clear aperture"}[s]
}

// A Path is one traced ray.
type Path struct {
	Status RayStatus
	// Surface is the index of the surface where the ray stopped, or -1 for
	// a ray that passed.
	Surface int
	// Points holds the ray's point on each surface it reached, in light
	// order; a clipped ray keeps the point where it struck outside the
	// clear aperture.
	Points []Vec3
	// Image is the point on the image plane (for a ray that passed).
	Image Vec3
	// Dir is the unit direction after the last surface the ray crossed.
	Dir Vec3
	// OPL is the optical path length from the start of the ray to Image,
	// in mm (index times geometric length, summed).
	OPL float64
}

// Err describes why the ray stopped, or returns nil for a ray that passed.
func (p Path) Err() error {
	if p.Status == Passed {
		return nil
	}
	return fmt.Errorf("ray stopped at surface %d: %v", p.Surface+1, p.Status)
}

// A Tracer traces real rays through a system at one wavelength. Build it
// with System.Tracer; it is safe for concurrent use.
type Tracer struct {
	System     System
	Wavelength float64   // nm
	N          []float64 // indices: object space, after each surface
	Vertex     []float64 // z of each surface vertex from the first vertex
	// Unclipped makes the tracer ignore the clear semi-apertures.
	Unclipped bool
	// NoPoints leaves every Path's Points nil: for figures that need only
	// where the rays end, their directions and path lengths (spots,
	// wavefronts), so that a trace allocates nothing per ray.
	NoPoints bool
	// fixed holds what does not change from ray to ray for each surface,
	// worked out once by System.Tracer.
	fixed []surfaceFixed
}

// surfaceFixed is a surface's curvature, whether it is a sphere (or a
// plane), and the ratio of the indices before and after it.
type surfaceFixed struct {
	curv, mu float64
	sphere   bool
	// clip is the height past which a ray is clipped (clipped), 0 for
	// none.
	clip float64
}

// Tracer prepares a real-ray trace of the system at a wavelength.
func (s System) Tracer(wavelengthNm float64) *Tracer {
	n := s.Indices(wavelengthNm)
	v := make([]float64, len(s.Surfaces))
	for i := 1; i < len(v); i++ {
		v[i] = v[i-1] + s.Gaps[i-1]
	}
	t := &Tracer{System: s, Wavelength: wavelengthNm, N: n, Vertex: v, fixed: make([]surfaceFixed, len(s.Surfaces))}
	for i, sf := range s.Surfaces {
		t.fixed[i] = surfaceFixed{curv: sf.Curvature(), mu: n[i] / n[i+1], sphere: !sf.IsAsphere()}
		if sa := s.SemiApertures; i < len(sa) && sa[i] > 0 {
			t.fixed[i].clip = sa[i] * (1 + 1e-12)
		}
	}
	return t
}

// LastVertex is the z of the last surface's vertex.
func (t *Tracer) LastVertex() float64 { return t.Vertex[len(t.Vertex)-1] }

// Trace follows a ray through every surface to the image plane at
// imageZ from the last vertex (positive toward image space). A ray that
// misses a surface, is totally reflected, or falls outside a clear
// semi-aperture stops there and says so in Status and Surface.
func (t *Tracer) Trace(r Ray, imageZ float64) Path {
	var pts []Vec3
	if !t.NoPoints {
		pts = make([]Vec3, 0, len(t.Vertex))
	}
	return t.trace(r, imageZ, pts)
}

// trace is Trace recording the points in pts (its capacity enough for a
// point on every surface; nil when t.NoPoints).
func (t *Tracer) trace(r Ray, imageZ float64, pts []Vec3) Path {
	p := Path{Surface: -1, Points: pts}
	pos, dir := r.Pos, r.Dir.Unit()
	for i := range t.Vertex {
		next, ok := t.crossSurface(i, pos, dir, &p)
		if !ok {
			p.Dir = dir
			return p
		}
		pos, dir = next, p.Dir
	}
	s := (t.LastVertex() + imageZ - pos.Z) / dir.Z
	p.Image = pos.Add(dir.Scale(s))
	p.OPL += t.N[len(t.N)-1] * s
	return p
}

// crossSurface carries the ray from pos to surface i and refracts it there,
// recording the point, the new direction and the path length in p.
func (t *Tracer) crossSurface(i int, pos, dir Vec3, p *Path) (Vec3, bool) {
	origin := Vec3{Z: t.Vertex[i]}
	local := pos.Sub(origin)
	f := &t.fixed[i]
	c, sphere := f.curv, f.sphere
	var s float64
	var ok bool
	if sphere {
		s, ok = intersectSphere(c, local, dir) // Surface.intersect of a sphere
	} else {
		s, ok = t.System.Surfaces[i].intersect(local, dir)
	}
	if !ok || (i > 0 && s < -newtonTol) {
		return t.stop(p, i, Missed, Vec3{}, false)
	}
	q := local.Add(dir.Scale(s))
	hit := q.Add(origin)
	if !t.Unclipped && f.clip > 0 && q.Height() > f.clip { // clipped, from the limit worked out once
		return t.stop(p, i, Clipped, hit, true)
	}
	if !t.NoPoints {
		p.Points = append(p.Points, hit)
	}
	p.OPL += t.N[i] * s
	var nrm Vec3
	if sphere {
		nrm = Vec3{-c * q.X, -c * q.Y, 1 - c*q.Z} // Surface.normal of a sphere
	} else {
		nrm = t.System.Surfaces[i].normal(q)
	}
	d, ok := refractMu(dir, nrm, f.mu)
	if !ok {
		return t.stop(p, i, TotalReflection, Vec3{}, false)
	}
	p.Dir = d.Unit()
	return hit, true
}

func (t *Tracer) stop(p *Path, i int, status RayStatus, hit Vec3, keep bool) (Vec3, bool) {
	p.Status, p.Surface = status, i
	if keep && !t.NoPoints {
		p.Points = append(p.Points, hit)
	}
	return Vec3{}, false
}

// At returns the point where a passed ray crosses the plane at z from the
// last vertex, moving along its image-space direction.
func (t *Tracer) At(p Path, z float64) Vec3 { return t.at(&p, z) }

func (t *Tracer) at(p *Path, z float64) Vec3 {
	return p.Image.Add(p.Dir.Scale((t.LastVertex() + z - p.Image.Z) / p.Dir.Z))
}
