package synth

import "fmt"

// A Kind is the form of a stock part.
type Kind int

// The kinds of part the generator makes. The zero value is PlanoConvex.
const (
	PlanoConvex      Kind = iota // curved side first, flat side toward the focus
	Biconvex                     // equiconvex
	BestForm                     // biconvex bent for least spherical aberration at infinite conjugate
	PositiveMeniscus             // convex first, weaker concave second
	PlanoConcave                 // concave side first
	Biconcave                    // equiconcave
	NegativeMeniscus             // weak convex first, steeper concave second
	Achromat                     // cemented achromatic doublet, crown first
	numKinds
)

var kindNames = [numKinds]string{"plano-convex", "biconvex", "best-form", "positive meniscus",
	"plano-concave", "biconcave", "negative meniscus", "achromat"}

func (k Kind) String() string {
	if k < 0 || k >= numKinds {
		return fmt.Sprintf("Kind(%d)", int(k))
	}
	return kindNames[k]
}

// Positive tells whether parts of this kind converge light.
func (k Kind) Positive() bool {
	return k <= PositiveMeniscus || k == Achromat
}

// shapeFactor is the Coddington shape factor q = (c1 + c2)/(c1 - c2) of a
// singlet of this kind in glass of index n (W. J. Smith, Modern Optical
// Engineering, 4th ed., sec. 5.4, from memory for the section; Hecht,
// Optics, 5th ed., sec. 6.3.1): 0 is equiconvex or
// equiconcave, +1 puts the flat side second; beyond 1 the lens is a meniscus.
func (k Kind) shapeFactor(n float64) float64 {
	switch k {
	case PlanoConvex, PlanoConcave:
		return 1
	case Biconvex, Biconcave:
		return 0
	case BestForm:
		// Least spherical aberration for an object at infinity:
		// q = 2 (n^2 - 1) / (n + 2) (thin-lens third-order theory; Hecht,
		// Optics, 5th ed., sec. 6.3.1, from memory).
		return 2 * (n*n - 1) / (n + 2)
	case PositiveMeniscus:
		return 2.5
	case NegativeMeniscus:
		return -2.5
	}
	panic(fmt.Sprintf("synth: no shape factor for %v", k))
}
