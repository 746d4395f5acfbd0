package main

import (
	"math"

	"github.com/spf13/pflag"

	"cardinal/search"
)

// fieldFlags are the field edge of draw and report, by the names find
// uses: --field-angle for an object at infinity, --object-height for a
// finite object. --field, the name of earlier versions, is hidden and means
// whichever of the two the search's kind takes.
type fieldFlags struct {
	Angle, Height, Former float64
	flags                 *pflag.FlagSet
}

func addFieldFlags(f *pflag.FlagSet, o *fieldFlags) {
	o.flags = f
	f.Float64Var(&o.Angle, "field-angle", 0, "field edge for an object at infinity (focus, expand), degrees; default the search's")
	f.Float64Var(&o.Height, "object-height", 0, "field edge for a finite object (image), mm; default the search's")
	f.Float64Var(&o.Former, "field", 0, "field edge in the unit of the search's kind")
	_ = f.MarkHidden("field")
}

// value is the field edge for a search of kind req.Kind, 0 for the
// search's own; a flag of the other kind is a usage error.
func (o fieldFlags) value(req search.Requirement) (float64, error) {
	set := func(n string) bool { return o.flags != nil && o.flags.Changed(n) }
	finite := req.Kind == search.Image
	switch {
	case set("field-angle") && finite:
		return 0, usageErrorf("--field-angle is for an object at infinity; this %s search has a finite object: give --object-height in mm", req.Kind)
	case set("object-height") && !finite:
		return 0, usageErrorf("--object-height is for a finite object; this %s search has its object at infinity: give --field-angle in degrees", req.Kind)
	case set("field-angle"):
		return inRange("--field-angle", "field_angle_deg", o.Angle)
	case set("object-height"):
		return inRange("--object-height", "object_height_mm", o.Height)
	case set("field") && finite:
		return inRange("--field", "object_height_mm", o.Former)
	case set("field"):
		return inRange("--field", "field_angle_deg", o.Former)
	}
	return 0, nil
}

// inRange refuses a field edge outside the range find allows for the same
// requirement key (search.Ranges), either sign.
func inRange(flag, key string, v float64) (float64, error) {
	for _, r := range search.Ranges() {
		if r.Key == key && (math.Abs(v) < r.Min || math.Abs(v) > r.Max) {
			return 0, usageErrorf("%s %g is outside %s; give a field edge in that range, or leave the flag out for the search's own", flag, v, r)
		}
	}
	return v, nil
}
