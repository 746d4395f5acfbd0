package optics

// References for the real-ray, aberration and beam code (trace.go,
// intersect.go, pupil.go, rayset.go, spot.go, wavefront.go, seidel.go,
// colour.go, marginal.go, quality.go, beam.go) and their tests:
//
//   - W. T. Welford, Aberrations of Optical Systems, Adam Hilger, 1986:
//     finite ray tracing, the reference sphere and wavefront aberration,
//     the Seidel sums and their thin-lens forms.
//   - G. H. Spencer and M. V. R. K. Murty, "General ray-tracing procedure",
//     J. Opt. Soc. Am. 52, 672-678 (1962): skew rays through spheres and
//     aspheres, vector refraction.
//   - W. J. Smith, Modern Optical Engineering, 4th ed., McGraw-Hill, 2008.
//   - E. Hecht, Optics, 5th ed., Pearson, 2017.
//   - M. Born and E. Wolf, Principles of Optics, 7th ed., Cambridge, 1999.
//   - A. E. Siegman, Lasers, University Science Books, 1986.
//   - M. Abramowitz and I. A. Stegun, Handbook of Mathematical Functions,
//     1964.
//
// Chapter and section numbers beside the citations were recalled from
// memory; the topic named with each citation is the reliable pointer.
