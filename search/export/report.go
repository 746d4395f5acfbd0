package export

import (
	"bytes"
	_ "embed"
	"encoding/base64"
	"fmt"
	"html/template"
	"io"
	"time"

	"cardinal/search"
)

//go:embed report.html.tmpl
var reportTemplate string

// ReportInput is what a report is made from.
type ReportInput struct {
	Search      int64
	SearchedAt  time.Time // when the search ran
	GeneratedAt time.Time // when the report is made
	Requirement search.Requirement
	// Results are the search's ranked results, all of them.
	Results []search.Result
	// Picks are the chosen results rebuilt, in the order asked.
	Picks   []Solution
	Request Request
	Draw    DrawOptions
	Plot    PlotOptions
}

// reportPick is one chosen solution as the page shows it.
type reportPick struct {
	Rank     int
	Parts    string
	Spacings string
	Drawing  template.HTML // inline SVG, made by this package
	Plot     template.URL  // PNG as a data URI
	Spots    Spots
	Quality  map[string]float64
	Limited  string // the search's diffraction-limited verdict, yes or no; "" when not traced
	Warnings []string
}

// reportPage is the template's data.
type reportPage struct {
	ReportInput
	RequirementText string
	Picked          map[int]bool
	Pages           []reportPick
	Cautions        []string
	RequestRows     [][]string
	RequestHeader   []string
	RequestNotes    [][2]string
	QualityColumns  search.QualityShown
	RankingNote     string
}

var reportFuncs = template.FuncMap{
	"parts":    DescribeParts,
	"mm":       func(v *float64) string { return optMM(v) },
	"fixed":    func(v float64, d int) string { return fmt.Sprintf("%.*f", d, v) },
	"target":   targetText,
	"checks":   checksText,
	"price":    priceText,
	"yesno":    yesNo,
	"spot":     spotText,
	"airy":     airyText,
	"limited":  limitedText,
	"shift":    shiftText,
	"figure":   func(v float64) string { return fmt.Sprintf("%.3g", v) },
	"rmsAt":    rmsAt,
	"timefmt":  func(t time.Time) string { return t.UTC().Format("2006-01-02 15:04 UTC") },
	"imageRow": func(sp Spots) bool { return !sp.Angular },
}

var reportTmpl = template.Must(template.New("report").Funcs(reportFuncs).Parse(reportTemplate))

// WriteReport writes one self-contained printable HTML page: the
// requirement, the ranked results, and for each pick its drawing, spot and
// fan plots and figures, then the purchase request and the cautions.
// Styles are inline, drawings inline SVG, plots PNG data URIs: the page
// fetches nothing.
func WriteReport(w io.Writer, in ReportInput) error {
	page := reportPage{ReportInput: in, RequirementText: DescribeRequirement(in.Requirement), Picked: map[int]bool{},
		Cautions: Cautions(in.Requirement), RequestRows: in.Request.Rows(), RequestHeader: RequestHeader, RequestNotes: in.Request.Notes(),
		QualityColumns: search.ShownQuality(in.Results)}
	page.RankingNote = rankingNote(in.Requirement, page.QualityColumns)
	for _, s := range in.Picks {
		p, err := pickPage(s, in)
		if err != nil {
			return err
		}
		page.Picked[s.Result.Rank] = true
		page.Pages = append(page.Pages, p)
	}
	return reportTmpl.Execute(w, page)
}

// pickPage draws and plots one pick.
func pickPage(s Solution, in ReportInput) (reportPick, error) {
	p := reportPick{Rank: s.Result.Rank, Parts: DescribeParts(s.Result.Parts),
		Spacings: DescribeSpacings(in.Requirement.Kind, s.Result), Quality: s.Result.Quality, Warnings: s.Verify()}
	if s.Result.ImageQuality != nil {
		p.Limited = yesNo(s.Result.DiffractionLimited)
	}
	sc, err := NewScene(s, in.Draw)
	if err != nil {
		return p, fmt.Errorf("solution %d: %w", p.Rank, err)
	}
	var b bytes.Buffer
	opts := in.Draw
	opts.Title = fmt.Sprintf("Solution %d: %s", p.Rank, p.Parts)
	if err := sc.WriteSVG(&b, opts); err != nil {
		return p, err
	}
	p.Drawing = template.HTML(b.String()) // our own SVG, escaped as it was written
	if p.Spots, err = NewSpots(s, in.Plot); err != nil {
		return p, fmt.Errorf("solution %d: %w", p.Rank, err)
	}
	b.Reset()
	if err := p.Spots.WritePlot(&b, fmt.Sprintf("Solution %d: spot diagrams and ray fans", p.Rank), "png"); err != nil {
		return p, err
	}
	p.Plot = template.URL("data:image/png;base64," + base64.StdEncoding.EncodeToString(b.Bytes()))
	return p, nil
}

// rmsAt is the RMS radius of field i at wavelength j.
func rmsAt(sp Spots, i, j int) float64 { return sp.Sets[i*len(sp.Wavelengths)+j].RMS }

func optMM(v *float64) string {
	if v == nil {
		return "–"
	}
	return fmt.Sprintf("%.2f", *v)
}

func targetText(r search.Result) string {
	switch {
	case r.EFL != nil:
		return fmt.Sprintf("EFL %.3f mm", *r.EFL)
	case r.Magnification != nil:
		return fmt.Sprintf("m %.4f", *r.Magnification)
	case r.Expansion != nil:
		return fmt.Sprintf("%.4f× %s", *r.Expansion, r.Form)
	}
	return "–"
}

func checksText(r search.Result) string {
	var bad []string
	for _, c := range r.Checks {
		if !c.OK {
			bad = append(bad, c.Name)
		}
	}
	if len(bad) == 0 {
		return "all met"
	}
	return fmt.Sprintf("misses %v", bad)
}

// priceText is the price of every piece, one amount per currency (never
// summed across currencies), "?" when no piece's price is stated and a
// "+ ?" when some are not.
func priceText(r search.Result) string {
	switch {
	case len(r.Prices) == 0:
		return "?"
	case r.PriceUnknown:
		return search.AmountsText(r.Prices) + " + ?"
	}
	return search.AmountsText(r.Prices)
}
