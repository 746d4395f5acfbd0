package drawing

import (
	"math"

	"cardinal/optics"
	"cardinal/search"
)

// A GhostMark is a ghost focus on the drawing: light of the laser
// reflected at lens surfaces that comes to a focus (search.GhostFocus, z
// from the first vertex). Number is its place in the list of all the
// layout's ghosts, most concentrated first (search.ResultGhosts), as the
// report numbers them; the label reads G and the number.
type GhostMark struct {
	Number int
	search.GhostFocus
}

// ghosts places the ghost foci of a laser requirement worth a mark: each
// flagged one and the most concentrated. One further than a fifth of the
// drawing's length outside it is listed in OffGhosts instead, as the
// cardinal points are.
func (sc *Scene) ghosts(sys optics.System) {
	s := sc.Solution
	if !s.Requirement.IsLaser() {
		return
	}
	gs, _ := search.ResultGhosts(sys, s.Requirement, s.Result)
	w := sc.XMax - sc.XMin
	lo, hi := sc.XMin-0.2*w, sc.XMax+0.2*w
	for i, g := range gs {
		if i > 0 && !g.Flagged() {
			continue
		}
		m := GhostMark{Number: i + 1, GhostFocus: g}
		if g.Z < lo || g.Z > hi {
			sc.OffGhosts = append(sc.OffGhosts, m)
			continue
		}
		sc.Ghosts = append(sc.Ghosts, m)
		sc.XMin, sc.XMax = math.Min(sc.XMin, g.Z), math.Max(sc.XMax, g.Z)
	}
}
