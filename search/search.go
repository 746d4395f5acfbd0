package search

import (
	"cmp"
	"container/heap"
	"math"
	"runtime"
	"slices"
	"sort"
	"sync"
	"sync/atomic"
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
	return limits{admit: firstOrderTol(r), gapMin: r.GapMin, lengthMax: r.LengthLimit(),
		bfdMin: r.BFDMin, wdMin: r.WDMin, form: r.Form}
}

// looser are the limits of the near-miss search: three times the tolerance,
// no gap, envelope, clearance or form limit.
func looser(r Requirement) limits {
	t := firstOrderTol(r)
	if t == 0 {
		t = 0.01 * math.Abs(target(r))
	}
	return limits{admit: 3 * t, lengthMax: math.Inf(1), bfdMin: math.Inf(-1), wdMin: math.Inf(-1)}
}

func target(r Requirement) float64 {
	switch r.Kind {
	case Focus:
		return r.EFL
	case Image:
		return r.Mag
	case Match:
		return 1 // full coupling
	}
	return r.Expansion
}

// search is one run of the solver.
type search struct {
	req Requirement
	lim limits
	c   []cand
	itemData
	sc     scorer
	tol    float64 // the requirement's first-order tolerance, for the checks
	top    int     // results to keep, at least 1: the kept heap never grows past it
	misses bool    // keep layouts that fail checks too (near-miss search)
	lax    bool    // prune by no check the pair solvers count (see strict)
	tree   *forest // the power trees, shared by every search of the candidates
	kept   *kept   // shared by the workers of one search
	// beamY is the collimated beam's radius the aperture pruning uses (0
	// for none) and phi0 the pair's power it assumes (aperture.go).
	beamY, phi0 float64
	img         imageTerms // image only (aperture.go)
	// win is the working distances the current first part allows (image;
	// imageWindow), set by bestFirst in the worker's own copy.
	win iv

	// Counts of this worker, added up by merge.
	solved     int            // layouts that met the first-order target
	met        int            // layouts that met every check (counted while the bound allowed)
	failed     map[uint16]int // failures by check, among solved layouts
	evaluated  int            // pairs solved
	unverified int            // roots the matrix check refused (never seen in tests)
}

// kept holds the best layouts found so far, and the bound their worst
// score sets, for every worker of a search.
type kept struct {
	mu    sync.Mutex
	heap  layoutHeap
	bound atomic.Uint64 // math.Float64bits of the bound; +Inf until full
	met   atomic.Bool   // a layout that meets every check was found
}

func newSearch(p *prepared, req Requirement, lim limits, top int) *search {
	if top < 1 || top > MaxShown {
		top = MaxShown
	}
	s := &search{req: req, lim: lim, c: p.cands, itemData: p.itemData, tree: &p.forest, sc: newScorer(req), tol: firstOrderTol(req),
		top: top, failed: map[uint16]int{}, kept: &kept{}}
	s.kept.heap.s = s
	s.kept.bound.Store(math.Float64bits(math.Inf(1)))
	return s
}

// worker returns a copy of the search that shares its candidates, trees
// and kept layouts but counts on its own.
func (s *search) worker() *search {
	w := *s
	w.solved, w.met, w.failed, w.evaluated, w.unverified = 0, 0, map[uint16]int{}, 0, 0
	return &w
}

// merge adds a worker's counts to the search's.
func (s *search) merge(w *search) {
	s.solved += w.solved
	s.met += w.met
	s.evaluated += w.evaluated
	s.unverified += w.unverified
	for k, v := range w.failed {
		s.failed[k] += v
	}
}

// emit takes a solved layout.
func (s *search) emit(l *layout) {
	s.solved++
	if !l.meets() {
		for bit := uint16(1); bit != 0 && bit <= failLast; bit <<= 1 {
			if l.fails&bit != 0 {
				s.failed[bit]++
			}
		}
		if !s.misses {
			return
		}
	} else {
		s.met++
		s.kept.met.Store(true)
	}
	k := s.kept
	k.mu.Lock()
	defer k.mu.Unlock()
	switch {
	case k.heap.Len() < s.top:
		heap.Push(&k.heap, *l)
	case s.better(l, &k.heap.ls[0]):
		k.heap.ls[0] = *l
		heap.Fix(&k.heap, 0)
	default:
		return
	}
	if k.heap.Len() == s.top {
		k.bound.Store(math.Float64bits(k.heap.ls[0].score))
	}
}

// full tells whether the kept list reached its size, after which the
// bound prunes and the count of layouts that meet is a lower bound.
func (s *search) full() bool { return !math.IsInf(s.bound(), 1) }

// bound is the score a new layout must not exceed to be kept: the worst
// kept score once the list is full, +Inf before.
func (s *search) bound() float64 {
	return math.Float64frombits(s.kept.bound.Load())
}

// exhaustive solves every candidate alone and every ordered pair.
func (s *search) exhaustive() {
	n := int32(len(s.c))
	for i := int32(0); i < n; i++ {
		s.singlet(i)
	}
	if s.req.MaxElements() < 2 {
		return
	}
	for i := int32(0); i < n; i++ {
		for j := int32(0); j < n; j++ {
			s.evaluated++
			s.pair(i, j)
		}
	}
}

// pruned solves every candidate alone, then for each first part walks the
// power tree and solves only the second parts of the nodes left open. When
// no layout meets, it searches again without pruning by the checks
// (strict), so that the counts of the failed checks say why.
func (s *search) pruned() {
	s.prunedOnce()
	if s.kept.met.Load() || !s.strict() {
		return
	}
	s.lax = true
	s.solved, s.met, s.evaluated, s.unverified, s.failed = 0, 0, 0, 0, map[uint16]int{}
	s.prunedOnce()
}

func (s *search) prunedOnce() {
	n := int32(len(s.c))
	for i := int32(0); i < n; i++ {
		s.singlet(i)
	}
	if s.req.MaxElements() < 2 || n == 0 {
		return
	}
	s.buildForest()
	s.setAperture()
	if s.tree.ordered == nil || s.tree.gapMin != s.lim.gapMin {
		s.tree.ordered, s.tree.gapMin = s.firstOrder(), s.lim.gapMin
	}
	order := s.tree.ordered
	workers := min(runtime.GOMAXPROCS(0), 4)
	var next atomic.Int64
	var wg sync.WaitGroup
	ws := make([]*search, workers)
	for k := range ws {
		ws[k] = s.worker()
		wg.Add(1)
		go func(w *search) {
			defer wg.Done()
			var open nodeQueue
			for {
				n := next.Add(1) - 1
				if n >= int64(len(order)) {
					return
				}
				i := order[n].i
				if b := w.bound(); fromOrderedBits(order[n].u) > b+margin(b) {
					return // the first parts come by increasing bound
				}
				if w.firstOut(&w.c[i]) {
					continue
				}
				w.bestFirst(i, &open)
			}
		}(ws[k])
	}
	wg.Wait()
	for _, w := range ws {
		s.merge(w)
	}
}

// bestFirst solves a = candidate i followed by the second parts of the open
// nodes, visiting the nodes with the least score bound first so that the
// bound tightens early, and stopping once the least bound left passes it.
func (s *search) bestFirst(i int32, open *nodeQueue) {
	a := &s.c[i]
	open.items = open.items[:0]
	if s.req.Kind == Image {
		if s.win = s.imageWindow(a); s.win.lo > s.win.hi {
			return
		}
	}
	for _, r := range s.tree.roots {
		if ok, lb := s.open(a, &s.tree.nodes[r]); ok {
			open.push(nodeBound{r, lb})
		}
	}
	for open.Len() > 0 {
		nb := open.pop()
		if b := s.bound(); nb.lb > b+margin(b) {
			return
		}
		nd := &s.tree.nodes[nb.id]
		if nd.left < 0 {
			for j := nd.lo; j < nd.hi; j++ {
				if s.pairBound(a, &s.c[j]) > s.bound()+margin(s.bound()) || s.secondOut(a, &s.c[j]) {
					continue
				}
				s.evaluated++
				s.pair(i, j)
			}
			continue
		}
		for _, c := range [2]int32{nd.left, nd.right} {
			if ok, lb := s.open(a, &s.tree.nodes[c]); ok {
				open.push(nodeBound{c, lb})
			}
		}
	}
}

// pairBound is the least score a then b can have: every term but the
// error, with the envelope at its least (the parts the gap minimum apart).
func (s *search) pairBound(a, b *cand) float64 {
	return s.sc.pair(0, a.L+s.lim.gapMin+b.L, pairAway(a, b), s.pairPrice(a, b))
}

// nodeBound is a node and the least score of a layout through it.
type nodeBound struct {
	id int32
	lb float64
}

// nodeQueue is a min-heap of nodes by bound, ties by node id, typed to
// spare the boxing of container/heap on the hot path.
type nodeQueue struct{ items []nodeBound }

func (q *nodeQueue) Len() int { return len(q.items) }

func (q *nodeQueue) less(i, j int) bool {
	a, b := q.items[i], q.items[j]
	return a.lb < b.lb || a.lb == b.lb && a.id < b.id
}

func (q *nodeQueue) push(x nodeBound) {
	q.items = append(q.items, x)
	for i := len(q.items) - 1; i > 0; {
		p := (i - 1) / 2
		if !q.less(i, p) {
			break
		}
		q.items[i], q.items[p] = q.items[p], q.items[i]
		i = p
	}
}

func (q *nodeQueue) pop() nodeBound {
	top := q.items[0]
	last := len(q.items) - 1
	q.items[0] = q.items[last]
	q.items = q.items[:last]
	for i := 0; ; {
		l, r, m := 2*i+1, 2*i+2, i
		if l < last && q.less(l, m) {
			m = l
		}
		if r < last && q.less(r, m) {
			m = r
		}
		if m == i {
			break
		}
		q.items[i], q.items[m] = q.items[m], q.items[i]
		i = m
	}
	return top
}

// buildForest builds one power tree per tier and sign of power (the
// candidates come grouped by tier and sorted by power within each), unless
// another search of the same candidates built them.
func (s *search) buildForest() {
	if s.tree.nodes != nil {
		return
	}
	n := int32(len(s.c))
	s.tree.nodes = make([]node, 0, forestSize(s.c))
	for lo := int32(0); lo < n; {
		hi := lo
		for hi < n && s.c[hi].tier == s.c[lo].tier {
			hi++
		}
		split := lo + int32(sort.Search(int(hi-lo), func(i int) bool { return s.c[lo+int32(i)].phi > 0 }))
		for _, r := range []int32{s.buildTree(lo, split), s.buildTree(split, hi)} {
			if r >= 0 {
				s.tree.roots = append(s.tree.roots, r)
			}
		}
		lo = hi
	}
}

// forestSize is the number of nodes buildForest makes: growing the slice
// would copy it over and over.
func forestSize(cs []cand) int {
	total := 0
	for lo := 0; lo < len(cs); {
		hi := lo
		for hi < len(cs) && cs[hi].tier == cs[lo].tier {
			hi++
		}
		split := lo + sort.Search(hi-lo, func(i int) bool { return cs[lo+i].phi > 0 })
		total += treeSize(split-lo) + treeSize(hi-split)
		lo = hi
	}
	return total
}

// treeSize is the number of nodes of buildTree's tree over n candidates.
func treeSize(n int) int {
	switch {
	case n <= 0:
		return 0
	case n <= leafSize:
		return 1
	}
	return 1 + treeSize(n/2) + treeSize(n-n/2)
}

// firstOrder sorts the first parts by the least score any pair starting
// with them can have, so that good pairs are found early and the loop can
// stop once that least score passes the bound; ties keep the candidates'
// order. Each key holds the candidate and its bound as orderedBits.
func (s *search) firstOrder() []sortKey {
	priceMin, awayMin, lMin := math.Inf(1), math.Inf(1), math.Inf(1)
	for i := range s.c {
		priceMin = min(priceMin, s.c[i].price)
		awayMin = min(awayMin, s.c[i].away())
		lMin = min(lMin, s.c[i].L)
	}
	w := s.sc.w
	order := make([]sortKey, len(s.c))
	radix := true
	for i := range s.c {
		a := &s.c[i]
		lb := w.Elements + w.Price*(a.price+priceMin) + w.Drawer*(a.away()+awayMin) +
			w.Envelope*(a.L+s.lim.gapMin+lMin)/s.sc.lref
		order[i] = sortKey{u: orderedBits(lb), i: int32(i)}
		radix = radix && lb == lb && lb != 0 // no NaN, no signed zeros
	}
	if radix {
		return radixSort(order, make([]sortKey, len(order)))
	}
	slices.SortFunc(order, func(x, y sortKey) int {
		if c := cmp.Compare(fromOrderedBits(x.u), fromOrderedBits(y.u)); c != 0 {
			return c
		}
		return cmp.Compare(x.i, y.i)
	})
	return order
}

// sorted returns the kept layouts best first.
func (s *search) sorted() []layout {
	ls := append([]layout(nil), s.kept.heap.ls...)
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
