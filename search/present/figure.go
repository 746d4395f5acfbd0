package present

import (
	"math"
	"strconv"
	"strings"
)

// Figure prints a figure to three significant digits (whole numbers from
// 1000 up), never as "-0" or with an exponent above 1000.
func Figure(v float64) string {
	if math.Abs(v) >= 1000 {
		return Fixed(v, 0)
	}
	s := strconv.FormatFloat(v, 'g', 3, 64)
	if strings.Contains(s, "e") {
		return s
	}
	if strings.Trim(s, "-0.") == "" {
		return "0"
	}
	return s
}
