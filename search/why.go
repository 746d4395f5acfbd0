package search

import (
	"fmt"
	"math"

	"cardinal/optics"
)

// failText says what each check's failure means, in bit order.
var failText = []string{
	"off the first-order target",
	"of the other expander form",
	"back clearance below the minimum",
	"working distance below the minimum",
	"facing surfaces closer than the gap minimum",
	"longer than the envelope maximum (or the 10 m sanity limit)",
	"vignette: a ray height exceeds a clear aperture",
	"need more pieces than the drawer holds",
	"no gap collimates the laser beam with its waist where asked",
	"couple less than the coupling minimum",
}

// why explains in words an outcome with no result.
func (s *search) why(p *prepared) []string {
	if len(p.cands) == 0 {
		return []string{"no part is left to search after the filters (see the notes)"}
	}
	if s.solved == 0 {
		return s.whyUnsolved()
	}
	w := []string{fmt.Sprintf("%d %s the first-order target, but none meets every constraint:", s.solved, plural(s.solved, "layout reaches", "layouts reach"))}
	for i, text := range failText {
		if n := s.failed[1<<i]; n > 0 {
			w = append(w, fmt.Sprintf("  %d %s", n, text))
		}
	}
	return w
}

func (s *search) whyUnsolved() []string {
	r := &s.req
	pairs := r.MaxElements() == 2
	var w []string
	switch r.Kind {
	case Focus:
		w = append(w, fmt.Sprintf("no single part has an EFL within %.3g mm of %g mm", s.tol, r.EFL))
		if pairs {
			w = append(w, "no pair reaches that EFL within the gap, length and back-clearance limits")
		}
	case Image:
		w = append(w, s.whyImageSinglet())
		if pairs {
			w = append(w, fmt.Sprintf("no pair forms a real image at %g on the %g mm track within the gap, length, working-distance and back-clearance limits", r.Mag, r.Track))
		}
	case Expand:
		form := "pair"
		if r.Form != AnyForm {
			form = string(r.Form) + " pair"
		}
		w = append(w, fmt.Sprintf("no %s of parts has a focal-length ratio within %.3g of %g and fits the gap and length limits", form, s.tol, r.Expansion))
	case Match:
		f0 := optics.ModeMatchFocal(r.WaistIn, r.WaistOut, r.Lambda())
		if r.Track > 0 {
			w = append(w, fmt.Sprintf("no single part couples %g or more on the %g mm track", r.MinCoupling(), r.Track))
		} else {
			w = append(w, fmt.Sprintf("no single part of focal length at least f0 = %.1f mm (pi w1 w2 / lambda) places both waists with positive working distance and back clearance", f0))
		}
		if pairs {
			w = append(w, "no pair matches the waists within the gap, length, working-distance and back-clearance limits")
		}
	}
	if s.unverified > 0 {
		w = append(w, fmt.Sprintf("%d pair solutions failed the matrix check and were dropped", s.unverified))
	}
	return w
}

// whyImageSinglet: a single part images over a track D + separation only
// when D >= 4f (see singletImage).
func (s *search) whyImageSinglet() string {
	strongest := math.Inf(1)
	for i := range s.c {
		if f := s.c[i].efl(); f > 0 {
			strongest = math.Min(strongest, f)
		}
	}
	need := s.req.Track / 4
	switch {
	case math.IsInf(strongest, 1):
		return "no part has positive power, and a single part needs it to form a real image"
	case strongest > need:
		return fmt.Sprintf("no part is strong enough for a %g mm track: a single part needs an EFL below about %.1f mm, the strongest has %.1f mm", s.req.Track, need, strongest)
	}
	return fmt.Sprintf("no single part reaches magnification %g within %.3g on a %g mm track", s.req.Mag, s.tol, s.req.Track)
}

func plural(n int, one, many string) string {
	if n == 1 {
		return one
	}
	return many
}
