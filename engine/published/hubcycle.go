package published

import (
	"math"
	"sort"

	"duosweep/engine"
)

// hubView is the search tree seen from a point r (a node or a corridor
// point), with needed nodes: those whose subtree (seen from r) holds a target.
type hubView struct {
	s        *engine.Site
	root     engine.Point
	rootNode int   // r as a node, or -1 for a corridor point
	top      []int // the root node, or the corridor's two ends
	par      []int32
	plen     []float64 // length of the link to the parent (or to r for corridor ends)
	depth    []float64 // distance from r
	order    []int32   // preorder (parents first)
	kidStart []int32
	kidList  []int32
	need     []bool
	weight   []float64 // needed corridor length below v, including its link
	reach    []float64 // largest depth of a target below v (-1: none)
	W        float64
}

func newHubView(s *engine.Site, root engine.Point, target []bool) *hubView {
	n := s.N
	root = s.Canon(root)
	vw := &hubView{s: s, root: root, rootNode: -1,
		par: make([]int32, n), plen: make([]float64, n), depth: make([]float64, n),
		need: make([]bool, n), weight: make([]float64, n), reach: make([]float64, n)}
	seen := make([]bool, n)
	var stack []int32
	if root.IsNode() {
		vw.rootNode = root.From
		vw.top = []int{root.From}
		vw.par[root.From] = -1
		seen[root.From] = true
		stack = append(stack, int32(root.From))
	} else {
		u, du, v, dv := s.Ends(root)
		vw.top = []int{u, v}
		vw.par[u], vw.par[v] = -1, -1
		vw.plen[u], vw.plen[v] = du, dv
		vw.depth[u], vw.depth[v] = du, dv
		seen[u], seen[v] = true, true
		stack = append(stack, int32(v), int32(u))
	}
	vw.order = make([]int32, 0, n)
	for len(stack) > 0 {
		v := stack[len(stack)-1]
		stack = stack[:len(stack)-1]
		vw.order = append(vw.order, v)
		visit := func(w int32, e int32) {
			if w < 0 || seen[w] || !s.InSearch[w] {
				return
			}
			seen[w] = true
			vw.par[w] = v
			vw.plen[w] = s.EW[e]
			vw.depth[w] = vw.depth[v] + s.EW[e]
			stack = append(stack, w)
		}
		if p := s.Parent[v]; p >= 0 {
			visit(p, s.ParentEdge[v])
		}
		for _, c := range s.Children(int(v)) {
			visit(c, s.ParentEdge[c])
		}
	}
	// children in CSR
	vw.kidStart = make([]int32, n+1)
	for _, v := range vw.order {
		if p := vw.par[v]; p >= 0 {
			vw.kidStart[p+1]++
		}
	}
	for i := 1; i <= n; i++ {
		vw.kidStart[i] += vw.kidStart[i-1]
	}
	vw.kidList = make([]int32, vw.kidStart[n])
	fill := append([]int32(nil), vw.kidStart[:n]...)
	for _, v := range vw.order {
		if p := vw.par[v]; p >= 0 {
			vw.kidList[fill[p]] = v
			fill[p]++
		}
	}
	for i := range vw.reach {
		vw.reach[i] = -1
	}
	for i := len(vw.order) - 1; i >= 0; i-- {
		v := vw.order[i]
		if target[v] {
			vw.need[v] = true
			vw.reach[v] = math.Max(vw.reach[v], vw.depth[v])
		}
		if !vw.need[v] {
			continue
		}
		vw.weight[v] += vw.plen[v]
		if p := vw.par[v]; p >= 0 {
			vw.need[p] = true
			vw.weight[p] += vw.weight[v]
			vw.reach[p] = math.Max(vw.reach[p], vw.reach[v])
		}
	}
	for _, t := range vw.top {
		if vw.need[t] {
			vw.W += vw.weight[t]
		}
	}
	return vw
}

// kids returns the needed children of v.
func (vw *hubView) kids(v int) []int {
	var out []int
	for _, c := range vw.kidList[vw.kidStart[v]:vw.kidStart[v+1]] {
		if vw.need[c] {
			out = append(out, int(c))
		}
	}
	return out
}

// hubCycle is a closed walk from the point r through the needed part of a
// view: r → w.Nodes[0] (lead), the node walk w, then back to r (tail).
type hubCycle struct {
	r          engine.Point
	w          *engine.Walk
	lead, tail float64
}

func (cy *hubCycle) Len() float64 { return cy.lead + cy.w.Len() + cy.tail }

// tour returns the closed depth-first tour of the needed part of the view
// from its root; order(v, kids) returns the children of v in visiting order
// (kids of -1: the needed corridor ends, for a corridor root).
func (vw *hubView) tour(order func(v int, kids []int) []int) *hubCycle {
	s := vw.s
	cy := &hubCycle{r: vw.root, w: &engine.Walk{}}
	var tops []int
	if vw.rootNode >= 0 {
		tops = []int{vw.rootNode}
	} else {
		for _, t := range vw.top {
			if vw.need[t] {
				tops = append(tops, t)
			}
		}
		tops = order(-1, tops)
		if len(tops) == 0 {
			u, du, _, _ := s.Ends(vw.root)
			tops, cy.lead, cy.tail = []int{u}, du, du
			cy.w.Push(s, u)
			return cy
		}
		cy.lead, cy.tail = vw.plen[tops[0]], vw.plen[tops[len(tops)-1]]
	}
	type frame struct {
		kids []int
		i    int
	}
	for _, t := range tops {
		cy.w.Push(s, t)
		stack := []frame{{kids: order(t, vw.kids(t))}}
		path := []int{t}
		for len(stack) > 0 {
			f := &stack[len(stack)-1]
			if f.i == len(f.kids) {
				stack = stack[:len(stack)-1]
				path = path[:len(path)-1]
				if len(path) > 0 {
					cy.w.Push(s, path[len(path)-1])
				}
				continue
			}
			c := f.kids[f.i]
			f.i++
			cy.w.Push(s, c)
			path = append(path, c)
			stack = append(stack, frame{kids: order(c, vw.kids(c))})
		}
		// the frame loop pops t itself without pushing it again: the walk is back at t
	}
	return cy
}

// pointAt returns the point at arclength a along the cycle and the index of
// the last walk node at or before it (-1 inside the lead).
func (cy *hubCycle) pointAt(s *engine.Site, a float64) (engine.Point, int) {
	w := cy.w
	first, last := w.Nodes[0], w.Nodes[len(w.Nodes)-1]
	switch {
	case a <= 0:
		return cy.r, -1
	case a < cy.lead:
		return towards(s, first, cy.r, cy.lead-a), -1
	case a <= cy.lead+w.Len():
		return w.PointAt(s, a-cy.lead)
	case a < cy.Len():
		return towards(s, last, cy.r, a-cy.lead-w.Len()), len(w.Nodes) - 1
	}
	return cy.r, len(w.Nodes) - 1
}

// towards returns the point at distance x from node v towards the corridor
// point r (v an end of r's corridor, or r == v).
func towards(s *engine.Site, v int, r engine.Point, x float64) engine.Point {
	if r.IsNode() || x <= 0 {
		return engine.At(v)
	}
	other := r.To
	if other == v {
		other = r.From
	}
	return s.Canon(engine.Point{From: v, To: other, Offset: x})
}

// breakpoints returns the arclengths where the cycle meets a node or its ends.
func (cy *hubCycle) breakpoints() []float64 {
	bp := make([]float64, 0, len(cy.w.Nodes)+2)
	bp = append(bp, 0)
	for _, a := range cy.w.Arc {
		if x := cy.lead + a; x > bp[len(bp)-1] {
			bp = append(bp, x)
		}
	}
	if L := cy.Len(); L > bp[len(bp)-1] {
		bp = append(bp, L)
	}
	return bp
}

// reach returns the largest arclength a such that an agent walking the cycle
// forwards (backwards when back is set: a is then the length walked from the
// end) to a and then straight to hub needs at most B length, and whether
// even a = 0 fits. a + d(P(a), hub) never decreases, so a scan over the
// breakpoints and one linear solve inside a corridor suffice.
func (cy *hubCycle) reach(s *engine.Site, hub engine.Point, B float64, back bool) (float64, bool) {
	L := cy.Len()
	bp := cy.breakpoints()
	pos := func(a float64) engine.Point { // a = length walked
		if back {
			p, _ := cy.pointAt(s, L-a)
			return p
		}
		p, _ := cy.pointAt(s, a)
		return p
	}
	arcs := make([]float64, len(bp)) // lengths walked at the breakpoints, ascending
	for i := range bp {
		if back {
			arcs[i] = L - bp[len(bp)-1-i]
		} else {
			arcs[i] = bp[i]
		}
	}
	f := func(a float64) float64 { return a + s.PointDist(pos(a), hub) }
	Bt := B + 1e-12*math.Max(1, B) // rounding slack: a tour passing hub exactly on budget fits
	if f(0) > Bt {
		return 0, false
	}
	i := 0
	for ; i+1 < len(arcs); i++ {
		if f(arcs[i+1]) > Bt {
			break
		}
	}
	if i+1 >= len(arcs) {
		return L, true
	}
	// inside one corridor piece f is piecewise linear with slopes 0 and 2
	// and never decreases: bisect for the last point that fits
	lo, hi := arcs[i], arcs[i+1]
	for it := 0; it < 100 && hi-lo > 1e-14*math.Max(1, L); it++ {
		mid := (lo + hi) / 2
		if f(mid) <= Bt {
			lo = mid
		} else {
			hi = mid
		}
	}
	return lo, true
}

// meetAtHub returns the cut m (arclength) minimising the later arrival at hub
// when agent fa walks the cycle forwards to m and agent fb backwards to m,
// each then going straight to hub; and that arrival time.
func (cy *hubCycle) meetAtHub(s *engine.Site, hub engine.Point, vf, vb float64) (float64, float64) {
	L := cy.Len()
	bp := cy.breakpoints()
	arr := func(m float64) (float64, float64) {
		p, _ := cy.pointAt(s, m)
		d := s.PointDist(p, hub)
		return (m + d) / vf, (L - m + d) / vb
	}
	F := func(m float64) float64 { a, b := arr(m); return a - b } // never decreases
	lo, hi := 0.0, L
	if F(0) >= 0 {
		hi = 0
	} else if F(L) <= 0 {
		lo = L
	} else {
		// first breakpoint with F >= 0
		j := sort.Search(len(bp), func(k int) bool { return F(bp[k]) >= 0 })
		lo, hi = bp[j-1], bp[j]
		for it := 0; it < 100 && hi-lo > 1e-13*math.Max(1, L); it++ {
			mid := (lo + hi) / 2
			if F(mid) < 0 {
				lo = mid
			} else {
				hi = mid
			}
		}
	}
	best, bt := lo, math.Inf(1)
	for _, m := range []float64{lo, hi} {
		a, b := arr(m)
		if t := math.Max(a, b); t < bt {
			best, bt = m, t
		}
	}
	return best, bt
}

// cycleFwd walks the cycle forwards from its start r to arclength a.
func cycleFwd(b *engine.RouteBuilder, cy *hubCycle, a float64) {
	p, i := cy.pointAt(b.Site(), a)
	if i >= 0 {
		b.ToNodes(cy.w.Nodes[:i+1])
	}
	b.To(p)
}

// cycleBwd walks the cycle backwards from its end r down to arclength a.
func cycleBwd(b *engine.RouteBuilder, cy *hubCycle, a float64) {
	p, i := cy.pointAt(b.Site(), a)
	if a < cy.lead+cy.w.Len() {
		for k := len(cy.w.Nodes) - 1; k > i; k-- {
			b.ToNodes([]int{cy.w.Nodes[k]})
		}
		if i < 0 {
			b.ToNodes([]int{cy.w.Nodes[0]})
		}
	}
	b.To(p)
}
