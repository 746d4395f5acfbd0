package main

import (
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
		return o.Angle, nil
	case set("object-height"):
		return o.Height, nil
	}
	return o.Former, nil
}
