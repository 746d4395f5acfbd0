package search

import (
	"fmt"
	"math"

	"cardinal/optics"
)

// assessAll traces the layouts with real rays, in parallel, each distinct
// system once. Layouts of parts sold under several part numbers (coated
// variants, revisions, the same lens from two suppliers) are often the
// same optical system at the same distances: optics.System.Assess is a
// function of the system and the conditions alone, so layouts whose
// systems and conditions print alike share one trace. The key prints
// every surface, gap, clear aperture and medium (the medium's value, with
// its dispersion coefficients), in full precision, and the working
// distance and back clearance the conditions come from; anything printed
// by address only (a pointer inside a medium) makes keys differ, never
// agree, so two layouts share a trace only when the inputs are equal.
func (s *search) assessAll(p *prepared, ls []layout) []judgement {
	js := make([]judgement, len(ls))
	keys := make([]string, len(ls))
	first := map[string]int{}
	var uniq []int
	for i := range ls {
		keys[i] = s.assessKey(p, &ls[i])
		if _, ok := first[keys[i]]; !ok {
			first[keys[i]] = i
			uniq = append(uniq, i)
		}
	}
	qs := make([]optics.Quality, len(ls))
	errs := make([]error, len(ls))
	inParallel(len(uniq), func(u int) {
		i := uniq[u]
		qs[i], errs[i] = s.system(p, &ls[i]).Assess(s.req.Conditions(ls[i].wd, ls[i].bc))
	})
	// Each layout works out its own verdict from the figures (a laser's
	// is judged against the layout's own waist).
	for i := range ls {
		j := first[keys[i]]
		js[i] = s.verdictOf(&ls[i], s.req.Conditions(ls[i].wd, ls[i].bc), qs[j], errs[j])
	}
	return js
}

// assessKey prints what optics.System.Assess computes from for layout l.
func (s *search) assessKey(p *prepared, l *layout) string {
	sys := s.system(p, l)
	return fmt.Sprintf("%v|%v|%#v|%v|%v|%v|%x|%x", sys.Surfaces, sys.Gaps, sys.Media, sys.SemiApertures,
		sys.ObjectMedium, sys.ImageMedium, math.Float64bits(l.wd), math.Float64bits(l.bc))
}
