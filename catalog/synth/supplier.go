package synth

import (
	"fmt"
	"strconv"
	"strings"
)

// A supplier is an invented supplier: its name, its stock diameters and
// glasses, and its pattern of part numbers.
type supplier struct {
	name      string
	diameters []float64 // mm, in the order a random draw favours (first most)
	glass     string    // default singlet glass
	crown     string    // default achromat glasses
	flint     string
	metric    bool   // metric diameters, KP-25-50 part numbers; else inch sizes, PCX-50-H
	statedCA  bool   // states an explicit clear aperture (diameter less 1 mm, 80 % below 10 mm)
	site      string // URL prefix of its part pages, at a reserved example domain (RFC 2606)
}

// The two invented suppliers of the demo scenario.
var (
	demoSupplier = supplier{name: "DEMO", diameters: []float64{25.4, 12.7, 50.8},
		glass: "517642", crown: "517642", flint: "620364", site: "https://demo.example.com/"}
	tarnwick = supplier{name: "TARNWICK", diameters: []float64{25, 12, 30, 6, 9, 50, 10, 40},
		glass: "589613", crown: "589613", flint: "755276", metric: true, statedCA: true,
		site: "https://tarnwick.example.org/"}
)

var (
	inchPrefix  = [numKinds]string{"PCX", "DCX", "BFX", "MEN", "PCV", "DCV", "NMN", "ACH"}
	metricLabel = [numKinds]string{"P", "B", "F", "M", "C", "D", "N", "A"}
	glassTag    = map[string]string{"517642": "B", "589613": "K", "620364": "F", "755276": "H",
		"785258": "S", "847238": "X", "fused-silica": "UV", "caf2": "CF", "sapphire": "SA"}
)

// partName is the supplier's part number for a spec: PCX-50, PCX-100-H-UV
// for the inch supplier, KP-25-50, KA-30-125-BS for the metric one.
func (s supplier) partName(sp Spec) string {
	f := num(abs(sp.EFL))
	var parts []string
	if s.metric {
		parts = []string{"K" + metricLabel[sp.Kind], num(sp.Diameter), f}
	} else {
		parts = []string{inchPrefix[sp.Kind], f}
		switch sp.Diameter {
		case 25.4:
		case 12.7:
			parts = append(parts, "H")
		case 50.8:
			parts = append(parts, "2")
		default:
			parts = append(parts, "D"+num(sp.Diameter))
		}
	}
	if g := s.glassTag(sp); g != "" {
		parts = append(parts, g)
	}
	return strings.Join(parts, "-")
}

// glassTag is empty for the supplier's default glass(es).
func (s supplier) glassTag(sp Spec) string {
	if sp.Kind == Achromat {
		if sp.Glass == s.crown && sp.Flint == s.flint {
			return ""
		}
		return tag(sp.Glass) + tag(sp.Flint)
	}
	if sp.Glass == s.glass {
		return ""
	}
	return tag(sp.Glass)
}

func tag(glass string) string {
	if t, ok := glassTag[glass]; ok {
		return t
	}
	return strings.ToUpper(glass)
}

// clearAperture is what the supplier states, zero for the 90 % default.
func (s supplier) clearAperture(d float64) float64 {
	switch {
	case !s.statedCA:
		return 0
	case d < 10:
		return roundTo(0.8*d, 0.1)
	default:
		return d - 1
	}
}

// num prints a length without trailing zeros: 50, 22.4, 12.7.
func num(v float64) string { return strconv.FormatFloat(v, 'f', -1, 64) }

func abs(v float64) float64 {
	if v < 0 {
		return -v
	}
	return v
}

// glassText names the glass for a description.
func glassText(sp Spec) string {
	names := map[string]string{"fused-silica": "fused silica", "caf2": "CaF2", "sapphire": "sapphire"}
	one := func(g string) string {
		if n, ok := names[g]; ok {
			return n
		}
		return "glass " + g
	}
	if sp.Kind == Achromat {
		return fmt.Sprintf("glasses %s/%s", sp.Glass, sp.Flint)
	}
	return one(sp.Glass)
}
