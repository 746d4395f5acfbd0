// Package wavecolour gives each wavelength the colour every plot, drawing
// and page of cardinal draws it in: its own colour as the eye sees it
// (from the CIE 1931 colour-matching functions) for visible light, and a
// grey for the ultraviolet and infrared (Of, Hex), with a name for it
// (Name). Wavelengths are in nanometres.
package wavecolour
