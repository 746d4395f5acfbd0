package search

import (
	"bytes"
	"encoding/json"
	"fmt"
	"math"

	"cardinal/optics"
)

// Kind is what a requirement asks of the optics.
type Kind string

// The requirement kinds (see DESIGN.md, "Requirement kinds").
const (
	Focus  Kind = "focus"  // infinite conjugate: an EFL, focusing a collimated beam
	Image  Kind = "image"  // finite conjugate: a track and a magnification
	Expand Kind = "expand" // afocal: a beam-expansion ratio
	Match  Kind = "match"  // mode matching: one Gaussian waist into another (match.go)
)

// Form is the kind of afocal pair a beam expander may be.
type Form string

// Expander forms; the empty Form accepts either.
const (
	AnyForm   Form = ""
	Keplerian Form = "keplerian" // two positive parts, an internal focus
	Galilean  Form = "galilean"  // a negative and a positive part, no internal focus
)

// Prefer shifts the ranking weights (see Weights).
type Prefer string

// Preferences; the empty one is the balanced default.
const (
	Balanced     Prefer = ""
	PreferDraw   Prefer = "drawer"
	PreferShort  Prefer = "short"
	PreferCheap  Prefer = "cheap"
	PreferSharp  Prefer = "sharp"  // weights real-ray image quality up (see Weights)
	PreferRobust Prefer = "robust" // weights the build yield and spread up (see Weights)
)

// DefaultGapMin is the edge clearance between facing parts that the command
// line and spec files use when none is given, in mm.
const DefaultGapMin = 0.5

// DefaultTop is how many results the command line shows when not told.
const DefaultTop = 10

// A Requirement is what the user asks for. Lengths in mm, the wavelength in
// nm. Zero values mean "not given" except where a field says otherwise.
type Requirement struct {
	Kind Kind `json:"kind"`

	// Focus.
	EFL    float64   `json:"efl_mm,omitempty"`
	EFLTol Tolerance `json:"efl_tol,omitzero"`

	// Image: track (object plane to image plane) and signed magnification.
	Track        float64   `json:"track_mm,omitempty"`
	Mag          float64   `json:"magnification,omitempty"`
	MagTol       Tolerance `json:"mag_tol,omitzero"`
	ObjectHeight float64   `json:"object_height_mm,omitempty"`        // half the object field
	NA           float64   `json:"na,omitempty"`                      // object-space numerical aperture
	WDMin        float64   `json:"working_distance_min_mm,omitempty"` // working distance minimum

	// Expand: output over input beam diameter, positive.
	Expansion float64   `json:"expansion,omitempty"`
	ExpandTol Tolerance `json:"expand_tol,omitzero"`
	Form      Form      `json:"form,omitempty"`

	// Common.
	Beam        float64 `json:"beam_mm,omitempty"`               // collimated input beam diameter (focus, expand)
	BFDMin      float64 `json:"back_clearance_min_mm,omitempty"` // back clearance minimum (focus, image)
	LengthMax   float64 `json:"envelope_max_mm,omitempty"`       // envelope maximum; 0 none
	DiameterMax float64 `json:"diameter_max_mm,omitempty"`       // part diameter maximum; 0 none
	GapMin      float64 `json:"gap_min_mm"`                      // edge clearance between facing parts; zero is zero
	Elements    int     `json:"elements,omitempty"`              // 1 singlets only; 2 (or 0) singlets and pairs
	Wavelength  float64 `json:"wavelength_nm,omitempty"`         // 0 means the d line
	Supplier    string  `json:"supplier,omitempty"`              // only this supplier's parts; "" all
	DrawerOnly  bool    `json:"in_drawer,omitempty"`             // only parts in the drawer
	Top         int     `json:"top"`                             // results to keep; 0 all that meet
	Prefer      Prefer  `json:"prefer,omitempty"`

	// Real rays and safety (see quality.go).
	FieldAngle float64   `json:"field_angle_deg,omitempty"` // focus: field edge for the real-ray figures, degrees
	Band       []float64 `json:"band_nm,omitempty"`         // wavelengths of the colour figures, nm; none: no colour figure
	Power      float64   `json:"power_w,omitempty"`         // laser power, W: brings the laser cautions
	// Laser says the light is a laser even in the visible without a power
	// (see IsLaser): one wavelength in plots, spots and verdicts unless a
	// band is given, and the laser cautions.
	Laser bool `json:"laser,omitempty"`
	// Arrangements lists every layout that meets as its own row, ranked on
	// its own (--top counts layouts); by default the layouts of one set of
	// parts, twins taken as one, are one row (group.go).
	Arrangements bool `json:"arrangements,omitempty"`

	// Build says how every ranked result is simulated as built (build.go).
	Build BuildSettings `json:"build,omitzero"`
	// noBuildStudy leaves the build study out, for the benchmark that
	// measures what it adds to find (BenchmarkFindStudyAdded).
	noBuildStudy bool

	// Laser beams (laser.go): a laser requirement (IsLaser) treats the
	// input as a Gaussian beam.
	WaistIn    float64 `json:"waist_in_mm,omitempty"`     // input waist, 1/e^2 radius; 0: Beam/2 at the first vertex
	WaistInAt  float64 `json:"waist_in_at_mm,omitempty"`  // input waist before the first vertex (negative: after it)
	M2         float64 `json:"m2,omitempty"`              // beam quality M^2; 0 means 1
	WaistOutAt float64 `json:"waist_out_at_mm,omitempty"` // expand: output waist beyond the last vertex
	LaserExit  float64 `json:"laser_exit_mm,omitempty"`   // the laser's exit aperture before the first vertex; 0 unknown

	// Match: the output waist radius and the least power coupling into
	// it; Track (optional) is the distance between the two waist planes.
	WaistOut    float64 `json:"waist_out_mm,omitempty"`
	CouplingMin float64 `json:"coupling_min,omitempty"` // 0 means DefaultCouplingMin
}

// formerKeys are the spec and saved-search keys of earlier versions, read
// as the names the glossary uses now.
var formerKeys = map[string]string{
	"wd_min_mm":     "working_distance_min_mm",
	"bfd_min_mm":    "back_clearance_min_mm",
	"length_max_mm": "envelope_max_mm",
	"drawer_only":   "in_drawer",
}

// UnmarshalJSON reads a requirement, its keys as MarshalJSON writes them
// or as earlier versions did (formerKeys); an unknown key is an error.
func (r *Requirement) UnmarshalJSON(b []byte) error {
	var m map[string]json.RawMessage
	if err := json.Unmarshal(b, &m); err != nil {
		return err
	}
	renamed := false
	for old, now := range formerKeys {
		if v, ok := m[old]; ok {
			if _, both := m[now]; both {
				return fmt.Errorf("json: both %q and its former name %q given", now, old)
			}
			m[now] = v
			delete(m, old)
			renamed = true
		}
	}
	if renamed {
		var err error
		if b, err = json.Marshal(m); err != nil {
			return err
		}
	}
	type plain Requirement // the same fields, without this method
	p := plain(*r)
	dec := json.NewDecoder(bytes.NewReader(b))
	dec.DisallowUnknownFields()
	if err := dec.Decode(&p); err != nil {
		return err
	}
	*r = Requirement(p)
	return nil
}

// Defaults returns the requirement the command line and spec files start
// from: tolerances 1 %, gap minimum 0.5 mm, top 10, singlets and pairs, the
// d line, a spacing tolerance of 0.1 mm for the build study.
func Defaults() Requirement {
	one := Tolerance{Value: 1, Percent: true}
	return Requirement{EFLTol: one, MagTol: one, ExpandTol: one,
		GapMin: DefaultGapMin, Top: DefaultTop, Elements: 2, Wavelength: optics.LineD,
		Build: BuildSettings{SpacingTol: DefaultSpacingTol}}
}

// MarshalJSON writes the requirement with the tolerance of its own kind
// only.
func (r Requirement) MarshalJSON() ([]byte, error) {
	type plain Requirement // the same fields, without this method
	p := plain(r)
	if r.Kind != Focus {
		p.EFLTol = Tolerance{}
	}
	if r.Kind != Image {
		p.MagTol = Tolerance{}
	}
	if r.Kind != Expand {
		p.ExpandTol = Tolerance{}
	}
	return json.Marshal(p)
}

// Lambda is the wavelength in nm, the d line when not given.
func (r Requirement) Lambda() float64 {
	if r.Wavelength == 0 {
		return optics.LineD
	}
	return r.Wavelength
}

// MaxElements is 1 or 2.
func (r Requirement) MaxElements() int {
	if r.Elements == 1 {
		return 1
	}
	return 2
}

// ChecksAperture tells whether ray heights are checked: only when a beam, an
// NA or an object height is given.
func (r Requirement) ChecksAperture() bool {
	return r.BeamDiameter() > 0 || r.NA > 0 || r.ObjectHeight > 0 || r.Kind == Match
}

// IsLaser tells whether the requirement names a laser: the laser switch, a
// power given, a wavelength outside the visible 400-700 nm (common
// practice), an input waist, or a mode-matching kind. A laser is one
// wavelength: plots, spots and the diffraction-limited verdict use the
// requirement's wavelength alone unless a band is given.
func (r Requirement) IsLaser() bool {
	return r.Laser || laserLight(r.Power, r.Lambda()) || r.WaistIn > 0 || r.Kind == Match
}

// laserLight tells whether light of a power (W, 0 when not given) and a
// wavelength (nm) is to be treated as a laser: a power given, or a
// wavelength outside the visible 400-700 nm (common practice).
func laserLight(power, wavelength float64) bool {
	return power > 0 || wavelength < 400 || wavelength > 700
}

// Validate rejects impossible or contradictory requirements before any
// search, every problem in one *RequirementError that names each field by
// its JSON key. Every number must be finite and inside its Range, so that
// nothing downstream divides into an infinity.
func (r Requirement) Validate() error {
	var ps problems
	for _, f := range r.numbers() {
		rg := rangeOf(f.key)
		v := f.v
		if f.key == "magnification" || f.key == "waist_in_at_mm" {
			v = math.Abs(v)
		}
		switch {
		case math.IsNaN(f.v) || math.IsInf(f.v, 0):
			ps.add("{%s} must be a finite number (%s)", f.key, rg)
		case f.v < 0 && f.key != "magnification" && f.key != "waist_in_at_mm":
			ps.add("{%s} is negative (%g); give %s", f.key, f.v, rg)
		case f.v != 0 && (v < rg.Min || v > rg.Max):
			ps.add("{%s} %g is outside %s", f.key, f.v, rg)
		}
	}
	if len(ps) > 0 {
		return ps.err()
	}
	switch r.Kind {
	case Focus:
		r.validateFocus(&ps)
	case Image:
		r.validateImage(&ps)
	case Expand:
		r.validateExpand(&ps)
	case Match:
		r.validateMatch(&ps)
	case "":
		ps.add("say what to find: an EFL ({efl_mm}), a track and magnification ({track_mm}, {magnification}), a beam expansion ({expansion}) or an output waist ({waist_out_mm})")
	default:
		ps.add("unknown {kind} %q: use focus, image, expand or match", r.Kind)
	}
	r.validateCommon(&ps)
	r.validateLaser(&ps)
	return ps.err()
}

type named struct {
	key string // JSON key
	v   float64
}

func (r Requirement) numbers() []named {
	ns := []named{{"efl_mm", r.EFL}, {"efl_tol", r.EFLTol.Value}, {"track_mm", r.Track},
		{"magnification", r.Mag}, {"mag_tol", r.MagTol.Value},
		{"object_height_mm", r.ObjectHeight}, {"na", r.NA}, {"working_distance_min_mm", r.WDMin},
		{"expansion", r.Expansion}, {"expand_tol", r.ExpandTol.Value}, {"beam_mm", r.Beam},
		{"back_clearance_min_mm", r.BFDMin}, {"envelope_max_mm", r.LengthMax},
		{"diameter_max_mm", r.DiameterMax}, {"gap_min_mm", r.GapMin}, {"wavelength_nm", r.Wavelength},
		{"field_angle_deg", r.FieldAngle}, {"power_w", r.Power}, {"top", float64(r.Top)},
		{"waist_in_mm", r.WaistIn}, {"waist_in_at_mm", r.WaistInAt}, {"m2", r.M2}, {"waist_out_at_mm", r.WaistOutAt},
		{"laser_exit_mm", r.LaserExit}, {"waist_out_mm", r.WaistOut}, {"coupling_min", r.CouplingMin}}
	for _, b := range r.Band {
		ns = append(ns, named{"band_nm", b})
	}
	return ns
}

func (r Requirement) validateFocus(ps *problems) {
	if r.EFL <= 0 {
		ps.add("a focus requirement needs a positive EFL ({efl_mm}); to spread a beam use {expansion}")
	} else if r.EFLTol.Abs(r.EFL) >= r.EFL {
		ps.add("the EFL tolerance {efl_tol} %s is as large as the EFL itself", r.EFLTol)
	}
	r.notFor(Focus, ps, named{"track_mm", r.Track}, named{"magnification", r.Mag}, named{"na", r.NA},
		named{"object_height_mm", r.ObjectHeight}, named{"working_distance_min_mm", r.WDMin}, named{"expansion", r.Expansion})
	if r.Form != AnyForm {
		ps.add("{form} applies to an expand requirement only")
	}
}

func (r Requirement) validateImage(ps *problems) {
	switch {
	case r.Track <= 0:
		ps.add("an image requirement needs a positive track ({track_mm}), object plane to image plane")
	case r.Mag == 0:
		ps.add("an image requirement needs a non-zero magnification ({magnification}); an object at infinity is a focus requirement ({efl_mm})")
	case r.MagTol.Abs(r.Mag) >= math.Abs(r.Mag):
		ps.add("the magnification tolerance {mag_tol} %s is as large as the magnification itself", r.MagTol)
	case r.WDMin+r.BFDMin >= r.Track:
		ps.add("the working distance minimum {working_distance_min_mm} %g mm and back clearance minimum {back_clearance_min_mm} %g mm leave nothing of the %g mm track", r.WDMin, r.BFDMin, r.Track)
	case r.Mag > 0 && r.MaxElements() == 1:
		ps.add("a single part forms an inverted real image (negative magnification); an erect image (%g) needs two {elements}", r.Mag)
	}
	r.notFor(Image, ps, named{"efl_mm", r.EFL}, named{"beam_mm", r.Beam}, named{"expansion", r.Expansion})
	if r.FieldAngle != 0 {
		ps.add("{field_angle_deg} does not apply to an image requirement: give {object_height_mm}")
	}
	if r.Form != AnyForm {
		ps.add("{form} applies to an expand requirement only")
	}
}

func (r Requirement) validateExpand(ps *problems) {
	switch {
	case r.Expansion <= 0:
		ps.add("a beam expansion ({expansion}) must be positive: output over input beam diameter")
	case r.ExpandTol.Abs(r.Expansion) >= r.Expansion:
		ps.add("the expansion tolerance {expand_tol} %s is as large as the expansion itself", r.ExpandTol)
	}
	if r.MaxElements() == 1 {
		ps.add("a beam expander needs two elements; drop {elements} 1")
	}
	if r.Form != AnyForm && r.Form != Keplerian && r.Form != Galilean {
		ps.add("unknown expander {form} %q: use keplerian or galilean", r.Form)
	}
	r.notFor(Expand, ps, named{"efl_mm", r.EFL}, named{"track_mm", r.Track}, named{"magnification", r.Mag},
		named{"na", r.NA}, named{"object_height_mm", r.ObjectHeight}, named{"working_distance_min_mm", r.WDMin},
		named{"back_clearance_min_mm", r.BFDMin}, named{"field_angle_deg", r.FieldAngle})
	if len(r.Band) > 0 {
		ps.add("{band_nm} does not apply to an expand requirement: expanders are ranked on first order only")
	}
}

func (r Requirement) notFor(kind Kind, ps *problems, fs ...named) {
	article := "a"
	if kind == Image || kind == Expand {
		article = "an"
	}
	for _, f := range fs {
		if f.v != 0 {
			ps.add("{%s} does not apply to %s %s requirement", f.key, article, kind)
		}
	}
}

func (r Requirement) validateCommon(ps *problems) {
	if r.Elements != 0 && r.Elements != 1 && r.Elements != 2 {
		ps.add("{elements} must be 1 or 2, not %d", r.Elements)
	}
	switch r.Prefer {
	case Balanced, PreferDraw, PreferShort, PreferCheap, PreferSharp, PreferRobust:
	default:
		ps.add("unknown preference {prefer} %q: use drawer, short, cheap, sharp or robust", r.Prefer)
	}
	if err := r.Build.Validate(); err != nil {
		ps.add("{build}: %s", err)
	}
	if r.LengthMax > 0 && r.LengthMax <= r.GapMin && r.MaxElements() == 2 && r.Kind == Expand {
		ps.add("the envelope maximum {envelope_max_mm} %g mm leaves no room for two parts %g mm apart", r.LengthMax, r.GapMin)
	}
}

// LengthLimit is the longest envelope a result may have: the length
// maximum when given, else SanityLength. TrackLimit is the longest track:
// SanityLength, or the length maximum when that is longer.
func (r Requirement) LengthLimit() float64 {
	if r.LengthMax > 0 {
		return r.LengthMax
	}
	return SanityLength
}

// TrackLimit: see LengthLimit.
func (r Requirement) TrackLimit() float64 { return math.Max(SanityLength, r.LengthMax) }

// Shown is how many results a search keeps: Top, or MaxShown for Top 0.
func (r Requirement) Shown() int {
	if r.Top <= 0 || r.Top > MaxShown {
		return MaxShown
	}
	return r.Top
}
