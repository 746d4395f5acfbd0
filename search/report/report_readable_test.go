package report

import (
	"fmt"
	"regexp"
	"strings"
	"testing"

	"cardinal/search/plots"
	"cardinal/search/solution/solutiontest"
	"cardinal/search/wavecolour"
)

// The report speaks to people: no raw JSON key as a label, no "-0", each
// part name in an unbreakable span, a build table for each pick, and one
// field for all the picks' drawings and plots.
func TestReportReadable(t *testing.T) {
	req := solutiontest.Requirements()["image"]
	req.ObjectHeight = 0 // no field: the report chooses one for all picks
	page, _ := testReportOf(t, req)
	for _, key := range []string{"airy_radius_um", "wavefront_rms_waves", "rms_spot_um", "best_focus_shift_mm", "diffraction_limited", "in_drawer", "unit_price"} {
		if strings.Contains(page, ">"+key+"<") {
			t.Errorf("the page shows the raw key %q as a label", key)
		}
	}
	if m := regexp.MustCompile(`>-0(\.0+)?( |<)`).FindString(page); m != "" {
		t.Errorf("the page shows a negative zero: %q", m)
	}
	if !strings.Contains(page, `<span class="part">TEST:`) || !strings.Contains(page, ".part { white-space: nowrap; }") {
		t.Error("part names are not kept from breaking")
	}
	sols := solutiontest.Solve(t, req)[:2]
	for _, s := range sols {
		id := fmt.Sprintf(`id="build-%d"`, s.Result.Rank)
		i := strings.Index(page, id)
		if i < 0 {
			t.Fatalf("no build table %s", id)
		}
		table := page[i : i+strings.Index(page[i:], "</table>")]
		for _, f := range s.Facings() {
			if !strings.Contains(table, f.Facing) {
				t.Errorf("build table %d lacks %q", s.Result.Rank, f.Facing)
			}
		}
		if !strings.Contains(table, "overall length, object to image") {
			t.Errorf("build table %d lacks the overall length", s.Result.Rank)
		}
	}
	// One field for both picks: the legends name the same field.
	fields := regexp.MustCompile(`chief ray of the field point \(([^)]*)\)`).FindAllStringSubmatch(page, -1)
	if len(fields) != 2 || fields[0][1] != fields[1][1] {
		t.Errorf("the picks are drawn at different fields: %q", fields)
	}
	if !strings.Contains(page, `id="field-note"`) || !strings.Contains(page, "the same for all") {
		t.Error("the report does not say which field all its picks use")
	}
	// The figures' wavelength columns carry the colour the plots and the
	// drawings give each wavelength.
	for _, wl := range plots.DefaultWavelengths(sols[0]) {
		if want := `style="background:` + wavecolour.Hex(wavecolour.Of(wl)) + `"`; !strings.Contains(page, want) {
			t.Errorf("no swatch %s for %g nm", want, wl)
		}
	}
}

// The figure labels carry units, and keys the report does not know yet
// still read as words with their unit.
func TestKeyLabel(t *testing.T) {
	for k, want := range map[string]string{"edge_gap_mm": "edge gap (mm)", "rms_spot_um": "rms spot (µm)", "yield_pct": "yield (%)", "score": "score"} {
		if got := keyLabel(k); got != want {
			t.Errorf("keyLabel(%q) = %q, want %q", k, got, want)
		}
	}
	for _, f := range figureLabels {
		if !strings.HasSuffix(f.label, ")") {
			t.Errorf("label %q names no unit", f.label)
		}
	}
}

// The report's first font is Liberation Sans, the font of the plots
// (TestPlotColoursAndFont in package plots).
func TestReportFontIsThePlots(t *testing.T) {
	if !strings.Contains(reportTemplate, `font-family: "Liberation Sans"`) {
		t.Error("the report's first font is not the plots' Liberation Sans")
	}
}
