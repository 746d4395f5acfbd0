// Package optics is the physics of cardinal: media and glass dispersion,
// surfaces, parts and systems, reduced ray-transfer matrices, cardinal
// points and conjugates.
//
// Units: lengths in millimetres, wavelengths in nanometres, powers in
// inverse millimetres (multiply by 1000 for dioptres).
//
// Sign convention: light travels in +z. A radius (and a curvature) is
// positive when its centre of curvature lies to the right of its vertex.
// Positions of front points (F, P, N, anti-principal, anti-nodal) are
// measured from the first vertex, positions of back points (F', P', N', ...)
// from the last vertex, both positive toward image space. The front focal
// length runs from P to F, the back focal length from P' to F'.
//
// Paraxial rays are carried as (y, n u): height and reduced angle, so every
// ray-transfer matrix has determinant 1.
//
// Functions never modify their inputs. A wrong shape or an impossible
// argument from the program panics with an "optics: " message; bad data from
// a user is returned as an error value.
package optics
