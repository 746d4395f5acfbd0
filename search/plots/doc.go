// Package plots traces a solution's spot figures and draws them with
// gonum/plot as PNG or SVG: the spot at best focus for each field point
// and wavelength, the RMS spot through focus, and the ray error across the
// pupil (NewSpots, Spots.WritePlot); and the build study's histograms of
// the compensator's move and of the target figure (WriteStudyPlot). Each
// wavelength is drawn in its own colour (package wavecolour).
//
// Units and signs are those of package optics: millimetres, nanometres,
// light travelling in +z. Inputs are never modified. A wrong argument from
// the program panics with a "plots: " message; bad data from a user is an
// error value.
package plots
