package engine_test

// A brute-force reference evaluator, written independently of the engine:
// it builds its own adjacency and all-pairs distances from the Scenario (BFS
// from every node), expands every route into its own per-corridor linear
// pieces, and solves MODEL.md §3 and §4 literally. It never calls
// engine.Evaluate, Trajectory, PositionAt, PointDist, Dist or the engine's
// intercept; it uses the engine only for node indices (Scenario order) and
// to run the planners whose plans it checks.

import (
	"context"
	"fmt"
	"math"
	"math/rand/v2"
	"os"
	"strconv"
	"strings"
	"testing"
	"time"

	"duosweep/engine"
	"duosweep/engine/internal/testtrees"
	"duosweep/engine/planners"
)

type refArc struct{ to, e int }

type refTree struct {
	n, start   int
	eu, ev     []int
	ew         []float64
	adj        [][]refArc
	edgeOf     map[[2]int]int
	D          [][]float64 // all-pairs distances
	next       [][]int     // next[u][v]: the neighbour of u on the path to v
	cand       []bool
	prob       []float64
	hasProb    bool
	speed      [2]float64
	candidates []int
}

func newRefTree(sc engine.Scenario) *refTree {
	n := len(sc.Nodes)
	idx := map[string]int{}
	for i, nd := range sc.Nodes {
		idx[nd.ID] = i
	}
	rt := &refTree{n: n, start: idx[sc.Start], adj: make([][]refArc, n), edgeOf: map[[2]int]int{},
		cand: make([]bool, n), prob: make([]float64, n)}
	for i, c := range sc.Corridors {
		u, v := idx[c.From], idx[c.To]
		rt.eu = append(rt.eu, u)
		rt.ev = append(rt.ev, v)
		rt.ew = append(rt.ew, c.Length)
		rt.adj[u] = append(rt.adj[u], refArc{v, i})
		rt.adj[v] = append(rt.adj[v], refArc{u, i})
		rt.edgeOf[[2]int{u, v}] = i
		rt.edgeOf[[2]int{v, u}] = i
	}
	rt.D = make([][]float64, n)
	rt.next = make([][]int, n)
	for src := 0; src < n; src++ {
		// BFS over the tree from src; the first hop is inherited.
		d := make([]float64, n)
		nx := make([]int, n)
		seen := make([]bool, n)
		for i := range nx {
			nx[i] = -1
		}
		queue := []int{src}
		seen[src] = true
		nx[src] = src
		for len(queue) > 0 {
			u := queue[0]
			queue = queue[1:]
			for _, a := range rt.adj[u] {
				if seen[a.to] {
					continue
				}
				seen[a.to] = true
				d[a.to] = d[u] + rt.ew[a.e]
				if u == src {
					nx[a.to] = a.to
				} else {
					nx[a.to] = nx[u]
				}
				queue = append(queue, a.to)
			}
		}
		rt.D[src], rt.next[src] = d, nx
	}
	for i, nd := range sc.Nodes {
		rt.cand[i] = nd.Candidate
		if nd.Candidate {
			rt.candidates = append(rt.candidates, i)
		}
		if nd.HasProbability {
			rt.hasProb = true
			rt.prob[i] = nd.Probability
		}
	}
	agents := sc.Agents
	if len(agents) == 0 {
		agents = engine.DefaultAgents()
	}
	rt.speed = [2]float64{agents[0].Speed, agents[1].Speed}
	return rt
}

// refPos is a place: node v when e < 0, else offset off from eu[e] along corridor e.
type refPos struct {
	e   int
	v   int
	off float64
}

func (rt *refTree) node(v int) refPos { return refPos{e: -1, v: v} }

// pos converts an engine point (checking it the reference's own way).
func (rt *refTree) pos(p engine.Point) (refPos, error) {
	if p.From < 0 || p.From >= rt.n {
		return refPos{}, fmt.Errorf("ref: bad node %d", p.From)
	}
	if p.To < 0 {
		return rt.node(p.From), nil
	}
	e, ok := rt.edgeOf[[2]int{p.From, p.To}]
	if !ok {
		return refPos{}, fmt.Errorf("ref: no corridor %d-%d", p.From, p.To)
	}
	w := rt.ew[e]
	if !(p.Offset >= 0 && p.Offset <= w) {
		return refPos{}, fmt.Errorf("ref: offset %g outside [0,%g]", p.Offset, w)
	}
	off := p.Offset
	if p.From != rt.eu[e] {
		off = w - p.Offset
	}
	if off <= 0 {
		return rt.node(rt.eu[e]), nil
	}
	if off >= w {
		return rt.node(rt.ev[e]), nil
	}
	return refPos{e: e, off: off}, nil
}

// exits lists the corridor ends of a place with the distance to each.
func (rt *refTree) exits(p refPos) [][2]float64 {
	if p.e < 0 {
		return [][2]float64{{float64(p.v), 0}}
	}
	return [][2]float64{{float64(rt.eu[p.e]), p.off}, {float64(rt.ev[p.e]), rt.ew[p.e] - p.off}}
}

// distNode is the distance from a place to node x.
func (rt *refTree) distNode(p refPos, x int) float64 {
	if p.e < 0 {
		return rt.D[p.v][x]
	}
	return math.Min(p.off+rt.D[rt.eu[p.e]][x], rt.ew[p.e]-p.off+rt.D[rt.ev[p.e]][x])
}

// distPos is the distance between two places.
func (rt *refTree) distPos(p, q refPos) float64 {
	if p.e >= 0 && p.e == q.e {
		return math.Abs(p.off - q.off)
	}
	best := math.Inf(1)
	for _, a := range rt.exits(p) {
		for _, b := range rt.exits(q) {
			best = math.Min(best, a[1]+rt.D[int(a[0])][int(b[0])]+b[1])
		}
	}
	return best
}

// refPiece: over [t0,t1] the agent waits at node v (e < 0) or moves linearly
// along corridor e from offset o0 to o1 (offsets from eu[e]).
type refPiece struct {
	t0, t1 float64
	e, v   int
	o0, o1 float64
}

type refRV struct {
	t       float64
	at      refPos
	npieces int
}

type refTraj struct {
	pieces []refPiece
	visit  []float64 // first time on each node
	end    float64
	final  refPos
	rv     []refRV
	length float64
}

func (rt *refTree) expand(r engine.Route, a int) (*refTraj, error) {
	tr := &refTraj{visit: make([]float64, rt.n), final: rt.node(rt.start)}
	for i := range tr.visit {
		tr.visit[i] = math.Inf(1)
	}
	tr.visit[rt.start] = 0
	sp := rt.speed[a]
	cur := rt.node(rt.start)
	t := 0.0
	seeNode := func(v int, at float64) {
		if at < tr.visit[v] {
			tr.visit[v] = at
		}
	}
	move := func(e int, o0, o1 float64) {
		if o0 == o1 {
			return
		}
		dt := math.Abs(o1-o0) / sp
		tr.pieces = append(tr.pieces, refPiece{t0: t, t1: t + dt, e: e, o0: o0, o1: o1})
		tr.length += math.Abs(o1 - o0)
		t += dt
	}
	offAt := func(e, v int) float64 { // offset of node v on corridor e
		if v == rt.eu[e] {
			return 0
		}
		return rt.ew[e]
	}
	for i, wp := range r.Waypoints {
		q, err := rt.pos(wp.P)
		if err != nil {
			return nil, fmt.Errorf("waypoint %d: %w", i, err)
		}
		if math.IsNaN(wp.T) || math.IsInf(wp.T, 0) {
			return nil, fmt.Errorf("waypoint %d: time %g", i, wp.T)
		}
		d := rt.distPos(cur, q)
		arrive := t + d/sp
		if wp.T < arrive-1e-9*math.Max(1, arrive) {
			return nil, fmt.Errorf("waypoint %d: time %g before arrival %g", i, wp.T, arrive)
		}
		// expand the walk
		switch {
		case cur == q:
		case cur.e >= 0 && cur.e == q.e:
			move(cur.e, cur.off, q.off)
		default:
			var bx, by int
			var bd = math.Inf(1)
			for _, x := range rt.exits(cur) {
				for _, y := range rt.exits(q) {
					if dd := x[1] + rt.D[int(x[0])][int(y[0])] + y[1]; dd < bd {
						bd, bx, by = dd, int(x[0]), int(y[0])
					}
				}
			}
			if cur.e >= 0 {
				move(cur.e, cur.off, offAt(cur.e, bx))
			}
			seeNode(bx, t)
			for u := bx; u != by; {
				w := rt.next[u][by]
				e := rt.edgeOf[[2]int{u, w}]
				move(e, offAt(e, u), offAt(e, w))
				seeNode(w, t)
				u = w
			}
			if q.e >= 0 {
				move(q.e, offAt(q.e, by), q.off)
			}
		}
		t = arrive // the pieces above sum to d/sp up to rounding
		if q.e < 0 {
			seeNode(q.v, t)
		}
		if wp.T > t {
			tr.pieces = append(tr.pieces, refPiece{t0: t, t1: wp.T, e: q.e, v: q.v, o0: q.off, o1: q.off})
			t = wp.T
		}
		cur = q
		if wp.Rendezvous {
			tr.rv = append(tr.rv, refRV{t: t, at: q, npieces: len(tr.pieces)})
		}
	}
	tr.end, tr.final = t, cur
	return tr, nil
}

func (p *refPiece) at(tau float64) refPos {
	if p.e < 0 {
		return refPos{e: -1, v: p.v}
	}
	o := p.o0
	if p.t1 > p.t0 {
		f := (tau - p.t0) / (p.t1 - p.t0)
		f = math.Max(0, math.Min(1, f))
		o = p.o0 + (p.o1-p.o0)*f
	}
	return refPos{e: p.e, off: o}
}

// posAt is where the uninformed agent is at time tau (linear scan).
func (tr *refTraj) posAt(start refPos, tau float64) refPos {
	if len(tr.pieces) == 0 {
		return tr.final
	}
	if tau <= tr.pieces[0].t0 {
		return tr.pieces[0].at(tr.pieces[0].t0)
	}
	for i := range tr.pieces {
		if tau <= tr.pieces[i].t1 {
			return tr.pieces[i].at(tau)
		}
	}
	return tr.final
}

type refExit struct {
	node        int
	found, evac float64
	finder      engine.Finder
	tA, tB      float64
}

type refReport struct {
	exits     []refExit
	worst     float64
	worstExit int
	expected  float64
	complete  bool
	unvisited []int
	lengths   [2]float64
}

func (rt *refTree) evaluate(p *engine.Plan, m engine.Model) (*refReport, error) {
	var trs [2]*refTraj
	for a := 0; a < 2; a++ {
		tr, err := rt.expand(p.Routes[a], a)
		if err != nil {
			return nil, err
		}
		trs[a] = tr
	}
	rep := &refReport{worstExit: -1, complete: true, lengths: [2]float64{trs[0].length, trs[1].length}}
	for _, x := range rt.candidates {
		ex := refExit{node: x, tA: trs[0].visit[x], tB: trs[1].visit[x], evac: math.Inf(1), finder: engine.Nobody}
		t := math.Min(ex.tA, ex.tB)
		ex.found = t
		switch {
		case math.IsInf(t, 1):
			rep.complete = false
			rep.unvisited = append(rep.unvisited, x)
		case math.Abs(ex.tA-ex.tB) <= 1e-9*math.Max(1, t):
			ex.finder, ex.evac = engine.Both, t
		default:
			f := 0
			if ex.tB < ex.tA {
				f = 1
			}
			ex.finder = engine.Finder(f)
			if m == engine.Radio {
				q := trs[1-f].posAt(rt.node(rt.start), t)
				ex.evac = t + rt.distNode(q, x)/rt.speed[1-f]
			} else {
				ex.evac = rt.faceToFace(trs[1-f], x, t, rt.speed[f], rt.speed[1-f])
			}
		}
		if rep.worstExit < 0 || ex.evac > rep.worst {
			rep.worst, rep.worstExit = ex.evac, x
		}
		if rt.prob[x] > 0 {
			rep.expected += rt.prob[x] * ex.evac
		}
		rep.exits = append(rep.exits, ex)
	}
	return rep, nil
}

// faceToFace follows MODEL.md §4 literally: the partner keeps its route up
// to the first rendezvous scheduled at or after t, then stays there (after
// its last waypoint it stays put); minimise τ + d(π(τ),x)/min(sf,sp) over
// τ ≥ t with d(x,π(τ)) ≤ sf(τ−t). On each piece d(π(τ),x) is the minimum of
// two (one for a wait) linear functions of τ (through either corridor end),
// so the minimum of the piecewise-linear objective over the feasible set is
// attained at a piece end, a crossing of the two linear parts, or a point
// where a linear part meets the feasibility line sf(τ−t). Every piece is
// examined; nothing assumes monotonicity.
func (rt *refTree) faceToFace(tr *refTraj, x int, t, sf, sp float64) float64 {
	slow := math.Min(sf, sp)
	pieces := tr.pieces
	final, tailFrom := tr.final, tr.end
	for _, rv := range tr.rv {
		if rv.t >= t-1e-9*math.Max(1, t) {
			pieces, final, tailFrom = tr.pieces[:rv.npieces], rv.at, rv.t
			break
		}
	}
	best := math.Inf(1)
	try := func(tau float64, q refPos) {
		d := rt.distNode(q, x)
		if d <= sf*(tau-t)+1e-9*math.Max(1, tau) {
			best = math.Min(best, tau+d/slow)
		}
	}
	for i := range pieces {
		pc := &pieces[i]
		a, b := math.Max(pc.t0, t), pc.t1
		if b < a {
			continue
		}
		// linear parts α + β·τ of d(π(τ), x)
		type line struct{ al, be float64 }
		var lines []line
		if pc.e < 0 || pc.t1 == pc.t0 || pc.o0 == pc.o1 {
			d := rt.distNode(pc.at(a), x)
			lines = []line{{d, 0}}
		} else {
			v := (pc.o1 - pc.o0) / (pc.t1 - pc.t0) // offset speed
			o0 := pc.o0 - v*pc.t0                  // offset = o0 + v·τ
			w := rt.ew[pc.e]
			du, dv := rt.D[rt.eu[pc.e]][x], rt.D[rt.ev[pc.e]][x]
			lines = []line{{o0 + du, v}, {w - o0 + dv, -v}}
		}
		cands := []float64{a, b}
		for j := range lines {
			if sf != lines[j].be { // sf(τ−t) = α + βτ
				cands = append(cands, (lines[j].al+sf*t)/(sf-lines[j].be))
			}
			for k := j + 1; k < len(lines); k++ {
				if lines[j].be != lines[k].be {
					cands = append(cands, (lines[k].al-lines[j].al)/(lines[j].be-lines[k].be))
				}
			}
		}
		for _, tau := range cands {
			if tau >= a && tau <= b {
				try(tau, pc.at(tau))
			}
		}
	}
	// the stationary tail from tailFrom on
	d0 := rt.distNode(final, x)
	for _, tau := range []float64{math.Max(tailFrom, t), math.Max(math.Max(tailFrom, t), t+d0/sf)} {
		try(tau, final)
	}
	return best
}

// ---- comparison helpers ----

func close6(a, b float64) bool {
	if math.IsInf(a, 1) || math.IsInf(b, 1) {
		return a == b
	}
	return math.Abs(a-b) <= 1e-6*math.Max(1, math.Max(math.Abs(a), math.Abs(b)))
}

// compareReports checks every figure of an engine report against the reference.
func compareReports(t *testing.T, label string, rt *refTree, got *engine.Report, want *refReport) bool {
	t.Helper()
	ok := true
	fail := func(format string, args ...any) {
		t.Errorf("%s: "+format, append([]any{label}, args...)...)
		ok = false
	}
	if len(got.Exits) != len(want.exits) {
		fail("%d exits, reference %d", len(got.Exits), len(want.exits))
		return false
	}
	for i, w := range want.exits {
		g := got.Exits[i]
		if g.Node != w.node {
			fail("exit %d is node %d, reference %d", i, g.Node, w.node)
			continue
		}
		if !close6(g.FoundAt, w.found) {
			fail("node %d: FoundAt %v, reference %v", w.node, g.FoundAt, w.found)
		}
		if g.Finder != w.finder {
			// only a near-tie may be called differently
			if !(g.Finder == engine.Both || w.finder == engine.Both) || !close6(w.tA, w.tB) {
				fail("node %d: Finder %d, reference %d (tA=%v tB=%v)", w.node, g.Finder, w.finder, w.tA, w.tB)
			}
		}
		if !close6(g.EvacAt, w.evac) {
			fail("node %d: EvacAt %v, reference %v (found %v by %d)", w.node, g.EvacAt, w.evac, w.found, w.finder)
		}
	}
	if !close6(got.Worst, want.worst) {
		fail("Worst %v, reference %v", got.Worst, want.worst)
	}
	if got.WorstExit != want.worstExit {
		// a near-tie may pick another exit, but it must attain the worst case
		var ge float64 = math.NaN()
		for _, w := range want.exits {
			if w.node == got.WorstExit {
				ge = w.evac
			}
		}
		if !close6(ge, want.worst) {
			fail("WorstExit %d, reference %d", got.WorstExit, want.worstExit)
		}
	}
	if got.Complete != want.complete {
		fail("Complete %v, reference %v", got.Complete, want.complete)
	}
	if fmt.Sprint(got.Unvisited) != fmt.Sprint(want.unvisited) && !(len(got.Unvisited) == 0 && len(want.unvisited) == 0) {
		fail("Unvisited %v, reference %v", got.Unvisited, want.unvisited)
	}
	if got.HasExpected != rt.hasProb {
		fail("HasExpected %v, reference %v", got.HasExpected, rt.hasProb)
	}
	if rt.hasProb && !close6(got.Expected, want.expected) {
		fail("Expected %v, reference %v", got.Expected, want.expected)
	}
	for a := 0; a < 2; a++ {
		if !close6(got.RouteLengths[a], want.lengths[a]) {
			fail("RouteLengths[%d] %v, reference %v", a, got.RouteLengths[a], want.lengths[a])
		}
	}
	return ok
}

// reproducer prints a scenario and a plan compactly enough to paste into a test.
func reproducer(sc engine.Scenario, p *engine.Plan) string {
	var b strings.Builder
	fmt.Fprintf(&b, "start %s, speeds", sc.Start)
	for _, a := range sc.Agents {
		fmt.Fprintf(&b, " %v", a.Speed)
	}
	b.WriteString("\n  corridors:")
	for _, c := range sc.Corridors {
		fmt.Fprintf(&b, " %s-%s:%v", c.From, c.To, c.Length)
	}
	b.WriteString("\n  candidates:")
	for i, nd := range sc.Nodes {
		if nd.Candidate {
			fmt.Fprintf(&b, " %d=%s", i, nd.ID)
			if nd.HasProbability {
				fmt.Fprintf(&b, "(p=%v)", nd.Probability)
			}
		}
	}
	for a, r := range p.Routes {
		fmt.Fprintf(&b, "\n  route %d:", a)
		for _, w := range r.Waypoints {
			if w.P.To < 0 {
				fmt.Fprintf(&b, " [%s t=%v", sc.Nodes[w.P.From].ID, w.T)
			} else {
				fmt.Fprintf(&b, " [%s->%s+%v t=%v", sc.Nodes[w.P.From].ID, sc.Nodes[w.P.To].ID, w.P.Offset, w.T)
			}
			if w.Rendezvous {
				b.WriteString(" rv")
			}
			b.WriteString("]")
		}
	}
	return b.String()
}

// ---- random hand-made plans ----

// randomPlan draws a valid plan with node and corridor-interior waypoints,
// random waits and rendezvous marks; with probability 1/2 the remaining
// candidates are appended (split at random) so that the plan is complete.
func randomPlan(rng *rand.Rand, rt *refTree) *engine.Plan {
	p := &engine.Plan{Note: "random"}
	var cur [2]refPos
	var t [2]float64
	cur[0], cur[1] = rt.node(rt.start), rt.node(rt.start)
	add := func(a int, pt engine.Point) {
		q, err := rt.pos(pt)
		if err != nil {
			panic(err)
		}
		arrive := t[a] + rt.distPos(cur[a], q)/rt.speed[a]
		T := arrive
		switch rng.IntN(6) {
		case 0, 1:
			T += 3 * rng.Float64()
		case 2:
			T += float64(1 + rng.IntN(3))
		}
		wp := engine.Waypoint{P: pt, T: T, Rendezvous: rng.IntN(4) == 0}
		p.Routes[a].Waypoints = append(p.Routes[a].Waypoints, wp)
		cur[a], t[a] = q, T
	}
	randPoint := func() engine.Point {
		if len(rt.eu) == 0 || rng.IntN(5) < 2 {
			return engine.At(rng.IntN(rt.n))
		}
		e := rng.IntN(len(rt.eu))
		u, v := rt.eu[e], rt.ev[e]
		if rng.IntN(2) == 0 {
			u, v = v, u
		}
		off := rng.Float64() * rt.ew[e]
		switch rng.IntN(10) {
		case 0:
			off = 0
		case 1:
			off = rt.ew[e]
		}
		return engine.Point{From: u, To: v, Offset: off}
	}
	for a := 0; a < 2; a++ {
		k := rng.IntN(8)
		for i := 0; i < k; i++ {
			add(a, randPoint())
		}
	}
	if rng.IntN(2) == 0 {
		for _, x := range rng.Perm(len(rt.candidates)) {
			add(rng.IntN(2), engine.At(rt.candidates[x]))
			if rng.IntN(6) == 0 {
				add(rng.IntN(2), randPoint())
			}
		}
	}
	return p
}

// ---- the seeded trees shared by the reference and property tests ----

// treeCount is the number of seeded random trees (2,000; 300 with -short;
// DUOSWEEP_TREES=n for longer soak runs).
func treeCount() int {
	if v, err := strconv.Atoi(os.Getenv("DUOSWEEP_TREES")); err == nil && v > 0 {
		return v
	}
	if testing.Short() {
		return 300
	}
	return 2000
}

func treeScenario(i int) engine.Scenario {
	return testtrees.Random(testtrees.NewRand(uint64(1_000_003+i)), testtrees.Options{})
}

type plannedPlan struct {
	name  string
	model engine.Model // the model it was made for
	plan  *engine.Plan
}

// plannerPlans runs every registered planner on the site for every model it
// supports. Search planners run only on small trees (≤ 9 nodes, every 10th
// tree) with a small budget.
func plannerPlans(t *testing.T, i int, s *engine.Site) []plannedPlan {
	t.Helper()
	var out []plannedPlan
	for _, info := range planners.Planners() {
		opt := planners.Options{Seed: int64(i)}
		if info.Search {
			if s.N > 9 || i%10 != 0 {
				continue
			}
			opt.Budget, opt.Iterations = 20*time.Millisecond, 150
		}
		for _, m := range info.Models {
			p, err := planners.MakePlan(context.Background(), s, info.Name, m, opt)
			if err != nil {
				t.Errorf("tree %d: planner %s (%s): %v", i, info.Name, m, err)
				continue
			}
			out = append(out, plannedPlan{info.Name, m, p})
		}
	}
	return out
}

func TestReferenceMatchesEngine(t *testing.T) {
	n := treeCount()
	rng := testtrees.NewRand(42)
	plans, checks := 0, 0
	failures := 0
	for i := 0; i < n && failures < 10; i++ {
		sc := treeScenario(i)
		s, err := engine.NewSite(sc)
		if err != nil {
			t.Fatalf("tree %d: NewSite: %v", i, err)
		}
		rt := newRefTree(sc)
		var all []plannedPlan
		for k := 0; k < 3; k++ {
			all = append(all, plannedPlan{"random", engine.Radio, randomPlan(rng, rt)})
		}
		all = append(all, plannerPlans(t, i, s)...)
		for _, pp := range all {
			plans++
			for _, m := range engine.Models {
				got, err := engine.Evaluate(s, pp.plan, m)
				want, rerr := rt.evaluate(pp.plan, m)
				if (err != nil) != (rerr != nil) {
					t.Errorf("tree %d, %s plan under %s: engine error %v, reference error %v", i, pp.name, m, err, rerr)
					failures++
					continue
				}
				if err != nil {
					continue
				}
				checks++
				if !compareReports(t, fmt.Sprintf("tree %d (%d nodes), %s plan (for %s) under %s", i, s.N, pp.name, pp.model, m), rt, got, want) {
					failures++
					t.Logf("reproducer: %s", reproducer(sc, pp.plan))
				}
			}
		}
	}
	t.Logf("%d trees, %d plans, %d reports compared with the reference", n, plans, checks)
}

// TestReferenceHandChecked makes sure the reference itself computes the
// hand-derived figures of the 1,1,3 star (see examples in evaluate_test.go),
// so that agreement with the engine is not agreement between two wrong programs.
func TestReferenceHandChecked(t *testing.T) {
	sc := testtrees.Star113()
	rt := newRefTree(sc)
	p := star113Plan(t)
	r, err := rt.evaluate(p, engine.Radio)
	if err != nil {
		t.Fatal(err)
	}
	if r.worst != 7 || r.worstExit != 2 {
		t.Errorf("reference radio worst %v at %d, want 7 at node 2 (b)", r.worst, r.worstExit)
	}
	f, err := rt.evaluate(p, engine.FaceToFace)
	if err != nil {
		t.Fatal(err)
	}
	for _, ex := range f.exits {
		if math.Abs(ex.evac-7) > 1e-12 {
			t.Errorf("reference face-to-face evac(%d) = %v, want 7", ex.node, ex.evac)
		}
	}
}
