// Package export turns the results of a saved search into what other
// people need: a purchase request grouped by supplier (with a CSV writer
// that a spreadsheet cannot be tricked into executing), a to-scale SVG
// drawing of a solution with real rays and cardinal points, spot-diagram
// and ray-fan plots, and one self-contained printable HTML report.
//
// Units and signs are those of package optics: millimetres, nanometres,
// light travelling in +z, z measured from the first vertex of the system.
// Inputs are never modified. A wrong argument from the program panics
// with an "export: " message; bad data from a user is an error value.
package export
