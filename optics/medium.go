package optics

import (
	"fmt"
	"math"
	"sort"
	"strconv"
	"strings"
)

// Reference wavelengths in nanometres (Fraunhofer lines; ISO 7944).
const (
	LineF = 486.1327 // hydrogen F line
	LineD = 587.5618 // helium d line, the reference wavelength
	LineC = 656.2725 // hydrogen C line
	LineE = 546.0740 // mercury e line
)

// A Medium is a transparent material with a refractive index that depends on
// wavelength. Indices are relative to air, as glass catalogues state them.
type Medium interface {
	// Name is the name the glass table knows the medium by.
	Name() string
	// Index is the refractive index at a vacuum wavelength in nanometres.
	Index(wavelengthNm float64) float64
	// Range is the wavelength band in nanometres over which the formula
	// was fitted; 0, 0 means it holds everywhere.
	Range() (loNm, hiNm float64)
}

// RangeWarning returns a sentence if the wavelength lies outside the
// medium's stated range, and "" otherwise.
func RangeWarning(m Medium, wavelengthNm float64) string {
	lo, hi := m.Range()
	if lo == 0 && hi == 0 || wavelengthNm >= lo && wavelengthNm <= hi {
		return ""
	}
	return fmt.Sprintf("%s: %.1f nm is outside the %.0f-%.0f nm range of its dispersion formula", m.Name(), wavelengthNm, lo, hi)
}

// Constant is a medium with the same index at every wavelength.
type Constant struct {
	Label string
	N     float64
}

func (c Constant) Name() string              { return c.Label }
func (c Constant) Index(float64) float64     { return c.N }
func (c Constant) Range() (float64, float64) { return 0, 0 }

// Air is the medium around the parts; indices are relative to it.
var Air Medium = Constant{Label: "air", N: 1}

// Sellmeier is the dispersion formula
// n^2 = 1 + sum B_i lambda^2 / (lambda^2 - C_i), lambda in micrometres
// (W. Sellmeier, Ann. Phys. Chem. 143, 272 (1871); the form used by glass
// catalogues). It takes any number of terms.
type Sellmeier struct {
	Label      string
	B, C       []float64 // C in square micrometres
	LoNm, HiNm float64
}

func (s Sellmeier) Name() string            { return s.Label }
func (s Sellmeier) Range() (lo, hi float64) { return s.LoNm, s.HiNm }
func (s Sellmeier) Index(wavelengthNm float64) float64 {
	if len(s.B) != len(s.C) {
		panic("optics: Sellmeier needs as many B as C coefficients")
	}
	l2 := wavelengthNm * wavelengthNm * 1e-6
	n2 := 1.0
	for i := range s.B {
		n2 += s.B[i] * l2 / (l2 - s.C[i])
	}
	return math.Sqrt(n2)
}

// Cauchy is the dispersion formula n = A0 + A1/lambda^2 + A2/lambda^4 + ...,
// lambda in micrometres (A.-L. Cauchy, 1836; e.g. Born and Wolf, Principles
// of Optics, 7th ed., section 2.3.4).
type Cauchy struct {
	Label      string
	A          []float64
	LoNm, HiNm float64
}

func (c Cauchy) Name() string            { return c.Label }
func (c Cauchy) Range() (lo, hi float64) { return c.LoNm, c.HiNm }
func (c Cauchy) Index(wavelengthNm float64) float64 {
	inv2 := 1 / (wavelengthNm * wavelengthNm * 1e-6)
	n, p := 0.0, 1.0
	for _, a := range c.A {
		n += a * p
		p *= inv2
	}
	return n
}

// GlassCode returns the medium of a six-digit glass code such as "517642"
// (nd = 1.517, Vd = 64.2; the international glass code, common practice) as a
// two-term Cauchy formula n = A + B/lambda^2 fitted through nd at the d line
// and nF - nC = (nd - 1)/Vd (the definition of the Abbe number). The fit is
// trusted over the visible band only.
func GlassCode(code string) (Medium, error) {
	if len(code) != 6 || strings.Trim(code, "0123456789") != "" {
		return nil, fmt.Errorf("glass code %q: want six digits, like 517642", code)
	}
	a, _ := strconv.Atoi(code[:3])
	v, _ := strconv.Atoi(code[3:])
	if a == 0 || v == 0 {
		return nil, fmt.Errorf("glass code %q: index and Abbe number must be positive", code)
	}
	nd := 1 + float64(a)/1000
	vd := float64(v) / 10
	return CauchyFromAbbe(code, nd, vd), nil
}

// CauchyFromAbbe fits n = A + B/lambda^2 through nd and the Abbe number Vd:
// B (1/lF^2 - 1/lC^2) = (nd - 1)/Vd and A = nd - B/ld^2.
func CauchyFromAbbe(label string, nd, vd float64) Cauchy {
	um := func(nm float64) float64 { return 1 / (nm * nm * 1e-6) }
	b := (nd - 1) / vd / (um(LineF) - um(LineC))
	return Cauchy{Label: label, A: []float64{nd - b*um(LineD), b}, LoNm: 400, HiNm: 750}
}

// Built-in glasses. Coefficients as published; wavelengths in micrometres.
var builtin = []Medium{
	// I. H. Malitson, "Interspecimen comparison of the refractive index of
	// fused silica", J. Opt. Soc. Am. 55, 1205-1209 (1965), eq. 2; 0.21-3.71 um.
	Sellmeier{Label: "fused-silica",
		B:    []float64{0.6961663, 0.4079426, 0.8974794},
		C:    []float64{0.0684043 * 0.0684043, 0.1162414 * 0.1162414, 9.896161 * 9.896161},
		LoNm: 210, HiNm: 3710},
	// I. H. Malitson, "A redetermination of some optical properties of
	// calcium fluoride", Appl. Opt. 2, 1103-1107 (1963); 0.23-9.7 um.
	Sellmeier{Label: "caf2",
		B:    []float64{0.5675888, 0.4710914, 3.8484723},
		C:    []float64{0.050263605 * 0.050263605, 0.1003909 * 0.1003909, 34.649040 * 34.649040},
		LoNm: 230, HiNm: 9700},
	// I. H. Malitson and M. J. Dodge, "Refractive index and birefringence of
	// synthetic sapphire", J. Opt. Soc. Am. 62, 1405 (1972); ordinary ray,
	// 0.2-5.5 um.
	Sellmeier{Label: "sapphire",
		B:    []float64{1.4313493, 0.65054713, 5.3414021},
		C:    []float64{0.0726631 * 0.0726631, 0.1193242 * 0.1193242, 18.028251 * 18.028251},
		LoNm: 200, HiNm: 5500},
	// Water near 20 degrees C: nd = 1.333 and Vd = 55.7 (handbook values,
	// common practice), as a two-term Cauchy fit over the visible.
	CauchyFromAbbe("water", 1.333, 55.7),
}

// A GlassTable resolves material names: "air", six-digit glass codes, and
// named glasses (case-insensitive). The zero value knows air and glass codes.
type GlassTable map[string]Medium

// BuiltinGlasses returns a new table with the built-in glasses.
func BuiltinGlasses() GlassTable {
	t := GlassTable{}
	for _, m := range builtin {
		t[m.Name()] = m
	}
	return t
}

// Add puts a medium into the table under its lower-cased name.
func (t GlassTable) Add(m Medium) { t[strings.ToLower(m.Name())] = m }

// Lookup finds a material by name.
func (t GlassTable) Lookup(name string) (Medium, error) {
	key := strings.ToLower(strings.TrimSpace(name))
	if key == "air" {
		return Air, nil
	}
	if m, ok := t[key]; ok {
		return m, nil
	}
	if len(key) == 6 && strings.Trim(key, "0123456789") == "" {
		return GlassCode(key)
	}
	names := make([]string, 0, len(t))
	for k := range t {
		names = append(names, k)
	}
	sort.Strings(names)
	return nil, fmt.Errorf("unknown glass %q: use a six-digit glass code (517642), air, or one of: %s", name, strings.Join(names, ", "))
}
