package optics

import "math"

// A Vec3 is a point or a direction in the system's coordinates, in mm: z
// along the axis from the first vertex, positive toward image space; x and
// y across it, the field lying along +y.
type Vec3 struct{ X, Y, Z float64 }

// Add returns v + w.
func (v Vec3) Add(w Vec3) Vec3 { return Vec3{v.X + w.X, v.Y + w.Y, v.Z + w.Z} }

// Sub returns v - w.
func (v Vec3) Sub(w Vec3) Vec3 { return Vec3{v.X - w.X, v.Y - w.Y, v.Z - w.Z} }

// Scale returns k v.
func (v Vec3) Scale(k float64) Vec3 { return Vec3{k * v.X, k * v.Y, k * v.Z} }

// Dot returns the scalar product.
func (v Vec3) Dot(w Vec3) float64 { return v.X*w.X + v.Y*w.Y + v.Z*w.Z }

// Norm returns the length.
func (v Vec3) Norm() float64 { return math.Sqrt(v.Dot(v)) }

// Unit returns v scaled to unit length; it panics on the zero vector.
func (v Vec3) Unit() Vec3 {
	n := v.Norm()
	if n == 0 {
		panic("optics: unit vector of zero length")
	}
	return v.Scale(1 / n)
}

// Height is the distance from the axis, sqrt(x^2 + y^2).
func (v Vec3) Height() float64 { return math.Sqrt(v.X*v.X + v.Y*v.Y) }
