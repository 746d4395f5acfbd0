package search

import (
	"encoding/json"
	"errors"
	"math"
	"strings"
	"testing"
)

// FuzzReadSpec: no requirement file makes the reader panic; it is read or
// refused with a *SpecError, and a requirement read and validated encodes
// as JSON (no NaN or infinity gets through).
func FuzzReadSpec(f *testing.F) {
	for _, s := range []string{`{"kind": "focus", "efl_mm": 50}`, `{"requirement": {"kind": "image", "track_mm": 300, "magnification": -0.5}}`,
		`{"kind": "expand", "expansion": 5, "expand_tol": "2%"}`, `{"kind": "focus", "efl_mm": 1e400}`, `{"kind"`, `[]`, ``} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, doc string) {
		req, err := ReadSpec(strings.NewReader(doc), "f.json")
		if err != nil {
			var se *SpecError
			if !errors.As(err, &se) || se.Line < 1 || se.Col < 1 {
				t.Fatalf("error %v (%T) is not a positioned *SpecError", err, err)
			}
			return
		}
		if req.Validate() == nil {
			if _, err := json.Marshal(req); err != nil {
				t.Fatalf("a valid requirement does not encode: %v", err)
			}
		}
	})
}

// FuzzParseTolerance: a tolerance read is finite and not negative.
func FuzzParseTolerance(f *testing.F) {
	for _, s := range []string{"1%", "0.5mm", "0.02", "-1%", "inf", "NaN", "1e400%"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		tol, err := ParseTolerance(s, "mm")
		if err == nil && (math.IsNaN(tol.Value) || math.IsInf(tol.Value, 0) || tol.Value < 0) {
			t.Fatalf("%q read as %+v", s, tol)
		}
	})
}
