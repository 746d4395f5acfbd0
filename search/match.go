package search

import (
	"math"

	"gonum.org/v1/gonum/mat"

	"cardinal/optics"
)

// Mode matching (Kind Match): an input waist w1 at the origin is to be
// turned into an output waist w2, either at a given distance (Track, from
// waist plane to waist plane) or wherever the layout puts it. The working
// distance runs from the input waist to the first vertex, the back
// clearance from the last vertex to the output waist plane. The figure of
// merit is the power coupling (optics.Coupling) of the beam produced into
// the target mode at the target plane; a layout's error is coupling - 1.

// matchBeams returns the Rayleigh ranges of the input and output waists in
// air.
func (s *search) matchBeams() (z1, z2 float64) {
	l := s.req.Lambda()
	return optics.NewGaussianBeam(l, s.req.WaistIn, 0, 1).RayleighRange(),
		optics.NewGaussianBeam(l, s.req.WaistOut, 0, 1).RayleighRange()
}

// matchCoupling is the coupling of a layout of matrix m (first to last
// vertex) with working distance wd and back clearance bc into the target
// waist at the end of bc.
func (s *search) matchCoupling(m optics.Mat2, wd, bc float64) float64 {
	lambda := s.req.Lambda()
	in := optics.NewGaussianBeam(lambda, s.req.WaistIn, wd, 1)
	out := in.Through(m, 1).Propagate(bc)
	return optics.Coupling(out, optics.NewGaussianBeam(lambda, s.req.WaistOut, 0, 1))
}

// singletMatch places one part. Without a track it takes both
// placements of Kogelnik and Li from the part's principal planes
// (optics.ModeMatchPlacements: exact for a thick part in air, whose matrix
// between its principal planes is a thin lens; Gerrard and Burch, ch. III).
// With a track it takes the placement of best coupling.
func (s *search) singletMatch(i int32) {
	c := &s.c[i]
	if s.req.Track > 0 {
		s.singletMatchTrack(i)
		return
	}
	for r, p := range optics.ModeMatchPlacements(s.req.WaistIn, s.req.WaistOut, s.req.Lambda(), c.efl()) {
		wd, bc := p.D1-c.P, c.Pp+p.D2
		if !(wd > 0 && bc > 0) {
			continue
		}
		s.emitMatch(&layout{a: i, b: -1, root: int8(r), wd: wd, bc: bc, env: c.L, track: wd + c.L + bc})
	}
}

// singletMatchTrack finds the working distance of best coupling on a fixed
// track: a scan of 64 positions, then a golden-section search around the
// best (Press et al., Numerical Recipes, 3rd ed., sec. 10.2). The coupling
// of a single part on a track has at most a few maxima, each wider than
// the scan's step for the tracks of a stock-lens search.
func (s *search) singletMatchTrack(i int32) {
	c := &s.c[i]
	room := s.req.Track - c.L
	if room <= 0 {
		return
	}
	eta := func(wd float64) float64 { return s.matchCoupling(c.m, wd, room-wd) }
	const n = 64
	best, bestEta := 0.0, -1.0
	for k := 1; k < n; k++ {
		wd := room * float64(k) / n
		if e := eta(wd); e > bestEta {
			best, bestEta = wd, e
		}
	}
	wd := goldenMax(eta, math.Max(best-room/n, 0), math.Min(best+room/n, room))
	s.emitMatch(&layout{a: i, b: -1, wd: wd, bc: room - wd, env: c.L, track: s.req.Track})
}

// goldenMax is the argument of the greatest value of f on [lo, hi] by
// golden-section search, to 1e-9 of the interval.
func goldenMax(f func(float64) float64, lo, hi float64) float64 {
	const r = 0.6180339887498949
	x1, x2 := hi-r*(hi-lo), lo+r*(hi-lo)
	f1, f2 := f(x1), f(x2)
	for k := 0; k < 60 && hi-lo > 1e-12*(1+math.Abs(hi)); k++ {
		if f1 < f2 {
			lo, x1, f1 = x1, x2, f2
			x2 = lo + r*(hi-lo)
			f2 = f(x2)
		} else {
			hi, x2, f2 = x2, x1, f1
			x1 = hi - r*(hi-lo)
			f1 = f(x1)
		}
	}
	return (lo + hi) / 2
}

// emitMatch computes the coupling of a placed layout and emits it when it
// is admitted.
func (s *search) emitMatch(l *layout) {
	l.value = s.matchCoupling(s.layoutMatrix(l), l.wd, l.bc)
	l.err = l.value - 1
	if -l.err > s.lim.admit {
		return
	}
	if s.finish(l) {
		if l.value < s.req.MinCoupling() {
			l.fails |= failCoupling
		}
		s.emit(l)
	}
}

// matchBranch is one layout family of a pair: the intermediate waist's
// Rayleigh range s and the signs of the two Kogelnik-Li placements.
//
// With the intermediate beam's waist of Rayleigh range s between the
// parts, part a (focal length f1, input Rayleigh range z1) must sit
// u = f1 + e1 sqrt(z1/s) sqrt(f1^2 - z1 s) after the input waist and puts
// the intermediate waist p = f1 + e1 sqrt(s/z1) sqrt(f1^2 - z1 s) behind
// its back principal plane; likewise for part b from the output side
// (Kogelnik and Li, Appl. Opt. 5, 1550 (1966), sec. VI, with f0^2 = z1 s:
// f0 = pi w1 W / lambda). So u + p = 2 f1 + e1 h1(s) with
// h1 = (z1 + s) sqrt(f1^2 - z1 s) / sqrt(z1 s), and the layout is
// determined by s and the signs e1, e2.
type matchBranch struct {
	s      float64
	e1, e2 float64
}

// matchLayout turns a branch into distances: working distance, vertex gap
// and back clearance; ok is false when s is out of range.
func matchLayout(a, b *cand, z1, z2 float64, br matchBranch) (wd, gap, bc float64, ok bool) {
	f1, f2 := a.efl(), b.efl()
	r1, r2 := f1*f1-z1*br.s, f2*f2-z2*br.s
	if !(br.s > 0) || r1 < 0 || r2 < 0 {
		return 0, 0, 0, false
	}
	r1, r2 = math.Sqrt(r1), math.Sqrt(r2)
	u := f1 + br.e1*math.Sqrt(z1/br.s)*r1
	p := f1 + br.e1*math.Sqrt(br.s/z1)*r1
	v := f2 + br.e2*math.Sqrt(z2/br.s)*r2
	pp := f2 + br.e2*math.Sqrt(br.s/z2)*r2
	return u - a.P, p + pp - b.P + a.Pp, v + b.Pp, true
}

// pairMatch solves a then b.
func (s *search) pairMatch(i, j int32) {
	a, b := &s.c[i], &s.c[j]
	z1, z2 := s.matchBeams()
	var brs []matchBranch
	if s.req.Track > 0 {
		brs = matchRoots(a, b, z1, z2, s.req.Track-a.sep()-b.sep())
	} else {
		brs = s.shortestMatch(a, b, z1, z2)
	}
	for r, br := range brs {
		wd, gap, bc, ok := matchLayout(a, b, z1, z2, br)
		if !ok || wd <= 0 || gap < 0 || bc <= 0 {
			continue
		}
		l := layout{a: i, b: j, root: int8(r), wd: wd, gap: gap, bc: bc, env: a.L + gap + b.L}
		l.track = wd + l.env + bc
		if bd := s.bound(); s.sc.pair(0, l.track, pairAway(a, b), s.pairPrice(a, b)) > bd+margin(bd) {
			s.solved++
			continue
		}
		l.value = s.matchCoupling(pairMatrix(a, b, gap), wd, bc)
		if 1-l.value > 1e-6 {
			s.unverified++ // the matrices refuse the root
			continue
		}
		l.err = l.value - 1
		if s.finish(&l) {
			if l.value < s.req.MinCoupling() {
				l.fails |= failCoupling
			}
			s.emit(&l)
		}
	}
}

// matchRoots solves a pair on a fixed track: with S the track less the
// parts' principal-point separations and K = S - 2 f1 - 2 f2, every layout
// satisfies e1 h1(s) + e2 h2(s) = K (see matchBranch). Squaring twice,
// with h_k^2 = N_k / D, N1 = z2 (z1 + s)^2 (f1^2 - z1 s),
// N2 = z1 (z2 + s)^2 (f2^2 - z2 s) and D = z1 z2 s:
//
//	(K^2 D - N1 - N2)^2 - 4 N1 N2 = 0,
//
// a polynomial of degree 6 in s whose real roots in
// (0, min(f1^2/z1, f2^2/z2)] hold every solution. Its roots are the
// eigenvalues of its companion matrix (gonum), polished by Newton's
// method; each root is kept with each sign pair that satisfies the
// unsquared equation, and pairMatch checks every layout through the
// matrices. A double root (two layouts merging, the degenerate case) is
// an eigenvalue pair with a tiny imaginary part, kept as one real root.
func matchRoots(a, b *cand, z1, z2, S float64) []matchBranch {
	f1, f2 := a.efl(), b.efl()
	sMax := math.Min(f1*f1/z1, f2*f2/z2)
	if !(sMax > 0) {
		return nil
	}
	K := S - 2*f1 - 2*f2
	// In t = s / sMax, so that the coefficients are of one scale.
	x := poly{0, sMax}
	n1 := poly{z1, sMax}.mul(poly{z1, sMax}).mul(poly{f1 * f1, -z1 * sMax}).scale(z2)
	n2 := poly{z2, sMax}.mul(poly{z2, sMax}).mul(poly{f2 * f2, -z2 * sMax}).scale(z1)
	d := x.scale(K * K * z1 * z2)
	e := d.sub(n1).sub(n2)
	p := e.mul(e).sub(n1.mul(n2).scale(4))
	var out []matchBranch
	h := func(t float64) (float64, float64) {
		s := t * sMax
		return (z1 + s) * math.Sqrt(math.Max(0, f1*f1-z1*s)) / math.Sqrt(z1*s),
			(z2 + s) * math.Sqrt(math.Max(0, f2*f2-z2*s)) / math.Sqrt(z2*s)
	}
	scale := math.Abs(K) + math.Abs(f1) + math.Abs(f2)
	for _, t := range p.realRoots(0, 1) {
		h1, h2 := h(t)
		for _, e1 := range []float64{1, -1} {
			for _, e2 := range []float64{1, -1} {
				if math.Abs(e1*h1+e2*h2-K) <= 1e-6*(scale+h1+h2) {
					out = append(out, matchBranch{t * sMax, e1, e2})
				}
				if h2 == 0 {
					break // e2 makes no difference
				}
			}
			if h1 == 0 {
				break
			}
		}
	}
	return out
}

// shortestMatch finds, without a track, the branch of least track that
// keeps the working distance, gap and back clearance at their minimums:
// the track u + p + p' + v + (separations) = 2 f1 + 2 f2 + e1 h1 + e2 h2 +
// (separations) along each of the four sign branches, scanned on a
// logarithmic grid of s and refined by golden section around the best.
func (s *search) shortestMatch(a, b *cand, z1, z2 float64) []matchBranch {
	f1, f2 := a.efl(), b.efl()
	sMax := math.Min(f1*f1/z1, f2*f2/z2)
	if !(sMax > 0) {
		return nil
	}
	gapNeed := math.Max(0, s.lim.gapMin+s.backMax(a)-s.frontMin(b))
	track := func(br matchBranch) float64 {
		wd, gap, bc, ok := matchLayout(a, b, z1, z2, br)
		if !ok || wd <= 0 || wd < s.lim.wdMin || gap < gapNeed || bc <= 0 || bc < s.lim.bfdMin {
			return math.Inf(1)
		}
		return wd + gap + bc
	}
	const n, decades = 96, 8
	var out []matchBranch
	for _, e1 := range []float64{1, -1} {
		for _, e2 := range []float64{1, -1} {
			at := func(k float64) matchBranch {
				return matchBranch{sMax * math.Pow(10, -decades*(1-k/n)), e1, e2}
			}
			bestK, best := -1.0, math.Inf(1)
			for k := 0; k <= n; k++ {
				if t := track(at(float64(k))); t < best {
					bestK, best = float64(k), t
				}
			}
			if bestK < 0 {
				continue
			}
			k := goldenMax(func(k float64) float64 { return -track(at(k)) }, math.Max(0, bestK-1), math.Min(n, bestK+1))
			br := at(k)
			if math.IsInf(track(br), 1) {
				br = at(bestK)
			}
			out = append(out, br)
		}
	}
	if len(out) == 0 {
		return nil
	}
	best := out[0]
	for _, br := range out[1:] {
		if track(br) < track(best) {
			best = br
		}
	}
	return []matchBranch{best}
}

// poly is a polynomial by its coefficients, lowest power first.
type poly []float64

func (p poly) mul(q poly) poly {
	out := make(poly, len(p)+len(q)-1)
	for i, a := range p {
		for j, b := range q {
			out[i+j] += a * b
		}
	}
	return out
}

func (p poly) scale(k float64) poly {
	out := make(poly, len(p))
	for i, a := range p {
		out[i] = k * a
	}
	return out
}

func (p poly) sub(q poly) poly {
	out := make(poly, max(len(p), len(q)))
	copy(out, p)
	for i, b := range q {
		out[i] -= b
	}
	return out
}

func (p poly) at(x float64) (v, dv float64) {
	for i := len(p) - 1; i >= 0; i-- {
		dv = dv*x + v
		v = v*x + p[i]
	}
	return v, dv
}

// realRoots returns the real roots of p in [lo, hi], from the eigenvalues
// of its companion matrix (the roots of a polynomial are those
// eigenvalues; Press et al., Numerical Recipes, 3rd ed., sec. 9.5.4),
// each polished by a few Newton steps. Coefficients negligible against the
// largest are dropped from the top so that the leading one is sound.
func (p poly) realRoots(lo, hi float64) []float64 {
	big := 0.0
	for _, c := range p {
		big = math.Max(big, math.Abs(c))
	}
	if big == 0 {
		return nil
	}
	n := len(p) - 1
	for n > 0 && math.Abs(p[n]) <= 1e-13*big {
		n--
	}
	if n == 0 {
		return nil
	}
	comp := mat.NewDense(n, n, nil)
	for i := 0; i < n; i++ {
		comp.Set(0, i, -p[n-1-i]/p[n])
		if i > 0 {
			comp.Set(i, i-1, 1)
		}
	}
	var eig mat.Eigen
	if !eig.Factorize(comp, mat.EigenNone) {
		return nil
	}
	var out []float64
	for _, z := range eig.Values(nil) {
		x := real(z)
		if math.Abs(imag(z)) > 1e-6*(1+math.Abs(x)) {
			continue
		}
		for k := 0; k < 4; k++ {
			v, dv := p.at(x)
			if dv == 0 {
				break
			}
			if nx := x - v/dv; !math.IsNaN(nx) && math.Abs(nx-x) < 1e-3*(1+math.Abs(x)) {
				x = nx
			}
		}
		if x >= lo-1e-12 && x <= hi+1e-12 {
			out = append(out, math.Max(lo, math.Min(hi, x)))
		}
	}
	return out
}

// matchFigures are the Gaussian figures of a mode-matching layout: the
// waist produced and where it lies, the coupling, and how far the
// adjustable spacing may move before the coupling drops by 1 %.
func (s *search) matchFigures(l *layout) LaserFigures {
	lambda := s.req.Lambda()
	out := optics.NewGaussianBeam(lambda, s.req.WaistIn, l.wd, 1).Through(s.layoutMatrix(l), 1)
	f := outFigures(out)
	f.Coupling = ptr(l.value)
	if tol, ok := s.couplingTol(l); ok {
		f.CouplingTol = ptr(tol)
	}
	return f
}

// couplingTol is the least move, either way, of the gap of a pair (the
// second part sliding, the waist planes and the first part fixed) or of a
// single part's position between the fixed waist planes, that lowers the
// coupling to 99 % of its value: doubling steps from 1 um until the
// coupling falls below, then bisection. ok is false when no move of up to
// the track's length does.
func (s *search) couplingTol(l *layout) (float64, bool) {
	eta0 := l.value
	at := func(d float64) float64 {
		if l.pair() {
			a, b := &s.c[l.a], &s.c[l.b]
			if l.gap+d < 0 || l.bc-d <= 0 {
				return 0
			}
			return s.matchCoupling(pairMatrix(a, b, l.gap+d), l.wd, l.bc-d)
		}
		if l.wd+d <= 0 || l.bc-d <= 0 {
			return 0
		}
		return s.matchCoupling(s.c[l.a].m, l.wd+d, l.bc-d)
	}
	drops := func(d float64) bool { return at(d) < 0.99*eta0 }
	best, ok := math.Inf(1), false
	for _, sign := range []float64{1, -1} {
		hi := 1e-3
		for !drops(sign*hi) && hi < 10*l.track {
			hi *= 2
		}
		if !drops(sign * hi) {
			continue
		}
		lo := hi / 2
		if hi == 1e-3 {
			lo = 0
		}
		for k := 0; k < 40; k++ {
			mid := (lo + hi) / 2
			if drops(sign * mid) {
				hi = mid
			} else {
				lo = mid
			}
		}
		if hi < best {
			best, ok = hi, true
		}
	}
	return best, ok
}
