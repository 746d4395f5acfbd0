package search

import (
	"fmt"
	"math"

	"cardinal/optics"
)

// Compensator is what the builder adjusts after assembly.
type Compensator string

// Compensators; the empty one is the default of the kind: the image plane
// for focus and image requirements, the gap for an expander.
const (
	CompensateDefault Compensator = ""
	CompensateImage   Compensator = "image" // refocus: the image plane moves to the focus
	CompensateGap     Compensator = "gap"   // the second part moves until the focus (or collimation) is back
	CompensateNone    Compensator = "none"  // nothing moves; the adjustment figures are the error left
)

// Distribution is how a tolerance spreads the built values.
type Distribution string

// Distributions; the empty one is uniform.
const (
	Uniform Distribution = ""       // uniform within +- the tolerance (a worst-case reading)
	Normal  Distribution = "normal" // normal, the tolerance at two standard deviations
)

// DefaultTrials is the number of simulated builds of each ranked result
// when BuildSettings.Trials is zero.
const DefaultTrials = 1000

// DefaultSpacingTol is the spacing tolerance the command line and spec
// files use when none is given, mm (a tenth of a millimetre: common
// practice for spacers and hand placement).
const DefaultSpacingTol = 0.1

// BuildSettings say how the build of every ranked result is simulated
// (build.go). The zero value: no spacing tolerance, uniform, the kind's
// default compensator, DefaultTrials builds, seed 0, part tolerances from
// optics.DefaultTolerances.
type BuildSettings struct {
	// SpacingTol is the tolerance of every air gap, of the working
	// distance and of the image plane's placement, mm.
	SpacingTol   float64      `json:"spacing_tol_mm"`
	Distribution Distribution `json:"distribution,omitempty"`
	Compensator  Compensator  `json:"compensator,omitempty"`
	// Trials is the number of simulated builds; 0 means DefaultTrials.
	Trials int    `json:"trials,omitempty"`
	Seed   uint64 `json:"seed,omitempty"`
	// PartDefaults are the tolerances of a part that states none (the
	// catalog's setting); zero fields take optics.DefaultTolerances.
	PartDefaults optics.Tolerances `json:"part_defaults,omitzero"`
}

// Validate reports settings out of range.
func (b BuildSettings) Validate() error {
	switch {
	case math.IsNaN(b.SpacingTol) || math.IsInf(b.SpacingTol, 0) || b.SpacingTol < 0:
		return fmt.Errorf("spacing tolerance %g mm: want 0 or more", b.SpacingTol)
	case b.Distribution != Uniform && b.Distribution != Normal && b.Distribution != "uniform":
		return fmt.Errorf("unknown distribution %q: use uniform or normal", b.Distribution)
	case b.Compensator != CompensateDefault && b.Compensator != CompensateImage && b.Compensator != CompensateGap && b.Compensator != CompensateNone:
		return fmt.Errorf("unknown compensator %q: use image, gap or none", b.Compensator)
	case b.Trials < 0 || b.Trials > 1_000_000:
		return fmt.Errorf("trials %d: want 0 (the default %d) up to 1000000", b.Trials, DefaultTrials)
	}
	return b.PartDefaults.Validate()
}

func (b BuildSettings) trials() int {
	if b.Trials == 0 {
		return DefaultTrials
	}
	return b.Trials
}

// A Setup is one result as it is built: its parts in light order (each
// turned as used), their stated tolerances (zero fields take the defaults)
// and the solved distances, mm (WorkingDistance for an image requirement,
// BackClearance for focus and image, Gap for a pair).
type Setup struct {
	Parts                               []optics.Part
	Tols                                []optics.Tolerances
	Gap, WorkingDistance, BackClearance float64
}

// model is a Setup ready to simulate: the paraxial lenses and what every
// trial compares against.
type model struct {
	kind   Kind
	comp   Compensator
	lenses []optics.Lens
	gap    float64 // nominal gap (pairs)
	wd     float64 // nominal working distance (image)
	plane  float64 // nominal image plane: from the first vertex (focus) or the object plane (image)
	target float64
	tol    float64 // absolute tolerance of the target
	params []Param
	deps   []optics.Departure // scratch space of departures
	offs   []optics.Offsets   // and of their values (buildvalue.go)
	// parts are the setup's parts, and rays the real-ray spot's settings
	// (spot.go), nil when the requirement traces no rays.
	parts []optics.Part
	rays  *spotRays
}

// A Param is one toleranced quantity of a build.
type Param struct {
	// Name says what varies, in words ("focal length of part 1").
	Name string `json:"name"`
	// Key is a short machine name (efl1, thickness1.2, index2.1, radius1.3,
	// gap, working_distance, image_plane).
	Key string `json:"key"`
	// Tol is the tolerance, in Unit ("%", "mm" or "" for an index).
	Tol  float64 `json:"tolerance"`
	Unit string  `json:"unit"`
	what paramKind
	part int // index of the lens, or -1
	k    int // element or surface within the part
}

type paramKind int8

const (
	pFocal paramKind = iota
	pRadius
	pThick
	pIndex
	pGap
	pWD
	pPlane
)

// compensatorFor is the compensator used: the asked one, or the kind's
// default; a singlet has no gap, so a gap asked of one refocuses instead,
// and an expander has no image plane, so it keeps the gap.
func compensatorFor(k Kind, asked Compensator, pair bool) Compensator {
	c := asked
	if c == CompensateDefault {
		c = CompensateImage
		if k == Expand {
			c = CompensateGap
		}
	}
	if c == CompensateGap && !pair {
		c = CompensateImage
	}
	if c == CompensateImage && k == Expand {
		c = CompensateGap
	}
	return c
}

// newModel prepares the setup of a result of the requirement.
func newModel(req Requirement, su Setup) (*model, error) {
	if n := len(su.Parts); n < 1 || n > 2 || len(su.Tols) != n {
		panic(fmt.Sprintf("search: a setup needs one or two parts and a tolerance each, got %d and %d", n, len(su.Tols)))
	}
	b := req.Build
	m := &model{kind: req.Kind, comp: compensatorFor(req.Kind, b.Compensator, len(su.Parts) == 2),
		gap: su.Gap, wd: su.WorkingDistance, target: target(req), tol: firstOrderTol(req)}
	env := 0.0
	for i, p := range su.Parts {
		t := su.Tols[i].Or(b.PartDefaults).Or(optics.DefaultTolerances)
		if err := t.Validate(); err != nil {
			return nil, fmt.Errorf("part %s: %w", p.ID(), err)
		}
		m.lenses = append(m.lenses, optics.NewLens(p, req.Lambda(), t))
		env += p.Length()
	}
	if len(su.Parts) == 2 {
		env += su.Gap
	}
	switch req.Kind {
	case Focus:
		m.plane = env + su.BackClearance
	case Image:
		m.plane = su.WorkingDistance + env + su.BackClearance
	}
	m.params = m.list(b.SpacingTol)
	m.parts, m.rays = su.Parts, newSpotRays(req)
	return m, nil
}

// list names every toleranced quantity of the build.
func (m *model) list(spacing float64) []Param {
	var ps []Param
	for i, l := range m.lenses {
		n := i + 1
		ps = append(ps, Param{Name: fmt.Sprintf("focal length of part %d", n), Key: fmt.Sprintf("efl%d", n),
			Tol: l.Tol.EFLPct, Unit: "%", what: pFocal, part: i})
		if l.Tol.RadiusPct > 0 {
			for k := range l.Curv {
				if l.Curv[k] == 0 {
					continue // a plane has no radius to vary
				}
				ps = append(ps, Param{Name: fmt.Sprintf("radius %d of part %d", k+1, n), Key: fmt.Sprintf("radius%d.%d", n, k+1),
					Tol: l.Tol.RadiusPct, Unit: "%", what: pRadius, part: i, k: k})
			}
		}
		for k := 0; k < l.Elements(); k++ {
			el := ""
			if l.Elements() > 1 {
				el = fmt.Sprintf(" element %d", k+1)
			}
			ps = append(ps,
				Param{Name: fmt.Sprintf("centre thickness of part %d%s", n, el), Key: fmt.Sprintf("thickness%d.%d", n, k+1),
					Tol: l.Tol.Thickness, Unit: "mm", what: pThick, part: i, k: k},
				Param{Name: fmt.Sprintf("index of part %d%s", n, el), Key: fmt.Sprintf("index%d.%d", n, k+1),
					Tol: l.Tol.Index, Unit: "", what: pIndex, part: i, k: k})
		}
	}
	if len(m.lenses) == 2 && m.comp != CompensateGap { // a gap that is adjusted has no placement error
		ps = append(ps, Param{Name: "gap", Key: "gap", Tol: spacing, Unit: "mm", what: pGap, part: -1})
	}
	if m.kind == Image {
		ps = append(ps, Param{Name: "working distance", Key: "working_distance", Tol: spacing, Unit: "mm", what: pWD, part: -1})
	}
	if m.kind != Expand && m.comp != CompensateImage {
		ps = append(ps, Param{Name: "image plane placement", Key: "image_plane", Tol: spacing, Unit: "mm", what: pPlane, part: -1})
	}
	return ps
}

// draw is one build's departures: one Dual per parameter, in the order of
// model.params.
type draw []optics.Dual

// departures turns a draw into the departures of each lens and the
// spacing errors (gap, working distance, image plane). The departures are
// the model's own scratch space, overwritten by the next call.
func (m *model) departures(d draw) (deps []optics.Departure, gap, wd, plane optics.Dual) {
	if m.deps == nil {
		m.deps = make([]optics.Departure, len(m.lenses))
		for i, l := range m.lenses {
			if l.Tol.RadiusPct > 0 {
				m.deps[i].Radius = make([]optics.Dual, len(l.Curv))
			}
			m.deps[i].Thick = make([]optics.Dual, l.Elements())
			m.deps[i].Index = make([]optics.Dual, l.Elements())
		}
	}
	deps = m.deps
	for j, p := range m.params {
		v := d[j]
		switch p.what {
		case pFocal:
			deps[p.part].Focal = v.Scale(0.01)
		case pRadius:
			deps[p.part].Radius[p.k] = v.Scale(0.01)
		case pThick:
			deps[p.part].Thick[p.k] = v
		case pIndex:
			deps[p.part].Index[p.k] = v
		case pGap:
			gap = v
		case pWD:
			wd = v
		case pPlane:
			plane = v
		}
	}
	return deps, gap, wd, plane
}

// trial is what one build gives after compensation: the compensator's move
// (mm; with no compensator, the error left: the defocus, or the gap change
// an expander would need), the target figure, and whether the compensator
// could be solved at all.
type trial struct {
	adjust, figure optics.Dual
	ok             bool
	// at is where the compensated build stands, for the real-ray spot
	// (spot.go): its gap and working distance, and its image plane from
	// the last vertex (the paraxial focus when refocus is true, the fixed
	// plane otherwise).
	at struct {
		gap, wd, imageZ float64
		refocus         bool
	}
}

// eval solves the compensator of one build exactly with the ray-transfer
// matrices. For a pair the system matrix is linear in the gap g,
// M(g) = M0 + g K with M0 = Mb Ma and K = Mb [0 1; 0 0] Ma (Gerrard and
// Burch, Introduction to Matrix Methods in Optics, Wiley 1975, ch. III, the
// product of the matrices), so every compensation is a linear or quadratic
// equation in g or in the image distance.
func (m *model) eval(d draw) trial {
	deps, dg, dwd, dplane := m.departures(d)
	ma, la := m.lenses[0].Matrix(deps[0])
	m0, k, length := ma, optics.DMat{}, la
	pair := len(m.lenses) == 2
	if pair {
		mb, lb := m.lenses[1].Matrix(deps[1])
		m0 = ma.Then(mb)
		k = optics.DMat{A: mb.A.Mul(ma.C), B: mb.A.Mul(ma.D), C: mb.C.Mul(ma.C), D: mb.C.Mul(ma.D)}
		length = la.Add(lb)
	}
	g0 := optics.Const(m.gap)
	at := func(g optics.Dual) optics.DMat { // M(g)
		return optics.DMat{A: m0.A.Add(g.Mul(k.A)), B: m0.B.Add(g.Mul(k.B)), C: m0.C.Add(g.Mul(k.C)), D: m0.D.Add(g.Mul(k.D))}
	}
	placed := g0.Add(dg)
	if !pair {
		placed = optics.Const(0)
	}
	switch m.kind {
	case Focus:
		return m.evalFocus(at, k, placed, length, dplane)
	case Image:
		return m.evalImage(at, k, placed, length, optics.Const(m.wd).Add(dwd), dplane)
	}
	return m.evalExpand(at, m0, k, placed)
}

// evalFocus: a collimated beam focuses A/phi beyond the last vertex, phi = -C.
func (m *model) evalFocus(at func(optics.Dual) optics.DMat, k optics.DMat, placed, length, dplane optics.Dual) trial {
	plane := optics.Const(m.plane).Add(dplane)
	if m.comp == CompensateGap {
		// The image plane stays; the gap g brings the focus onto it:
		// A(g) = phi(g) (W - g), W = plane - lengths, a quadratic in g.
		m0 := at(optics.Const(0))
		w := plane.Sub(length)
		a0, a1, p0, p1 := m0.A, k.A, m0.C.Neg(), k.C.Neg()
		g, ok := nearestRoot(p1, a1.Add(p0).Sub(p1.Mul(w)), a0.Sub(p0.Mul(w)), m.gap)
		if !ok {
			return trial{}
		}
		phi := at(g).C.Neg()
		t := trial{adjust: g.Sub(optics.Const(m.gap)), figure: optics.Const(1).Div(phi), ok: phi.V != 0}
		t.at.gap, t.at.imageZ = g.V, plane.V-length.V-g.V
		return t
	}
	s := at(placed)
	phi := s.C.Neg()
	if phi.V == 0 {
		return trial{}
	}
	focus := length.Add(placed).Add(s.A.Div(phi)) // from the first vertex
	t := trial{figure: optics.Const(1).Div(phi), ok: true}
	t.at.gap = placed.V
	if m.comp == CompensateNone {
		t.adjust = focus.Sub(plane)
		t.at.imageZ = plane.V - length.V - placed.V
	} else {
		t.adjust = focus.Sub(optics.Const(m.plane))
		t.at.imageZ, t.at.refocus = s.A.V/phi.V, true
	}
	return t
}

// evalImage: with S = M T(wd) from the object plane, the image lies
// z = -S.B / S.D beyond the last vertex and the magnification is 1 / S.D
// (det S = 1).
func (m *model) evalImage(at func(optics.Dual) optics.DMat, k optics.DMat, placed, length, wd, dplane optics.Dual) trial {
	plane := optics.Const(m.plane).Add(dplane)
	withObject := func(s optics.DMat) (b, d optics.Dual) { // S.B and S.D of M T(wd)
		return s.A.Mul(wd).Add(s.B), s.C.Mul(wd).Add(s.D)
	}
	if m.comp == CompensateGap {
		// The object and image planes stay; the gap brings the image onto
		// the plane: S.B(g) + (W - g) S.D(g) = 0, W = plane - wd - lengths.
		b0, d0 := withObject(at(optics.Const(0)))
		b1, d1 := withObject(k)
		w := plane.Sub(wd).Sub(length)
		g, ok := nearestRoot(d1.Neg(), b1.Add(w.Mul(d1)).Sub(d0), b0.Add(w.Mul(d0)), m.gap)
		if !ok {
			return trial{}
		}
		_, sd := withObject(at(g))
		t := trial{adjust: g.Sub(optics.Const(m.gap)), figure: optics.Const(1).Div(sd), ok: sd.V != 0}
		t.at.gap, t.at.wd, t.at.imageZ = g.V, wd.V, plane.V-wd.V-length.V-g.V
		return t
	}
	sb, sd := withObject(at(placed))
	if sd.V == 0 {
		return trial{}
	}
	image := wd.Add(length).Add(placed).Sub(sb.Div(sd)) // from the object plane
	t := trial{figure: optics.Const(1).Div(sd), ok: true}
	t.at.gap, t.at.wd = placed.V, wd.V
	if m.comp == CompensateNone {
		t.adjust = image.Sub(plane)
		t.at.imageZ = plane.V - wd.V - length.V - placed.V
	} else {
		t.adjust = image.Sub(optics.Const(m.plane))
		t.at.imageZ, t.at.refocus = -sb.V/sd.V, true
	}
	return t
}

// evalExpand: the pair is afocal where C(g) = C0 + g K.C = 0, and its
// expansion is then |A|.
func (m *model) evalExpand(at func(optics.Dual) optics.DMat, m0, k optics.DMat, placed optics.Dual) trial {
	if k.C.V == 0 {
		return trial{}
	}
	collimated := m0.C.Div(k.C).Neg()
	if m.comp == CompensateNone {
		s := at(placed)
		return trial{adjust: collimated.Sub(placed), figure: s.A.Abs(), ok: true}
	}
	s := at(collimated)
	return trial{adjust: collimated.Sub(optics.Const(m.gap)), figure: s.A.Abs(), ok: true}
}

// nearestRoot solves a g^2 + b g + c = 0 and returns the real root nearest
// near, with its derivative, by the form q = -(b + sgn(b) sqrt(b^2 - 4ac))/2,
// roots q/a and c/q, that loses no digits to cancellation (W. H. Press et
// al., Numerical Recipes, 3rd ed., Cambridge 2007, sec. 5.6). A vanishing
// a leaves the one root -c/b.
func nearestRoot(a, b, c optics.Dual, near float64) (optics.Dual, bool) {
	if a.V == 0 {
		if b.V == 0 {
			return optics.Dual{}, false
		}
		return c.Div(b).Neg(), true
	}
	disc := b.Mul(b).Sub(a.Mul(c).Scale(4))
	if disc.V < 0 {
		return optics.Dual{}, false
	}
	r := disc.Sqrt()
	if b.V < 0 {
		r = r.Neg()
	}
	q := b.Add(r).Scale(-0.5)
	if q.V == 0 {
		return optics.Dual{}, false // b = 0 and c = 0: the double root 0
	}
	x1, x2 := q.Div(a), c.Div(q)
	if math.Abs(x2.V-near) < math.Abs(x1.V-near) {
		return x2, true
	}
	return x1, true
}
