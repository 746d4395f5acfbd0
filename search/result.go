package search

import (
	"encoding/json"
	"fmt"
	"math"
	"strings"
)

// PartUse is one part of a result, in light order.
type PartUse struct {
	Supplier string `json:"supplier"`
	Part     string `json:"part"`
	Reversed bool   `json:"reversed"`
}

// ID is SUPPLIER:PART.
func (u PartUse) ID() string { return u.Supplier + ":" + u.Part }

// A Check is one constraint of the requirement and whether the result holds it.
type Check struct {
	Name   string `json:"name"`
	OK     bool   `json:"ok"`
	Detail string `json:"detail"`
}

// A Result is one way to meet the requirement with one or two parts. Lengths
// in mm; a nil length does not apply (the working distance of an object at
// infinity, the back clearance and track of an afocal expander, the gap of a
// singlet).
type Result struct {
	Rank            int       `json:"rank"`
	Parts           []PartUse `json:"parts"`
	Gap             *float64  `json:"gap_mm,omitempty"`
	WorkingDistance *float64  `json:"working_distance_mm"`
	BackClearance   *float64  `json:"back_clearance_mm"`
	Envelope        float64   `json:"envelope_mm"`
	Track           *float64  `json:"track_mm"`
	EFL             *float64  `json:"efl_mm,omitempty"`
	Magnification   *float64  `json:"magnification,omitempty"`
	Expansion       *float64  `json:"expansion,omitempty"`
	Form            Form      `json:"form,omitempty"`
	// Error is achieved minus target, in the target's unit (mm for an EFL);
	// ErrorPct is the same in percent of the target.
	Error    float64 `json:"error"`
	ErrorPct float64 `json:"error_pct"`
	Checks   []Check `json:"checks"`
	Meets    bool    `json:"meets"`
	// Price is the sum over the pieces, nil when a price is not stated.
	Price    *float64 `json:"price"`
	Currency string   `json:"currency,omitempty"`
	InDrawer bool     `json:"in_drawer"`
	Score    float64  `json:"score"`
	Reason   string   `json:"reason"`
	// ImageQuality holds the real-ray figures (quality.go), its keys
	// inline in the JSON; nil when real rays were not traced.
	*ImageQuality
	// Quality is the same figures by JSON key, for pages that list them;
	// filled with ImageQuality, also when a result is read back from JSON.
	Quality map[string]float64 `json:"-"`
}

// UnmarshalJSON reads a result and fills Quality from its figures.
func (r *Result) UnmarshalJSON(b []byte) error {
	type plain Result // the same fields, without this method
	var p plain
	if err := json.Unmarshal(b, &p); err != nil {
		return err
	}
	*r = Result(p)
	if r.ImageQuality != nil {
		r.Quality = r.ImageQuality.Figures()
	}
	return nil
}

// result turns a layout into a Result.
func (s *search) result(p *prepared, l *layout, rank int) Result {
	r := Result{Rank: rank, Envelope: l.env, Error: l.err, Meets: l.meets(), Score: l.score, Form: l.form}
	if t := target(s.req); t != 0 {
		r.ErrorPct = 100 * l.err / math.Abs(t)
	}
	idx := []int32{l.a}
	if l.pair() {
		idx = append(idx, l.b)
		r.Gap = ptr(l.gap)
	}
	r.WorkingDistance, r.BackClearance, r.Track = opt(l.wd), opt(l.bc), opt(l.track)
	switch s.req.Kind {
	case Focus:
		r.EFL = ptr(l.value)
	case Image:
		r.Magnification = ptr(l.value)
	case Expand:
		r.Expansion = ptr(l.value)
	}
	s.fillParts(p, &r, l, idx)
	r.Checks = s.checks(l)
	r.Reason = s.reason(&r, l)
	return r
}

func (s *search) fillParts(p *prepared, r *Result, l *layout, idx []int32) {
	price, known := 0.0, true
	for _, ci := range idx {
		c := &s.c[ci]
		e := p.items[c.item].Entry
		r.Parts = append(r.Parts, PartUse{Supplier: e.Part.Supplier, Part: e.Part.Name, Reversed: c.rev})
		if e.Price > 0 {
			price += e.Price
			if r.Currency == "" {
				r.Currency = e.Currency
			}
		} else {
			known = false
		}
	}
	if known {
		r.Price = ptr(price)
	}
	if l.pair() {
		r.InDrawer = pairAway(&s.c[l.a], &s.c[l.b]) == 0
	} else {
		r.InDrawer = s.c[l.a].away == 0
	}
}

func ptr(v float64) *float64 { return &v }

func opt(v float64) *float64 {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return nil
	}
	return &v
}

// checks lists each constraint that applies with its verdict.
func (s *search) checks(l *layout) []Check {
	r := &s.req
	var cs []Check
	add := func(bit uint16, name, format string, a ...any) {
		cs = append(cs, Check{Name: name, OK: l.fails&bit == 0, Detail: fmt.Sprintf(format, a...)})
	}
	switch r.Kind {
	case Focus:
		add(failTarget, "efl", "%.3f mm, target %g mm +- %.3g mm", l.value, r.EFL, s.tol)
	case Image:
		add(failTarget, "magnification", "%.4f, target %g +- %.3g", l.value, r.Mag, s.tol)
	case Expand:
		add(failTarget, "expansion", "%.4f, target %g +- %.3g", l.value, r.Expansion, s.tol)
		if r.Form != AnyForm {
			add(failForm, "form", "%s, asked %s", l.form, r.Form)
		}
	}
	if !math.IsNaN(l.bc) {
		add(failBack, "back_clearance", "%.2f mm, minimum %g mm", l.bc, r.BFDMin)
	}
	if r.Kind == Image {
		add(failWD, "working_distance", "%.2f mm, minimum %g mm", l.wd, r.WDMin)
	}
	if l.pair() {
		add(failGap, "gap", "edge clearance %.2f mm, minimum %g mm", s.edgeClearance(&s.c[l.a], &s.c[l.b], l.gap), r.GapMin)
	}
	if r.LengthMax > 0 {
		add(failEnvelope, "envelope", "%.2f mm, maximum %g mm", l.env, r.LengthMax)
	}
	if r.ChecksAperture() {
		add(failAperture, "aperture", "ray height %.0f%% of the clear aperture of part %d", 100*l.vigRatio, l.vigPart+1)
	}
	if l.fails&failDrawer != 0 {
		add(failDrawer, "drawer", "needs two pieces, the drawer has fewer")
	}
	return cs
}

// reason says in a few words why the result ranks where it does.
func (s *search) reason(r *Result, l *layout) string {
	var w []string
	if !r.Meets {
		var f []string
		for _, c := range r.Checks {
			if !c.OK {
				f = append(f, c.Name)
			}
		}
		return "misses " + strings.Join(f, ", ")
	}
	if l.pair() {
		w = append(w, "pair")
	} else {
		w = append(w, "single part")
	}
	if l.err == 0 || math.Abs(l.err) <= 1e-9*math.Abs(target(s.req)) {
		w = append(w, "on target")
	} else {
		w = append(w, fmt.Sprintf("%.2g%% off target", math.Abs(r.ErrorPct)))
	}
	w = append(w, fmt.Sprintf("%.0f mm long", l.env))
	if r.InDrawer {
		w = append(w, "in the drawer")
	}
	if r.Price == nil {
		w = append(w, "price unknown")
	}
	return strings.Join(w, ", ")
}
