package solution

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"cardinal/search"
	"cardinal/search/present"
)

// DescribeRequirement says the requirement in one line of words, with its
// units: what it asks, every limit that was given, and the conditions of
// the real-ray figures and the cautions (field angle, band, laser power)
// when they were given.
func DescribeRequirement(r search.Requirement) string {
	var w []string
	add := func(format string, a ...any) { w = append(w, fmt.Sprintf(format, a...)) }
	switch r.Kind {
	case search.Focus:
		add("focus: EFL %s mm ± %s", num(r.EFL), r.EFLTol)
	case search.Image:
		add("image: track %s mm, magnification %s ± %s", num(r.Track), num(r.Mag), r.MagTol)
	case search.Expand:
		add("expand: beam expansion %s× ± %s", num(r.Expansion), r.ExpandTol)
		if r.Form != search.AnyForm {
			add("%s form", r.Form)
		}
	default:
		add("requirement of unknown kind %q", r.Kind)
	}
	for _, f := range []struct {
		format string
		v      float64
	}{{"beam %s mm", r.Beam}, {"NA %s", r.NA}, {"object height %s mm", r.ObjectHeight},
		{"working distance ≥ %s mm", r.WDMin}, {"back clearance ≥ %s mm", r.BFDMin},
		{"envelope ≤ %s mm", r.LengthMax}, {"diameter ≤ %s mm", r.DiameterMax}} {
		if f.v != 0 {
			add(f.format, num(f.v))
		}
	}
	add("gap ≥ %s mm", num(r.GapMin))
	add("wavelength %s nm", num(r.Lambda()))
	if r.FieldAngle != 0 {
		add("field angle %s°", num(r.FieldAngle))
	}
	if len(r.Band) > 0 {
		add("band %s nm", numList(r.Band))
	}
	if r.Power != 0 {
		add("laser power %s W", num(r.Power))
	} else if r.Laser {
		add("laser")
	}
	if r.Prefer != search.Balanced {
		add("prefer %s", r.Prefer)
	}
	if r.MaxElements() == 1 {
		add("single parts only")
	}
	if r.Supplier != "" {
		add("supplier %s", r.Supplier)
	}
	if r.DrawerOnly {
		add("drawer only")
	}
	return strings.Join(w, "; ")
}

// DescribeParts names the parts in light order, "(reversed)" where turned.
func DescribeParts(ps []search.PartUse) string { return present.PartsText(ps) }

// DescribeSpacings gives a result's distances and achieved figure in words.
func DescribeSpacings(kind search.Kind, r search.Result) string {
	var w []string
	length := func(name string, v *float64) {
		if v != nil {
			w = append(w, fmt.Sprintf("%s %.2f mm", name, *v))
		}
	}
	length("working distance", r.WorkingDistance)
	length("gap", r.Gap)
	length("back clearance", r.BackClearance)
	length("envelope", &r.Envelope)
	length("track", r.Track)
	switch {
	case r.EFL != nil:
		w = append(w, fmt.Sprintf("EFL %.3f mm", *r.EFL))
	case r.Magnification != nil:
		w = append(w, fmt.Sprintf("magnification %.4f", *r.Magnification))
	case r.Expansion != nil:
		w = append(w, strings.TrimSpace(fmt.Sprintf("expansion %.4f× %s", *r.Expansion, r.Form)))
	}
	if math.Abs(r.ErrorPct) >= 5e-4 {
		w = append(w, fmt.Sprintf("%+.2f %% off target", r.ErrorPct))
	}
	return strings.Join(w, ", ")
}

// num prints a number as briefly as it was given.
func num(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }

// numList prints numbers as briefly as given, separated by commas.
func numList(vs []float64) string {
	s := make([]string, len(vs))
	for i, v := range vs {
		s[i] = num(v)
	}
	return strings.Join(s, ", ")
}
