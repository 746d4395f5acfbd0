package catalog

import (
	"fmt"
	"math"
	"strings"
)

// A Range is the closed interval [Min, Max] in mm. The zero value means no
// limit; an infinite end means no limit on that side.
type Range struct{ Min, Max float64 }

// IsZero tells whether the range sets no limit.
func (r Range) IsZero() bool { return r.Min == 0 && r.Max == 0 }

// Part kinds a Filter accepts, besides Singlet, Cemented and AirSpaced.
const (
	Positive = "positive" // converging: positive power at the reference wavelength
	Negative = "negative" // diverging
)

// KindNames returns the kinds a Filter accepts.
func KindNames() []string { return []string{Positive, Negative, Singlet, Cemented, AirSpaced} }

// A Filter selects parts. The zero value selects every part; each field set
// narrows the selection further.
type Filter struct {
	EFL      Range // effective focal length at the reference wavelength
	Diameter Range // mechanical diameter
	// Suppliers keeps the parts of any of these suppliers (exact names).
	Suppliers []string
	// Kinds keeps the parts that are all of these kinds (see KindNames).
	Kinds []string
	// InDrawer keeps the parts with at least one piece in the drawer.
	InDrawer bool
	// IDs keeps the parts named SUPPLIER:PART.
	IDs []string
}

// where returns the SQL condition and its arguments over the aliases p
// (parts), c (computed, forward orientation) and d (drawer, left-joined).
func (f Filter) where() (string, []any, error) {
	conds := []string{"1"}
	var args []any
	rng := func(col string, r Range, what string) error {
		if r.IsZero() {
			return nil
		}
		if math.IsNaN(r.Min) || math.IsNaN(r.Max) || r.Min > r.Max {
			return fmt.Errorf("%s range %g:%g is empty: give MIN:MAX with MIN <= MAX", what, r.Min, r.Max)
		}
		if !math.IsInf(r.Min, -1) {
			conds, args = append(conds, col+" >= ?"), append(args, r.Min)
		}
		if !math.IsInf(r.Max, 1) {
			conds, args = append(conds, col+" <= ?"), append(args, r.Max)
		}
		return nil
	}
	if err := rng("c.efl_mm", f.EFL, "EFL"); err != nil {
		return "", nil, err
	}
	if err := rng("c.diameter_mm", f.Diameter, "diameter"); err != nil {
		return "", nil, err
	}
	if len(f.Suppliers) > 0 {
		conds = append(conds, "p.supplier IN ("+placeholders(len(f.Suppliers))+")")
		for _, s := range f.Suppliers {
			args = append(args, s)
		}
	}
	for _, k := range f.Kinds {
		c, err := kindCondition(k)
		if err != nil {
			return "", nil, err
		}
		conds = append(conds, c)
	}
	if f.InDrawer {
		conds = append(conds, "d.quantity > 0")
	}
	if len(f.IDs) > 0 {
		var ors []string
		for _, id := range f.IDs {
			sup, part := SplitID(id)
			ors, args = append(ors, "(p.supplier = ? AND p.part = ?)"), append(args, sup, part)
		}
		conds = append(conds, "("+strings.Join(ors, " OR ")+")")
	}
	return strings.Join(conds, " AND "), args, nil
}

func kindCondition(k string) (string, error) {
	switch strings.ToLower(strings.TrimSpace(k)) {
	case Positive:
		return "c.power_per_mm > 0", nil
	case Negative:
		return "c.power_per_mm < 0", nil
	case Singlet:
		return "p.kind = 'singlet'", nil
	case Cemented:
		return "p.kind = 'cemented'", nil
	case AirSpaced:
		return "p.kind = 'air-spaced'", nil
	}
	return "", fmt.Errorf("unknown kind %q: use %s", k, strings.Join(KindNames(), ", "))
}

// filteredParts is the FROM clause every filtered query shares.
const filteredParts = ` FROM parts p
	JOIN computed c ON c.part_id = p.id AND c.reversed = 0
	LEFT JOIN drawer d ON d.part_id = p.id `

func placeholders(n int) string {
	return strings.TrimSuffix(strings.Repeat("?, ", n), ", ")
}

// SplitID splits SUPPLIER:PART at the first colon; with no colon the
// supplier is empty.
func SplitID(id string) (supplier, part string) {
	if i := strings.IndexByte(id, ':'); i >= 0 {
		return id[:i], id[i+1:]
	}
	return "", id
}
