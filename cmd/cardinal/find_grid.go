package main

import (
	"fmt"
	"math"
	"strings"

	"cardinal/search"
)

// resultGrid lays results out for a terminal: short columns, parts as
// SUPPLIER:PART with "(rev)" when turned around, and the real-ray figures
// where any result has them.
func resultGrid(req search.Requirement, rs []search.Result) grid {
	target := map[search.Kind]string{search.Focus: "EFL", search.Image: "mag", search.Expand: "expansion"}[req.Kind]
	qc := qualityColumns{search.ShownQuality(rs)}
	g := grid{Header: []string{"#", "parts", "wd", "gap", "back", "envelope", "track", target, "error"}}
	g.Header = append(append(g.Header, qc.header()...), "checks", "price", "drawer", "why")
	for _, r := range rs {
		row := []string{
			fmt.Sprint(r.Rank), partsCell(r.Parts), findMM(r.WorkingDistance), findMM(r.Gap), findMM(r.BackClearance),
			fixed(r.Envelope, 2), findMM(r.Track), targetCell(req, r), errorCell(req, r)}
		row = append(append(row, qc.cells(r.ImageQuality)...), checksCell(r), priceCell(r), yesNo(r.InDrawer), r.Reason)
		g.Rows = append(g.Rows, row)
	}
	return g
}

// qualityColumns are the real-ray columns of find's table: none when no
// result was traced; the edge spot and the focal shift only where given.
type qualityColumns struct{ search.QualityShown }

func (qc qualityColumns) header() []string {
	if !qc.Any {
		return nil
	}
	spot := "spot um"
	if qc.Edge {
		spot = "spot um axis/edge"
	}
	h := []string{spot, "airy um", "diffr. limited"}
	if qc.Colour {
		h = append(h, "focal shift um")
	}
	return h
}

// cells are the real-ray figures of one result, "-" where it was not
// traced: RMS spots at best focus, the Airy radius, the Marechal verdict
// and the focal shift over the band.
func (qc qualityColumns) cells(q *search.ImageQuality) []string {
	if !qc.Any {
		return nil
	}
	c := []string{"-", "-", "-"}
	if qc.Colour {
		c = append(c, "-")
	}
	if q == nil {
		return c
	}
	c[0] = fixed(q.RMSSpot, 1)
	if q.RMSSpotEdge != nil {
		c[0] += " / " + fixed(*q.RMSSpotEdge, 1)
	}
	c[1], c[2] = fixed(q.AiryRadius, 1), yesNo(q.DiffractionLimited)
	if qc.Colour && q.FocalShift != nil {
		c[3] = fixed(*q.FocalShift, 0)
	}
	return c
}

func partsCell(ps []search.PartUse) string {
	s := make([]string, len(ps))
	for i, p := range ps {
		s[i] = p.ID()
		if p.Reversed {
			s[i] += " (rev)"
		}
	}
	return strings.Join(s, " + ")
}

// findMM prints a length in mm with two decimals, "-" where it does not apply.
func findMM(v *float64) string {
	if v == nil {
		return "-"
	}
	return fixed(*v, 2)
}

func targetCell(req search.Requirement, r search.Result) string {
	switch {
	case r.EFL != nil:
		return fixed(*r.EFL, 3)
	case r.Magnification != nil:
		return fixed(*r.Magnification, 4)
	case r.Expansion != nil:
		return fixed(*r.Expansion, 3) + " " + string(r.Form)
	}
	return "-"
}

// errorCell is the error in percent of the target; "0" within rounding.
func errorCell(req search.Requirement, r search.Result) string {
	if math.Abs(r.ErrorPct) < 5e-4 {
		return "0"
	}
	return fmt.Sprintf("%+.2g%%", r.ErrorPct)
}

func checksCell(r search.Result) string {
	var bad []string
	for _, c := range r.Checks {
		if !c.OK {
			bad = append(bad, c.Name)
		}
	}
	if len(bad) == 0 {
		return "all ok"
	}
	return "fails " + strings.Join(bad, ",")
}

// priceCell is the price of every piece, one amount per currency (never
// summed across currencies); "?" for a price not stated.
func priceCell(r search.Result) string {
	switch {
	case len(r.Prices) == 0:
		return "?"
	case r.PriceUnknown:
		return search.AmountsText(r.Prices) + " + ?"
	}
	return search.AmountsText(r.Prices)
}

func yesNo(b bool) string {
	if b {
		return "yes"
	}
	return "no"
}
