package search

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"math"
	"strings"

	"cardinal/optics"
)

// Kind is what a requirement asks of the optics.
type Kind string

// The three requirement kinds (see DESIGN.md, "Requirement kinds").
const (
	Focus  Kind = "focus"  // infinite conjugate: an EFL, focusing a collimated beam
	Image  Kind = "image"  // finite conjugate: a track and a magnification
	Expand Kind = "expand" // afocal: a beam-expansion ratio
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

	// Build says how every ranked result is simulated as built (build.go).
	Build BuildSettings `json:"build,omitzero"`
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
	return r.Beam > 0 || r.NA > 0 || r.ObjectHeight > 0
}

// IsLaser tells whether the requirement names a laser: the laser switch, a
// power given, or a wavelength outside the visible 400-700 nm (common
// practice). A laser is one wavelength: plots, spots and the
// diffraction-limited verdict use the requirement's wavelength alone
// unless a band is given.
func (r Requirement) IsLaser() bool {
	l := r.Lambda()
	return r.Laser || r.Power > 0 || l < 400 || l > 700
}

// Validate rejects impossible or contradictory requirements before any
// search, every problem in one error.
func (r Requirement) Validate() error {
	var errs []string
	bad := func(format string, a ...any) { errs = append(errs, fmt.Sprintf(format, a...)) }
	for _, f := range r.numbers() {
		if math.IsNaN(f.v) || math.IsInf(f.v, 0) {
			bad("%s must be a finite number", f.name)
		} else if f.v < 0 && f.name != "magnification" {
			bad("%s is negative (%g)", f.name, f.v)
		}
	}
	if len(errs) > 0 {
		return joinProblems(errs)
	}
	switch r.Kind {
	case Focus:
		r.validateFocus(bad)
	case Image:
		r.validateImage(bad)
	case Expand:
		r.validateExpand(bad)
	default:
		bad("say what to find: an EFL (--efl), a track and magnification (--track, --mag), or a beam expansion (--expand)")
	}
	r.validateCommon(bad)
	return joinProblems(errs)
}

type named struct {
	name string
	v    float64
}

func (r Requirement) numbers() []named {
	return []named{{"efl", r.EFL}, {"efl tolerance", r.EFLTol.Value}, {"track", r.Track},
		{"magnification", r.Mag}, {"magnification tolerance", r.MagTol.Value},
		{"object height", r.ObjectHeight}, {"NA", r.NA}, {"working distance minimum", r.WDMin},
		{"expansion", r.Expansion}, {"expansion tolerance", r.ExpandTol.Value}, {"beam", r.Beam},
		{"back clearance minimum", r.BFDMin}, {"length maximum", r.LengthMax},
		{"diameter maximum", r.DiameterMax}, {"gap minimum", r.GapMin}, {"wavelength", r.Wavelength},
		{"field angle", r.FieldAngle}, {"power", r.Power}}
}

func (r Requirement) validateFocus(bad func(string, ...any)) {
	if r.EFL <= 0 {
		bad("a focus requirement needs a positive EFL (--efl); to spread a beam use --expand")
	} else if r.EFLTol.Abs(r.EFL) >= r.EFL {
		bad("the EFL tolerance %s is as large as the EFL itself", r.EFLTol)
	}
	r.notFor("focus", bad, named{"--track", r.Track}, named{"--mag", r.Mag}, named{"--na", r.NA},
		named{"--object-height", r.ObjectHeight}, named{"--working-distance-min", r.WDMin}, named{"--expand", r.Expansion})
	if r.Form != AnyForm {
		bad("--galilean and --keplerian apply to --expand only")
	}
	if r.FieldAngle >= 90 {
		bad("a field angle of %g degrees is not below 90", r.FieldAngle)
	}
}

func (r Requirement) validateImage(bad func(string, ...any)) {
	switch {
	case r.Track <= 0:
		bad("an image requirement needs a positive track (--track), object plane to image plane")
	case r.Mag == 0:
		bad("an image requirement needs a non-zero magnification (--mag); an object at infinity is a focus requirement (--efl)")
	case r.MagTol.Abs(r.Mag) >= math.Abs(r.Mag):
		bad("the magnification tolerance %s is as large as the magnification itself", r.MagTol)
	case r.WDMin+r.BFDMin >= r.Track:
		bad("the working distance minimum %g mm and back clearance minimum %g mm leave nothing of the %g mm track", r.WDMin, r.BFDMin, r.Track)
	case r.Mag > 0 && r.MaxElements() == 1:
		bad("a single part forms an inverted real image (negative magnification); an erect image (%g) needs two elements", r.Mag)
	}
	if r.NA >= 1 {
		bad("an NA in air must be below 1, not %g", r.NA)
	}
	r.notFor("image", bad, named{"--efl", r.EFL}, named{"--beam", r.Beam}, named{"--expand", r.Expansion},
		named{"--field-angle (for an image give --object-height)", r.FieldAngle})
	if r.Form != AnyForm {
		bad("--galilean and --keplerian apply to --expand only")
	}
}

func (r Requirement) validateExpand(bad func(string, ...any)) {
	switch {
	case r.Expansion <= 0:
		bad("a beam expansion (--expand) must be positive: output over input beam diameter")
	case r.ExpandTol.Abs(r.Expansion) >= r.Expansion:
		bad("the expansion tolerance %s is as large as the expansion itself", r.ExpandTol)
	}
	if r.MaxElements() == 1 {
		bad("a beam expander needs two elements; drop --elements 1")
	}
	if r.Form != AnyForm && r.Form != Keplerian && r.Form != Galilean {
		bad("unknown expander form %q: use keplerian or galilean", r.Form)
	}
	r.notFor("expand", bad, named{"--efl", r.EFL}, named{"--track", r.Track}, named{"--mag", r.Mag},
		named{"--na", r.NA}, named{"--object-height", r.ObjectHeight}, named{"--working-distance-min", r.WDMin},
		named{"--back-clearance-min", r.BFDMin}, named{"--field-angle", r.FieldAngle})
	if len(r.Band) > 0 {
		bad("--band does not apply to an expand requirement: expanders are ranked on first order only")
	}
}

func (r Requirement) notFor(kind string, bad func(string, ...any), fs ...named) {
	for _, f := range fs {
		if f.v != 0 {
			bad("%s does not apply to %s %s requirement", f.name, map[bool]string{true: "an", false: "a"}[kind == "image" || kind == "expand"], kind)
		}
	}
}

func (r Requirement) validateCommon(bad func(string, ...any)) {
	if r.Elements != 0 && r.Elements != 1 && r.Elements != 2 {
		bad("--elements must be 1 or 2, not %d", r.Elements)
	}
	if r.Top < 0 {
		bad("--top must be 0 (all) or more, not %d", r.Top)
	}
	if l := r.Lambda(); l < 150 || l > 20000 {
		bad("wavelength %g nm is outside 150-20000 nm", l)
	}
	switch r.Prefer {
	case Balanced, PreferDraw, PreferShort, PreferCheap, PreferSharp, PreferRobust:
	default:
		bad("unknown preference %q: use drawer, short, cheap, sharp or robust", r.Prefer)
	}
	if err := r.Build.Validate(); err != nil {
		bad("%v", err)
	}
	for _, b := range r.Band {
		if !(b >= 150 && b <= 20000) {
			bad("band wavelength %g nm is outside 150-20000 nm", b)
		}
	}
	if r.LengthMax > 0 && r.LengthMax <= r.GapMin && r.MaxElements() == 2 && r.Kind == Expand {
		bad("the length maximum %g mm leaves no room for two parts %g mm apart", r.LengthMax, r.GapMin)
	}
}

func joinProblems(errs []string) error {
	if len(errs) == 0 {
		return nil
	}
	return errors.New("requirement: " + strings.Join(errs, "; "))
}
