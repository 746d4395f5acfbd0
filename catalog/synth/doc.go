// Package synth makes invented lens catalogs: the built-in demo catalog of
// cardinal and synthetic catalogs of any size for tests and benchmarks.
//
// Every part is designed, not copied: a focal length from a preferred-number
// series (ISO 3), a stock diameter, a glass given by its six-digit code or a
// built-in crystal, a shape (plano-convex, biconvex, best-form, meniscus,
// plano-concave, biconcave, or a cemented achromat from the thin-lens
// achromat condition), then real centre thicknesses for a sensible edge and
// radii solved so that the thick-lens focal length at the d line hits the
// nominal one. The stated EFL, BFD and edge thickness of each entry agree
// with its prescription, so the files import without warnings.
//
// Supplier names, part numbers, prices (in XTS, the ISO 4217 code reserved for testing)
// and URLs (example.com) are invented; no real catalog data is used.
// Output is deterministic: the same seed and size give the same catalog.
package synth
