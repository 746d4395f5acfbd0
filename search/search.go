package search

import (
	"container/heap"
	"math"
	"sort"
)

// limits are what the pruning and the admission of a first-order solution
// use: the requirement's own, or looser ones when looking for near misses.
type limits struct {
	admit     float64 // first-order tolerance a singlet or expander must meet
	gapMin    float64
	lengthMax float64 // +Inf for none
	bfdMin    float64
	wdMin     float64
	form      Form
}

func limitsOf(r Requirement) limits {
	l := limits{admit: firstOrderTol(r), gapMin: r.GapMin, lengthMax: math.Inf(1),
		bfdMin: r.BFDMin, wdMin: r.WDMin, form: r.Form}
	if r.LengthMax > 0 {
		l.lengthMax = r.LengthMax
	}
	return l
}

// looser are the limits of the near-miss search: three times the tolerance,
// no gap, envelope, clearance or form limit.
func looser(r Requirement) limits {
	t := firstOrderTol(r)
	if t == 0 {
		t = 0.01 * math.Abs(target(r))
	}
	return limits{admit: 3 * t, lengthMax: math.Inf(1)}
}

func target(r Requirement) float64 {
	switch r.Kind {
	case Focus:
		return r.EFL
	case Image:
		return r.Mag
	}
	return r.Expansion
}

// search is one run of the solver.
type search struct {
	req    Requirement
	lim    limits
	c      []cand
	sc     scorer
	tol    float64 // the requirement's first-order tolerance, for the checks
	top    int     // results to keep; 0 all
	misses bool    // keep layouts that fail checks too (near-miss search)
	nodes  []node
	roots  []int32

	kept       layoutHeap
	solved     int            // layouts that met the first-order target
	failed     map[uint16]int // failures by check, among solved layouts
	evaluated  int            // pairs solved
	unverified int            // roots the matrix check refused (never seen in tests)
}

func newSearch(p *prepared, req Requirement, lim limits, top int) *search {
	s := &search{req: req, lim: lim, c: p.cands, sc: newScorer(req), tol: firstOrderTol(req),
		top: top, failed: map[uint16]int{}}
	s.kept.s = s
	return s
}

// emit takes a solved layout.
func (s *search) emit(l *layout) {
	s.solved++
	if !l.meets() {
		for bit := uint16(1); bit != 0 && bit <= failDrawer; bit <<= 1 {
			if l.fails&bit != 0 {
				s.failed[bit]++
			}
		}
		if !s.misses {
			return
		}
	}
	if s.top == 0 || s.kept.Len() < s.top {
		heap.Push(&s.kept, *l)
		return
	}
	if s.better(l, &s.kept.ls[0]) {
		s.kept.ls[0] = *l
		heap.Fix(&s.kept, 0)
	}
}

// bound is the score a new layout must not exceed to be kept: the worst
// kept score once the list is full, +Inf before.
func (s *search) bound() float64 {
	if s.top == 0 || s.kept.Len() < s.top || s.misses {
		return math.Inf(1)
	}
	return s.kept.ls[0].score
}

// exhaustive solves every candidate alone and every ordered pair.
func (s *search) exhaustive() {
	n := int32(len(s.c))
	for i := int32(0); i < n; i++ {
		s.singlet(i, s.emit)
	}
	if s.req.MaxElements() < 2 {
		return
	}
	for i := int32(0); i < n; i++ {
		for j := int32(0); j < n; j++ {
			s.evaluated++
			s.pair(i, j, s.emit)
		}
	}
}

// pruned solves every candidate alone, then for each first part walks the
// power tree and solves only the second parts of the nodes left open.
func (s *search) pruned() {
	n := int32(len(s.c))
	for i := int32(0); i < n; i++ {
		s.singlet(i, s.emit)
	}
	if s.req.MaxElements() < 2 || n == 0 {
		return
	}
	split := int32(sort.Search(int(n), func(i int) bool { return s.c[i].phi > 0 }))
	s.roots = nil
	for _, r := range []int32{s.buildTree(0, split), s.buildTree(split, n)} {
		if r >= 0 {
			s.roots = append(s.roots, r)
		}
	}
	order, lb := s.firstOrder()
	stack := make([]int32, 0, 64)
	for _, i := range order {
		if b := s.bound(); lb[i] > b+margin(b) {
			break
		}
		a := &s.c[i]
		stack = append(stack[:0], s.roots...)
		for len(stack) > 0 {
			id := stack[len(stack)-1]
			stack = stack[:len(stack)-1]
			nd := &s.nodes[id]
			if !s.open(a, nd) {
				continue
			}
			if nd.left >= 0 {
				stack = append(stack, nd.right, nd.left)
				continue
			}
			for j := nd.lo; j < nd.hi; j++ {
				s.evaluated++
				s.pair(i, j, s.emit)
			}
		}
	}
}

// firstOrder sorts the first parts by the least score any pair starting
// with them can have, so that good pairs are found early and the loop can
// stop once that least score passes the bound.
func (s *search) firstOrder() ([]int32, []float64) {
	priceMin, awayMin, lMin := math.Inf(1), math.Inf(1), math.Inf(1)
	for i := range s.c {
		priceMin = math.Min(priceMin, s.c[i].price)
		awayMin = math.Min(awayMin, s.c[i].away)
		lMin = math.Min(lMin, s.c[i].L)
	}
	w := s.sc.w
	lb := make([]float64, len(s.c))
	order := make([]int32, len(s.c))
	for i := range s.c {
		a := &s.c[i]
		order[i] = int32(i)
		lb[i] = w.Elements + w.Price*(a.price+priceMin) + w.Drawer*(a.away+awayMin)/2 +
			w.Envelope*(a.L+s.lim.gapMin+lMin)/s.sc.lref
	}
	sort.SliceStable(order, func(x, y int) bool { return lb[order[x]] < lb[order[y]] })
	return order, lb
}

// sorted returns the kept layouts best first.
func (s *search) sorted() []layout {
	ls := append([]layout(nil), s.kept.ls...)
	sort.Slice(ls, func(i, j int) bool { return s.better(&ls[i], &ls[j]) })
	return ls
}

// layoutHeap keeps the worst kept layout on top.
type layoutHeap struct {
	s  *search
	ls []layout
}

func (h *layoutHeap) Len() int           { return len(h.ls) }
func (h *layoutHeap) Less(i, j int) bool { return h.s.better(&h.ls[j], &h.ls[i]) }
func (h *layoutHeap) Swap(i, j int)      { h.ls[i], h.ls[j] = h.ls[j], h.ls[i] }
func (h *layoutHeap) Push(x any)         { h.ls = append(h.ls, x.(layout)) }
func (h *layoutHeap) Pop() any {
	l := h.ls[len(h.ls)-1]
	h.ls = h.ls[:len(h.ls)-1]
	return l
}
