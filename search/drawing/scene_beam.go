package drawing

import (
	"math"

	"cardinal/optics"
)

// beamSamples is the number of points the envelope has in each air space.
const beamSamples = 60

// A BeamEnvelope is a laser beam's 1/e² radius along the drawing, for a
// requirement with a collimated input beam: a Gaussian beam (TEM00) whose
// waist, of the requirement's beam radius, sits at the first vertex,
// carried part by part with the ABCD law (optics.System.Beam; Siegman,
// Lasers, 1986, ch. 20) and sampled through each air space. Inside a part
// the radius is drawn straight between its vertices.
type BeamEnvelope struct {
	Points [][2]float64 // (z, w), mm
	// Waist is the output beam's waist radius, mm, and WaistZ where it
	// lies (z from the first vertex); NaN when it lies before the last
	// vertex (a diverging output).
	Waist  float64
	WaistZ float64 `finite:"-"` // a sentinel, tested before it is drawn
}

// beamEnvelope computes the envelope from the lead-in to the image plane
// (or the run-out of an afocal solution).
func (sc *Scene) beamEnvelope() *BeamEnvelope {
	s := sc.Solution
	if !math.IsInf(s.ObjectZ, -1) || !(s.Requirement.Beam > 0) {
		return nil
	}
	wl := sc.Wavelength
	n0 := s.System().Indices(wl)[0]
	in := optics.NewGaussianBeam(wl, s.Requirement.Beam/2, 0, n0)
	env := &BeamEnvelope{}
	add := func(z, w float64) { env.Points = append(env.Points, [2]float64{z, w}) }
	sample := func(b optics.GaussianBeam, z0, length float64) {
		for i := 0; i <= beamSamples; i++ {
			d := length * float64(i) / beamSamples
			add(z0+d, b.Propagate(d).Radius())
		}
	}
	sample(in.Propagate(-sc.leadIn()), -sc.leadIn(), sc.leadIn())
	beam := in
	for i := range s.Parts {
		last := sc.Vertices[sc.PartSurfaces[i]+len(s.Parts[i].Surfaces)-1]
		beam = optics.Assemble(nil, nil, s.Parts[:i+1], s.Gaps[:i]).Beam(in)
		end := sc.runOut()
		switch {
		case i < len(s.Gaps):
			end = s.Gaps[i]
		case !s.Afocal():
			end = s.ImageZ
		}
		sample(beam, last, end)
	}
	env.Waist, env.WaistZ = beam.WaistRadius(), sc.Vertices[len(sc.Vertices)-1]-beam.WaistDistance()
	if beam.WaistDistance() > 0 {
		env.WaistZ = math.NaN()
	}
	return env
}
