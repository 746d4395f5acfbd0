package drawing

import (
	"math"

	"cardinal/optics"
)

// bounds finds the drawing's extent from the planes, the parts and the rays.
func (sc *Scene) bounds() {
	sc.XMin, sc.XMax = 0, sc.Vertices[len(sc.Vertices)-1]
	grow := func(z float64) {
		if !math.IsNaN(z) && !math.IsInf(z, 0) {
			sc.XMin, sc.XMax = math.Min(sc.XMin, z), math.Max(sc.XMax, z)
		}
	}
	grow(sc.ObjectZ)
	grow(sc.ImageZ)
	for _, p := range sc.Solution.Parts {
		sc.YMax = math.Max(sc.YMax, p.Diameter/2)
	}
	if sc.Envelope != nil {
		for _, q := range sc.Envelope.Points {
			sc.YMax = math.Max(sc.YMax, q[1])
		}
	}
	for _, r := range sc.Rays {
		for _, q := range r.Points {
			grow(q[0])
			sc.YMax = math.Max(sc.YMax, math.Abs(q[1]))
		}
	}
}

// marks places the cardinal points of each part and of the system. A
// point further than a fifth of the drawing's length outside it is listed
// in OffDrawing instead.
func (sc *Scene) marks(sys optics.System) {
	var all []Mark
	for i, p := range sc.Solution.Parts {
		z0 := sc.Vertices[sc.PartSurfaces[i]]
		all = append(all, cardinalMarks(p.System(nil, nil).Cardinal(sc.Wavelength), i+1, z0, z0+p.Length())...)
	}
	all = append(all, cardinalMarks(sys.Cardinal(sc.Wavelength), 0, 0, sys.Length())...)
	w := sc.XMax - sc.XMin
	lo, hi := sc.XMin-0.2*w, sc.XMax+0.2*w
	for _, m := range all {
		if m.Z < lo || m.Z > hi {
			sc.OffDrawing = append(sc.OffDrawing, m)
			continue
		}
		sc.Marks = append(sc.Marks, m)
		sc.XMin, sc.XMax = math.Min(sc.XMin, m.Z), math.Max(sc.XMax, m.Z)
	}
}

// cardinalMarks places the focal, principal and (where they differ from
// the principal points, that is between different media) nodal points,
// front points from the first vertex z0 and back points from the last
// vertex z1 (optics' convention). An afocal system has none.
func cardinalMarks(c optics.Cardinal, part int, z0, z1 float64) []Mark {
	if c.Afocal {
		return nil
	}
	ms := []Mark{{"F", part, z0 + c.F}, {"P", part, z0 + c.P}, {"P′", part, z1 + c.PPrime}, {"F′", part, z1 + c.FPrime}}
	if math.Abs(c.N-c.P) > 1e-9 || math.Abs(c.NPrime-c.PPrime) > 1e-9 {
		ms = append(ms, Mark{"N", part, z0 + c.N}, Mark{"N′", part, z1 + c.NPrime})
	}
	return ms
}

// dims lists the distances to dimension: working distance, gaps and back
// clearance in the first row, the envelope in the second, the track in the
// third (each where it applies).
func (sc *Scene) dims(env float64) {
	if !math.IsInf(sc.ObjectZ, -1) {
		sc.Dims = append(sc.Dims, Dim{"working distance", sc.ObjectZ, 0, 0})
	}
	for i := 1; i < len(sc.PartSurfaces); i++ {
		sc.Dims = append(sc.Dims, Dim{"gap", sc.Vertices[sc.PartSurfaces[i]-1], sc.Vertices[sc.PartSurfaces[i]], 0})
	}
	if math.IsNaN(sc.ImageZ) {
		sc.Dims = append(sc.Dims, Dim{"envelope", 0, env, 1})
		return
	}
	sc.Dims = append(sc.Dims, Dim{"back clearance", env, sc.ImageZ, 0}, Dim{"envelope", 0, env, 1})
	start := 0.0
	if !math.IsInf(sc.ObjectZ, -1) {
		start = sc.ObjectZ
	}
	sc.Dims = append(sc.Dims, Dim{"track", start, sc.ImageZ, 2})
}
