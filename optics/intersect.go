package optics

import "math"

// Newton iteration limits for the intersection of a ray with an asphere.
const (
	newtonSteps = 40
	newtonTol   = 1e-12 // mm along the ray
)

// intersect finds where the line p + t d meets the surface, in the
// surface's own frame (vertex at the origin, d a unit vector). It returns the
// parameter t, which may be negative, and false when the line misses the
// surface or reaches it only beyond the edge of a conic's domain.
func (s Surface) intersect(p, d Vec3) (float64, bool) {
	t, ok := intersectSphere(s.Curvature(), p, d)
	if !s.IsAsphere() {
		return t, ok
	}
	if !ok {
		t = -p.Z / d.Z // start again from the vertex plane
	}
	return s.newton(p, d, t)
}

// intersectSphere solves c |q|^2 - 2 q_z = 0, the sphere of curvature c
// through the origin, for q = p + t d on the vertex side (where the ray
// meets the normal (-c x, -c y, 1 - c z) with d.n >= 0), in the form that
// stays exact as c goes to 0 (G. H. Spencer and M. V. R. K. Murty, "General
// ray-tracing procedure", J. Opt. Soc. Am. 52, 672-678 (1962); W. T.
// Welford, Aberrations of Optical Systems, 1986, ch. 4): from the point
// p0 where the ray crosses the vertex plane,
// t = F / (G + sqrt(G^2 - c F)), G = d_z - c p0.d, F = c p0.p0.
func intersectSphere(c float64, p, d Vec3) (float64, bool) {
	if d.Z <= 0 {
		return 0, false
	}
	t0 := -p.Z / d.Z
	p0 := p.Add(d.Scale(t0))
	p0.Z = 0
	g := d.Z - c*p0.Dot(d)
	f := c * p0.Dot(p0)
	disc := g*g - c*f
	if disc < 0 {
		return 0, false
	}
	if g > 0 {
		return t0 + f/(g+math.Sqrt(disc)), true
	}
	if c == 0 {
		return 0, false
	}
	return t0 + (g-math.Sqrt(disc))/c, true
}

// newton refines t so that p + t d lies on the surface z = sag(h), by
// Newton's method on g(t) = z(t) - sag(h(t)), whose derivative is
// d_z - sag'(h) (x d_x + y d_y) / h (Spencer and Murty 1962).
func (s Surface) newton(p, d Vec3, t float64) (float64, bool) {
	for i := 0; i < newtonSteps; i++ {
		q := p.Add(d.Scale(t))
		h := q.Height()
		z, ok := s.Sag(h)
		if !ok {
			return 0, false
		}
		dg := d.Z
		if h > 0 {
			dg -= s.SagSlope(h) * (q.X*d.X + q.Y*d.Y) / h
		}
		if dg == 0 || math.IsNaN(dg) {
			return 0, false
		}
		step := (q.Z - z) / dg
		t -= step
		if math.Abs(step) < newtonTol {
			return t, true
		}
	}
	return 0, false
}

// normal is the unit normal of the surface at q (surface frame), pointing
// toward +z: for a sphere (-c x, -c y, 1 - c z), otherwise the normalised
// gradient of z - sag(h).
func (s Surface) normal(q Vec3) Vec3 {
	c := s.Curvature()
	if !s.IsAsphere() {
		return Vec3{-c * q.X, -c * q.Y, 1 - c*q.Z}
	}
	h := q.Height()
	if h == 0 {
		return Vec3{0, 0, 1}
	}
	m := s.SagSlope(h) / h
	return Vec3{-m * q.X, -m * q.Y, 1}.Unit()
}

// refract bends the unit direction d at a surface of unit normal nrm from
// index n1 into n2 by Snell's law in vector form,
// n' r' = n r + (n' cos I' - n cos I) nrm (Welford, Aberrations of Optical
// Systems, 1986, ch. 4; Spencer and Murty 1962). It returns false on
// total internal reflection.
func refract(d, nrm Vec3, n1, n2 float64) (Vec3, bool) { return refractMu(d, nrm, n1/n2) }

// refractMu is refract with the ratio of the indices mu = n1 / n2.
func refractMu(d, nrm Vec3, mu float64) (Vec3, bool) {
	cosI := d.Dot(nrm)
	k := 1 - mu*mu*(1-cosI*cosI)
	if k < 0 {
		return Vec3{}, false
	}
	cosIp := math.Sqrt(k)
	if cosI < 0 {
		cosIp = -cosIp
	}
	return d.Scale(mu).Add(nrm.Scale(cosIp - mu*cosI)), true
}
