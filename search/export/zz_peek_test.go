package export

import (
	"os"
	"testing"
)

func TestPeekPlot(t *testing.T) {
	for name, req := range testRequirements() {
		s := solve(t, req)[0]
		sp, err := NewSpots(s, PlotOptions{})
		if err != nil {
			t.Fatal(err)
		}
		for _, f := range []string{"png", "svg"} {
			w, _ := os.Create("/tmp/h6/spot-" + name + "." + f)
			if err := sp.WritePlot(w, "test "+name, f); err != nil {
				t.Fatal(err)
			}
			w.Close()
		}
		for _, st := range sp.Sets {
			t.Logf("%s field %.3g wl %.1f rms %.3g passed %d lost %d", name, st.Field, st.Wavelength, st.RMS, st.Passed, st.Lost)
		}
		t.Logf("airy %.3g", sp.Airy)
	}
}
