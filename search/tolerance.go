package search

import (
	"encoding/json"
	"fmt"
	"math"
	"strconv"
	"strings"
)

// A Tolerance is an allowed departure from a target, either a percentage of
// the target or an absolute amount (mm for lengths, a plain number for
// magnifications and ratios). The zero value allows no departure.
type Tolerance struct {
	Value   float64
	Percent bool
}

// ParseTolerance reads "1%", "0.5mm", "0.5 mm" or "0.5"; unit is the word
// the absolute form may carry ("mm", or "" for a plain number).
func ParseTolerance(s, unit string) (Tolerance, error) {
	t := strings.TrimSpace(strings.ToLower(s))
	tol := Tolerance{}
	switch {
	case strings.HasSuffix(t, "%"):
		tol.Percent = true
		t = strings.TrimSpace(strings.TrimSuffix(t, "%"))
	case unit != "" && strings.HasSuffix(t, unit):
		t = strings.TrimSpace(strings.TrimSuffix(t, unit))
	}
	v, err := strconv.ParseFloat(t, 64)
	if err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
		if unit != "" {
			return Tolerance{}, fmt.Errorf("tolerance %q: want a percentage like 1%% or an amount like 0.5%s", s, unit)
		}
		return Tolerance{}, fmt.Errorf("tolerance %q: want a percentage like 1%% or a number like 0.01", s)
	}
	if v < 0 {
		return Tolerance{}, fmt.Errorf("tolerance %q is below zero", s)
	}
	tol.Value = v
	return tol, nil
}

// Abs is the tolerance as an absolute amount for the given target.
func (t Tolerance) Abs(target float64) float64 {
	if t.Percent {
		return t.Value / 100 * math.Abs(target)
	}
	return t.Value
}

// String gives the form ParseTolerance reads ("1%" or "0.5").
func (t Tolerance) String() string {
	s := strconv.FormatFloat(t.Value, 'g', -1, 64)
	if t.Percent {
		return s + "%"
	}
	return s
}

// MarshalJSON writes the tolerance as a string such as "1%".
func (t Tolerance) MarshalJSON() ([]byte, error) { return json.Marshal(t.String()) }

// UnmarshalJSON reads a string such as "1%" or "0.5mm", or a plain number
// (an absolute amount).
func (t *Tolerance) UnmarshalJSON(b []byte) error {
	var v float64
	if err := json.Unmarshal(b, &v); err == nil {
		if v < 0 {
			return fmt.Errorf("tolerance %g is below zero", v)
		}
		*t = Tolerance{Value: v}
		return nil
	}
	var s string
	if err := json.Unmarshal(b, &s); err != nil {
		return fmt.Errorf("tolerance: want a string like \"1%%\" or a number")
	}
	tol, err := ParseTolerance(s, "mm")
	if err != nil {
		return err
	}
	*t = tol
	return nil
}
