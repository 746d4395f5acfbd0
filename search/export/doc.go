// Package export turns the results of a saved search into what other
// people need: a purchase request grouped by supplier (with a CSV writer
// that a spreadsheet cannot be tricked into executing), a build sheet per
// solution (which way round each part goes, in words from its
// prescription, and the spacings at the vertices and between the rims), a
// to-scale SVG drawing of a solution with real rays, cardinal points and,
// for a laser, the beam's envelope, a page of spot figures (the spot at
// best focus, through focus, and the ray error across the pupil), and one
// self-contained printable HTML report. Every plot and drawing draws a
// wavelength in the same colour, its own (wavecolour.go).
//
// Units and signs are those of package optics: millimetres, nanometres,
// light travelling in +z, z measured from the first vertex of the system.
// Inputs are never modified. A wrong argument from the program panics
// with an "export: " message; bad data from a user is an error value.
package export
