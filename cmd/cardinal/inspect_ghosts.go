package main

import (
	"math"

	"github.com/spf13/pflag"

	"cardinal/catalog/record"
	"cardinal/optics"
	"cardinal/search"
	"cardinal/search/present"
)

// ghostOptions are the ghost-focus flags of `cardinal inspect`. The laser
// beam is --beam (1/e^2 diameter, waist at the first vertex) or --waist-in
// with --waist-in-at; --power and --laser-exit come from the same flags
// find uses.
type ghostOptions struct {
	Ghosts             bool
	WaistIn, WaistInAt float64 // mm
	M2                 float64 // 0 means 1
	LaserExit          float64 // mm before the first vertex; 0 unknown
}

func (g *ghostOptions) flags(f *pflag.FlagSet) {
	f.BoolVar(&g.Ghosts, "ghosts", false, "list the ghost foci of a laser beam (--beam or --waist-in) instead of the cardinal points")
	f.Float64Var(&g.WaistIn, "waist-in", 0, "with --ghosts: input waist, 1/e^2 radius, mm (instead of --beam)")
	f.Float64Var(&g.WaistInAt, "waist-in-at", 0, "with --ghosts: input waist's distance before the first vertex, mm")
	f.Float64Var(&g.M2, "m2", 0, "with --ghosts: beam quality M^2 (default 1)")
	f.Float64Var(&g.LaserExit, "laser-exit", 0, "with --ghosts: the laser's exit aperture before the first vertex, mm (flags ghosts near it)")
}

// validate checks the ghost flags with the real-ray flags they share.
func (g ghostOptions) validate(ro rayOptions) error {
	if !g.Ghosts {
		if g.WaistIn != 0 || g.WaistInAt != 0 || g.M2 != 0 || g.LaserExit != 0 {
			return usageErrorf("--waist-in, --waist-in-at, --m2 and --laser-exit go with --ghosts")
		}
		return nil
	}
	for name, v := range map[string]float64{"--waist-in": g.WaistIn, "--waist-in-at": g.WaistInAt, "--m2": g.M2, "--laser-exit": g.LaserExit} {
		if math.IsNaN(v) || math.IsInf(v, 0) || v < 0 && name != "--waist-in-at" {
			return usageErrorf("%s %g: give a positive number", name, v)
		}
	}
	switch {
	case (ro.Beam > 0) == (g.WaistIn > 0):
		return usageErrorf("--ghosts needs the laser beam: --beam (1/e^2 diameter, waist at the first vertex) or --waist-in, one of them")
	case ro.NA > 0 || ro.FieldAngle > 0 || len(ro.Band) > 0 || ro.ObjectDistance > 0 || ro.ObjectHeight > 0:
		return usageErrorf("--ghosts takes --beam or --waist-in, --wavelength, --power and --laser-exit; the other real-ray flags do not apply")
	case g.M2 != 0 && g.M2 < 1:
		return usageErrorf("--m2 %g: M^2 is at least 1", g.M2)
	case g.WaistInAt != 0 && g.WaistIn == 0:
		return usageErrorf("--waist-in-at places the input waist: give --waist-in too")
	}
	return nil
}

// requirement is the laser requirement the ghost figures are judged with.
func (g ghostOptions) requirement(ro rayOptions, wl float64) search.Requirement {
	return search.Requirement{Kind: search.Focus, Laser: true, Beam: ro.Beam, Power: ro.Power, Wavelength: wl,
		WaistIn: g.WaistIn, WaistInAt: g.WaistInAt, M2: g.M2, LaserExit: g.LaserExit}
}

// writeGhosts prints the ghost foci of the parts, the notes that go with
// them, and the laser cautions.
func writeGhosts(o *inspectOptions, entries []record.Entry, in, out optics.Medium) error {
	req := o.Ghosts.requirement(o.Rays, o.Wavelength)
	var all []search.PartGhosts
	var lists []present.GhostList
	for _, e := range entries {
		pg := search.InspectGhosts(e, search.InspectSetting{Reverse: o.Reverse, Wavelength: o.Wavelength, In: in, Out: out}, req)
		all = append(all, pg)
		name := pg.Supplier + ":" + pg.Part
		if pg.Reversed {
			name += " (reversed)"
		}
		lists = append(lists, present.GhostList{Name: name, Ghosts: pg.Ghosts})
		if pg.Virtual > 0 {
			notef(o.env, "note: %s: %d %s (virtual focus), not listed\n", e.Part.ID(), pg.Virtual,
				map[bool]string{true: "reflected beam only diverges", false: "reflected beams only diverge"}[pg.Virtual == 1])
		}
	}
	printCautions(o.env, req, search.GhostNotes(req), nil)
	return render(o.env, o.env.Out, outputFlags{Format: o.Format}, present.Ghosts(lists, true), all)
}
