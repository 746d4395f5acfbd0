package present

import (
	"fmt"
	"math"
	"strings"

	"cardinal/search"
)

// CompensatorText says in words what a compensator moves.
func CompensatorText(c search.Compensator, k search.Kind) string {
	switch c {
	case search.CompensateImage:
		return "image plane (refocus)"
	case search.CompensateGap:
		if k == search.Expand {
			return "gap (recollimate)"
		}
		return "gap (refocus onto the fixed image plane)"
	}
	return "nothing (the range is the error left)"
}

// StudySummary is the build study of one result as figure and value rows.
func StudySummary(req search.Requirement, st search.Study) Table {
	name, unit := search.FigureName(req.Kind)
	with := func(s string) string {
		if unit == "" {
			return s
		}
		return s + " " + unit
	}
	dist := "uniform within each tolerance"
	if req.Build.Distribution == search.Normal {
		dist = "normal, each tolerance at two standard deviations"
	}
	adjust := "compensator's move in 95 % of builds"
	if st.Compensator == search.CompensateNone {
		adjust = "error left in 95 % of builds"
	}
	lo, hi := st.FigureRange()
	rows := [][2]string{
		{"simulated builds", fmt.Sprintf("%d (%s; seed %d)", st.Trials, dist, req.Build.Seed)},
		{"spacing tolerance", fmt.Sprintf("+-%s mm (every gap, the working distance, the image plane where it is not the compensator)", Fixed(req.Build.SpacingTol, 3))},
		{"compensator", CompensatorText(st.Compensator, req.Kind)},
		{adjust, RangeText(st.AdjustLow, st.AdjustHigh, 3) + " mm"},
		{name + " in 95 % of builds", fmt.Sprintf("%s..%s (%s %%)", with(sig(lo)), with(sig(hi)), RangeText(st.SpreadLow, st.SpreadHigh, 3))},
		{"target", with(fmt.Sprintf("%s +- %s", sig(st.Target), sig(st.Tol)))},
		{"yield", fmt.Sprintf("%s %% of builds meet the target's tolerance", Fixed(st.Yield, 1))},
		{"matters most", orMissing(st.Dominant)},
		{"linear estimate", fmt.Sprintf("standard deviation of the %s %s, of the compensator %s mm (builds: %s, %s mm)",
			name, with(sig(st.LinearTargetSD)), sig(st.LinearAdjustSD), with(sig(st.TargetSD)), sig(st.AdjustSD))},
	}
	if st.SpotBuilds > 0 {
		where := "at the best focus after refocusing"
		if st.Compensator != search.CompensateImage {
			where = "on the fixed image plane"
		}
		rows = append(rows, [2]string{"RMS spot on axis", fmt.Sprintf("median %s µm, 95 %% of builds %s..%s µm, %s (%d builds traced with real rays)",
			Figure(st.SpotMedian), Figure(st.SpotLow), Figure(st.SpotHigh), where, st.SpotBuilds)})
	}
	if st.SpotLost > 0 {
		rows = append(rows, [2]string{"no spot", fmt.Sprintf("in %d builds no ray reached the image", st.SpotLost)})
	}
	if st.Failed > 0 {
		rows = append(rows, [2]string{"no solution", fmt.Sprintf("%d builds could not be compensated (counted as missing the target)", st.Failed)})
	}
	t := Table{Columns: []Column{{Key: "figure", Label: "figure"}, {Key: "value", Label: "value"}}}
	for _, r := range rows {
		t.Add(Text(r[0]), Text(r[1]))
	}
	return t
}

func orMissing(s string) string {
	if s == "" {
		return Missing
	}
	return s
}

// sig is a number with five significant figures, never "-0".
func sig(v float64) string {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return Missing
	}
	s := fmt.Sprintf("%.5g", v)
	if strings.Trim(s, "-0.") == "" {
		return "0"
	}
	return s
}

// Sensitivities is the table of the study's sensitivities, most important
// first: the derivative of the target figure and of the compensator's move
// per unit of each toleranced quantity, and the change each makes at its
// tolerance.
func Sensitivities(req search.Requirement, st search.Study) Table {
	name, unit := search.FigureName(req.Kind)
	t := Table{Columns: []Column{
		{Key: "rank", Label: "#"},
		{Key: "tolerance", Label: "tolerance"},
		{Key: "key", Label: "key", Optional: true},
		{Key: "plus_minus", Label: "+-"},
		{Key: "unit", Label: "unit"},
		{Key: "d_target_per_unit", Label: "d " + name + " per unit", Unit: unit},
		{Key: "target_change_at_tol", Label: name + " at tol", Unit: unit},
		{Key: "d_adjust_mm_per_unit", Label: "d adjust per unit", Unit: "mm"},
		{Key: "adjust_mm_at_tol", Label: "adjust at tol", Unit: "mm"},
	}}
	for i, s := range st.Sensitivities {
		u := s.Unit
		if u == "" {
			u = "index"
		}
		t.Add(Int(i+1), Text(s.Name), Text(s.Key), SigCell(s.Tol), Text(u),
			SigCell(s.Target), SigCell(s.TargetAtTol), SigCell(s.Adjust), SigCell(s.AdjustAtTol))
	}
	return t
}

// SigCell is a number with five significant figures.
func SigCell(v float64) Cell {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return Cell{Text: Missing}
	}
	return Cell{Text: sig(v), Raw: v}
}

// A StudyHistogram is one histogram of a build study with its bins as
// rows: Key names it with its unit as JSON does ("adjust_mm", "efl_mm",
// "magnification", "spot_um"), Title heads it for people.
type StudyHistogram struct {
	Key, Title string
	Table      Table
}

// StudyHistograms are the study's histograms of bins equal in width: the
// compensator's move, the target figure after compensation and, where
// builds were traced with real rays, their RMS spot.
func StudyHistograms(req search.Requirement, st search.Study, bins int) []StudyHistogram {
	name, unit := search.FigureName(req.Kind)
	fig := strings.ToLower(name)
	move := "Compensator's move in the builds"
	if st.Compensator == search.CompensateNone {
		move = "Error left in the builds (no compensator)"
	}
	hs := []StudyHistogram{
		{withUnit("adjust", "mm"), move, HistogramTable(search.NewHistogram(st.Adjust, bins), "adjust", "move", "mm")},
		{withUnit(fig, unit), name + " after compensation in the builds", HistogramTable(search.NewHistogram(st.Figure, bins), fig, name, unit)},
	}
	if st.SpotBuilds > 0 {
		hs = append(hs, StudyHistogram{withUnit("spot", "um"), "RMS spot at the compensated focus in the builds",
			HistogramTable(search.NewHistogram(st.Spot, bins), "spot", "spot", "um")})
	}
	return hs
}

// withUnit is a key with its unit, as JSON keys carry them.
func withUnit(key, unit string) string {
	if unit == "" {
		return key
	}
	return key + "_" + unit
}

// HistogramTable lists a histogram's bins, one row each: the bin's edges
// (keys from key and unit: adjust_from_mm, adjust_to_mm), the number of
// builds in it, and a bar of # for people.
func HistogramTable(h search.Histogram, key, label, unit string) Table {
	t := Table{Columns: []Column{
		{Key: withUnit(key+"_from", unit), Label: label + " from", Unit: unit},
		{Key: withUnit(key+"_to", unit), Label: "to", Unit: unit},
		{Key: "builds", Label: "builds"},
		{Key: "bar", Label: "", TextOnly: true},
	}}
	top := 0
	for _, c := range h.Counts {
		top = max(top, c)
	}
	for i, c := range h.Counts {
		bar := ""
		if top > 0 {
			bar = strings.Repeat("#", int(math.Round(40*float64(c)/float64(top))))
		}
		t.Add(SigCell(h.Edges[i]), SigCell(h.Edges[i+1]), Int(c), Cell{Text: bar, Raw: bar})
	}
	return t
}
