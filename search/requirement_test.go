package search

import (
	"encoding/json"
	"errors"
	"math"
	"reflect"
	"strings"
	"testing"
)

func TestRequirementValidate(t *testing.T) {
	focus := func(mod func(*Requirement)) Requirement {
		r := focusReq(50)
		if mod != nil {
			mod(&r)
		}
		return r
	}
	image := func(mod func(*Requirement)) Requirement {
		r := imageReq(300, -0.5)
		if mod != nil {
			mod(&r)
		}
		return r
	}
	tests := []struct {
		name string
		req  Requirement
		want string // part of the error; "" for valid
	}{
		{"focus", focus(nil), ""},
		{"image", image(nil), ""},
		{"expand", expandReq(3), ""},
		{"no kind", Defaults(), "say what to find"},
		{"negative EFL", focus(func(r *Requirement) { r.EFL = -50 }), `"efl_mm" is negative`},
		{"tolerance as large as the EFL", focus(func(r *Requirement) { r.EFLTol = Tolerance{Value: 60} }), "as large as the EFL"},
		{"negative track", image(func(r *Requirement) { r.Track = -1 }), `"track_mm" is negative`},
		{"zero magnification", image(func(r *Requirement) { r.Mag = 0 }), "non-zero magnification"},
		{"NA of 1", image(func(r *Requirement) { r.NA = 1 }), `"na" 1 is outside 0 to 0.999`},
		{"minimums longer than the track", image(func(r *Requirement) { r.WDMin, r.BFDMin = 200, 100 }), "leave nothing"},
		{"erect image from one part", image(func(r *Requirement) { r.Mag, r.Elements = 0.5, 1 }), `needs two "elements"`},
		{"expander of one part", func() Requirement { r := expandReq(3); r.Elements = 1; return r }(), "needs two elements"},
		{"zero expansion", func() Requirement { r := expandReq(3); r.Expansion = 0; return r }(), "must be positive"},
		{"NaN", focus(func(r *Requirement) { r.Beam = nan() }), "finite"},
		{"flag of another kind", focus(func(r *Requirement) { r.NA = 0.1 }), `"na" does not apply`},
		{"three elements", focus(func(r *Requirement) { r.Elements = 3 }), `"elements" must be 1 or 2`},
		{"negative top", focus(func(r *Requirement) { r.Top = -1 }), `"top" is negative`},
		{"wavelength out of range", focus(func(r *Requirement) { r.Wavelength = 50 }), `"wavelength_nm" 50 is outside 150 to 20000 nm`},
		{"form on a focus", focus(func(r *Requirement) { r.Form = Galilean }), `"form" applies to an expand requirement only`},
		{"sharp", focus(func(r *Requirement) {
			r.Prefer, r.Beam, r.FieldAngle, r.Band = PreferSharp, 5, 2, []float64{486.1, 656.3}
		}), ""},
		{"field angle of 90 degrees", focus(func(r *Requirement) { r.FieldAngle = 90 }), `"field_angle_deg" 90 is outside`},
		{"negative field angle", focus(func(r *Requirement) { r.FieldAngle = -1 }), `"field_angle_deg" is negative`},
		{"field angle on an image", image(func(r *Requirement) { r.FieldAngle = 2 }), `give "object_height_mm"`},
		{"band on an expander", func() Requirement { r := expandReq(3); r.Band = []float64{500, 600}; return r }(), "first order only"},
		{"band out of range", focus(func(r *Requirement) { r.Band = []float64{100, 600} }), `"band_nm" 100 is outside`},
		{"negative power", focus(func(r *Requirement) { r.Power = -1 }), `"power_w" is negative`},
		{"power on an image", image(func(r *Requirement) { r.Power = 0.01 }), ""},
		{"unknown kind", focus(func(r *Requirement) { r.Kind = "banana" }), `unknown "kind" "banana": use focus, image, expand or match`},
		{"EFL far too short", focus(func(r *Requirement) { r.EFL = 1e-200 }), `"efl_mm" 1e-200 is outside 0.1 to 100000 mm`},
		{"EFL far too long", focus(func(r *Requirement) { r.EFL = 1e308 }), `"efl_mm" 1e+308 is outside`},
		{"infinite track", image(func(r *Requirement) { r.Track = math.Inf(1) }), `"track_mm" must be a finite number`},
		{"track of 1e308", image(func(r *Requirement) { r.Track = 1e308 }), `"track_mm" 1e+308 is outside`},
		{"tiny magnification", image(func(r *Requirement) { r.Mag = -1e-300 }), `"magnification" -1e-300 is outside`},
		{"huge magnification", image(func(r *Requirement) { r.Mag = -1e300 }), `"magnification" -1e+300 is outside`},
		{"huge beam", focus(func(r *Requirement) { r.Beam = 1e300 }), `"beam_mm" 1e+300 is outside`},
		{"huge tolerance", focus(func(r *Requirement) { r.EFLTol = Tolerance{Value: 1e300} }), `"efl_tol" 1e+300 is outside`},
		{"NaN tolerance", focus(func(r *Requirement) { r.EFLTol = Tolerance{Value: nan()} }), `"efl_tol" must be a finite number`},
		{"NaN band", focus(func(r *Requirement) { r.Band = []float64{nan()} }), `"band_nm" must be a finite number`},
		{"top past the ceiling", focus(func(r *Requirement) { r.Top = MaxShown + 1 }), `"top" 10001 is outside 0 to 10000`},
		{"zero tolerance", focus(func(r *Requirement) { r.EFLTol = Tolerance{} }), ""},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			err := tt.req.Validate()
			switch {
			case tt.want == "" && err != nil:
				t.Fatalf("unexpected error %v", err)
			case tt.want != "" && (err == nil || !strings.Contains(err.Error(), tt.want)):
				t.Fatalf("error %v, want one containing %q", err, tt.want)
			}
			var re *RequirementError
			if err != nil && (!errors.As(err, &re) || len(re.Problems) == 0 || len(re.Problems[0].Keys) == 0) {
				t.Errorf("error %#v names no field", err)
			}
		})
	}
}

func nan() float64 {
	z := 0.0
	return z / z
}

func TestParseTolerance(t *testing.T) {
	tests := []struct {
		in, unit string
		want     Tolerance
		abs      float64 // Abs(200)
		err      bool
	}{
		{"1%", "mm", Tolerance{1, true}, 2, false},
		{" 2.5 % ", "mm", Tolerance{2.5, true}, 5, false},
		{"0.5mm", "mm", Tolerance{Value: 0.5}, 0.5, false},
		{"0.5 mm", "mm", Tolerance{Value: 0.5}, 0.5, false},
		{"0.02", "", Tolerance{Value: 0.02}, 0.02, false},
		{"-1%", "mm", Tolerance{}, 0, true},
		{"a lot", "mm", Tolerance{}, 0, true},
		{"inf", "", Tolerance{}, 0, true},
	}
	for _, tt := range tests {
		t.Run(tt.in, func(t *testing.T) {
			got, err := ParseTolerance(tt.in, tt.unit)
			if (err != nil) != tt.err {
				t.Fatalf("error %v, want error %v", err, tt.err)
			}
			if err == nil && (got != tt.want || got.Abs(200) != tt.abs) {
				t.Errorf("got %+v (abs %g), want %+v (abs %g)", got, got.Abs(200), tt.want, tt.abs)
			}
		})
	}
}

// A requirement written as JSON reads back the same, as a spec file and as
// the "requirement" object of a saved search.
func TestReadSpecRoundTrip(t *testing.T) {
	r := imageReq(250, -0.25)
	r.MagTol, r.NA, r.ObjectHeight, r.Supplier, r.Prefer = Tolerance{Value: 0.01}, 0.05, 4, "DEMO", PreferShort
	r.Band, r.Power = []float64{486.1, 587.6, 656.3}, 0.2
	b, err := json.Marshal(r)
	if err != nil {
		t.Fatal(err)
	}
	for name, doc := range map[string]string{"spec": string(b), "saved": `{"requirement": ` + string(b) + `, "results": []}`} {
		got, err := ReadSpec(strings.NewReader(doc), name)
		if err != nil {
			t.Fatal(err)
		}
		if !reflect.DeepEqual(got, r) {
			t.Errorf("%s: read %+v, want %+v", name, got, r)
		}
	}
	if _, err := ReadSpec(strings.NewReader(`{"kind": "focus", "efl": 50}`), "typo.json"); err == nil || !strings.Contains(err.Error(), "typo.json") {
		t.Errorf("misspelt key: error %v", err)
	}
}
