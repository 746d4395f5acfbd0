package drawing

import (
	"math"
	"strings"
	"testing"

	"cardinal/search/solution/solutiontest"
)

// A laser focus drawn without a field shows the beam's envelope and no
// chief ray. The envelope starts at the beam's radius and narrows to the
// focused waist w0' = lambda f / (pi w) of a collimated Gaussian beam of
// radius w through a lens of focal length f (Siegman, Lasers, 1986,
// ch. 17, focusing of a Gaussian beam; the far-field form, valid when the
// input's Rayleigh range is much longer than f).
func TestLaserDrawsTheBeamEnvelope(t *testing.T) {
	req := solutiontest.Requirements()["focus"] // a laser: a power is given
	s := solutiontest.Solve(t, req)[0]
	sc, svg := drawBytes(t, s, DrawOptions{})
	if !sc.Beam || sc.Envelope == nil {
		t.Fatal("a laser focus without a field has no beam envelope")
	}
	for _, r := range sc.Rays {
		if r.Name != "marginal" {
			t.Errorf("a %s ray is drawn for a laser beam without a field", r.Name)
		}
	}
	w := req.Beam / 2
	if got := sc.Envelope.Points[len(sc.Envelope.Points)/100][1]; math.Abs(got-w) > 1e-3*w {
		t.Errorf("the envelope before the lens is %.5f mm, want the beam radius %.5f mm", got, w)
	}
	f := *s.Result.EFL
	want := req.Lambda() * 1e-6 * f / (math.Pi * w)
	if math.Abs(sc.Envelope.Waist-want) > 0.05*want {
		t.Errorf("focused waist %.5f mm, want %.5f mm within 5 %%", sc.Envelope.Waist, want)
	}
	least := math.Inf(1)
	for _, p := range sc.Envelope.Points {
		least = math.Min(least, p[1])
	}
	if least > 3*want {
		t.Errorf("the envelope never narrows below %.4f mm; the waist is %.4f mm", least, want)
	}
	if !strings.Contains(string(svg), `class="beam-envelope"`) || strings.Contains(string(svg), "ray-chief") {
		t.Error("the SVG lacks the envelope or still has a chief ray")
	}
	// With a field asked, the chief ray is drawn too.
	sc, svg = drawBytes(t, s, DrawOptions{Field: 0.5})
	if sc.Beam || sc.Envelope == nil || !strings.Contains(string(svg), "ray-chief") {
		t.Error("a laser drawing with a field asked lacks its chief ray or its envelope")
	}
}
