package importers

import (
	"math"
	"strconv"
	"strings"

	"cardinal/optics"
)

// CoatingColumn is the prescription CSV column that states a part's
// coating: the residual reflectance, in percent at normal incidence and
// at the coating's design wavelength, of every surface of the part that
// borders air (optics.Coating). An empty cell states nothing (the Fresnel
// reflectance from the indices); a value, 0 included, states a coating.
const CoatingColumn = "residual_reflectance"

// parseCoating reads the coating column: a percentage from 0 to 100, a
// trailing % allowed.
func parseCoating(r *row, p *optics.Part) {
	cell := r.text(CoatingColumn)
	if cell == "" {
		return
	}
	s := strings.TrimSpace(strings.TrimSuffix(cell, "%"))
	v, err := strconv.ParseFloat(s, 64)
	if err != nil || math.IsNaN(v) || math.IsInf(v, 0) || v < 0 || v > 100 {
		r.fail(CoatingColumn, "%q: want the residual reflectance of each coated surface as a percentage from 0 to 100, such as 0.25%% (leave it empty for an uncoated part)", cell)
		return
	}
	p.Coating = optics.Coating{Stated: true, ResidualPct: v}
}

// coatingCell writes a part's coating back as the reader reads it: empty
// when not stated.
func coatingCell(c optics.Coating) string {
	if !c.Stated {
		return ""
	}
	return formatFloat(c.ResidualPct)
}
