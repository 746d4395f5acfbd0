// Package solution rebuilds a search result into a system of real parts
// (New: the parts from the catalog, turned as the result says, at its
// spacings) and says in words what every output shows of it: which way
// round each part goes (orient.go, from the prescription), how to build it
// (the build sheet, with spacings at the vertices and between the rims
// from the sags), the requirement and parts described in one line
// (describe.go), the chief ray's field when none is asked (field.go), and
// the cautions that go with a laser, a Keplerian expander or a ghost focus
// (caution.go). The drawing, the plots, the purchase request and the
// report all start from a Solution.
//
// Units and signs are those of package optics: millimetres, nanometres,
// light travelling in +z, z measured from the first vertex of the system.
// Inputs are never modified. A wrong argument from the program panics
// with a "solution: " message; bad data from a user is an error value.
package solution
