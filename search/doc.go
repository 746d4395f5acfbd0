// Package search turns first-order requirements into stock singlets and
// pairs of parts: it validates a Requirement, computes every part's
// thick-lens cardinal points at the requested wavelength in both
// orientations, solves singlets in closed form and pairs at the nominal
// target (the spacing is solved, never scanned), checks mechanical
// clearance and paraxial ray heights, and ranks what meets the requirement.
// With an aperture (a beam for focus, an NA for image) the survivors of the
// first-order ranking are traced with real rays and ranked by image quality
// too (quality.go, score.go); expanders are ranked on first order only.
//
// Units and signs are those of package optics: millimetres, nanometres,
// light travelling in +z, front positions from the first vertex and back
// positions from the last vertex. Parts are in air.
//
// The search is complete: the pruned search (a tree over the parts sorted by
// power, cut by the interval of second-part power that can meet the
// requirement and by a lower bound on the ranking score) returns exactly
// what the exhaustive search over every pair returns. Tests prove it on the
// demo catalog and on random synthetic catalogs.
//
// Inspect (inspect.go) works out what `cardinal inspect` shows of one part:
// every cardinal point, and with a RaySetting the real-ray figures under
// the conditions it chooses (a collimated beam, or an object at a given
// distance or at the -1x conjugate); InspectGhosts its ghost foci.
//
// Inputs are never modified. A wrong argument from the program panics with
// a "search: " message; a bad requirement from a user is an error value.
package search
