package drawing

import (
	"bytes"
	"errors"
	"math"
	"strings"
	"testing"

	"cardinal/search/finite"
	"cardinal/search/solution/solutiontest"
)

// A drawing never holds NaN or an infinity: a scene with one, whether in
// its model (a ray point) or only in a figure the writer works out from it
// (the field, which places the labels), is refused with an error naming
// the place, and nothing is written. NaN and the infinities are the IEEE
// 754 values that are not finite (IEEE Std 754-2019, section 3.4; common
// practice).
func TestSVGRefusesNonFinite(t *testing.T) {
	s := solutiontest.Solve(t, solutiontest.Requirements()["focus"])[0]
	for _, tc := range []struct {
		name  string
		spoil func(*Scene)
		path  string
	}{
		{"a ray point", func(sc *Scene) { sc.Rays[0].Points[1][1] = math.NaN() }, "Rays[0].Points[1][1]"},
		{"the drawing's extent", func(sc *Scene) { sc.XMax = math.Inf(1) }, "XMax"},
		// Each bound finite, their difference (the drawing's width)
		// overflows: only the written SVG shows it.
		{"a width worked out while drawing", func(sc *Scene) { sc.XMin, sc.XMax = -math.MaxFloat64, math.MaxFloat64 }, "attribute"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			sc, err := NewScene(s, DrawOptions{})
			if err != nil {
				t.Fatal(err)
			}
			tc.spoil(&sc)
			var b bytes.Buffer
			err = sc.WriteSVG(&b, DrawOptions{})
			var fe *finite.Error
			if !errors.As(err, &fe) || !strings.Contains(fe.Path, tc.path) {
				t.Fatalf("got %v, want a *finite.Error at %s", err, tc.path)
			}
			if b.Len() > 0 {
				t.Errorf("%d bytes written", b.Len())
			}
		})
	}
}

// The finite scene draws: the guard refuses nothing it should draw.
func TestSVGGuardPassesAFiniteScene(t *testing.T) {
	for kind, req := range solutiontest.Requirements() {
		t.Run(kind, func(t *testing.T) {
			_, b := drawBytes(t, solutiontest.Solve(t, req)[0], DrawOptions{})
			if err := finite.Attributes("the drawing", b); err != nil || bytes.Contains(b, []byte("NaN")) {
				t.Errorf("%v; NaN in the drawing: %v", err, bytes.Contains(b, []byte("NaN")))
			}
		})
	}
}
