package importers

import (
	"encoding/csv"
	"fmt"
	"io"
	"strings"

	"cardinal/catalog/record"
	"cardinal/optics"
)

// WritePrescriptions writes entries as a neutral prescription CSV that
// ReadPrescriptions reads back field for field (the source line and the
// warnings aside, which the reader sets): numbers in the shortest form that
// parses back to the same float, flats as inf, zero optional values as
// empty cells. Conic and asphere columns appear only up to the last surface
// that uses them, tolerance and coating columns only when some entry
// states one.
// Glasses are written by name, so the reader's glass table
// must know every glass the entries use.
func WritePrescriptions(w io.Writer, entries []record.Entry) error {
	n, nConic, nAsph := 2, 0, 0
	for _, e := range entries {
		if err := checkShape(e.Part); err != nil {
			return err
		}
		n = max(n, len(e.Part.Surfaces))
		for i, s := range e.Part.Surfaces {
			if s.Conic != 0 {
				nConic = max(nConic, i+1)
			}
			if s.Asph != [7]float64{} {
				nAsph = max(nAsph, i+1)
			}
		}
	}
	tols, coats := false, false
	for _, e := range entries {
		tols = tols || e.Tolerances != (optics.Tolerances{})
		coats = coats || e.Part.Coating.Stated
	}
	cw := csv.NewWriter(w)
	h := prescriptionHeader(n, nConic, nAsph)
	if tols {
		h = append(h, "efl_tolerance", "thickness_tolerance", "index_tolerance", "radius_tolerance")
	}
	if coats {
		h = append(h, CoatingColumn)
	}
	cw.Write(h)
	for _, e := range entries {
		row := prescriptionRow(e, n, nConic, nAsph)
		if tols {
			t := e.Tolerances
			row = append(row, optionalFloat(t.EFLPct), optionalFloat(t.Thickness), optionalFloat(t.Index), optionalFloat(t.RadiusPct))
		}
		if coats {
			row = append(row, coatingCell(e.Part.Coating))
		}
		cw.Write(row)
	}
	cw.Flush()
	return cw.Error()
}

// checkShape refuses a part the format cannot hold.
func checkShape(p optics.Part) error {
	n := len(p.Surfaces)
	switch {
	case n < 2 || n > MaxSurfaces:
		return fmt.Errorf("writing %s: %d surfaces; the prescription CSV holds 2 to %d", p.ID(), n, MaxSurfaces)
	case strings.HasPrefix(p.Supplier, "#"):
		return fmt.Errorf("writing %s: a supplier name starting with # would read back as a comment line", p.ID())
	case len(p.Thickness) != n-1 || len(p.Media) != n-1:
		return fmt.Errorf("writing %s: %d surfaces need %d thicknesses and media, not %d and %d", p.ID(), n, n-1, len(p.Thickness), len(p.Media))
	}
	for i, m := range p.Media {
		if m == nil {
			return fmt.Errorf("writing %s: glass%d has no material", p.ID(), i+1)
		}
	}
	return nil
}

func prescriptionHeader(n, nConic, nAsph int) []string {
	h := []string{"supplier", "part", "description", "diameter", "clear_aperture"}
	for i := 1; i <= n; i++ {
		h = append(h, col("r", i))
	}
	for i := 1; i < n; i++ {
		h = append(h, col("t", i))
	}
	for i := 1; i < n; i++ {
		h = append(h, col("glass", i))
	}
	for i := 1; i <= nConic; i++ {
		h = append(h, col("conic", i))
	}
	for i := 1; i <= nAsph; i++ {
		h = append(h, col("asph", i))
	}
	return append(h, "efl", "bfd", "edge_thickness", "stated_wavelength", "price", "currency", "url", "notes")
}

func prescriptionRow(e record.Entry, n, nConic, nAsph int) []string {
	p := e.Part
	row := []string{p.Supplier, p.Name, p.Description, formatFloat(p.Diameter), optionalFloat(p.ClearAperture)}
	surface := func(i int) (optics.Surface, bool) {
		if i < len(p.Surfaces) {
			return p.Surfaces[i], true
		}
		return optics.Surface{}, false
	}
	for i := range n {
		s, ok := surface(i)
		row = append(row, formatRadius(s, ok))
	}
	for i := range n - 1 {
		row = append(row, cellAt(p.Thickness, i, formatFloat))
	}
	for i := range n - 1 {
		row = append(row, cellAt(p.Media, i, func(m optics.Medium) string { return m.Name() }))
	}
	for i := range nConic {
		s, _ := surface(i)
		row = append(row, optionalFloat(s.Conic))
	}
	for i := range nAsph {
		s, _ := surface(i)
		row = append(row, formatAsph(s.Asph))
	}
	return append(row, optionalFloat(e.StatedEFL), optionalFloat(e.StatedBFD), optionalFloat(e.StatedEdge),
		optionalFloat(e.StatedWavelength), optionalFloat(e.Price), e.Currency, e.URL, e.Notes)
}

func formatRadius(s optics.Surface, ok bool) string {
	switch {
	case !ok:
		return ""
	case s.IsPlane():
		return "inf"
	}
	return formatFloat(s.Radius)
}

func cellAt[T any](xs []T, i int, f func(T) string) string {
	if i < len(xs) {
		return f(xs[i])
	}
	return ""
}

// formatAsph writes the non-zero coefficients as "a4=1.2e-06 a6=-3.1e-10".
func formatAsph(a [7]float64) string {
	var terms []string
	for i, v := range a {
		if v != 0 {
			terms = append(terms, fmt.Sprintf("a%d=%s", 2*i+4, formatFloat(v)))
		}
	}
	return strings.Join(terms, " ")
}
