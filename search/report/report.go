package report

import (
	"bytes"
	_ "embed"
	"encoding/base64"
	"fmt"
	"html/template"
	"io"
	"strings"
	"time"

	"cardinal/search"
	"cardinal/search/drawing"
	"cardinal/search/finite"
	"cardinal/search/plots"
	"cardinal/search/present"
	"cardinal/search/purchase"
	"cardinal/search/solution"
	"cardinal/search/wavecolour"
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
	Picks   []solution.Solution `finite:"-"` // the input, flat radii infinite; each page is checked as drawn
	Request purchase.Request
	Draw    drawing.DrawOptions
	Plot    plots.PlotOptions
}

// reportPick is one chosen solution as the page shows it.
type reportPick struct {
	Rank     int
	Parts    string
	Names    template.HTML // the parts, each name unbroken
	Spacings string
	Drawing  template.HTML // inline SVG, made by this package
	Plot     template.URL  // PNG as a data URI
	Spots    plots.Spots
	Figures  []figureRow // the search's real-ray figures, with human labels
	Build    [][]string  // the build sheet's rows (BuildHeader)
	// The build study (search.StudyBuild): its summary rows, the
	// sensitivity table and the histograms as a PNG data URI.
	Study      [][]string
	SensHeader []string
	Sens       [][]string
	StudyPlot  template.URL
	Warnings   []string
	// Ghosts is the ghost-focus section of a laser requirement's pick;
	// nil otherwise.
	Ghosts *reportGhosts
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
	ResultsTable    template.HTML // present.HTML of the ranked results
	BuildHeader     []string
	// FieldNote says which field the drawings and plots use, the same for
	// every pick.
	FieldNote string
}

var reportFuncs = template.FuncMap{
	"figure":   present.Figure,
	"spotAt":   spotAt,
	"timefmt":  func(t time.Time) string { return t.UTC().Format("2006-01-02 15:04 UTC") },
	"imageRow": func(sp plots.Spots) bool { return !sp.Angular },
	"swatch":   func(nm float64) template.CSS { return template.CSS("background:" + wavecolour.Hex(wavecolour.Of(nm))) },
	"wlname":   wavecolour.Name,
}

var reportTmpl = template.Must(template.New("report").Funcs(reportFuncs).Parse(reportTemplate))

// WriteReport writes one self-contained printable HTML page: the
// requirement, the ranked results, and for each pick its drawing, spot and
// fan plots and figures, then the purchase request and the cautions.
// Styles are inline, drawings inline SVG, plots PNG data URIs: the page
// fetches nothing.
func WriteReport(w io.Writer, in ReportInput) error {
	page := reportPage{ReportInput: in, RequirementText: solution.DescribeRequirement(in.Requirement), Picked: map[int]bool{},
		Cautions: solution.Cautions(in.Requirement, solution.Results(in.Picks)...), RequestRows: in.Request.Rows(), RequestHeader: purchase.RequestLabels(), RequestNotes: notesWithoutBuilds(in.Request.Notes()),
		QualityColumns: search.ShownQuality(in.Results), BuildHeader: solution.BuildHeader()}
	page.RankingNote = rankingNote(in.Requirement, page.QualityColumns)
	page.ResultsTable = rankedTable(in)
	in.Draw, in.Plot, page.FieldNote = commonField(in.Picks, in.Draw, in.Plot)
	for _, s := range in.Picks {
		p, err := pickPage(s, in)
		if err != nil {
			return err
		}
		page.Picked[s.Result.Rank] = true
		page.Pages = append(page.Pages, p)
	}
	if err := finite.Check("the report", page); err != nil {
		return err
	}
	return reportTmpl.Execute(w, page)
}

// pickPage draws and plots one pick.
func pickPage(s solution.Solution, in ReportInput) (reportPick, error) {
	p := reportPick{Rank: s.Result.Rank, Parts: solution.DescribeParts(s.Result.Parts),
		Spacings: solution.DescribeSpacings(in.Requirement.Kind, s.Result), Figures: qualityFigures(s.Result), Warnings: s.Verify(),
		Build: s.Build().Rows(solution.SidesOf(in.Requirement.Kind)), Names: template.HTML(present.PartsHTML(s.Result.Parts)),
		Ghosts: ghostSection(s)}
	sc, err := drawing.NewScene(s, in.Draw)
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
	if p.Spots, err = plots.NewSpots(s, in.Plot); err != nil {
		return p, fmt.Errorf("solution %d: %w", p.Rank, err)
	}
	b.Reset()
	if err := p.Spots.WritePlot(&b, fmt.Sprintf("Solution %d: spots at best focus, through focus, and ray errors", p.Rank), "png"); err != nil {
		return p, err
	}
	p.Plot = template.URL("data:image/png;base64," + base64.StdEncoding.EncodeToString(b.Bytes()))
	return p, studyPage(&p, s, in.Requirement)
}

// studyPage adds the build study of the pick with the search's settings:
// the same figures find printed and the tolerance command prints.
func studyPage(p *reportPick, s solution.Solution, req search.Requirement) error {
	st, err := search.StudyBuild(req, s.Setup())
	if err != nil {
		return fmt.Errorf("solution %d: build study: %w", p.Rank, err)
	}
	texts := func(t present.Table) (head []string, rows [][]string) {
		for _, c := range t.Columns {
			head = append(head, c.Heading())
		}
		for _, r := range t.Rows {
			row := make([]string, len(r))
			for i, c := range r {
				row[i] = c.Text
			}
			rows = append(rows, row)
		}
		return head, rows
	}
	_, p.Study = texts(present.StudySummary(req, st))
	sens := present.Sensitivities(req, st)
	keep := []int{1, 3, 4, 6, 8} // tolerance, +-, unit, change of the target and of the compensator at the tolerance
	head, rows := texts(sens)
	for _, i := range keep {
		p.SensHeader = append(p.SensHeader, head[i])
	}
	for _, r := range rows {
		var row []string
		for _, i := range keep {
			row = append(row, r[i])
		}
		p.Sens = append(p.Sens, row)
	}
	var b bytes.Buffer
	if err := plots.WriteStudyPlot(&b, req, st, fmt.Sprintf("Solution %d: %d simulated builds", p.Rank, st.Trials), "png"); err != nil {
		return err
	}
	p.StudyPlot = template.URL("data:image/png;base64," + base64.StdEncoding.EncodeToString(b.Bytes()))
	return nil
}

// notesWithoutBuilds drops the request's build-sheet notes: the report
// shows each build sheet as a table of its own.
func notesWithoutBuilds(ns [][2]string) [][2]string {
	var out [][2]string
	for _, n := range ns {
		if !strings.HasPrefix(n[0], "build ") {
			out = append(out, n)
		}
	}
	return out
}

// spotAt is the RMS radius of field i at wavelength j as a table shows it
// (SpotSet.Cell): no number where no ray reached the image.
func spotAt(sp plots.Spots, i, j int) string { return sp.Sets[i*len(sp.Wavelengths)+j].Cell() }

// rankedTable is the ranked results as find describes them (one
// presentation model: present.Results), the default columns with the Airy
// radius, the picks highlighted.
func rankedTable(in ReportInput) template.HTML {
	t := present.Results(in.Requirement, in.Results)
	keys := []string{}
	for _, c := range t.Columns {
		if !c.Optional || c.Key == "airy_radius_um" || c.Key == "envelope_mm" || c.Key == "track_mm" && in.Requirement.Kind != search.Expand {
			keys = append(keys, c.Key)
		}
	}
	t, err := t.Select(keys, false, false)
	if err != nil {
		panic("report: " + err.Error()) // the keys come from the table itself
	}
	picked := map[int]bool{}
	for _, s := range in.Picks {
		picked[s.Result.Rank] = true
	}
	return template.HTML(present.HTML(t, "results", func(i int) string { // escaped by present.HTML
		if picked[in.Results[i].Rank] {
			return "picked"
		}
		return ""
	}))
}
