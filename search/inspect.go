package search

import (
	"fmt"
	"math"
	"strconv"

	"cardinal/catalog/record"
	"cardinal/optics"
)

// An Inspection is what `cardinal inspect` tells of one part at one
// wavelength: every cardinal point, the length, edge thickness and indices,
// the tolerances the build study gives the part and, when a real-ray
// setting is asked, the real-ray figures. The JSON keys are those the
// command prints; focal quantities are null for an afocal part.
type Inspection struct {
	Supplier             string   `json:"supplier"`
	Part                 string   `json:"part"`
	Reversed             bool     `json:"reversed"`
	WavelengthNm         float64  `json:"wavelength_nm"`
	LengthMm             float64  `json:"length_mm"`
	EFLMm                *float64 `json:"efl_mm"`
	FFrontMm             *float64 `json:"f_front_mm"`
	FBackMm              *float64 `json:"f_back_mm"`
	FFDMm                *float64 `json:"ffd_mm"`
	BFDMm                *float64 `json:"bfd_mm"`
	FocalMm              *float64 `json:"focal_mm"`
	FocalPrimeMm         *float64 `json:"focal_prime_mm"`
	PrincipalMm          *float64 `json:"principal_mm"`
	PrincipalPrimeMm     *float64 `json:"principal_prime_mm"`
	NodalMm              *float64 `json:"nodal_mm"`
	NodalPrimeMm         *float64 `json:"nodal_prime_mm"`
	AntiPrincipalMm      *float64 `json:"antiprincipal_mm"`
	AntiPrincipalPrimeMm *float64 `json:"antiprincipal_prime_mm"`
	AntiNodalMm          *float64 `json:"antinodal_mm"`
	AntiNodalPrimeMm     *float64 `json:"antinodal_prime_mm"`
	EdgeThicknessMm      float64  `json:"edge_thickness_mm"`
	// Tolerances are the part's manufacturing tolerances: as stated, the
	// defaults where not (InspectSetting.Defaults); StatedTolerances is
	// true when the part states any, TolerancesFrom says for each
	// ("stated", or what the defaults are called) by its JSON key.
	Tolerances       optics.Tolerances `json:"tolerances"`
	StatedTolerances bool              `json:"tolerances_stated"`
	TolerancesFrom   map[string]string `json:"tolerances_from"`
	// ResidualReflectancePct is the stated coating (the reflectance of
	// each surface bordering air, %); null when not stated.
	ResidualReflectancePct *float64 `json:"residual_reflectance_pct"`
	Warnings               []string `json:"warnings"`
	// ImageQuality holds the real-ray figures, its keys inline; nil
	// unless a real-ray setting is asked and the part can be traced.
	*ImageQuality

	// For people, not in JSON:
	// RaySetting is the real-ray setting in words ("" when none is asked).
	RaySetting  string          `json:"-"`
	Description string          `json:"-"`
	Diameter    float64         `json:"-"` // mm
	Cardinal    optics.Cardinal `json:"-"`
	Media       []optics.Medium `json:"-"` // object space, each gap, image space
	Indices     []float64       `json:"-"` // of Media at the wavelength
}

// ID is SUPPLIER:PART.
func (r Inspection) ID() string { return r.Supplier + ":" + r.Part }

// An InspectSetting says how a part is inspected. Wavelength 0 means the
// d line; nil media are air.
type InspectSetting struct {
	Reverse    bool // turn the part around
	Wavelength float64
	In, Out    optics.Medium // object and image space
	Rays       RaySetting    // zero traces nothing
	// Defaults are the tolerances of a part that states none (the
	// catalog's, for a catalog part) and DefaultsFrom what they are called
	// ("catalog default"); zero: optics.DefaultTolerances, "default".
	Defaults     optics.Tolerances
	DefaultsFrom string
}

// A RaySetting is how a part is traced with real rays when inspected. The
// zero value traces nothing.
type RaySetting struct {
	Beam, NA       float64   // collimated beam diameter, mm; object-space NA
	ObjectDistance float64   // object plane in front of the first vertex, mm (NA); 0: the -1x conjugate
	ObjectHeight   float64   // field edge for NA, mm
	FieldAngle     float64   // field edge for Beam, degrees
	Band           []float64 // nm; none: no colour figure
	Power          float64   // W, with Beam: a laser
}

// Traces tells whether the setting asks for real rays.
func (s RaySetting) Traces() bool { return s.Beam > 0 || s.NA > 0 }

// IsLaser tells whether the traced light is to be treated as a laser, by
// the rule of Requirement.IsLaser: a power given, or a wavelength (nm)
// outside the visible.
func (s RaySetting) IsLaser(wavelength float64) bool {
	return s.Traces() && laserLight(s.Power, wavelength)
}

// Inspect works out the figures of one part.
func Inspect(e record.Entry, s InspectSetting) Inspection {
	wl := s.Wavelength
	if wl == 0 {
		wl = optics.LineD
	}
	p := e.Part
	if s.Reverse {
		p = p.Reversed()
	}
	sys := p.System(s.In, s.Out)
	in, out := s.In, s.Out
	if in == nil {
		in = optics.Air
	}
	if out == nil {
		out = optics.Air
	}
	c := sys.Cardinal(wl)
	edge, err := p.EdgeThickness()
	warnings := append([]string{}, e.Warnings...)
	if err != nil {
		warnings = append(warnings, fmt.Sprintf("edge thickness: %v", err))
	}
	warnings = append(warnings, sys.RangeWarnings(wl)...)
	r := Inspection{Supplier: p.Supplier, Part: p.Name, Reversed: s.Reverse, WavelengthNm: wl,
		LengthMm: c.Length, EdgeThicknessMm: edge, Description: p.Description, Diameter: p.Diameter,
		Cardinal: c, Media: append(append([]optics.Medium{in}, p.Media...), out), Indices: sys.Indices(wl)}
	if c.Afocal {
		warnings = append(warnings, fmt.Sprintf("afocal at %s nm: angular magnification %.6g; the part has no focal, principal or nodal points", gNum(wl), c.AngularMagnification))
	} else {
		v := func(x float64) *float64 { return &x }
		r.EFLMm, r.FFrontMm, r.FBackMm = v(c.EFL), v(c.FFront), v(c.FBack)
		r.FFDMm, r.BFDMm, r.FocalMm, r.FocalPrimeMm = v(c.F), v(c.FPrime), v(c.F), v(c.FPrime)
		r.PrincipalMm, r.PrincipalPrimeMm, r.NodalMm, r.NodalPrimeMm = v(c.P), v(c.PPrime), v(c.N), v(c.NPrime)
		r.AntiPrincipalMm, r.AntiPrincipalPrimeMm, r.AntiNodalMm, r.AntiNodalPrimeMm = v(c.AP), v(c.APPrime), v(c.AN), v(c.ANPrime)
	}
	r.setTolerances(e.Tolerances, s)
	if p.Coating.Stated {
		r.ResidualReflectancePct = &p.Coating.ResidualPct
	}
	r.Warnings = warnings
	if s.Rays.Traces() {
		s.Rays.judge(&r, sys, c, wl)
	}
	return r
}

// judge traces the system and fills the inspection's real-ray figures, or
// adds a warning saying why it cannot be traced.
func (s RaySetting) judge(r *Inspection, sys optics.System, c optics.Cardinal, wl float64) {
	cond, text, err := s.Conditions(c, wl)
	r.RaySetting = text
	if err == nil {
		var q optics.Quality
		if q, err = sys.Assess(cond); err == nil {
			iq := NewImageQuality(q, cond.Field != 0, cond.Band)
			r.ImageQuality = &iq
			r.Warnings = append(r.Warnings, q.Warnings...)
			return
		}
	}
	r.Warnings = append(r.Warnings, "real rays not traced: "+err.Error())
}

// Conditions are the real-ray conditions of the setting for a part with
// cardinal points c at wavelength wl (nm), with the setting in words. With
// an NA and no object distance the object sits at the -1x conjugate, twice
// the focal length before the front principal point (Newton's equation
// x x' = f f' with m = -x/f = -1: x = f; Hecht, Optics, 5th ed., sec.
// 5.2.3), the symmetric finite conjugate, which needs no further choice.
// The image plane is the paraxial image, which must be real (behind the
// last vertex).
func (s RaySetting) Conditions(c optics.Cardinal, wl float64) (optics.Conditions, string, error) {
	cond := optics.Conditions{Reference: wl, Band: s.Band}
	if c.Afocal {
		return cond, "real rays: none (afocal)", fmt.Errorf("an afocal part has no focus to judge")
	}
	var text string
	if s.Beam > 0 {
		cond.Object = optics.Object{Z: math.Inf(-1), Aperture: optics.Aperture{Beam: s.Beam}}
		cond.Field = s.FieldAngle
		text = fmt.Sprintf("real rays: %s mm collimated beam", gNum(s.Beam))
		if s.FieldAngle > 0 {
			text += fmt.Sprintf(", field edge %s deg", gNum(s.FieldAngle))
		}
	} else {
		z, how := -s.ObjectDistance, ""
		if s.ObjectDistance == 0 {
			var st optics.ConjugateStatus
			z, _, st = c.ForMagnification(-1)
			how = " (the -1x conjugate)"
			if st != optics.Solved || !(z < 0) {
				return cond, "real rays: NA " + gNum(s.NA), fmt.Errorf("no real object images at -1x (EFL %.2f mm); give --object-distance", c.EFL)
			}
		}
		cond.Object = optics.Object{Z: z, Aperture: optics.Aperture{NA: s.NA}}
		cond.Field = s.ObjectHeight
		text = fmt.Sprintf("real rays: NA %s, object %.3f mm in front of the first vertex%s", gNum(s.NA), -z, how)
		if s.ObjectHeight > 0 {
			text += fmt.Sprintf(", object height %s mm", gNum(s.ObjectHeight))
		}
	}
	zi, _, st := c.Image(cond.Object.Z)
	if st != optics.Solved || !(zi > 0) {
		return cond, text, fmt.Errorf("the image is not real (paraxial image at %.3f mm from the last vertex); real-ray figures need a real focus", zi)
	}
	return cond, text + fmt.Sprintf("; image plane %.3f mm behind the last vertex", zi), nil
}

// gNum is the shortest text of v that reads back as v.
func gNum(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }

// PartGhosts are the ghost foci of one part, in JSON as inspect prints
// them.
type PartGhosts struct {
	Supplier string       `json:"supplier"`
	Part     string       `json:"part"`
	Reversed bool         `json:"reversed"`
	Ghosts   []GhostFocus `json:"ghosts"`
	// Virtual counts the reflections whose beam only diverges.
	Virtual int `json:"virtual"`
}

// InspectGhosts finds the ghost foci of one part (turned around when the
// setting says so, between its media) for a laser requirement: the beam
// of Requirement.InputBeam, in the object space's index.
func InspectGhosts(e record.Entry, s InspectSetting, req Requirement) PartGhosts {
	p := e.Part
	if s.Reverse {
		p = p.Reversed()
	}
	sys := p.System(s.In, s.Out)
	beam := req.inputBeamIn(sys.Indices(req.Lambda())[0])
	gs, virtual := Ghosts(sys, req, beam)
	if gs == nil {
		gs = []GhostFocus{}
	}
	return PartGhosts{Supplier: p.Supplier, Part: p.Name, Reversed: s.Reverse, Ghosts: gs, Virtual: virtual}
}

// setTolerances fills the part's tolerances: each one the part states,
// the setting's defaults for the rest, and which is which.
func (r *Inspection) setTolerances(stated optics.Tolerances, s InspectSetting) {
	word := s.DefaultsFrom
	if word == "" {
		word = "default"
	}
	r.Tolerances = stated.Or(s.Defaults).Or(optics.DefaultTolerances)
	r.StatedTolerances = stated != (optics.Tolerances{})
	from := func(v float64) string {
		if v != 0 {
			return "stated"
		}
		return word
	}
	r.TolerancesFrom = map[string]string{"efl_pct": from(stated.EFLPct), "thickness_mm": from(stated.Thickness),
		"index": from(stated.Index), "radius_pct": from(stated.RadiusPct)}
}
