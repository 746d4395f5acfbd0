package importers

import (
	"cmp"
	"fmt"
	"io"
	"math"
	"regexp"
	"runtime"
	"slices"
	"strconv"
	"strings"
	"sync"

	"cardinal/catalog/record"
	"cardinal/optics"
)

// MaxSurfaces is the most surfaces a row of the prescription CSV holds
// (r1 ... r6).
const MaxSurfaces = 6

// DefaultStatedWavelength is the wavelength in nm at which stated EFL and BFD
// are taken when a row does not say (DESIGN.md, neutral prescription CSV).
const DefaultStatedWavelength = 587.6

// prescriptionSchema is the column set of the neutral prescription CSV,
// version 1 (DESIGN.md).
var prescriptionSchema = schema{
	known: func(name string) bool {
		switch name {
		case "supplier", "part", "description", "diameter", "clear_aperture",
			"efl", "bfd", "edge_thickness", "stated_wavelength",
			"price", "currency", "url", "notes",
			"efl_tolerance", "thickness_tolerance", "index_tolerance", "radius_tolerance",
			CoatingColumn:
			return true
		}
		for _, p := range []struct {
			prefix string
			n      int
		}{{"r", MaxSurfaces}, {"t", MaxSurfaces - 1}, {"glass", MaxSurfaces - 1}, {"conic", MaxSurfaces}, {"asph", MaxSurfaces}} {
			if i, ok := indexed(name, p.prefix); ok && i <= p.n {
				return true
			}
		}
		return false
	},
	required: []string{"supplier", "part", "diameter", "r1", "r2", "t1", "glass1"},
}

// indexed splits "r3" into 3 for the prefix "r".
func indexed(name, prefix string) (int, bool) {
	rest, ok := strings.CutPrefix(name, prefix)
	if !ok || len(rest) != 1 || rest[0] < '1' || rest[0] > '9' {
		return 0, false
	}
	return int(rest[0] - '0'), true
}

// ReadPrescriptions reads a neutral prescription CSV (DESIGN.md, version 1)
// into entries, resolving glass names through glasses (nil knows air and
// six-digit glass codes only). file names the input in messages. The error,
// when not nil, is a FileErrors listing every bad row and cell, and the
// entries are then nil. Each entry's Warnings hold ComputedWarnings;
// warnings about the file as a whole (unknown columns) are dropped here and
// returned by ReadPrescriptionFile.
func ReadPrescriptions(r io.Reader, file string, glasses optics.GlassTable) ([]record.Entry, error) {
	f, err := ReadPrescriptionFile(r, file, glasses)
	return f.Rows, err
}

// ReadPrescriptionFile is ReadPrescriptions with the file's own warnings.
func ReadPrescriptionFile(r io.Reader, file string, glasses optics.GlassTable) (File[record.Entry], error) {
	// The rows are read on every processor (each row is read on its own)
	// as the file is read, then checked against one another in file order.
	type parsed struct {
		row *row
		e   record.Entry
	}
	type run struct {
		t     *table
		first int // the number of its first row
		rows  []rawRow
	}
	runs := make(chan run, 2*runtime.GOMAXPROCS(0))
	var (
		mu      sync.Mutex
		results = map[int][]parsed{} // by the number of the run's first row
		wg      sync.WaitGroup
	)
	for range max(1, runtime.GOMAXPROCS(0)) {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for r := range runs {
				out := make([]parsed, len(r.rows))
				for i := range r.rows {
					row := r.t.row(r.rows[i])
					e := parseEntry(row, glasses)
					if len(row.errs) == 0 {
						e.Warnings = ComputedWarnings(e)
					}
					out[i] = parsed{row, e}
				}
				mu.Lock()
				results[r.first] = out
				mu.Unlock()
			}
		}()
	}
	n := 0
	t := streamTable(r, file, prescriptionSchema, func(t *table, rows []rawRow) {
		runs <- run{t, n, rows}
		n += len(rows)
	})
	close(runs)
	wg.Wait()
	errs := t.errs
	var entries []record.Entry
	if n > 0 {
		entries = make([]record.Entry, 0, n)
	}
	seen := make(map[string]int, n)
	for k := 0; k < n; k += len(results[k]) {
		rows := results[k]
		for i := range rows {
			row, e := rows[i].row, &rows[i].e
			id := e.Part.ID()
			if first, dup := seen[id]; dup && e.Part.Supplier != "" && e.Part.Name != "" {
				row.fail("part", "%s is already on line %d; supplier and part together must be unique", id, first)
			} else {
				seen[id] = row.rec.line
			}
			if len(row.errs) > 0 {
				errs = append(errs, row.errs...)
				continue
			}
			entries = append(entries, *e)
		}
	}
	if len(errs) > 0 {
		sortErrors(errs)
		return File[record.Entry]{Warnings: t.warnings}, errs
	}
	return File[record.Entry]{Rows: entries, Warnings: t.warnings}, nil
}

// parseEntry reads one row; the row collects what is wrong. The part is
// validated (optics.Part.Validate) only when every cell parsed.
func parseEntry(r *row, glasses optics.GlassTable) record.Entry {
	e := record.Entry{Line: r.rec.line}
	p := &e.Part
	p.Supplier = r.required("supplier")
	if strings.ContainsRune(p.Supplier, ':') {
		r.fail("supplier", "%q holds a colon, which separates supplier from part in SUPPLIER:PART", p.Supplier)
	}
	if strings.HasPrefix(p.Supplier, "#") {
		r.fail("supplier", "%q starts with #, which marks a comment line", p.Supplier)
	}
	p.Name = r.required("part")
	p.Description = r.text("description")
	if r.text("diameter") == "" {
		r.fail("diameter", "is empty but required")
	}
	p.Diameter = r.ranged("diameter", lengthLimit)
	p.ClearAperture = r.ranged("clear_aperture", lengthLimit)
	parseSurfaces(r, p, glasses)
	parseStated(r, &e)
	if len(r.errs) == 0 {
		if err := p.Validate(); err != nil {
			for _, pr := range err.(optics.Problems) {
				r.fail(pr.Field, "%s", pr.Reason)
			}
		}
	}
	return e
}

// parseSurfaces reads r1..rN, t1..t(N-1), glass1..glass(N-1) and the
// optional conic and asphere columns, where N is the highest i with ri
// filled (DESIGN.md).
func parseSurfaces(r *row, p *optics.Part, glasses optics.GlassTable) {
	n := 0
	for i := 1; i <= MaxSurfaces; i++ {
		if r.text(col("r", i)) != "" {
			n = i
		}
	}
	if n < 2 {
		r.fail("r2", "is empty: a part needs at least two surfaces (inf or plano for a flat)")
		return
	}
	p.Surfaces = make([]optics.Surface, n)
	p.Thickness = make([]float64, n-1)
	p.Media = make([]optics.Medium, n-1)
	for i := 1; i <= n; i++ {
		p.Surfaces[i-1].Radius = parseRadius(r, col("r", i), n)
	}
	for i := 1; i < n; i++ {
		if r.text(col("t", i)) == "" {
			r.fail(col("t", i), "is empty, but the part has %d surfaces and needs t1 to t%d", n, n-1)
		}
		p.Thickness[i-1] = r.ranged(col("t", i), lengthLimit)
	}
	for i := 1; i < n; i++ {
		p.Media[i-1] = parseGlass(r, col("glass", i), n, glasses)
	}
	if p.Media[0] == optics.Air || p.Media[n-2] == optics.Air {
		r.fail(col("glass", 1), "a part cannot begin or end with air; name the glass of its first and last element")
	}
	for i := 1; i <= n; i++ {
		k, _ := r.number(col("conic", i))
		p.Surfaces[i-1].Conic = r.within(col("conic", i), k, conicLimit, true)
	}
	for i := 1; i <= n; i++ {
		p.Surfaces[i-1].Asph = parseAsph(r, col("asph", i))
	}
	for i := n; i <= MaxSurfaces; i++ {
		for _, c := range []string{col("t", i), col("glass", i), col("conic", i+1), col("asph", i+1)} {
			if r.text(c) != "" {
				r.fail(c, "is filled but the part has only %d surfaces (r%d is the last radius given)", n, n)
			}
		}
	}
}

// col is the name of a numbered column: r1, t2, glass3, ... Those the
// surfaces can have are made once, not once per row.
func col(prefix string, i int) string {
	if names := colNames[prefix]; i < len(names) {
		return names[i]
	}
	return prefix + strconv.Itoa(i)
}

var colNames = func() map[string][]string {
	m := map[string][]string{}
	for _, prefix := range []string{"r", "t", "glass", "conic", "asph"} {
		for i := range MaxSurfaces + 2 {
			m[prefix] = append(m[prefix], prefix+strconv.Itoa(i))
		}
	}
	return m
}()

// parseRadius reads a radius in mm; inf, infinity or plano (any case, any
// sign) is a flat, stored as +Inf.
func parseRadius(r *row, c string, n int) float64 {
	s := r.text(c)
	switch strings.TrimLeft(strings.ToLower(s), "+-") {
	case "":
		r.fail(c, "is empty, but the part has %d surfaces; write inf or plano for a flat", n)
		return math.Inf(1)
	case "inf", "infinity", "plano":
		return math.Inf(1)
	}
	v, ok := r.number(c)
	if ok && v == 0 {
		r.fail(c, "a radius of 0 is not a surface; write inf or plano for a flat")
	}
	if !ok {
		return math.Inf(1)
	}
	if v != 0 && !radiusLimit.holds(v, false) {
		r.fail(c, "radius %s mm is outside %s in size; write inf or plano for a flat", formatFloat(v), radiusLimit)
		return math.Inf(1)
	}
	return v
}

var equalsSpace = regexp.MustCompile(`\s*=\s*`)

// parseAsph reads even-asphere coefficients written "a4=1.2e-6 a6=-3.1e-10"
// (space, comma or semicolon between terms; a4 ... a16 of h^4 ... h^16, in
// the form of ISO 10110-12).
func parseAsph(r *row, c string) [7]float64 {
	var a [7]float64
	s := equalsSpace.ReplaceAllString(r.text(c), "=")
	set := map[string]bool{}
	for _, term := range strings.FieldsFunc(s, func(r rune) bool { return r == ' ' || r == '\t' || r == ',' || r == ';' }) {
		key, val, ok := strings.Cut(term, "=")
		key = strings.ToLower(key)
		i, known := asphIndex[key]
		v, err := strconv.ParseFloat(val, 64)
		switch {
		case !ok || !known:
			r.fail(c, "%q is not a term like a4=1.2e-6 (even orders a4 to a16)", term)
		case err != nil || math.IsNaN(v) || math.IsInf(v, 0):
			r.fail(c, "%s: %q is not a finite number", key, val)
		case !asphLimit.holds(v, true):
			r.fail(c, "%s = %s is outside %s in size; check the value and its unit", key, val, asphLimit)
		case set[key]:
			r.fail(c, "%s is given twice", key)
		default:
			set[key] = true
			a[i] = v
		}
	}
	return a
}

var asphIndex = map[string]int{"a4": 0, "a6": 1, "a8": 2, "a10": 3, "a12": 4, "a14": 5, "a16": 6}

func parseGlass(r *row, c string, n int, glasses optics.GlassTable) optics.Medium {
	name := r.text(c)
	if name == "" {
		r.fail(c, "is empty, but the part has %d surfaces and needs glass1 to glass%d", n, n-1)
		return nil
	}
	m, err := glasses.Lookup(name)
	if err != nil {
		r.fail(c, "%v", err)
	}
	return m
}

// parseStated reads the supplier's stated values and the purchase fields.
func parseStated(r *row, e *record.Entry) {
	if v, ok := r.number("efl"); ok && v == 0 {
		r.fail("efl", "0 is not a focal length; leave the cell empty when not stated")
	} else {
		e.StatedEFL = r.within("efl", v, focalLimit, true)
	}
	bfd, _ := r.number("bfd")
	e.StatedBFD = r.within("bfd", bfd, focalLimit, true)
	e.StatedEdge = r.ranged("edge_thickness", lengthLimit)
	e.StatedWavelength = r.ranged("stated_wavelength", wavelengthLimit)
	if v, ok := r.number("price"); ok && v < 0 {
		r.fail("price", "must not be negative, not %s", formatFloat(v))
	} else {
		e.Price = r.within("price", v, priceLimit, true)
	}
	e.Currency = r.text("currency")
	e.URL = r.text("url")
	e.Notes = r.text("notes")
	parseTolerances(r, e)
	parseCoating(r, &e.Part)
}

// parseTolerances reads the part's stated manufacturing tolerances (empty
// cells are not stated): efl_tolerance and radius_tolerance in percent (a
// trailing % allowed), thickness_tolerance in mm, index_tolerance a plain
// number.
func parseTolerances(r *row, e *record.Entry) {
	pct := func(col string) float64 {
		s := strings.TrimSpace(strings.TrimSuffix(r.text(col), "%"))
		if s == "" {
			return 0
		}
		v, err := strconv.ParseFloat(s, 64)
		if err != nil || v != v || v < 0 || v >= 50 {
			r.fail(col, "%q: want a percentage from 0 up to below 50, such as 1%% or 2", r.text(col))
			return 0
		}
		return v
	}
	e.Tolerances.EFLPct = pct("efl_tolerance")
	e.Tolerances.RadiusPct = pct("radius_tolerance")
	if v, ok := r.number("thickness_tolerance"); ok && (v < 0 || v > 10) {
		r.fail("thickness_tolerance", "%s mm: want 0 to 10 mm", formatFloat(v))
	} else {
		e.Tolerances.Thickness = v
	}
	if v, ok := r.number("index_tolerance"); ok && (v < 0 || v >= 0.5) {
		r.fail("index_tolerance", "%s: want 0 up to below 0.5", formatFloat(v))
	} else {
		e.Tolerances.Index = v
	}
}

// sortErrors orders problems by line, keeping the order within a line.
func sortErrors(errs FileErrors) {
	slices.SortStableFunc(errs, func(a, b LineError) int { return cmp.Compare(a.Line, b.Line) })
}

// describe is a short form of a number of mm for messages.
func describe(v float64) string { return fmt.Sprintf("%.5g", v) }
