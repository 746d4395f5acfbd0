package solution

import (
	"fmt"
	"math"

	"cardinal/catalog/record"
	"cardinal/optics"
	"cardinal/search"
)

// A Solution is one result of a search rebuilt into an optical system from
// the catalog's prescriptions: the parts in light order, turned as the
// result says, at the solved spacings.
type Solution struct {
	Requirement search.Requirement
	Result      search.Result
	// Entries are the catalog entries of Result.Parts, in the same order,
	// as stored (not turned around).
	Entries []record.Entry
	// Parts are the parts as used: in light order, reversed where the
	// result says so.
	Parts []optics.Part
	// Gaps[i] is the air gap from part i's last vertex to part i+1's first.
	Gaps []float64
	// ObjectZ is the object plane from the first vertex (negative), or
	// -Inf for an object at infinity.
	ObjectZ float64 `finite:"-"`
	// ImageZ is the image (or focal) plane from the last vertex; NaN for an
	// afocal solution. Both are sentinels, passed over by the finite guard.
	ImageZ float64 `finite:"-"`
}

// New rebuilds a result from the catalog entries, keyed by
// SUPPLIER:PART. A part the catalog no longer holds, or a result that lacks
// a distance its kind needs, is an error.
func New(req search.Requirement, r search.Result, entries map[string]record.Entry) (Solution, error) {
	s := Solution{Requirement: req, Result: r, ObjectZ: math.Inf(-1), ImageZ: math.NaN()}
	if len(r.Parts) == 0 {
		return Solution{}, fmt.Errorf("result %d lists no parts", r.Rank)
	}
	for _, u := range r.Parts {
		e, ok := entries[u.ID()]
		if !ok {
			return Solution{}, fmt.Errorf("result %d: part %s is no longer in the catalog", r.Rank, u.ID())
		}
		p := e.Part
		if u.Reversed {
			p = p.Reversed()
		}
		s.Entries, s.Parts = append(s.Entries, e), append(s.Parts, p)
	}
	if len(s.Parts) > 1 {
		if r.Gap == nil {
			return Solution{}, fmt.Errorf("result %d: a pair without a gap", r.Rank)
		}
		s.Gaps = []float64{*r.Gap}
	}
	if req.Kind == search.Image {
		if r.WorkingDistance == nil {
			return Solution{}, fmt.Errorf("result %d: an image solution without a working distance", r.Rank)
		}
		s.ObjectZ = -*r.WorkingDistance
	}
	if r.BackClearance != nil {
		s.ImageZ = *r.BackClearance
	}
	return s, nil
}

// System is the solution's optical system in air.
func (s Solution) System() optics.System {
	return optics.Assemble(nil, nil, s.Parts, s.Gaps)
}

// Wavelength is the requirement's wavelength, nm.
func (s Solution) Wavelength() float64 { return s.Requirement.Lambda() }

// Afocal tells whether the solution has no image plane (a beam expander).
func (s Solution) Afocal() bool { return math.IsNaN(s.ImageZ) }

// Envelope is the first to last vertex, mm.
func (s Solution) Envelope() float64 { return s.System().Length() }

// Object is the object of the requirement for the ray tracer: at infinity
// with the beam diameter, or at the working distance with the NA; the
// aperture stop at the first surface, as the search assumes. Without a
// beam or NA the bundle fills the first surface's clear aperture.
func (s Solution) Object() optics.Object {
	o := optics.Object{Z: s.ObjectZ}
	if math.IsInf(s.ObjectZ, -1) {
		o.Aperture.Beam = s.Requirement.Beam
	} else {
		o.Aperture.NA = s.Requirement.NA
	}
	return o
}

// Verify recomputes the solution's first-order figures from today's
// catalog and lists, in words, every one that differs from what the search
// saved (a part re-imported with another prescription since, say). An
// empty list means the rebuilt system is the one the search found.
func (s Solution) Verify() []string {
	sys := s.System()
	c := sys.Cardinal(s.Wavelength())
	var diffs []string
	differ := func(what string, saved *float64, now float64) {
		if saved != nil && !near(*saved, now) {
			diffs = append(diffs, fmt.Sprintf("result %d: %s is now %.6g, the search saved %.6g", s.Result.Rank, what, now, *saved))
		}
	}
	differ("envelope (mm)", &s.Result.Envelope, sys.Length())
	switch s.Requirement.Kind {
	case search.Focus:
		differ("EFL (mm)", s.Result.EFL, c.EFL)
		differ("back clearance (mm)", s.Result.BackClearance, c.BFD())
	case search.Image:
		z, m, _ := c.Image(s.ObjectZ)
		differ("back clearance (mm)", s.Result.BackClearance, z)
		differ("magnification", s.Result.Magnification, m)
	case search.Expand:
		differ("expansion", s.Result.Expansion, math.Abs(c.LateralMagnification))
	}
	return diffs
}

// near compares a saved figure with a recomputed one: within 1e-6
// relative, or 1e-6 absolute near zero (JSON keeps 17 digits, so this
// only catches a real change).
func near(a, b float64) bool {
	return math.Abs(a-b) <= 1e-6*math.Max(1, math.Max(math.Abs(a), math.Abs(b)))
}

// Setup is the solution as the build study sees it (search.StudyBuild):
// its parts as used, their stated tolerances and the solved distances.
func (s Solution) Setup() search.Setup {
	su := search.Setup{Parts: s.Parts}
	for _, e := range s.Entries {
		su.Tols = append(su.Tols, e.Tolerances)
	}
	if len(s.Gaps) > 0 {
		su.Gap = s.Gaps[0]
	}
	if !math.IsInf(s.ObjectZ, 0) {
		su.WorkingDistance = -s.ObjectZ
	}
	if !math.IsNaN(s.ImageZ) {
		su.BackClearance = s.ImageZ
	}
	return su
}
