package drawing

import (
	"bytes"
	"encoding/xml"
	"fmt"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"

	"cardinal/search/solution"
	"cardinal/search/solution/solutiontest"
	"cardinal/search/wavecolour"
)

// measureScript runs in the browser after the drawings: for every text of
// every drawing it takes the box the browser rendered (getBBox, in the
// drawing's user units, with the fonts the browser really has) and lists
// each one that reaches outside the drawing's viewBox, and each dimension
// or ghost label whose box overlaps another text's.
const measureScript = `<script>
const out = [];
let n = 0;
for (const svg of document.querySelectorAll("svg.cardinal-layout")) {
  const vb = svg.viewBox.baseVal;
  for (const t of svg.querySelectorAll("text")) {
    n++;
    const b = t.getBBox();
    if (b.x < vb.x - 1e-3 || b.y < vb.y - 1e-3 || b.x + b.width > vb.x + vb.width + 1e-3 || b.y + b.height > vb.y + vb.height + 1e-3) {
      out.push(svg.dataset.name + ": [" + b.x.toFixed(2) + ", " + (b.x + b.width).toFixed(2) + "] outside [" +
        vb.x.toFixed(2) + ", " + (vb.x + vb.width).toFixed(2) + "]: " + t.textContent);
    }
  }
}
const clash = [];
for (const svg of document.querySelectorAll("svg.cardinal-layout")) {
  const texts = [...svg.querySelectorAll("text")];
  for (const a of svg.querySelectorAll("text.dim-label, text.ghost-label")) {
    const p = a.getBBox();
    for (const t of texts) {
      if (t === a) continue;
      const q = t.getBBox();
      if (p.x < q.x + q.width && q.x < p.x + p.width && p.y < q.y + q.height && q.y < p.y + p.height) {
        clash.push(svg.dataset.name + ": " + a.textContent + " overlaps " + t.textContent);
      }
    }
  }
}
document.getElementById("measured").textContent = n;
document.getElementById("overflow").textContent = out.join("\n");
document.getElementById("overlaps").textContent = clash.join("\n");
</script>`

// browserPage is a page of drawings followed by the measuring script.
func browserPage(t *testing.T, drawings map[string][]byte) string {
	t.Helper()
	var b strings.Builder
	b.WriteString(`<!DOCTYPE html><html><head><meta charset="utf-8"></head><body>`)
	for name, svg := range drawings {
		tagged := strings.Replace(string(svg), `class="cardinal-layout"`, fmt.Sprintf(`class="cardinal-layout" data-name=%q`, name), 1)
		fmt.Fprintf(&b, `<div style="width:1200px">%s</div>`, strings.Replace(tagged, "<svg ", `<svg style="width:100%;height:auto" `, 1))
	}
	b.WriteString(`<pre id="measured"></pre><pre id="overflow"></pre><pre id="overlaps"></pre>` + measureScript + `</body></html>`)
	return b.String()
}

// preText reads the text of <pre id="id"> from a dumped DOM.
func preText(t *testing.T, dom, id string) string {
	t.Helper()
	start := strings.Index(dom, `<pre id="`+id+`">`)
	if start < 0 {
		t.Fatalf("the DOM has no <pre id=%q>", id)
	}
	rest := dom[start+len(`<pre id="`+id+`">`):]
	var s string
	if err := xml.Unmarshal([]byte("<x>"+rest[:strings.Index(rest, "</pre>")]+"</x>"), &s); err != nil {
		t.Fatalf("<pre id=%q>: %v", id, err)
	}
	return s
}

// Every text of the layout drawings, the legend's long lines and the laser
// caution among them, lies inside the drawing as a real browser renders
// it, and no dimension or ghost label overlaps another text (a short gap
// beside a long back clearance on a 300 mm track among them, and laser
// layouts with several flagged ghosts).
func TestSVGTextInsideTheDrawing(t *testing.T) {
	bin := solutiontest.Chromium(t)
	drawings := map[string][]byte{}
	for kind, req := range solutiontest.Requirements() {
		for i, s := range solutiontest.Solve(t, req) {
			_, svg := drawBytes(t, s, DrawOptions{})
			drawings[fmt.Sprintf("%s %d", kind, i+1)] = svg
		}
	}
	drawings["short gap on a long track"] = shortGapDrawing(t)
	ghosts := solutiontest.Requirements()["focus"]
	ghosts.LaserExit = 25
	for i, s := range solutiontest.Solve(t, ghosts) {
		_, drawings[fmt.Sprintf("ghosts %d", i+1)] = drawBytes(t, s, DrawOptions{})
	}
	_, drawings["ghost at the laser's exit"] = drawBytes(t, biconvexLaser(t), DrawOptions{})
	long := solutiontest.Solve(t, solutiontest.Requirements()["focus"])[0]
	_, drawings["long title"] = drawBytes(t, long, DrawOptions{Title: strings.Repeat("a long title that goes on, ", 12)})
	page := filepath.Join(t.TempDir(), "drawings.html")
	if err := os.WriteFile(page, []byte(browserPage(t, drawings)), 0o644); err != nil {
		t.Fatal(err)
	}
	dom, console := solutiontest.Headless(t, bin, page, "--dump-dom")
	if len(console) > 0 {
		t.Errorf("console messages:\n%s", strings.Join(console, "\n"))
	}
	if n := preText(t, dom, "measured"); n == "" || n == "0" {
		t.Fatalf("the script measured %q texts: it did not run", n)
	}
	if over := preText(t, dom, "overflow"); over != "" {
		t.Errorf("texts outside the drawing:\n%s", over)
	}
	if clash := preText(t, dom, "overlaps"); clash != "" {
		t.Errorf("dimension labels overlapping other texts:\n%s", clash)
	}
}

// drawBytes draws a solution's layout.
func drawBytes(t *testing.T, s solution.Solution, o DrawOptions) (Scene, []byte) {
	t.Helper()
	sc, err := NewScene(s, o)
	if err != nil {
		t.Fatal(err)
	}
	var b bytes.Buffer
	if err := sc.WriteSVG(&b, o); err != nil {
		t.Fatal(err)
	}
	return sc, b.Bytes()
}

// Every ray of the drawing is stroked in its wavelength's colour
// (wavecolour.Of), the colour the plots give that wavelength.
func TestRaysInTheirWavelengthsColour(t *testing.T) {
	req := solutiontest.Requirements()["image"]
	_, svg := drawBytes(t, solutiontest.Solve(t, req)[0], DrawOptions{})
	want := wavecolour.Hex(wavecolour.Of(req.Lambda()))
	rays := regexp.MustCompile(`class="ray ray-[a-z]+"[^>]* stroke="(#[0-9a-f]{6})"`).FindAllStringSubmatch(string(svg), -1)
	if len(rays) == 0 {
		t.Fatal("no ray found in the drawing")
	}
	for _, m := range rays {
		if m[1] != want {
			t.Errorf("a ray drawn %s, its wavelength's colour is %s", m[1], want)
		}
	}
}
