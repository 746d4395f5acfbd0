package finite

import (
	"errors"
	"math"
	"strings"
	"testing"
)

type inner struct {
	Y   float64
	Tag float64 `finite:"-"`
}

type model struct {
	Name   string
	X      float64
	Points []inner
	ByKey  map[string]float64
	Ptr    *float64
	Any    any
	small  float32
}

// NaN and the infinities are the IEEE 754 values that are not finite
// (IEEE Std 754-2019, section 3.4; common practice); Check must find each,
// wherever it sits, and pass every finite number, the largest included.
func TestCheck(t *testing.T) {
	nan, inf := math.NaN(), math.Inf(1)
	big := math.MaxFloat64
	tests := []struct {
		name string
		v    any
		path string // "" for no error
	}{
		{"finite, largest and smallest", model{X: big, Points: []inner{{Y: -big}, {Y: math.SmallestNonzeroFloat64}}, ByKey: map[string]float64{"a": 1}}, ""},
		{"NaN field", model{X: nan}, "X"},
		{"infinity in a slice", model{Points: []inner{{Y: 1}, {Y: -inf}}}, "Points[1].Y"},
		{"skipped sentinel", model{Points: []inner{{Tag: nan}}}, ""},
		{"map value", model{ByKey: map[string]float64{"efl": inf}}, "ByKey[efl]"},
		{"through a pointer", model{Ptr: &nan}, "Ptr"},
		{"through an interface", model{Any: []float64{0, nan}}, "Any[1]"},
		{"unexported float32", model{small: float32(inf)}, "small"},
		{"bare value", nan, "the value itself"},
		{"nil pointer", (*model)(nil), ""},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			err := Check("the drawing", tc.v)
			if tc.path == "" {
				if err != nil {
					t.Fatalf("unexpected %v", err)
				}
				return
			}
			var fe *Error
			if !errors.As(err, &fe) || fe.Path != tc.path {
				t.Fatalf("got %v, want an *Error at %s", err, tc.path)
			}
			if !strings.Contains(err.Error(), "the drawing would hold") || !strings.Contains(err.Error(), tc.path) {
				t.Errorf("message %q does not name the output and the place", err)
			}
		})
	}
}

// A cycle of pointers ends.
func TestCheckCycle(t *testing.T) {
	type node struct {
		V    float64
		Next *node
	}
	a := &node{V: 1}
	a.Next = a
	if err := Check("x", a); err != nil {
		t.Fatal(err)
	}
}

func TestAttributes(t *testing.T) {
	tests := []struct {
		name, doc, path string
	}{
		{"finite", `<svg viewBox="0 0 10 10"><line class="axis" x1="0" y1="-1.5e-3"/></svg>`, ""},
		{"NaN coordinate", `<svg><polyline class="ray ray-edge" points="0,0 NaN,1"/></svg>`, `<polyline class="ray ray-edge"> attribute points`},
		{"infinity", `<svg><line x1="+Inf"/></svg>`, "<line> attribute x1"},
		{"a part named NaN in text is text", `<svg><text x="1" data-part="2">NaN-50 Info</text></svg>`, ""},
		{"a word is not a number", `<svg><text class="Infinity NaNo">a</text></svg>`, ""},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			err := Attributes("the drawing", []byte(tc.doc))
			var fe *Error
			switch {
			case tc.path == "" && err != nil:
				t.Fatalf("unexpected %v", err)
			case tc.path != "" && (!errors.As(err, &fe) || fe.Path != tc.path):
				t.Fatalf("got %v, want an *Error at %s", err, tc.path)
			}
		})
	}
}
