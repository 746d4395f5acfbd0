package search

import "math"

// Checks a layout can fail, one bit each.
const (
	failTarget    uint16 = 1 << iota // EFL, magnification or expansion out of tolerance
	failForm                         // Keplerian asked, Galilean found, or the other way
	failBack                         // back clearance below the minimum
	failWD                           // working distance below the minimum
	failGap                          // facing surfaces closer than the gap minimum
	failEnvelope                     // longer than the length maximum
	failAperture                     // a ray height exceeds a part's clear aperture
	failDrawer                       // the drawer holds fewer pieces than needed
	failCollimate                    // laser expander: no gap puts the output waist where asked
	failCoupling                     // mode matching: coupling below the minimum
	failLast      = failCoupling
)

// checkNames are the names of the checks in output, in bit order.
var checkNames = []string{"target", "form", "back_clearance", "working_distance", "gap", "envelope", "aperture", "drawer", "collimation", "coupling"}

// layout is one way to use one candidate or two: the solved distances, the
// achieved first-order figure and the checks.
type layout struct {
	a, b  int32 // candidate indices; b < 0 for a singlet
	root  int8  // which root of the solve (0 or 1)
	gap   float64
	wd    float64 // working distance; NaN for an object at infinity
	bc    float64 // back clearance; NaN for an afocal system
	env   float64 // envelope, first to last vertex
	track float64 // object (or first vertex) to image; NaN for an afocal system
	value float64 // achieved EFL, magnification or expansion
	err   float64 // value - target
	form  Form

	edge     float64 // edge clearance between the facing surfaces, or a lower bound on it (pairs)
	vigRatio float64 // largest ray height over clear semi-aperture; 0 unchecked
	vigPart  int8    // the part (0 or 1) where vigRatio occurs
	fails    uint16
	score    float64
}

func (l *layout) meets() bool   { return l.fails == 0 }
func (l *layout) pair() bool    { return l.b >= 0 }
func (l *layout) elements() int { return 1 + b2i(l.b >= 0) }

func b2i(b bool) int {
	if b {
		return 1
	}
	return 0
}

// better is the ranking order: meets every check first, then the lower
// score, then fewer parts, then the part IDs, orientations and root, so
// that ties always fall the same way.
func (s *search) better(x, y *layout) bool {
	if x.meets() != y.meets() {
		return x.meets()
	}
	if x.score != y.score {
		return x.score < y.score
	}
	if x.elements() != y.elements() {
		return x.elements() < y.elements()
	}
	if k, l := s.sortKey(x.a), s.sortKey(y.a); k != l {
		return k < l
	}
	if x.b != y.b {
		if x.b < 0 || y.b < 0 {
			return x.b < y.b
		}
		if k, l := s.sortKey(x.b), s.sortKey(y.b); k != l {
			return k < l
		}
	}
	return x.root < y.root
}

// sortKey orders candidates by part ID, then orientation.
func (s *search) sortKey(i int32) int64 {
	c := &s.c[i]
	return int64(s.keys[c.item])*2 + int64(b2i(c.rev))
}

// scoredLength is the length the envelope term of the score counts: the
// envelope, or for mode matching the whole track from waist to waist
// (without a fixed track the shortest layout is the aim; with one it is
// the same for all). It is never less than the envelope, so the pruning's
// bounds on the envelope bound it too.
func (s *search) scoredLength(l *layout) float64 {
	if s.req.Kind == Match {
		return l.track
	}
	return l.env
}

// finish computes the score and applies the checks common to every kind.
// It returns false, with the layout only counted as solved, when the score
// alone keeps the layout out of the results: the checks would change
// nothing.
func (s *search) finish(l *layout) bool {
	a := &s.c[l.a]
	if l.pair() {
		b := &s.c[l.b]
		l.score = s.sc.pair(l.err, s.scoredLength(l), pairAway(a, b), s.pairPrice(a, b))
	} else {
		l.score = s.sc.singlet(a, l.err, s.scoredLength(l))
	}
	if b := s.bound(); l.score > b+margin(b) {
		s.solved++
		return false
	}
	r := &s.req
	if math.Abs(l.err) > s.tol+onTarget(s.req) {
		l.fails |= failTarget
	}
	if !math.IsNaN(l.bc) && l.bc < r.BFDMin {
		l.fails |= failBack
	}
	if !math.IsNaN(l.wd) && l.wd < r.WDMin {
		l.fails |= failWD
	}
	if l.env > r.LengthLimit() || l.track > r.TrackLimit() {
		l.fails |= failEnvelope // NaN tracks (afocal) compare false
	}
	if l.pair() {
		b := &s.c[l.b]
		if l.edge = s.quickClearance(a, b, l.gap); l.edge < r.GapMin {
			l.edge = s.edgeClearance(a, b, l.gap)
		}
		if l.edge < r.GapMin {
			l.fails |= failGap
		}
		if a.item == b.item && r.DrawerOnly && a.qty < 2 {
			l.fails |= failDrawer
		}
	}
	if r.ChecksAperture() {
		s.rayHeights(l)
		if l.vigRatio > 1 {
			l.fails |= failAperture
		}
	}
	return true
}
