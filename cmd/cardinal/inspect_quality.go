package main

import (
	"math"
	"strconv"

	"github.com/spf13/pflag"

	"cardinal/search"
	"cardinal/search/present"
	"cardinal/search/solution"
)

// rayOptions are the real-ray flags of `cardinal inspect`: the fields of
// search.RaySetting, which works out the conditions. The zero value traces
// nothing.
type rayOptions struct {
	Beam, NA       float64   // collimated beam diameter, mm; object-space NA
	ObjectDistance float64   // object plane in front of the first vertex, mm (--na); 0: the -1x conjugate
	ObjectHeight   float64   // field edge for --na, mm
	FieldAngle     float64   // field edge for --beam, degrees
	Band           []float64 // nm; none: no colour figure
	Power          float64   // W, for the laser cautions
}

func (ro *rayOptions) flags(f *pflag.FlagSet) {
	f.Float64Var(&ro.Beam, "beam", 0, "trace real rays: collimated beam diameter, mm (object at infinity)")
	f.Float64Var(&ro.NA, "na", 0, "trace real rays: object-space numerical aperture (finite object)")
	f.Float64Var(&ro.ObjectDistance, "object-distance", 0, "with --na: object plane to first vertex, mm (default: the -1x conjugate)")
	f.Float64Var(&ro.ObjectHeight, "object-height", 0, "with --na: field edge, object height in mm")
	f.Float64Var(&ro.FieldAngle, "field-angle", 0, "with --beam: field edge, degrees")
	f.Float64SliceVar(&ro.Band, "band", nil, "wavelengths for the focal shift, nm, e.g. 486.1,587.6,656.3; none gives no colour figure")
	f.Float64Var(&ro.Power, "power", 0, "with --beam: laser power, W (brings the laser cautions)")
}

func (ro rayOptions) traces() bool { return ro.setting().Traces() }

// validate checks the real-ray flags against each other.
func (ro rayOptions) validate() error {
	for name, v := range map[string]float64{"--beam": ro.Beam, "--na": ro.NA, "--object-distance": ro.ObjectDistance,
		"--object-height": ro.ObjectHeight, "--field-angle": ro.FieldAngle, "--power": ro.Power} {
		if !(v >= 0) || math.IsInf(v, 0) {
			return usageErrorf("%s %g: give a positive number", name, v)
		}
	}
	switch {
	case ro.Beam > 0 && ro.NA > 0:
		return usageErrorf("give --beam (object at infinity) or --na (finite object), not both")
	case !ro.traces() && (ro.ObjectDistance > 0 || ro.ObjectHeight > 0 || ro.FieldAngle > 0 || len(ro.Band) > 0 || ro.Power > 0):
		return usageErrorf("--object-distance, --object-height, --field-angle, --band and --power go with --beam or --na, which trace real rays")
	case ro.Beam > 0 && (ro.ObjectDistance > 0 || ro.ObjectHeight > 0):
		return usageErrorf("--beam puts the object at infinity: its field is --field-angle, and --object-distance and --object-height go with --na")
	case ro.NA > 0 && (ro.FieldAngle > 0 || ro.Power > 0):
		return usageErrorf("--na is for a finite object: its field is --object-height; --field-angle and --power go with --beam")
	case ro.FieldAngle >= 90:
		return usageErrorf("--field-angle %g: give an angle below 90 degrees", ro.FieldAngle)
	}
	return nil
}

// setting is the real-ray setting the flags ask for.
func (ro rayOptions) setting() search.RaySetting { return search.RaySetting(ro) }

// writeLaserCautions writes the laser cautions (solution.LaserCautions, the
// one text of them) on stderr.
func writeLaserCautions(e *env) {
	for _, c := range solution.LaserCautions() {
		notef(e, "caution: %s\n", c)
	}
}

func num(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }

// qualityKeys are the JSON keys of the real-ray figures, the CSV columns
// too.
var qualityKeys = []string{"rms_spot_um", "rms_spot_edge_um", "airy_radius_um", "wavefront_rms_waves",
	"diffraction_limited", "focal_shift_um", "best_focus_shift_mm", "diffraction_limited_why", "wavefront_worst_rms_waves"}

// qualityCells are the cells of qualityKeys, missing where a figure does
// not apply or the part was not traced.
func qualityCells(q *search.ImageQuality) []present.Cell {
	c := make([]present.Cell, len(qualityKeys))
	for i := range c {
		c[i] = present.Cell{Text: present.Missing}
	}
	if q == nil {
		return c
	}
	c[0], c[1], c[2], c[3] = present.Num(q.RMSSpot, 2), present.OptNum(q.RMSSpotEdge, 2), present.Num(q.AiryRadius, 2), present.Num(q.WavefrontRMS, 4)
	c[4], c[5], c[6] = present.Bool(q.DiffractionLimited), present.OptNum(q.FocalShift, 1), present.Num(q.BestFocusShift, 3)
	c[7], c[8] = present.Text(q.DiffractionLimitedWhy), present.Num(q.WavefrontWorst, 4)
	return c
}

// qualityRows are the table rows of the real-ray figures: none when no
// rays were asked for, one line saying so when the part was not traced.
func qualityRows(r search.Inspection) [][]string {
	if r.RaySetting == "" {
		return nil
	}
	q := r.ImageQuality
	if q == nil {
		return [][]string{{"real-ray figures", "-", "not traced (see warnings)"}}
	}
	rows := [][]string{{"RMS spot on axis, best focus", present.Fixed(q.RMSSpot, 2), "um"}}
	if q.RMSSpotEdge != nil {
		rows = append(rows, []string{"RMS spot at the field edge, same plane", present.Fixed(*q.RMSSpotEdge, 2), "um"})
	}
	rows = append(rows,
		[]string{"Airy radius, 1.22 lambda / (2 NA')", present.Fixed(q.AiryRadius, 2), "um"},
		[]string{"wavefront error, RMS", present.Fixed(q.WavefrontRMS, 4), "waves"},
		[]string{"diffraction limited", present.Limited(q).Text, "Marechal: 0.07 waves RMS or less at every field point and wavelength, one shared plane"})
	if q.FocalShift != nil {
		rows = append(rows, []string{"focal shift over the band", present.Fixed(*q.FocalShift, 1), "um"})
	} else {
		rows = append(rows, []string{"focal shift over the band", "-", "no --band: one wavelength gives no colour figure"})
	}
	return append(rows, []string{"best focus from the paraxial image", present.Fixed(q.BestFocusShift, 3), "mm, + away from the part"})
}
