package drawing

import (
	"slices"
	"testing"
)

func TestWrapText(t *testing.T) {
	for _, tc := range []struct {
		name string
		s    string
		n    int
		want []string
	}{
		{"fits", "marginal rays", 20, []string{"marginal rays"}},
		{"exactly", "ab cd", 5, []string{"ab cd"}},
		{"breaks between words", "ab cd ef", 5, []string{"ab cd", "ef"}},
		{"long word alone", "a verylongword b", 5, []string{"a", "verylongword", "b"}},
		{"counts characters, not bytes", "F′ F′ F′", 5, []string{"F′ F′", "F′"}},
		{"empty", "", 5, []string{""}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			if got := wrapText(tc.s, tc.n); !slices.Equal(got, tc.want) {
				t.Errorf("wrapText(%q, %d) = %q, want %q", tc.s, tc.n, got, tc.want)
			}
		})
	}
}
