package drawing

import (
	"fmt"
	"math"

	"cardinal/optics"
	"cardinal/search/solution"
)

// DrawOptions say what to draw beyond the solution itself. The zero value
// draws the requirement's field (the object height of an image
// requirement), or a small illustrative field where it gives none.
type DrawOptions struct {
	// Field is the field point of the chief ray: object height in mm for a
	// finite object, field angle in degrees for an object at infinity;
	// 0 picks the default above.
	Field float64
	// Title heads the drawing; empty gives one from the solution.
	Title string
	// Illustrative says that Field was chosen by the program, not by the
	// user or the requirement (the legend says so).
	Illustrative bool
}

// A Scene is a solution's layout in the meridional plane, z along the axis
// from the first vertex and y up, in mm: what the SVG drawing shows, kept
// apart from the SVG so that tests can read it.
type Scene struct {
	Solution   solution.Solution `finite:"-"` // the input: a flat surface's radius is +Inf by convention
	Wavelength float64
	// Field is the chief ray's field point (mm or degrees, see
	// DrawOptions); FieldGiven is false when the drawing chose it.
	Field      float64
	FieldGiven bool
	// Beam is true for a laser requirement without a field: the drawing
	// shows the beam's envelope and no chief ray of an invented field.
	Beam bool
	// Envelope is the laser beam's 1/e² envelope, drawn for any laser
	// requirement with a collimated beam; nil otherwise.
	Envelope *BeamEnvelope
	// Vertices[k] is the z of surface k's vertex.
	Vertices []float64
	// PartSurfaces[i] is the index of part i's first surface.
	PartSurfaces []int
	// ObjectZ is the object plane's z (-Inf at infinity); ImageZ the image
	// plane's z from the first vertex (NaN for an afocal solution). Both
	// are sentinels the drawing tests before it draws a plane, so the
	// finite guard (search/finite) passes them over.
	ObjectZ float64 `finite:"-"`
	ImageZ  float64 `finite:"-"`
	Rays    []SceneRay
	// Marks are the cardinal points on the drawing; OffDrawing those too
	// far away to draw, listed in the legend instead.
	Marks, OffDrawing []Mark
	// Ghosts are the ghost foci marked for a laser requirement (each
	// flagged one and the most concentrated); OffGhosts those too far
	// away to draw, listed in the legend.
	Ghosts, OffGhosts []GhostMark
	Dims              []Dim
	// XMin and XMax bound the drawing along z; YMax is the largest height
	// of a part or a ray.
	XMin, XMax, YMax float64
}

// A SceneRay is one real ray as drawn: its points (z, y) from where the
// drawing starts it to where it ends.
type SceneRay struct {
	Name   string // "marginal", "chief" or "rim"
	Points [][2]float64
	Status optics.RayStatus
	// Surface is where a ray that did not pass stopped (0-based), else -1.
	Surface int
}

// A Mark is a cardinal point: Kind is F, F′, P, P′, N or N′; Part is 0 for
// the whole system, i+1 for part i.
type Mark struct {
	Kind string
	Part int
	Z    float64
}

// A Dim is a dimensioned distance along the axis, from Z0 to Z1, in row
// Row below the parts (0 nearest).
type Dim struct {
	Name   string
	Z0, Z1 float64
	Row    int
}

// NewScene traces the solution's rays and places everything to draw.
func NewScene(s solution.Solution, o DrawOptions) (Scene, error) {
	sys := s.System()
	sc := Scene{Solution: s, Wavelength: s.Wavelength(), ObjectZ: s.ObjectZ, ImageZ: math.NaN()}
	sc.vertices(sys)
	env := sys.Length()
	if !s.Afocal() {
		sc.ImageZ = env + s.ImageZ
	}
	sc.Field, sc.FieldGiven = solution.DefaultField(s, o.Field)
	sc.FieldGiven = sc.FieldGiven && !o.Illustrative
	sc.Beam = !sc.FieldGiven && s.Requirement.IsLaser()
	if err := sc.trace(sys); err != nil {
		return Scene{}, err
	}
	if s.Requirement.IsLaser() {
		sc.Envelope = sc.beamEnvelope()
	}
	sc.bounds()
	sc.marks(sys)
	sc.ghosts(sys)
	sc.dims(env)
	return sc, nil
}

func (sc *Scene) vertices(sys optics.System) {
	sc.Vertices = make([]float64, len(sys.Surfaces))
	for k := 1; k < len(sc.Vertices); k++ {
		sc.Vertices[k] = sc.Vertices[k-1] + sys.Gaps[k-1]
	}
	k := 0
	for _, p := range sc.Solution.Parts {
		sc.PartSurfaces = append(sc.PartSurfaces, k)
		k += len(p.Surfaces)
	}
}

// trace follows the upper and lower marginal rays of the axial point, and
// the chief and rim rays of the field point (none for a laser beam drawn
// without a field).
func (sc *Scene) trace(sys optics.System) error {
	tr := sys.Tracer(sc.Wavelength)
	obj := sc.Solution.Object()
	fan := []optics.PupilPoint{{Y: 1}, {Y: -1}}
	bundles := []struct {
		field float64
		pts   []optics.PupilPoint
		names []string
	}{{0, fan, []string{"marginal", "marginal"}}, {sc.Field, append([]optics.PupilPoint{{}}, fan...), []string{"chief", "rim", "rim"}}}
	if sc.Beam { // a laser beam without a field: no invented chief ray
		bundles = bundles[:1]
	}
	for _, b := range bundles {
		bundle, err := sys.Bundle(obj, b.field, sc.Wavelength, b.pts)
		if err != nil {
			return fmt.Errorf("rays for the drawing: %w", err)
		}
		for i, r := range bundle.Rays {
			sc.Rays = append(sc.Rays, sc.drawRay(tr, r, b.names[i]))
		}
	}
	return nil
}

// drawRay traces one ray and keeps the points to draw: from the object
// point (or a lead-in before the first vertex for an object at infinity),
// through each surface, to the image plane (or a run-out past the last
// vertex for an afocal solution).
func (sc *Scene) drawRay(tr *optics.Tracer, r optics.Ray, name string) SceneRay {
	imageZ := sc.Solution.ImageZ
	if sc.Solution.Afocal() {
		imageZ = sc.runOut()
	}
	p := tr.Trace(r, imageZ)
	start := r.Pos
	if math.IsInf(sc.ObjectZ, -1) {
		start = r.Pos.Add(r.Dir.Scale((-sc.leadIn() - r.Pos.Z) / r.Dir.Z))
	}
	sr := SceneRay{Name: name, Status: p.Status, Surface: p.Surface, Points: [][2]float64{{start.Z, start.Y}}}
	for _, q := range p.Points {
		sr.Points = append(sr.Points, [2]float64{q.Z, q.Y})
	}
	if p.Status == optics.Passed {
		sr.Points = append(sr.Points, [2]float64{p.Image.Z, p.Image.Y})
	}
	return sr
}

// leadIn is how far before the first vertex a collimated beam is drawn.
func (sc *Scene) leadIn() float64 { return 0.25 * sc.span() }

// runOut is how far past the last vertex an afocal output beam is drawn.
func (sc *Scene) runOut() float64 { return 0.5 * sc.span() }

// span is the scale of the drawing: envelope, and the working distance
// and back clearance where they apply.
func (sc *Scene) span() float64 {
	s := sc.Solution
	l := s.Envelope()
	if !math.IsInf(s.ObjectZ, -1) {
		l -= s.ObjectZ
	}
	if !s.Afocal() {
		l += math.Abs(s.ImageZ)
	}
	return math.Max(l, 10)
}
