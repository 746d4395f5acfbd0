// Package drawing draws a solution to scale as SVG: the parts' surfaces,
// real rays from the object through the system, the cardinal points, the
// spacings dimensioned, a legend with the build order and, for a laser,
// the beam's envelope and the cautions. NewScene works out what is drawn
// (positions, rays, marks, dimensions); Scene.WriteSVG lays it out. Rays
// are drawn in their wavelength's colour (package wavecolour).
//
// Units and signs are those of package optics: millimetres, nanometres,
// light travelling in +z, z measured from the first vertex of the system.
// Inputs are never modified. A wrong argument from the program panics
// with a "drawing: " message; bad data from a user is an error value.
package drawing
