package present

import (
	"html"
	"math"
	"slices"
	"strconv"
	"strings"

	"cardinal/search"
)

// Results describes find's results (and the nearest misses) once: the
// columns every format shows, their keys the JSON keys of search.Result.
// The default set depends on the requirement's kind; the real-ray columns
// are there only when a result was traced, the edge spot and the focal
// shift only when a field or a band was given.
func Results(req search.Requirement, rs []search.Result) Table {
	cols := resultColumns(req, rs, search.ShownQuality(rs))
	t := Table{Columns: make([]Column, len(cols))}
	for i, c := range cols {
		t.Columns[i] = c.Column
	}
	for _, r := range rs {
		row := make([]Cell, len(cols))
		for i, c := range cols {
			row[i] = c.cell(r)
		}
		t.Add(row...)
	}
	return t
}

// resultColumn is a column and how a result fills it.
type resultColumn struct {
	Column
	cell func(search.Result) Cell
}

func resultColumns(req search.Requirement, rs []search.Result, qs search.QualityShown) []resultColumn {
	// The checks column only where some layout fails one, the error only
	// where some layout is off target.
	anyFails, anyOff, anyOther, anyAlt := false, false, false, false
	for _, r := range rs {
		anyFails = anyFails || !r.Meets
		anyOff = anyOff || Signed(r.ErrorPct) != "0"
		anyOther = anyOther || r.OtherArrangements > 0
		anyAlt = anyAlt || len(r.Alternatives) > 0
	}
	focus, image, expand := req.Kind == search.Focus, req.Kind == search.Image, req.Kind == search.Expand
	match := req.Kind == search.Match
	cols := []resultColumn{
		{Column{Key: "rank", Keep: 9, Label: "#"}, func(r search.Result) Cell { return Int(r.Rank) }},
		{Column{Key: "parts", Keep: 9, Label: "parts"}, func(r search.Result) Cell { return partsCell(r.Parts) }},
		{Column{Key: "other_arrangements", Keep: 6, Label: "+", Optional: !anyOther},
			func(r search.Result) Cell { return ArrangementsCell(r.OtherArrangements) }},
		{Column{Key: "working_distance_mm", Keep: 6, Label: "wd", Unit: "mm", Optional: !image && !match},
			func(r search.Result) Cell { return OptNum(r.WorkingDistance, 2) }},
		{Column{Key: "gap_mm", Keep: 6, Label: "gap", Unit: "mm"}, func(r search.Result) Cell { return OptNum(r.Gap, 2) }},
		{Column{Key: "back_clearance_mm", Keep: 6, Label: "back", Unit: "mm", Optional: expand},
			func(r search.Result) Cell { return OptNum(r.BackClearance, 2) }},
		{Column{Key: "envelope_mm", Keep: 5, Label: "envelope", Unit: "mm", Optional: !expand},
			func(r search.Result) Cell { return Num(r.Envelope, 2) }},
		{Column{Key: "track_mm", Keep: 6, Label: "track", Unit: "mm", Optional: !image && !match},
			func(r search.Result) Cell { return OptNum(r.Track, 2) }},
		{Column{Key: "efl_mm", Keep: 8, Label: "EFL", Unit: "mm", Optional: !focus}, func(r search.Result) Cell { return OptNum(r.EFL, 3) }},
		{Column{Key: "magnification", Keep: 8, Label: "mag", Optional: !image},
			func(r search.Result) Cell { return OptNum(r.Magnification, 4) }},
		{Column{Key: "expansion", Keep: 8, Label: "expansion", Optional: !expand},
			func(r search.Result) Cell { return OptNum(r.Expansion, 3) }},
		{Column{Key: "form", Keep: 7, Label: "form", Optional: !expand}, func(r search.Result) Cell { return Text(string(r.Form)) }},
		{Column{Key: "error_pct", Keep: 4, Label: "error", Unit: "%", Optional: !anyOff}, func(r search.Result) Cell { return errorCell(r.ErrorPct) }},
	}
	build := buildColumns(rs)
	if len(build) > 0 {
		cols = append(cols, build[0]) // the yield, before the real-ray columns
		build = build[1:]
	}
	cols = append(cols, qualityColumns(qs)...)
	cols = append(cols, laserColumns(req, rs)...)
	cols = append(cols, build...)
	cols = append(cols,
		resultColumn{Column{Key: "failed_checks", Keep: 7, Label: "checks", Optional: !anyFails}, checksCell},
		resultColumn{Column{Key: "price", Keep: 7, Label: "price", TextOnly: true}, priceCell})
	cols = append(cols, priceColumns(rs)...)
	return append(cols,
		resultColumn{Column{Key: "pieces_to_order", Label: "to order", Optional: true},
			func(r search.Result) Cell { return Int(r.ToOrder) }},
		resultColumn{Column{Key: "in_drawer", Keep: 7, Label: "drawer"}, func(r search.Result) Cell { return Bool(r.InDrawer) }},
		resultColumn{Column{Key: "score", Label: "score", Optional: true}, func(r search.Result) Cell { return Num(r.Score, 3) }},
		resultColumn{Column{Key: "reason", Label: "why", Note: true}, func(r search.Result) Cell { return Text(r.Reason) }},
		resultColumn{Column{Key: "alternatives", Label: "alternatives", TextOnly: true, Note: true, Optional: !anyAlt},
			func(r search.Result) Cell { return Cell{Text: AlternativesText(r.Alternatives)} }},
	)
}

// ArrangementsCell is "+3" for a row with three other arrangements that
// meet (search/group.go), empty for none; the count is the raw value.
func ArrangementsCell(n int) Cell {
	if n == 0 {
		return Cell{Raw: 0}
	}
	return Cell{Text: "+" + strconv.Itoa(n), Raw: n}
}

// AlternativesText names the parts optically the same as the row's that
// its arrangements use: "also TARNWICK:KC-12-125, 15.90 XTS; also ...".
func AlternativesText(as []search.Alternative) string {
	ts := make([]string, len(as))
	for i, a := range as {
		ts[i] = a.Text()
	}
	return strings.Join(ts, "; ")
}

// qualityColumns are the real-ray figures: none when no result was traced.
func qualityColumns(qs search.QualityShown) []resultColumn {
	if !qs.Any {
		return nil
	}
	q := func(f func(*search.ImageQuality) Cell) func(search.Result) Cell {
		return func(r search.Result) Cell {
			if r.ImageQuality == nil {
				return Cell{Text: Missing}
			}
			return f(r.ImageQuality)
		}
	}
	cols := []resultColumn{
		{Column{Key: "rms_spot_um", Keep: 5, Label: "spot", Unit: "µm"}, q(func(iq *search.ImageQuality) Cell { return Num(iq.RMSSpot, 1) })},
		{Column{Key: "rms_spot_edge_um", Keep: 5, Label: "edge spot", Unit: "µm", Optional: !qs.Edge},
			q(func(iq *search.ImageQuality) Cell { return OptNum(iq.RMSSpotEdge, 1) })},
		{Column{Key: "airy_radius_um", Label: "Airy", Unit: "µm", Optional: true}, q(func(iq *search.ImageQuality) Cell { return Num(iq.AiryRadius, 1) })},
		{Column{Key: "wavefront_rms_waves", Label: "wavefront", Unit: "waves", Optional: true},
			q(func(iq *search.ImageQuality) Cell { return Num(iq.WavefrontRMS, 3) })},
		{Column{Key: "diffraction_limited", Keep: 6, Label: "diffraction limited"},
			q(Limited)},
		{Column{Key: "diffraction_limited_why", Label: "limited by", Optional: true},
			q(func(iq *search.ImageQuality) Cell { return Text(iq.DiffractionLimitedWhy) })},
		{Column{Key: "wavefront_worst_rms_waves", Label: "worst wavefront", Unit: "waves", Optional: true},
			q(func(iq *search.ImageQuality) Cell { return Num(iq.WavefrontWorst, 3) })},
		{Column{Key: "focal_shift_um", Keep: 5, Label: "focal shift", Unit: "µm", Optional: !qs.Colour},
			q(func(iq *search.ImageQuality) Cell { return OptNum(iq.FocalShift, 0) })},
		{Column{Key: "best_focus_shift_mm", Label: "best focus", Unit: "mm", Optional: true},
			q(func(iq *search.ImageQuality) Cell { return Num(iq.BestFocusShift, 3) })},
	}
	return cols
}

// Limited is the diffraction-limited verdict over every field point and
// wavelength judged: the text yes, or which fails first (no: on axis, no:
// field edge, no: colour), the raw value the boolean; yes or no for a
// result saved before the verdict said why.
func Limited(q *search.ImageQuality) Cell {
	c := Bool(q.DiffractionLimited)
	if q.DiffractionLimitedWhy != "" {
		c.Text = q.DiffractionLimitedWhy
	}
	return c
}

// laserColumns are the Gaussian-beam figures of a laser requirement and
// its worst ghost focus: none when no result carries them.
func laserColumns(req search.Requirement, rs []search.Result) []resultColumn {
	some := false
	for _, r := range rs {
		some = some || r.Gaussian != nil
	}
	if !some {
		return nil
	}
	g := func(f func(*search.LaserFigures) Cell) func(search.Result) Cell {
		return func(r search.Result) Cell {
			if r.Gaussian == nil {
				return Cell{Text: Missing}
			}
			return f(r.Gaussian)
		}
	}
	waist := resultColumn{Column{Key: "waist_radius_um", Keep: 6, Label: "waist", Unit: "µm"},
		g(func(f *search.LaserFigures) Cell { return Num(f.WaistRadius, 1) })}
	at := resultColumn{Column{Key: "waist_at_mm", Label: "waist at", Unit: "mm", Optional: true},
		g(func(f *search.LaserFigures) Cell { return Num(f.WaistAt, 2) })}
	zr := resultColumn{Column{Key: "rayleigh_range_mm", Label: "Rayleigh range", Unit: "mm", Optional: true},
		g(func(f *search.LaserFigures) Cell { return Num(f.RayleighRange, 3) })}
	var cols []resultColumn
	switch req.Kind {
	case search.Focus:
		cols = []resultColumn{waist, at,
			{Column{Key: "waist_shift_mm", Label: "waist shift", Unit: "mm", Optional: true},
				g(func(f *search.LaserFigures) Cell { return OptNum(f.WaistShift, 2) })},
			zr,
			{Column{Key: "spot_limited_by", Label: "limited by", Optional: true}, g(func(f *search.LaserFigures) Cell { return Text(f.SpotLimit) })}}
	case search.Expand:
		cols = []resultColumn{waist, at, zr,
			{Column{Key: "divergence_mrad", Keep: 6, Label: "divergence", Unit: "mrad"},
				g(func(f *search.LaserFigures) Cell { return OptNum(f.Divergence, 4) })},
			{Column{Key: "divergence_ratio", Label: "x limit"},
				g(func(f *search.LaserFigures) Cell { return OptNum(f.DivergenceRatio, 3) })},
			{Column{Key: "laser_wavefront_rms_waves", Label: "wavefront", Unit: "waves", Optional: true},
				g(func(f *search.LaserFigures) Cell { return OptNum(f.WavefrontRMS, 4) })},
			{Column{Key: "afocal_gap_mm", Label: "afocal gap", Unit: "mm", Optional: true},
				g(func(f *search.LaserFigures) Cell { return OptNum(f.AfocalGap, 2) })}}
	case search.Match:
		cols = []resultColumn{
			{Column{Key: "coupling", Keep: 8, Label: "coupling"}, g(func(f *search.LaserFigures) Cell { return OptNum(f.Coupling, 4) })},
			{Column{Key: "coupling_tol_mm", Label: "coupling tol", Unit: "mm"},
				g(func(f *search.LaserFigures) Cell { return OptNum(f.CouplingTol, 3) })},
			waist, at, zr}
	}
	return append(cols,
		resultColumn{Column{Key: "worst_ghost", Label: "worst ghost", TextOnly: true, Note: true}, g(ghostCell)},
		resultColumn{Column{Key: "worst_ghost_concentration", Label: "ghost x", Optional: true},
			g(func(f *search.LaserFigures) Cell {
				if f.Ghost == nil {
					return Cell{Text: Missing}
				}
				return Num(f.Ghost.Concentration, 3)
			})},
		resultColumn{Column{Key: "worst_ghost_z_mm", Label: "ghost at", Unit: "mm", Optional: true},
			g(func(f *search.LaserFigures) Cell {
				if f.Ghost == nil {
					return Cell{Text: Missing}
				}
				return Num(f.Ghost.Z, 2)
			})},
		resultColumn{Column{Key: "ghosts_flagged", Label: "ghosts flagged", Optional: true},
			g(func(f *search.LaserFigures) Cell { return Int(f.GhostsFlagged) })})
}

// GhostText says where the most concentrated ghost focus lies: its
// concentration against the beam at the first part, its position from the
// first vertex and its flags, then how many ghosts are flagged in all.
func GhostText(f *search.LaserFigures) string {
	g := f.Ghost
	if g == nil {
		return "none real"
	}
	s := Fixed(g.Concentration, 0) + "x the beam's peak irradiance, " + Fixed(g.Z, 1) + " mm from the first vertex"
	if len(g.Flags) > 0 {
		s += " (" + strings.Join(g.Flags, ", ") + ")"
	}
	if f.GhostsFlagged > 0 {
		s += "; " + strconv.Itoa(f.GhostsFlagged) + " flagged"
	}
	return s
}

func ghostCell(f *search.LaserFigures) Cell { return Cell{Text: GhostText(f)} }

// PartsText names the parts in light order, "(reversed)" after a part
// that is turned around.
func PartsText(ps []search.PartUse) string {
	s := make([]string, len(ps))
	for i, p := range ps {
		s[i] = p.ID()
		if p.Reversed {
			s[i] += " (reversed)"
		}
	}
	return strings.Join(s, " + ")
}

// partsCell names the parts, each name unbroken on a page.
func partsCell(ps []search.PartUse) Cell {
	c := Text(PartsText(ps))
	c.HTML = PartsHTML(ps)
	return c
}

// PartsHTML names the parts for a page, escaped, each name in a span that
// does not break, "(reversed)" after a part turned around.
func PartsHTML(ps []search.PartUse) string {
	s := make([]string, len(ps))
	for i, p := range ps {
		s[i] = `<span class="part">` + html.EscapeString(p.ID()) + `</span>`
		if p.Reversed {
			s[i] += " (reversed)"
		}
	}
	return strings.Join(s, " + ")
}

// errorCell is the error in percent of the target, "0" within rounding.
func errorCell(pct float64) Cell {
	if math.IsNaN(pct) || math.IsInf(pct, 0) {
		return Cell{Text: Missing}
	}
	c := Cell{Text: Signed(pct), Raw: pct}
	return c
}

// Signed is a percentage with a sign and two significant figures, "0"
// within rounding: how an error reads in a table.
func Signed(pct float64) string {
	if math.Abs(pct) < 5e-4 {
		return "0"
	}
	s := Fixed(pct, 2)
	if a := math.Abs(pct); a < 0.1 {
		s = Fixed(pct, 4)
	} else if a < 1 {
		s = Fixed(pct, 3)
	}
	if pct > 0 {
		s = "+" + s
	}
	return s
}

// ChecksText is "all met", or the checks a layout fails.
func ChecksText(r search.Result) string {
	var bad []string
	for _, c := range r.Checks {
		if !c.OK {
			bad = append(bad, c.Name)
		}
	}
	if len(bad) == 0 {
		return "all met"
	}
	return "fails " + strings.Join(bad, ", ")
}

func checksCell(r search.Result) Cell {
	t := ChecksText(r)
	if t == "all met" {
		return Cell{Text: t, Raw: ""}
	}
	return Cell{Text: t, Raw: strings.TrimPrefix(t, "fails ")}
}

// PriceText is the price of every piece, one amount per currency (never
// summed across currencies), "?" for a price not stated.
func PriceText(r search.Result) string {
	switch {
	case len(r.Prices) == 0:
		return "?"
	case r.PriceUnknown:
		return search.AmountsText(r.Prices) + " + ?"
	}
	return search.AmountsText(r.Prices)
}

func priceCell(r search.Result) Cell { return Cell{Text: PriceText(r)} }

// priceColumns hold the price in each currency the results use, one plain
// number per cell (price_XTS): what a spreadsheet reads in place of the
// text of the price column.
func priceColumns(rs []search.Result) []resultColumn {
	var cur []string
	for _, r := range rs {
		for _, a := range r.Prices {
			if !slices.Contains(cur, a.Currency) {
				cur = append(cur, a.Currency)
			}
		}
	}
	slices.Sort(cur)
	cols := make([]resultColumn, len(cur))
	for i, c := range cur {
		cols[i] = resultColumn{Column{Key: "price_" + c, Label: "price", Unit: c, Optional: true},
			func(r search.Result) Cell {
				for _, a := range r.Prices {
					if a.Currency == c {
						return Num(a.Amount, 2)
					}
				}
				return Cell{Text: Missing}
			}}
	}
	return cols
}

// buildColumns are the build study's figures (search.BuildFigures): the
// compensator's 95 % range and the yield by default, the rest on demand;
// none when no result was studied.
func buildColumns(rs []search.Result) []resultColumn {
	if !slices.ContainsFunc(rs, func(r search.Result) bool { return r.Build != nil }) {
		return nil
	}
	b := func(f func(*search.BuildFigures) Cell) func(search.Result) Cell {
		return func(r search.Result) Cell {
			if r.Build == nil {
				return Cell{Text: Missing}
			}
			return f(r.Build)
		}
	}
	cols := []resultColumn{
		{Column{Key: "yield_pct", Keep: 5, Label: "yield", Unit: "%"},
			b(func(f *search.BuildFigures) Cell { return Num(f.Yield, 0) })},
		{Column{Key: "adjust_range_mm", Keep: 4, Label: "adjust", Unit: "mm", TextOnly: true},
			b(func(f *search.BuildFigures) Cell { return Text(adjustText(f.AdjustLow, f.AdjustHigh)) })},
		{Column{Key: "compensator", Label: "adjusts", Optional: true},
			b(func(f *search.BuildFigures) Cell { return Text(string(f.Compensator)) })},
		{Column{Key: "adjust_low_mm", Label: "adjust low", Unit: "mm", Optional: true},
			b(func(f *search.BuildFigures) Cell { return Num(f.AdjustLow, 3) })},
		{Column{Key: "adjust_high_mm", Label: "adjust high", Unit: "mm", Optional: true},
			b(func(f *search.BuildFigures) Cell { return Num(f.AdjustHigh, 3) })},
		{Column{Key: "spread_range_pct", Label: "built", Unit: "%", TextOnly: true, Optional: true},
			b(func(f *search.BuildFigures) Cell { return Text(RangeText(f.SpreadLow, f.SpreadHigh, 2)) })},
		{Column{Key: "spread_low_pct", Label: "built low", Unit: "%", Optional: true},
			b(func(f *search.BuildFigures) Cell { return Num(f.SpreadLow, 3) })},
		{Column{Key: "spread_high_pct", Label: "built high", Unit: "%", Optional: true},
			b(func(f *search.BuildFigures) Cell { return Num(f.SpreadHigh, 3) })},
		{Column{Key: "dominant", Label: "matters most", Optional: true},
			b(func(f *search.BuildFigures) Cell { return Text(f.Dominant) })},
	}
	if !slices.ContainsFunc(rs, func(r search.Result) bool { return r.Build != nil && r.Build.SpotBuilds > 0 }) {
		return cols
	}
	spot := func(v func(*search.BuildFigures) float64) func(search.Result) Cell {
		return b(func(f *search.BuildFigures) Cell {
			if f.SpotBuilds == 0 {
				return Cell{Text: Missing}
			}
			return Num(v(f), 2)
		})
	}
	return append(cols,
		resultColumn{Column{Key: "spot_median_um", Label: "built spot", Unit: "um", Optional: true},
			spot(func(f *search.BuildFigures) float64 { return f.SpotMedian })},
		resultColumn{Column{Key: "spot_high_um", Label: "built spot high", Unit: "um", Optional: true},
			spot(func(f *search.BuildFigures) float64 { return f.SpotHigh })})
}

// adjustText is an adjustment range in mm: two decimals below a
// millimetre, one above, to keep the column narrow.
func adjustText(lo, hi float64) string {
	if math.Max(math.Abs(lo), math.Abs(hi)) >= 1 {
		return RangeText(lo, hi, 1)
	}
	return RangeText(lo, hi, 2)
}

// RangeText is a range of signed values, "-1.14..+1.18".
func RangeText(lo, hi float64, decimals int) string {
	sign := func(v float64) string {
		s := Fixed(v, decimals)
		if v > 0 && strings.Trim(s, "0.") != "" {
			s = "+" + s
		}
		return s
	}
	return sign(lo) + ".." + sign(hi)
}
