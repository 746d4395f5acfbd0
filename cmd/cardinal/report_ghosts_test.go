package main

import (
	"encoding/json"
	"html"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"
)

// The report's ghost section of a single-part pick lists the same ghosts
// as 'inspect --ghosts' of that part with the same beam: the same paths,
// in the same order, at the same places, with the same peak irradiance
// and flags; and it carries the cautions.
func TestReportGhostsAsInspect(t *testing.T) {
	db := savedCatalog(t)
	beam := []string{"--beam", "6", "--wavelength", "1064", "--power", "2", "--laser-exit", "60"}
	if _, errs, code := findRun(t, db, append([]string{"--efl", "75", "--efl-tol", "3%", "--top", "3", "--elements", "1"}, beam...)...); code != 0 {
		t.Fatalf("find: exit %d\n%s", code, errs)
	}
	_, rs := savedResults(t, db, "3")
	pick := -1
	for _, r := range rs {
		if len(r.Parts) == 1 {
			pick = r.Rank
			break
		}
	}
	if pick < 0 {
		t.Fatal("no single-part result to compare")
	}
	file := filepath.Join(t.TempDir(), "report.html")
	if _, errs, code := cmdRun(t, db, "report", "3", "--pick", strconv.Itoa(pick), "-o", file); code != 0 {
		t.Fatalf("report: exit %d\n%s", code, errs)
	}
	b, err := os.ReadFile(file)
	if err != nil {
		t.Fatal(err)
	}
	page := string(b)
	start := strings.Index(page, `id="ghosts-`+strconv.Itoa(pick)+`"`)
	if start < 0 {
		t.Fatalf("the report has no ghost section for pick %d", pick)
	}
	section := page[start:]
	section = section[:strings.Index(section, "</div>\n</div>")]
	mustContain(t, section, "do not replace a safety assessment", "laser safety officer", "Focused laser beams")
	var rows [][]string
	cell := regexp.MustCompile(`<td[^>]*>(.*?)</td>`)
	for _, tr := range regexp.MustCompile(`<tr[^>]*>(.*?)</tr>`).FindAllStringSubmatch(section, -1) {
		var row []string
		for _, td := range cell.FindAllStringSubmatch(tr[1], -1) {
			row = append(row, html.UnescapeString(td[1]))
		}
		if len(row) > 0 {
			rows = append(rows, row)
		}
	}

	r := rs[pick-1]
	args := append([]string{"inspect", r.Parts[0].ID(), "--ghosts", "--format", "json"}, beam...)
	if r.Parts[0].Reversed {
		args = append(args, "--reverse")
	}
	out, errs, code := cmdRun(t, db, args...)
	if code != 0 {
		t.Fatalf("inspect: exit %d\n%s", code, errs)
	}
	var parts []struct {
		Ghosts []struct {
			Surfaces []int    `json:"surfaces"`
			Z        float64  `json:"z_mm"`
			Peak     float64  `json:"peak_w_per_cm2"`
			Flags    []string `json:"flags"`
		} `json:"ghosts"`
	}
	if err := json.Unmarshal([]byte(out), &parts); err != nil {
		t.Fatal(err)
	}
	want := parts[0].Ghosts
	if len(want) == 0 || len(rows) != len(want) {
		t.Fatalf("report lists %d ghosts, inspect %d:\n%v", len(rows), len(want), rows)
	}
	// Columns: #, reflections, goes, focus at, radius, reflectance, from,
	// concentration, peak, flags.
	for i, g := range want {
		row := rows[i]
		path := make([]string, len(g.Surfaces))
		for k, s := range g.Surfaces {
			path[k] = strconv.Itoa(s)
		}
		if row[1] != "surface "+strings.Join(path, ", then ") || row[3] != strconv.FormatFloat(g.Z, 'f', 2, 64) ||
			row[8] != strconv.FormatFloat(g.Peak, 'f', 0, 64) || row[9] != strings.Join(g.Flags, "; ") {
			t.Errorf("ghost %d: report %q, inspect %+v", i+1, row, g)
		}
	}
}
