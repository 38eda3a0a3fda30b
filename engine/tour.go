package engine

import (
	"fmt"
	"math"
	"sort"
)

// ChildOrder names a rule for the order in which a depth-first tour visits
// the children of a node. Planners try several and keep the best plan.
type ChildOrder int

const (
	// OrderIndex visits children in corridor order.
	OrderIndex ChildOrder = iota
	// OrderDeepLast visits the child whose subtree reaches farthest last.
	OrderDeepLast
	// OrderDeepFirst visits the child whose subtree reaches farthest first.
	OrderDeepFirst
	// OrderLightFirst visits the child with the least corridor length below it first.
	OrderLightFirst
)

func (o ChildOrder) String() string {
	switch o {
	case OrderIndex:
		return "corridor order"
	case OrderDeepLast:
		return "farthest branch last"
	case OrderDeepFirst:
		return "farthest branch first"
	case OrderLightFirst:
		return "lightest branch first"
	}
	return fmt.Sprintf("ChildOrder(%d)", int(o))
}

// AllOrders lists every child order.
var AllOrders = []ChildOrder{OrderIndex, OrderDeepLast, OrderDeepFirst, OrderLightFirst}

// subtreeStats holds, per node, the search-tree corridor length below it
// (including its parent corridor) and the farthest candidate depth below it.
type subtreeStats struct {
	weight []float64 // corridor length of the search tree inside v's subtree plus v's parent corridor
	reach  []float64 // largest Depth of a search-tree node in v's subtree
}

func (s *Site) stats() *subtreeStats {
	s.statsOnce.Do(func() {
		st := &subtreeStats{weight: make([]float64, s.N), reach: make([]float64, s.N)}
		for i := s.N - 1; i >= 0; i-- {
			v := s.Order[i]
			if !s.InSearch[v] {
				continue
			}
			st.reach[v] = math.Max(st.reach[v], s.Depth[v])
			if p := s.Parent[v]; p >= 0 {
				st.weight[v] += s.EW[s.ParentEdge[v]]
				st.weight[p] += st.weight[v]
				st.reach[p] = math.Max(st.reach[p], st.reach[v])
			}
		}
		s.st = st
	})
	return s.st
}

// SearchChildren returns the children of v inside the search tree, ordered
// by o. The lists are computed once per order for the whole site (O(n log n))
// and shared: do not modify the result.
func (s *Site) SearchChildren(v int, o ChildOrder) []int {
	k := s.kidLists(o)
	return k.list[k.start[v]:k.start[v+1]]
}

// kids is a CSR list of search-tree children in one child order.
type kids struct {
	start []int32
	list  []int
}

func (s *Site) kidLists(o ChildOrder) *kids {
	if o < 0 || int(o) >= len(s.kidsOnce) {
		o = OrderIndex
	}
	s.kidsOnce[o].Do(func() {
		st := s.stats()
		k := &kids{start: make([]int32, s.N+1), list: make([]int, 0, s.N)}
		key := func(c int) float64 {
			switch o {
			case OrderDeepLast:
				return st.reach[c]
			case OrderDeepFirst:
				return -st.reach[c]
			case OrderLightFirst:
				return st.weight[c]
			}
			return 0
		}
		for v := 0; v < s.N; v++ {
			k.start[v] = int32(len(k.list))
			from := len(k.list)
			for _, c := range s.Children(v) {
				if s.InSearch[c] {
					k.list = append(k.list, int(c))
				}
			}
			if o != OrderIndex && len(k.list)-from > 1 {
				part := k.list[from:]
				sort.SliceStable(part, func(i, j int) bool { return key(part[i]) < key(part[j]) })
			}
		}
		k.start[s.N] = int32(len(k.list))
		s.kidCache[o] = k
	})
	return s.kidCache[o]
}

// Walk is a walk through the tree given as consecutive adjacent nodes, with
// the arclength at each node.
type Walk struct {
	Nodes []int
	Arc   []float64
}

// Len is the total length of the walk.
func (w *Walk) Len() float64 {
	if len(w.Arc) == 0 {
		return 0
	}
	return w.Arc[len(w.Arc)-1]
}

// Push appends node v, which must be adjacent to the walk's last node.
func (w *Walk) Push(s *Site, v int) {
	if len(w.Nodes) == 0 {
		w.Nodes, w.Arc = append(w.Nodes, v), append(w.Arc, 0)
		return
	}
	u := w.Nodes[len(w.Nodes)-1]
	w.Nodes = append(w.Nodes, v)
	w.Arc = append(w.Arc, w.Arc[len(w.Arc)-1]+s.EW[s.Edge(u, v)])
}

// AppendTour appends the closed depth-first tour of the search subtree below
// v (v itself is assumed to be the walk's current end) in child order o,
// skipping children of v for which skip returns true.
func (s *Site) AppendTour(w *Walk, v int, o ChildOrder, skip func(int) bool) {
	s.AppendTourWith(w, v, func(u int) []int { return s.SearchChildren(u, o) }, skip)
}

// AppendTourWith is AppendTour with the children of each node, in tour
// order, given by children. Iterative: safe for deep trees.
func (s *Site) AppendTourWith(w *Walk, v int, children func(int) []int, skip func(int) bool) {
	type frame struct {
		v    int
		kids []int
		i    int
	}
	stack := []frame{{v: v, kids: children(v)}}
	for len(stack) > 0 {
		f := &stack[len(stack)-1]
		if f.i == len(f.kids) {
			stack = stack[:len(stack)-1]
			if len(stack) > 0 {
				w.Push(s, stack[len(stack)-1].v)
			}
			continue
		}
		c := f.kids[f.i]
		f.i++
		if len(stack) == 1 && skip != nil && skip(c) {
			continue
		}
		w.Push(s, c)
		stack = append(stack, frame{v: c, kids: children(c)})
	}
}

// Tour returns the closed depth-first tour of the search tree from the start
// in child order o. Its length is 2W. O(n log n).
func (s *Site) Tour(o ChildOrder) *Walk {
	w := &Walk{}
	w.Push(s, s.Start)
	s.AppendTour(w, s.Start, o, nil)
	return w
}

// PointAt returns the point at arclength a along the walk, and the index i of
// the last walk node at or before it.
func (w *Walk) PointAt(s *Site, a float64) (Point, int) {
	if a <= 0 || len(w.Nodes) == 1 {
		return At(w.Nodes[0]), 0
	}
	i := sort.SearchFloat64s(w.Arc, a) // first Arc >= a
	if i >= len(w.Arc) {
		return At(w.Nodes[len(w.Nodes)-1]), len(w.Nodes) - 1
	}
	if w.Arc[i] == a {
		return At(w.Nodes[i]), i
	}
	u, v := w.Nodes[i-1], w.Nodes[i]
	return s.Canon(Point{From: u, To: v, Offset: a - w.Arc[i-1]}), i - 1
}

// RouteBuilder builds a route of one agent with tight waypoint times: each
// waypoint is timed at the agent's arrival at full speed. The planners share it.
type RouteBuilder struct {
	s     *Site
	speed float64
	cur   Point
	t     float64
	wps   []Waypoint
}

// NewRoute starts a route of agent at the site's start at time 0.
func NewRoute(s *Site, agent int) *RouteBuilder {
	return &RouteBuilder{s: s, speed: s.Speed[agent], cur: At(s.Start)}
}

// To walks to p at full speed.
func (b *RouteBuilder) To(p Point) {
	p = b.s.Canon(p)
	if p == b.cur && len(b.wps) > 0 {
		return
	}
	b.t += b.s.PointDist(b.cur, p) / b.speed
	b.cur = p
	b.wps = append(b.wps, Waypoint{P: p, T: b.t})
}

// ToNodes walks along nodes (each adjacent to the previous or reachable by a tree path).
func (b *RouteBuilder) ToNodes(nodes []int) {
	for _, v := range nodes {
		if b.cur.IsNode() && b.cur.From == v {
			continue
		}
		b.To(At(v))
	}
}

// WaitUntil waits at the current place until t.
func (b *RouteBuilder) WaitUntil(t float64) {
	if t > b.t {
		b.t = t
		b.wps = append(b.wps, Waypoint{P: b.cur, T: t})
	}
}

// Rendezvous marks the last waypoint (adding one at the current place if needed).
func (b *RouteBuilder) Rendezvous() {
	if len(b.wps) == 0 {
		b.wps = append(b.wps, Waypoint{P: b.cur, T: b.t})
	}
	b.wps[len(b.wps)-1].Rendezvous = true
}

// Route returns the route built so far (it shares the builder's waypoints).
func (b *RouteBuilder) Route() Route { return Route{Waypoints: b.wps} }

// WalkPrefix walks the walk from its start up to arclength a (a point, maybe inside a corridor).
func (b *RouteBuilder) WalkPrefix(s *Site, w *Walk, a float64) {
	p, i := w.PointAt(s, a)
	b.ToNodes(w.Nodes[:i+1])
	b.To(p)
}

// WalkSuffixReversed walks the walk backwards from its end down to arclength a.
func (b *RouteBuilder) WalkSuffixReversed(s *Site, w *Walk, a float64) {
	p, i := w.PointAt(s, a)
	for k := len(w.Nodes) - 1; k > i; k-- {
		b.ToNodes([]int{w.Nodes[k]})
	}
	b.To(p)
}

// Clone returns an independent copy of the builder.
func (b *RouteBuilder) Clone() *RouteBuilder {
	c := *b
	c.wps = append([]Waypoint(nil), b.wps...)
	return &c
}

// Site returns the site the builder walks on.
func (b *RouteBuilder) Site() *Site { return b.s }

// Time returns the time at which the builder's agent stands at the end of
// the route built so far.
func (b *RouteBuilder) Time() float64 { return b.t }
