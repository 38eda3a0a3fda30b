package published

import (
	"context"
	"fmt"
	"math"
	"sort"

	"duosweep/engine"
)

// The hub-rendezvous planner (face-to-face model). See docs/hub-rendezvous.md
// for the design, what is proven and what is only measured.
//
// c is the weighted centroid of the search tree (Site.Centroid): every point
// is within W/2 of it. Phase 1: one closed depth-first tour from the start is
// ordered so that it passes c as close as possible to the moment both agents
// have used their share of the time T1 = 2W/(v0+v1) (= W with equal speeds);
// one agent walks it forwards, the other backwards, each as far as it can
// while still being back at c by T1, where they meet (a rendezvous). Any
// exit found in phase 1 is then reached by both by T1 + W/(2·slower speed).
// Phase 2: whatever is still unexplored is searched from c, in one of three
// ways (together, opposite tours, or split and meet at c again). A handful of
// variants are built and evaluated exactly; the best is kept, and the plain
// face-to-face opposite-tours plan is always one of them.

// hubItems describes how the start's tour is arranged around the centroid:
// the path from the start to c, and the parts hanging off it.
type hubItems struct {
	c      engine.Point
	d      float64 // d(start, c)
	onPath []bool  // nodes of the start–c path (c itself when it is a node)
	next   []int   // on the path: the child towards c (-1 at c or at the corridor's upper end past c)
	roots  []int   // item roots: needed children of path nodes other than the path child, and the far end of c's corridor
	w      []float64
}

func hubArrange(vw *hubView, c engine.Point) *hubItems {
	s := vw.s
	it := &hubItems{c: c, onPath: make([]bool, s.N), next: make([]int, s.N)}
	for i := range it.next {
		it.next[i] = -1
	}
	low := -1 // deepest path node
	far := -1 // far end of c's corridor
	if c.IsNode() {
		low = c.From
	} else {
		u, _, v, _ := s.Ends(c)
		low, far = u, v
		if vw.depth[v] < vw.depth[u] {
			low, far = v, u
		}
	}
	for v := low; v >= 0; v = int(vw.par[v]) {
		it.onPath[v] = true
		if p := vw.par[v]; p >= 0 {
			it.next[p] = v
		}
	}
	if far >= 0 {
		it.next[low] = far
	}
	it.d = vw.depth[low]
	if far >= 0 {
		it.d += s.PointDist(engine.At(low), c)
	}
	for v := low; v >= 0; v = int(vw.par[v]) {
		for _, k := range vw.kids(v) {
			switch {
			case k == far:
				it.roots = append(it.roots, k)
				it.w = append(it.w, vw.weight[k]-s.PointDist(engine.At(low), c))
			case k != it.next[v]:
				it.roots = append(it.roots, k)
				it.w = append(it.w, vw.weight[k])
			}
		}
	}
	return it
}

// hubExactItems is the largest item count split by exhaustive search.
const hubExactItems = 16

// split chooses the items walked before the tour's passage at c, so that
// their weight is as close to target as possible: exhaustive for at most
// hubExactItems items, else first-fit decreasing.
func (it *hubItems) split(target float64) []bool {
	k := len(it.roots)
	in := make([]bool, k)
	idx := make([]int, k)
	for i := range idx {
		idx[i] = i
	}
	sort.SliceStable(idx, func(a, b int) bool { return it.w[idx[a]] > it.w[idx[b]] })
	if k <= hubExactItems {
		best, bestErr := 0, math.Abs(target)
		for mask := 1; mask < 1<<k; mask++ {
			sum := 0.0
			for j := 0; j < k; j++ {
				if mask&(1<<j) != 0 {
					sum += it.w[idx[j]]
				}
			}
			if e := math.Abs(sum - target); e < bestErr-1e-12*math.Max(1, target) {
				best, bestErr = mask, e
			}
		}
		for j := 0; j < k; j++ {
			in[idx[j]] = best&(1<<j) != 0
		}
		return in
	}
	sum := 0.0
	for _, j := range idx {
		if sum+it.w[j] <= target*(1+1e-12) {
			in[j] = true
			sum += it.w[j]
		}
	}
	return in
}

// hubLargeSite is the node count above which only one order of the leftover
// parts, no cover-then-meet plan and one moved hub are tried (3 exact
// evaluations instead of 11); the same threshold as the other published
// planners.
const hubLargeSite = LargeSite

// hubVariant is one candidate plan with a short tag naming how it was made.
type hubVariant struct {
	tag  string
	plan *engine.Plan
}

// hubVariants builds every variant the planner compares.
func hubVariants(s *engine.Site) []hubVariant {
	var out []hubVariant
	if len(s.Candidates()) == 0 {
		return []hubVariant{{"empty", &engine.Plan{Note: "no candidate junctions: nothing to search"}}}
	}
	out = append(out, hubOpposite(s))
	b := engine.ComputeBounds(s)
	c := s.Centroid()
	vw := newHubView(s, engine.At(s.Start), s.Candidate)
	items := hubArrange(vw, c)
	T1 := 2 * b.W / (s.Speed[0] + s.Speed[1])
	roles := []int{0}
	straddle := []bool{false, true}
	if s.Speed[0] != s.Speed[1] {
		roles = []int{0, 1}
		straddle = []bool{false}
	} else if s.N > hubLargeSite {
		straddle = []bool{false}
	}
	for _, fa := range roles {
		fb := 1 - fa
		target := (s.Speed[fa]*T1 - items.d) / 2
		in := items.split(target)
		inX := make([]bool, s.N)
		wOf := make([]float64, s.N)
		for j, r := range items.roots {
			inX[r] = in[j]
			wOf[r] = items.w[j]
		}
		for _, smallFirst := range straddle {
			order := func(v int, kids []int) []int {
				if v < 0 || !items.onPath[v] {
					// off the path: the branch reaching farthest last
					sort.SliceStable(kids, func(i, j int) bool { return vw.reach[kids[i]] < vw.reach[kids[j]] })
					return kids
				}
				class := func(k int) int {
					switch {
					case k == items.next[v]:
						return 1 // towards c (in a corridor centroid: also the far part)
					case inX[k]:
						return 0
					}
					return 2
				}
				sort.SliceStable(kids, func(i, j int) bool {
					ci, cj := class(kids[i]), class(kids[j])
					if ci != cj {
						return ci < cj
					}
					if smallFirst {
						return wOf[kids[i]] < wOf[kids[j]]
					}
					return wOf[kids[i]] > wOf[kids[j]]
				})
				return kids
			}
			cy := vw.tour(order)
			name := fmt.Sprintf("%s forwards, %s backwards", s.Names[fa], s.Names[fb])
			if !smallFirst {
				name += ", largest leftover part first"
			} else {
				name += ", smallest leftover part first"
			}
			out = append(out, hubPhases(s, cy, c, fa, T1, name, s.N > hubLargeSite)...)
		}
	}
	return out
}

// hubOpposite is the plain face-to-face opposite-tours plan (farthest branch
// last, rendezvous where they meet): the safe fallback, worst ≤ 2W.
func hubOpposite(s *engine.Site) hubVariant {
	w := s.Tour(engine.OrderDeepLast)
	split := w.Len() * s.Speed[0] / (s.Speed[0] + s.Speed[1])
	f, b := engine.NewRoute(s, 0), engine.NewRoute(s, 1)
	f.WalkPrefix(s, w, split)
	b.WalkSuffixReversed(s, w, split)
	f.Rendezvous()
	b.Rendezvous()
	p := &engine.Plan{Note: fmt.Sprintf("fallback: %s walks a depth-first tour forwards, %s backwards, rendezvous where they meet", s.Names[0], s.Names[1])}
	p.Routes[0], p.Routes[1] = f.Route(), b.Route()
	return hubVariant{"opposite", p}
}

// hubPhase1 is the budget phase towards a hub point: each agent walks its
// end of the tour as far as it can while being back at hub by T1, and they
// meet there. left marks the candidates still unexplored (none: ok false).
type hubPhase1 struct {
	ra, rb *engine.RouteBuilder
	t      float64 // rendezvous time at hub
	left   []bool
	some   bool
}

func hubBudget(s *engine.Site, cy *hubCycle, hub engine.Point, fa int, T1 float64) (*hubPhase1, bool) {
	fb := 1 - fa
	L := cy.Len()
	a, _ := cy.reach(s, hub, s.Speed[fa]*T1, false)
	l, _ := cy.reach(s, hub, s.Speed[fb]*T1, true)
	if a >= L-l {
		return nil, false // the budget covers the whole tour: cover-then-meet does it
	}
	ph := &hubPhase1{ra: engine.NewRoute(s, fa), rb: engine.NewRoute(s, fb), left: make([]bool, s.N)}
	cycleFwd(ph.ra, cy, a)
	cycleBwd(ph.rb, cy, L-l)
	ph.ra.To(hub)
	ph.rb.To(hub)
	ph.t = math.Max(ph.ra.Time(), ph.rb.Time())
	ph.ra.WaitUntil(ph.t)
	ph.rb.WaitUntil(ph.t)
	ph.ra.Rendezvous()
	ph.rb.Rendezvous()
	ta, err1 := s.Trajectory(ph.ra.Route(), fa)
	tb, err2 := s.Trajectory(ph.rb.Route(), fb)
	if err1 != nil || err2 != nil {
		return nil, false
	}
	fva, fvb := ta.FirstVisits(), tb.FirstVisits()
	for v := 0; v < s.N; v++ {
		if s.Candidate[v] && math.IsInf(fva[v], 1) && math.IsInf(fvb[v], 1) {
			ph.left[v], ph.some = true, true
		}
	}
	return ph, true
}

// together lets both agents walk, from the hub, the depth-first tour of what
// is left (farthest branch last) up to its last new candidate.
func (ph *hubPhase1) together(s *engine.Site, sub *hubView, cy2 *hubCycle, fa int, note string) *engine.Plan {
	end := 0
	seen := make([]bool, s.N)
	for i, v := range cy2.w.Nodes {
		if ph.left[v] && !seen[v] {
			seen[v] = true
			end = i
		}
	}
	qa, qb := ph.ra.Clone(), ph.rb.Clone()
	// by node index, not arclength: the last candidate is reached exactly
	qa.ToNodes(cy2.w.Nodes[:end+1])
	qb.ToNodes(cy2.w.Nodes[:end+1])
	p := &engine.Plan{Note: note + "both search the rest together"}
	p.Routes[fa], p.Routes[1-fa] = qa.Route(), qb.Route()
	return p
}

func deepLastIn(sub *hubView) func(v int, kids []int) []int {
	return func(v int, kids []int) []int {
		sort.SliceStable(kids, func(i, j int) bool { return sub.reach[kids[i]] < sub.reach[kids[j]] })
		return kids
	}
}

// entry returns the path from the view's root down to the first node where
// the needed part branches or holds a target (nil when that is the root).
func (vw *hubView) entry() []int {
	var path []int
	var tops []int
	for _, t := range vw.top {
		if vw.need[t] {
			tops = append(tops, t)
		}
	}
	if vw.rootNode >= 0 {
		tops = vw.kids(vw.rootNode)
		if vw.need[vw.rootNode] && vw.weight[vw.rootNode] == 0 {
			return nil
		}
	}
	for len(tops) == 1 {
		v := tops[0]
		path = append(path, v)
		if vw.need[v] && vw.weight[v]-vw.plen[v] == 0 {
			break // a target leaf
		}
		tops = vw.kids(v)
	}
	return path
}

// along returns the point at distance x from the view's root along path
// (a downward node path of the view starting next to the root).
func (vw *hubView) along(path []int, x float64) engine.Point {
	s := vw.s
	for _, v := range path {
		if vw.depth[v] < x {
			continue
		}
		if p := vw.par[v]; p >= 0 {
			return s.Canon(engine.Point{From: v, To: int(p), Offset: vw.depth[v] - x})
		}
		if vw.rootNode >= 0 {
			return s.Canon(engine.Point{From: v, To: vw.rootNode, Offset: vw.depth[v] - x})
		}
		other := vw.root.To
		if other == v {
			other = vw.root.From
		}
		return s.Canon(engine.Point{From: v, To: other, Offset: vw.depth[v] - x})
	}
	if len(path) > 0 {
		return engine.At(path[len(path)-1])
	}
	return vw.root
}

// hubPhases builds, from one arranged tour, the cover-then-meet plan and the
// budget plans with each phase-2 rule, at the centroid and at hubs moved
// from it towards what the centroid plan leaves unexplored.
func hubPhases(s *engine.Site, cy *hubCycle, c engine.Point, fa int, T1 float64, name string, large bool) []hubVariant {
	fb := 1 - fa
	var out []hubVariant
	// cover-then-meet: cut the tour so both reach c at the same time after
	// exploring their halves, rendezvous at c (left out on large sites, where
	// it wins least often)
	if !large {
		m, _ := cy.meetAtHub(s, c, s.Speed[fa], s.Speed[fb])
		ra, rb := engine.NewRoute(s, fa), engine.NewRoute(s, fb)
		cycleFwd(ra, cy, m)
		cycleBwd(rb, cy, m)
		ra.To(c)
		rb.To(c)
		t := math.Max(ra.Time(), rb.Time())
		ra.WaitUntil(t)
		rb.WaitUntil(t)
		ra.Rendezvous()
		rb.Rendezvous()
		p := &engine.Plan{Note: fmt.Sprintf("hub: %s split the tour where both reach the centroid together at t=%.6g and meet there", name, t)}
		p.Routes[fa], p.Routes[fb] = ra.Route(), rb.Route()
		out = append(out, hubVariant{"cover-meet", p})
	}
	ph, ok := hubBudget(s, cy, c, fa, T1)
	if !ok || !ph.some {
		return out
	}
	sub := newHubView(s, c, ph.left)
	cy2 := sub.tour(deepLastIn(sub))
	note := fmt.Sprintf("hub: %s, each back at the centroid by t=%.6g (rendezvous); then ", name, ph.t)
	out = append(out, hubVariant{"budget+together", ph.together(s, sub, cy2, fa, note)})
	// hubs moved from c towards the unexplored part: phase-1 exits get up to
	// δ farther, the rest δ nearer
	path := sub.entry()
	if len(path) == 0 {
		return out
	}
	reachE := sub.depth[path[len(path)-1]]
	fracs := []float64{0.25, 0.5, 0.75}
	if large {
		fracs = fracs[:1] // the one that wins most often on the test families
	}
	for _, f := range fracs {
		h := sub.along(path, f*reachE)
		ph2, ok := hubBudget(s, cy, h, fa, T1)
		if !ok {
			continue
		}
		note := fmt.Sprintf("hub: %s, each back by t=%.6g at a point %.0f%% of the way from the centroid to what it would leave unexplored (rendezvous); then ", name, ph2.t, 100*f)
		if !ph2.some {
			p := &engine.Plan{Note: note + "nothing is left"}
			p.Routes[fa], p.Routes[fb] = ph2.ra.Route(), ph2.rb.Route()
			out = append(out, hubVariant{"shifted", p})
			continue
		}
		sub2 := newHubView(s, h, ph2.left)
		out = append(out, hubVariant{"shifted+together", ph2.together(s, sub2, sub2.tour(deepLastIn(sub2)), fa, note)})
	}
	return out
}

// planHub builds the variants and keeps the best under the face-to-face model.
func planHub(ctx context.Context, s *engine.Site, m engine.Model) (*engine.Plan, error) {
	vs := hubVariants(s)
	plans := make([]*engine.Plan, len(vs))
	for i, v := range vs {
		plans[i] = v.plan
	}
	return pickBest(ctx, s, m, plans)
}
