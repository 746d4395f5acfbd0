package search

import (
	"encoding/json"
	"fmt"
	"math"
	"slices"
	"sort"
	"strings"
)

// PartUse is one part of a result, in light order.
type PartUse struct {
	Supplier string `json:"supplier"`
	Part     string `json:"part"`
	Reversed bool   `json:"reversed"`
}

// ID is SUPPLIER:PART.
func (u PartUse) ID() string { return u.Supplier + ":" + u.Part }

// A Check is one constraint of the requirement and whether the result holds it.
type Check struct {
	Name   string `json:"name"`
	OK     bool   `json:"ok"`
	Detail string `json:"detail"`
}

// A Result is one way to meet the requirement with one or two parts. Lengths
// in mm; a nil length does not apply (the working distance of an object at
// infinity, the back clearance and track of an afocal expander, the gap of a
// singlet).
type Result struct {
	Rank            int       `json:"rank"`
	Parts           []PartUse `json:"parts"`
	Gap             *float64  `json:"gap_mm,omitempty"`
	WorkingDistance *float64  `json:"working_distance_mm"`
	BackClearance   *float64  `json:"back_clearance_mm"`
	Envelope        float64   `json:"envelope_mm"`
	Track           *float64  `json:"track_mm"`
	EFL             *float64  `json:"efl_mm,omitempty"`
	Magnification   *float64  `json:"magnification,omitempty"`
	Expansion       *float64  `json:"expansion,omitempty"`
	Form            Form      `json:"form,omitempty"`
	// Error is achieved minus target, in the target's unit (mm for an EFL);
	// ErrorPct is the same in percent of the target.
	Error    float64 `json:"error"`
	ErrorPct float64 `json:"error_pct"`
	Checks   []Check `json:"checks"`
	Meets    bool    `json:"meets"`
	// Prices is the price of every piece the layout uses, one amount per
	// currency (amounts in different currencies are never added), by
	// currency; PriceUnknown is true when some piece has no stated price
	// (its price is then in no amount).
	Prices       []Amount `json:"prices"`
	PriceUnknown bool     `json:"price_unknown,omitempty"`
	// ToOrder is the number of pieces to order after those the drawer
	// holds, and OrderPrices their price per currency.
	ToOrder     int      `json:"pieces_to_order"`
	OrderPrices []Amount `json:"order_prices"`
	InDrawer    bool     `json:"in_drawer"`
	// Arrangement is 0 for a row, k for the row's k-th other arrangement.
	Arrangement int `json:"arrangement,omitempty"`
	// Arrangements are the row's other layouts that meet, best first: the
	// same parts in another order, orientation or root, or with a part
	// optically the same in its place (see group.go); Alternatives names
	// those parts.
	Arrangements []Result `json:"arrangements,omitempty"`
	// OtherArrangements counts the row's other layouts that meet, also
	// those past the first few kept in Arrangements (arrangementsListed).
	OtherArrangements int           `json:"other_arrangements,omitempty"`
	Alternatives      []Alternative `json:"alternatives,omitempty"`
	Score             float64       `json:"score"`
	Reason            string        `json:"reason"`
	// ImageQuality holds the real-ray figures (quality.go), its keys
	// inline in the JSON; nil when real rays were not traced.
	*ImageQuality
	// Build sums up the simulated builds (study.go); nil when not studied.
	Build *BuildFigures `json:"build,omitempty"`
	// Gaussian holds the Gaussian-beam figures and the worst ghost of a
	// laser requirement (laser.go); nil otherwise.
	Gaussian *LaserFigures `json:"gaussian,omitempty"`
	// Quality is the same figures by JSON key, for pages that list them;
	// filled with ImageQuality, also when a result is read back from JSON.
	Quality map[string]float64 `json:"-"`
}

// An Amount is a sum of money in one currency.
type Amount struct {
	Amount   float64 `json:"amount"`
	Currency string  `json:"currency"`
}

// String is "12.50 XTS", the currency left out when not stated.
func (a Amount) String() string {
	return strings.TrimSpace(fmt.Sprintf("%.2f %s", a.Amount, a.Currency))
}

// AmountsText writes amounts in different currencies side by side, never
// summed: "9.50 USD + 21.00 EUR"; "-" for none.
func AmountsText(as []Amount) string {
	if len(as) == 0 {
		return "-"
	}
	s := make([]string, len(as))
	for i, a := range as {
		s[i] = a.String()
	}
	return strings.Join(s, " + ")
}

// addAmount adds v to the amount of its currency, keeping the list sorted
// by currency.
func addAmount(as []Amount, v float64, currency string) []Amount {
	i := sort.Search(len(as), func(i int) bool { return as[i].Currency >= currency })
	if i < len(as) && as[i].Currency == currency {
		as[i].Amount += v
		return as
	}
	return slices.Insert(as, i, Amount{Amount: v, Currency: currency})
}

// UnmarshalJSON reads a result and fills Quality from its figures. A
// result saved before prices were kept per currency (one "price" and
// "currency") is read into Prices.
func (r *Result) UnmarshalJSON(b []byte) error {
	type plain Result // the same fields, without this method
	var p plain
	if err := json.Unmarshal(b, &p); err != nil {
		return err
	}
	*r = Result(p)
	if r.Prices == nil {
		var old struct {
			Price    *float64 `json:"price"`
			Currency string   `json:"currency"`
		}
		if json.Unmarshal(b, &old) == nil && old.Price != nil {
			r.Prices = []Amount{{Amount: *old.Price, Currency: old.Currency}}
		}
	}
	if r.ImageQuality != nil {
		r.Quality = r.ImageQuality.Figures()
	}
	return nil
}

// result turns a layout into a Result.
func (s *search) result(p *prepared, l *layout, rank int) Result {
	r := Result{Rank: rank, Envelope: l.env, Error: l.err, Meets: l.meets(), Score: l.score, Form: l.form}
	if t := target(s.req); t != 0 {
		r.ErrorPct = 100 * l.err / math.Abs(t)
	}
	idx := []int32{l.a}
	if l.pair() {
		idx = append(idx, l.b)
		r.Gap = ptr(l.gap)
	}
	r.WorkingDistance, r.BackClearance, r.Track = opt(l.wd), opt(l.bc), opt(l.track)
	switch s.req.Kind {
	case Focus:
		r.EFL = ptr(l.value)
	case Image:
		r.Magnification = ptr(l.value)
	case Expand:
		r.Expansion = ptr(l.value)
	}
	s.fillParts(p, &r, idx)
	r.Checks = s.checks(l)
	r.Reason = s.reason(&r, l)
	return r
}

// fillParts names the parts and prices the pieces: all of them, and those
// to order after the drawer's (the same part twice draws on one drawer
// quantity).
func (s *search) fillParts(p *prepared, r *Result, idx []int32) {
	r.Prices, r.OrderPrices = []Amount{}, []Amount{}
	used := map[int32]int{}
	for _, ci := range idx {
		c := &s.c[ci]
		e := p.info(c.item)
		r.Parts = append(r.Parts, PartUse{Supplier: e.supplier, Part: e.name, Reversed: c.rev})
		used[c.item]++
		order := used[c.item] > int(c.qty)
		if order {
			r.ToOrder++
		}
		if !(e.price > 0) {
			r.PriceUnknown = true
			continue
		}
		r.Prices = addAmount(r.Prices, e.price, e.currency)
		if order {
			r.OrderPrices = addAmount(r.OrderPrices, e.price, e.currency)
		}
	}
	r.InDrawer = r.ToOrder == 0
}

func ptr(v float64) *float64 { return &v }

func opt(v float64) *float64 {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return nil
	}
	return &v
}

// checks lists each constraint that applies with its verdict.
func (s *search) checks(l *layout) []Check {
	r := &s.req
	var cs []Check
	add := func(bit uint16, name, format string, a ...any) {
		cs = append(cs, Check{Name: name, OK: l.fails&bit == 0, Detail: fmt.Sprintf(format, a...)})
	}
	switch r.Kind {
	case Focus:
		add(failTarget, "efl", "%.3f mm, target %g mm +- %.3g mm", l.value, r.EFL, s.tol)
	case Image:
		add(failTarget, "magnification", "%.4f, target %g +- %.3g", l.value, r.Mag, s.tol)
	case Expand:
		add(failTarget, "expansion", "%.4f, target %g +- %.3g", l.value, r.Expansion, s.tol)
		if r.Form != AnyForm {
			add(failForm, "form", "%s, asked %s", l.form, r.Form)
		}
		if r.collimates() {
			add(failCollimate, "collimation", "output waist %g mm beyond the last part", r.WaistOutAt)
		}
	case Match:
		add(failCoupling, "coupling", "%.4f, minimum %g", l.value, r.MinCoupling())
	}
	if !math.IsNaN(l.bc) {
		add(failBack, "back_clearance", "%.2f mm, minimum %g mm", l.bc, r.BFDMin)
	}
	if r.Kind == Image || r.Kind == Match {
		add(failWD, "working_distance", "%.2f mm, minimum %g mm", l.wd, r.WDMin)
	}
	if l.pair() {
		add(failGap, "gap", "edge clearance %.2f mm, minimum %g mm", s.edgeClearance(&s.c[l.a], &s.c[l.b], l.gap), r.GapMin)
	}
	switch {
	case r.LengthMax > 0 && (l.fails&failEnvelope == 0 || l.env > r.LengthMax):
		add(failEnvelope, "envelope", "%.2f mm, maximum %g mm", l.env, r.LengthMax)
	case l.fails&failEnvelope != 0 && l.env > r.LengthLimit():
		add(failEnvelope, "envelope", "%.0f mm, beyond the %g mm sanity limit (raise it with an envelope maximum)", l.env, r.LengthLimit())
	case l.fails&failEnvelope != 0:
		add(failEnvelope, "envelope", "track %.0f mm, beyond the %g mm sanity limit (raise it with an envelope maximum)", l.track, r.TrackLimit())
	}
	if r.ChecksAperture() {
		add(failAperture, "aperture", "ray height %.0f%% of the clear aperture of part %d", 100*l.vigRatio, l.vigPart+1)
	}
	if l.fails&failDrawer != 0 {
		add(failDrawer, "drawer", "needs two pieces, the drawer has fewer")
	}
	return cs
}

// reason says in a few words why the result ranks where it does.
func (s *search) reason(r *Result, l *layout) string {
	var w []string
	if !r.Meets {
		var f []string
		for _, c := range r.Checks {
			if !c.OK {
				f = append(f, c.Name)
			}
		}
		return "misses " + strings.Join(f, ", ")
	}
	if l.pair() {
		w = append(w, "pair")
	} else {
		w = append(w, "single part")
	}
	if l.err == 0 || math.Abs(l.err) <= 1e-9*math.Abs(target(s.req)) {
		w = append(w, "on target")
	} else {
		w = append(w, fmt.Sprintf("%.2g%% off target", math.Abs(r.ErrorPct)))
	}
	w = append(w, fmt.Sprintf("%.0f mm long", l.env))
	switch n := len(r.Parts); {
	case r.InDrawer:
		w = append(w, "parts at hand in the drawer")
	case r.ToOrder < n:
		w = append(w, fmt.Sprintf("%d of %d pieces at hand in the drawer", n-r.ToOrder, n))
	}
	if r.PriceUnknown {
		w = append(w, "price unknown")
	}
	return strings.Join(w, ", ")
}
