package importers

import (
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"cardinal/optics"
)

// A Glass is one row of a glass CSV: a named dispersion formula.
//
// Formula and Coefficients, in the order the file writes them (wavelength
// lambda in micrometres):
//
//	sellmeier  B1 C1 B2 C2 ... Bk Ck  n^2 = 1 + sum Bi lambda^2/(lambda^2 - Ci), Ci in um^2
//	cauchy     A0 A1 A2 ...           n = A0 + A1/lambda^2 + A2/lambda^4 + ...
//	constant   n                      the same index at every wavelength
//	abbe       nd Vd                  two-term Cauchy through nd and nF - nC = (nd - 1)/Vd
//
// MinNm and MaxNm are the band over which the formula holds; both zero means
// none is stated (an abbe glass then keeps the 400-750 nm of its fit).
type Glass struct {
	Name         string
	Formula      string // sellmeier, cauchy, constant or abbe
	Coefficients []float64
	MinNm, MaxNm float64
	Source       string // where the coefficients come from
	Line         int    // source line, 0 if none
}

// Formulas returns the formulas a glass CSV may name.
func Formulas() []string { return []string{"sellmeier", "cauchy", "constant", "abbe"} }

var glassSchema = schema{
	known: func(name string) bool {
		switch name {
		case "name", "formula", "coefficients", "min_nm", "max_nm", "source":
			return true
		}
		return false
	},
	required: []string{"name", "formula", "coefficients"},
}

// Medium returns the glass as an optics medium. It panics if the glass is
// not valid (see Validate).
func (g Glass) Medium() optics.Medium {
	c := g.Coefficients
	switch g.Formula {
	case "sellmeier":
		s := optics.Sellmeier{Label: g.Name, LoNm: g.MinNm, HiNm: g.MaxNm}
		for i := 0; i+1 < len(c); i += 2 {
			s.B = append(s.B, c[i])
			s.C = append(s.C, c[i+1])
		}
		return s
	case "cauchy":
		return optics.Cauchy{Label: g.Name, A: append([]float64(nil), c...), LoNm: g.MinNm, HiNm: g.MaxNm}
	case "constant":
		return ranged{optics.Constant{Label: g.Name, N: c[0]}, g.MinNm, g.MaxNm}
	case "abbe":
		m := optics.CauchyFromAbbe(g.Name, c[0], c[1])
		if g.MinNm != 0 || g.MaxNm != 0 {
			m.LoNm, m.HiNm = g.MinNm, g.MaxNm
		}
		return m
	}
	panic(fmt.Sprintf("importers: glass %q has unknown formula %q", g.Name, g.Formula))
}

// ranged is a medium with a stated wavelength range of its own.
type ranged struct {
	optics.Medium
	lo, hi float64
}

func (r ranged) Range() (float64, float64) { return r.lo, r.hi }

// Validate reports every problem with the glass, keyed by column name.
func (g Glass) Validate() error {
	var ps optics.Problems
	add := func(field, format string, a ...any) {
		ps = append(ps, optics.Problem{Field: field, Reason: fmt.Sprintf(format, a...)})
	}
	key := strings.ToLower(g.Name)
	switch {
	case g.Name == "":
		add("name", "is empty but required")
	case key == "air":
		add("name", "air is built in and cannot be redefined")
	case len(key) == 6 && strings.Trim(key, "0123456789") == "":
		add("name", "%q is a six-digit glass code, which the program reads as nd and Vd; give the glass a name", g.Name)
	case strings.HasPrefix(g.Name, "#"):
		add("name", "%q starts with #, which marks a comment line", g.Name)
	}
	for _, v := range g.Coefficients {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			add("coefficients", "%v is not a finite number", v)
		}
	}
	if reason := g.checkCount(); reason != "" {
		add("coefficients", "%s", reason)
	}
	if lo, hi := g.MinNm, g.MaxNm; (lo == 0) != (hi == 0) || lo < 0 || lo >= hi && hi != 0 || math.IsInf(hi, 0) || math.IsNaN(lo) || math.IsNaN(hi) {
		add("max_nm", "the range %s-%s nm must satisfy 0 < min_nm < max_nm (leave both empty for none)", formatFloat(g.MinNm), formatFloat(g.MaxNm))
	}
	if len(ps) == 0 {
		if reason := g.checkIndex(); reason != "" {
			add("coefficients", "%s", reason)
		}
	}
	if len(ps) > 0 {
		return ps
	}
	return nil
}

// checkCount tells what is wrong with the number of coefficients.
func (g Glass) checkCount() string {
	n := len(g.Coefficients)
	switch g.Formula {
	case "sellmeier":
		if n == 0 || n%2 != 0 {
			return fmt.Sprintf("sellmeier takes pairs B1 C1 B2 C2 ..., not %d numbers", n)
		}
	case "cauchy":
		if n == 0 {
			return "cauchy takes A0 A1 ... (at least A0)"
		}
	case "constant":
		if n != 1 {
			return fmt.Sprintf("constant takes one number, the index, not %d", n)
		}
	case "abbe":
		if n != 2 {
			return fmt.Sprintf("abbe takes two numbers, nd and Vd, not %d", n)
		} else if g.Coefficients[0] < 1 || g.Coefficients[1] <= 0 {
			return "abbe needs nd >= 1 and Vd > 0"
		}
	default:
		return fmt.Sprintf("formula %q is not one of %s", g.Formula, strings.Join(Formulas(), ", "))
	}
	return ""
}

// checkIndex refuses a Sellmeier pole inside the glass's band (the F to C
// band when none is stated, or the 400-750 nm an abbe fit holds over), and
// an index that is not a finite number >= 1 anywhere in it (indexProblem
// proves that, where sampling would miss a dip between samples).
func (g Glass) checkIndex() string {
	lo, hi := g.Medium().Range()
	if lo == 0 && hi == 0 {
		lo, hi = optics.LineF, optics.LineC
	}
	if g.Formula == "sellmeier" {
		for i := 1; i < len(g.Coefficients); i += 2 {
			if c := g.Coefficients[i]; c > 0 && math.Sqrt(c)*1000 >= lo && math.Sqrt(c)*1000 <= hi {
				return fmt.Sprintf("C%d = %s um^2 puts a pole of the formula at %.1f nm, inside %.0f-%.0f nm; check the order B1 C1 B2 C2 ...", i/2+1, formatFloat(c), math.Sqrt(c)*1000, lo, hi)
			}
		}
	}
	return g.indexProblem(lo, hi)
}

// ReadGlasses reads a glass CSV (columns name, formula, coefficients,
// min_nm, max_nm, source; the rules of the prescription CSV for comments,
// quoting and header). Coefficients are numbers separated by spaces, in the
// order Glass documents. The error, when not nil, is a FileErrors and the
// glasses are then nil.
func ReadGlasses(r io.Reader, file string) ([]Glass, error) {
	f, err := ReadGlassFile(r, file)
	return f.Rows, err
}

// ReadGlassFile is ReadGlasses with the file's own warnings.
func ReadGlassFile(r io.Reader, file string) (File[Glass], error) {
	t := readTable(r, file, glassSchema)
	errs := t.errs
	var out []Glass
	seen := map[string]int{}
	for _, rec := range t.rows {
		if !t.headerOK {
			break
		}
		row := t.row(rec)
		g := parseGlassRow(row)
		key := strings.ToLower(g.Name)
		if first, dup := seen[key]; dup && key != "" {
			row.fail("name", "%s is already on line %d; names must be unique (case does not count)", g.Name, first)
		} else {
			seen[key] = rec.line
		}
		errs = append(errs, row.errs...)
		out = append(out, g)
	}
	if len(errs) > 0 {
		sortErrors(errs)
		return File[Glass]{Warnings: t.warnings}, errs
	}
	return File[Glass]{Rows: out, Warnings: t.warnings}, nil
}

func parseGlassRow(r *row) Glass {
	g := Glass{Line: r.rec.line, Name: r.required("name"), Source: r.text("source")}
	g.Formula = strings.ToLower(r.required("formula"))
	for _, f := range strings.Fields(r.required("coefficients")) {
		v, err := strconv.ParseFloat(f, 64)
		if err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
			r.fail("coefficients", "%q is not a finite number; separate the coefficients with spaces", f)
			continue
		}
		g.Coefficients = append(g.Coefficients, v)
	}
	g.MinNm = r.ranged("min_nm", wavelengthLimit)
	g.MaxNm = r.ranged("max_nm", wavelengthLimit)
	if len(r.errs) > 0 {
		return g
	}
	if err := g.Validate(); err != nil {
		for _, p := range err.(optics.Problems) {
			r.fail(p.Field, "%s", p.Reason)
		}
	}
	return g
}

// WriteGlasses writes glasses as a glass CSV that ReadGlasses reads back
// field for field (the source line aside).
func WriteGlasses(w io.Writer, glasses []Glass) error {
	cw := NewSafeCSV(w) // cells a spreadsheet would run as formulas get a quote; the readers take it away
	cw.Write([]string{"name", "formula", "coefficients", "min_nm", "max_nm", "source"})
	for _, g := range glasses {
		if strings.HasPrefix(g.Name, "#") {
			return fmt.Errorf("writing glass %q: a name starting with # would read back as a comment line", g.Name)
		}
		c := make([]string, len(g.Coefficients))
		for i, v := range g.Coefficients {
			c[i] = formatFloat(v)
		}
		cw.Write([]string{g.Name, g.Formula, strings.Join(c, " "), optionalFloat(g.MinNm), optionalFloat(g.MaxNm), g.Source})
	}
	return cw.Flush()
}
