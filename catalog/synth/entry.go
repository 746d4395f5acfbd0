package synth

import (
	"fmt"
	"math"

	"cardinal/catalog/record"
	"cardinal/optics"
)

// Currency is the code of every generated price: XTS, the ISO 4217 code
// reserved for testing, so that no one mistakes a demo price for money (the
// small demo file catalog/demo/lenses.csv uses it too).
const Currency = "XTS"

// Notes is the note on every generated entry.
const Notes = "demo figures"

// A coating names a variant of the same prescription, as suppliers sell
// one lens uncoated and with several antireflection coatings.
type coating struct{ suffix, text string }

// The suffixes hold a digit, so they never read as a glass tag.
var coatings = []coating{{"", "uncoated"}, {"A1", "AR coated 400-700 nm"},
	{"A2", "AR coated 650-1050 nm"}, {"A3", "AR coated 1050-1700 nm"}}

var kindText = [numKinds]string{"Plano-convex lens", "Biconvex lens", "Best-form lens",
	"Positive meniscus lens", "Plano-concave lens", "Biconcave lens", "Negative meniscus lens",
	"Cemented achromatic doublet"}

// entry designs the part of sp, numbered base (the supplier's partName)
// plus a variant suffix, and fills in what the supplier states about it.
// variant 0 is the uncoated part; 1-3 the coated ones; from 4 on the
// coatings repeat as later revisions with their own part numbers.
func (s supplier) entry(sp Spec, base string, variant int) (record.Entry, error) {
	sp.ClearAperture = s.clearAperture(sp.Diameter)
	p, err := Design(sp)
	if err != nil {
		return record.Entry{}, err
	}
	coat := coatings[variant%len(coatings)]
	p.Supplier = s.name
	p.Name = base + suffix(variant)
	p.Description = fmt.Sprintf("%s, %s, EFL %s mm, dia. %s mm, %s", kindText[sp.Kind],
		glassText(sp), num(sp.EFL), num(sp.Diameter), coat.text)
	if variant >= len(coatings) {
		p.Description += fmt.Sprintf(", revision %d", variant/len(coatings)+1)
	}
	c := p.System(nil, nil).Cardinal(optics.LineD)
	edge, err := p.EdgeThickness()
	if err != nil {
		return record.Entry{}, err
	}
	return record.Entry{Part: p, StatedEFL: sp.EFL, StatedBFD: stated(c.BFD()),
		StatedEdge: roundTo(edge, 0.01), Price: s.price(sp, variant%len(coatings) != 0),
		Currency: Currency, URL: s.site + p.Name, Notes: Notes}, nil
}

// suffix is the part-number suffix of a variant: "", -A1, -A2, -A3, -R2, -A1-R2, ...
func suffix(variant int) string {
	s := ""
	if c := coatings[variant%len(coatings)].suffix; c != "" {
		s = "-" + c
	}
	if r := variant / len(coatings); r > 0 {
		s += fmt.Sprintf("-R%d", r+1)
	}
	return s
}

// stated rounds a computed distance to 0.01 mm, or finer where that would
// be off by more than 0.05 %, so that a reader's 1 % check never trips.
func stated(v float64) float64 {
	for q := 0.01; ; q /= 10 {
		r := roundTo(v, q)
		if math.Abs(r-v) <= 5e-4*math.Abs(v) || q < 1e-5 {
			return r
		}
	}
}

var (
	kindPrice  = [numKinds]float64{24, 27, 38, 31, 25, 26, 34, 68}
	glassPrice = map[string]float64{"517642": 1, "589613": 1.15, "620364": 1.2, "755276": 1.45,
		"785258": 1.6, "847238": 1.8, "fused-silica": 2.1, "caf2": 4.6, "sapphire": 6.5}
)

// price is an invented list price in XTS that grows with the diameter, the
// kind of part, the glass, a fast focal ratio and a coating.
func (s supplier) price(sp Spec, coated bool) float64 {
	g := glassFactor(sp.Glass)
	if sp.Kind == Achromat {
		g = (g + glassFactor(sp.Flint)) / 2
	}
	p := kindPrice[sp.Kind] * g * (0.35 + 0.65*math.Pow(sp.Diameter/25.4, 1.6))
	if abs(sp.EFL) < 1.5*sp.Diameter {
		p *= 1.2
	}
	if coated {
		p *= 1.25
	}
	if s.metric {
		return math.Max(1, math.Round(p)) - 0.1 // prices ending in .90
	}
	return math.Max(0.5, roundTo(p, 0.5))
}

func glassFactor(g string) float64 {
	if f, ok := glassPrice[g]; ok {
		return f
	}
	return 1.3
}
