package importers

import (
	"math"

	"cardinal/catalog/record"
)

// A PreviewRow is one entry as it will be stored, with its computed EFL
// beside the stated one: how a wrong sign convention or unit in a mapping
// shows itself before anything is written.
type PreviewRow struct {
	Entry record.Entry
	// Computed is the EFL in mm at the stated wavelength (587.6 nm when
	// none is stated); Afocal is true when the prescription has no focus.
	Computed float64
	Afocal   bool
	// OffPercent is |computed - stated| / |stated| in percent, 0 when no
	// EFL is stated; Off says it exceeds FocalTolerance (the usual 1 % of
	// stock lenses, common practice), or that an afocal part states one.
	OffPercent float64
	Off        bool
}

// Preview works out the computed EFL of each entry and compares it with the
// stated one. Each entry's part must be valid.
func Preview(entries []record.Entry) []PreviewRow {
	out := make([]PreviewRow, len(entries))
	for i, e := range entries {
		wl := e.StatedWavelength
		if wl == 0 {
			wl = DefaultStatedWavelength
		}
		c := e.Part.System(nil, nil).Cardinal(wl)
		r := PreviewRow{Entry: e, Afocal: c.Afocal}
		if !c.Afocal {
			r.Computed = c.EFL
		}
		if s := e.StatedEFL; s != 0 {
			if c.Afocal {
				r.Off = true
			} else {
				r.OffPercent = 100 * math.Abs(c.EFL-s) / math.Abs(s)
				r.Off = math.Abs(c.EFL-s) > FocalTolerance*math.Abs(s)
			}
		}
		out[i] = r
	}
	return out
}

// Disagreeing returns the rows whose stated EFL is off.
func Disagreeing(rows []PreviewRow) []PreviewRow {
	var out []PreviewRow
	for _, r := range rows {
		if r.Off {
			out = append(out, r)
		}
	}
	return out
}
