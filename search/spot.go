package search

import (
	"math"
	"math/rand/v2"

	"cardinal/optics"
)

// spotRays are the real-ray settings of the spot each simulated build is
// judged by: the requirement's object and aperture at its wavelength, on
// axis, with the bundle the real-ray stage traces (quality.go), so that
// the nominal build's spot is the one find printed.
type spotRays struct {
	wl     float64
	object optics.Object // Z is set per build for a finite object
	rings  int           // of the bundle's hexapolar pattern
	points []optics.PupilPoint
}

// spotRings is the number of hexapolar rings of the spot bundle: the
// real-ray stage's (optics.Conditions, 12 rings, 468 rays).
const spotRings = 12

// newSpotRays is the spot's settings for a requirement whose results are
// traced with real rays, nil for the others.
func newSpotRays(req Requirement) *spotRays {
	if !req.TracesRays() {
		return nil
	}
	c := req.Conditions(0, 0)
	return &spotRays{wl: c.Reference, object: c.Object, rings: spotRings}
}

// spot is the on-axis RMS spot radius of one compensated build, um: real
// rays through the built pieces (optics.Lens.Built) at the build's gap
// and working distance, on the compensated image plane. Where the image
// plane is the compensator the builder refocuses: the spot is taken at
// its best focus (the plane of least RMS radius), as find's RMS spot is;
// where the plane is fixed (a gap compensator, or none) on that plane.
// ok is false when no ray reaches the image.
func (m *model) spot(d draw, t trial) (rms float64, ok bool) {
	deps, _, _, _ := m.departures(d)
	parts := make([]optics.Part, len(m.lenses))
	for i, l := range m.lenses {
		parts[i] = l.Built(m.parts[i], deps[i])
	}
	var gaps []float64
	if len(parts) == 2 {
		gaps = []float64{t.at.gap}
	}
	sys := optics.Assemble(nil, nil, parts, gaps)
	obj := m.rays.object
	if !obj.AtInfinity() {
		obj.Z = -t.at.wd
	}
	if m.rays.points == nil { // worked out here: most studies trace nothing
		m.rays.points = optics.Hexapolar(m.rays.rings)
	}
	b, err := sys.Bundle(obj, 0, m.rays.wl, m.rays.points)
	if err != nil {
		return 0, false
	}
	tracer := sys.Tracer(m.rays.wl)
	tracer.NoPoints = true // the spot needs where the rays end, not their points on the way
	tr := tracer.TraceBundle(b, t.at.imageZ)
	s := tr.SpotAt(t.at.imageZ)
	if t.at.refocus {
		s = tr.BestFocus()
	}
	if s.Passed == 0 || math.IsNaN(s.RMS) || math.IsInf(s.RMS, 0) {
		return 0, false
	}
	return 1000 * s.RMS, true
}

// spots traces the first limit builds of the study (all with limit < 0)
// that were compensated, drawing the same random numbers in the same order
// as study does, and puts their spots and the spot figures into st.
func (m *model) spots(b BuildSettings, stream uint64, limit int, st *Study) {
	if m.rays == nil {
		return
	}
	n := b.trials()
	if limit >= 0 {
		n = min(n, limit)
	}
	rng := rand.New(rand.NewPCG(b.Seed, stream))
	v, d := make([]float64, len(m.params)), make(draw, len(m.params))
	st.Spot = make([]float64, 0, n)
	for i := 0; i < n; i++ {
		t, ok := m.buildValue(rng, b.Distribution, v)
		if !ok {
			continue // not compensated: no spot (study counts it failed)
		}
		for j, x := range v {
			d[j] = optics.Const(x)
		}
		if s, ok := m.spot(d, t); ok {
			st.Spot = append(st.Spot, s)
		} else {
			st.SpotLost++
		}
	}
	st.SpotBuilds = len(st.Spot)
	if len(st.Spot) > 0 {
		st.SpotLow, st.SpotHigh = percentiles(st.Spot, 2.5, 97.5)
		st.SpotMedian, _ = percentiles(st.Spot, 50, 50)
	}
}

// FindSpotBuilds is how many builds of each shown row find traces for its
// spot figures, and findSpotRings the rings of their bundle (61 rays): a
// cheap version of the tolerance command's, which traces every build with
// the real-ray stage's 468 rays, so that the study stays a small part of
// find's time (BenchmarkFindStudy).
const (
	FindSpotBuilds = 30
	findSpotRings  = 4
)

// findSpots traces the first FindSpotBuilds builds of each setup with the
// cheap bundle, in parallel, each in its own slot; nil where the setup
// cannot be modelled.
func findSpots(req Requirement, sus []Setup) []*Study {
	out := make([]*Study, len(sus))
	inParallel(len(sus), func(i int) {
		m, err := newModel(req, sus[i])
		if err != nil || m.rays == nil {
			return
		}
		m.rays.rings = findSpotRings
		var st Study
		m.spots(req.Build, streamOf(sus[i]), FindSpotBuilds, &st)
		out[i] = &st
	})
	return out
}
