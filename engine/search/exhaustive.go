package search

// The exhaustive planner: branch and bound over the target-sequence class.
//
// # The plan class
//
// TargetSequenceClass (radio) and TargetSequenceRVClass (face to face) are
// the plans built as follows. Each agent's route is a sequence of legs; a leg
// is walked along the tree path at full speed and ends at a node of the search
// tree; there is no waiting except at a rendezvous. When an agent finishes a
// leg at time T (both agents start at the start at time 0; at equal times
// agent 0 goes first) it takes its next leg, which goes to
//
//   - a target: a candidate that neither agent has stood on by time T and
//     with no other such candidate on the tree path to it (passing through a
//     node visits it, so a leg never passes an unvisited candidate);
//   - a parking node, after which the agent stops for good: an anchor (the
//     start, a candidate, or a node with three or more corridors in the
//     search tree, or the node it stands on) reached without passing a
//     candidate still unvisited at T;
//   - face to face only, a rendezvous node R (an anchor, reached under the same
//     rule): the agent waits at R; its partner carries on with target legs
//     and then walks to R (it may pass unvisited candidates on the way); both
//     waypoints at R are marked rendezvous at the meeting time, the later
//     arrival, and both set off again from R.
//
// An agent stops when every candidate has been visited by time T; the last
// agent still moving may not stop or park while a candidate is unvisited, and
// an agent may not stop while its partner waits for it. Agents walk through
// visited nodes freely, but a leg never targets a visited candidate: hedging
// (being near where the partner will find the exit) is only by the final
// parking leg, regrouping only by rendezvous.
//
// # The search
//
// Depth-first branch and bound over the agents' decisions in time order (the
// agent whose leg ends first decides). The incumbent is seeded with BestPlan
// and with a short improve run from it (ExhaustiveImproveIterations, seeded
// with Options.Seed), so the result is never worse than a published planner
// or than that improve run; when the seed wins, the note says so. A branch is
// pruned when a lower bound on every completion reaches the incumbent: the
// largest settled evacuation time (a candidate whose evac(x) the rest of the
// plan cannot change, computed with the evaluator's own exitFull on the
// partial trajectories), for the other found candidates a bound that holds
// however the routes go on, for each unvisited candidate y the time both
// agents need to reach it from where they are, and the closed-walk bound
// T + (2·W(S) − d)/(2·vmax) over the Steiner tree S of the unvisited
// candidates and the deciding agent (MODEL.md §5's LB1 argument from the
// current positions). Equivalent states (same visited candidates, same
// positions, same leg of the partner relative to the decision time, nothing
// pending) are memoised with their (time, settled worst) pairs; a state
// dominated by one already explored is cut. Parking nodes outside the Steiner
// tree of the unvisited and pending candidates and the agent are skipped: the
// point where the path leaves that tree is an anchor that is at least as close
// to every place that matters at every moment, so the class optimum is
// unchanged. Targets are tried nearest first.
//
// Every plan the search returns is scored by Evaluate.

import (
	"context"
	"fmt"
	"math"
	"sort"
	"time"

	"duosweep/engine"
	"duosweep/engine/published"
)

// Limits of the exhaustive planner: it refuses larger sites up front.
const (
	ExhaustiveMaxCandidates = 24
	ExhaustiveMaxNodes      = 48 // nodes of the search tree
)

// ExhaustiveImproveIterations is the length of the improve run (seeded with
// Options.Seed) whose plan joins the published plans as the exhaustive
// search's first incumbent.
const ExhaustiveImproveIterations = 3000

// DefaultExhaustiveBudget is the exhaustive planner's time limit when Options.Budget is 0.
const DefaultExhaustiveBudget = 10 * time.Second

// Names of the plan classes searched by the exhaustive planner (see the
// package comment of exhaustive.go and docs/search.md).
const (
	TargetSequenceClass   = "target sequences"
	TargetSequenceRVClass = "target sequences with node rendezvous"
)

// ClassName returns the name of the exhaustive planner's plan class under m.
func ClassName(m engine.Model) string {
	if m.Rendezvous() {
		return TargetSequenceRVClass
	}
	return TargetSequenceClass
}

// ErrSiteTooLarge is returned (wrapped) when a site exceeds the exhaustive planner's limits.
var ErrSiteTooLarge = fmt.Errorf("engine: exhaustive: site too large")

// ExhaustiveResult is what the exhaustive search reports besides the plan.
type ExhaustiveResult struct {
	Proven    bool   // the search finished: no plan of the class is better
	States    int64  // decision states visited
	Class     string // the class name
	Incumbent string // the planner whose plan won ("exhaustive" when the search found it)
}

const (
	agActive = iota
	agWaiting
	agStopped
)

type exAgent struct {
	tr     *engine.Trajectory
	wps    []engine.Waypoint
	pos    int     // node at the end of the committed route
	T      float64 // time at the end of the committed route
	status int
	from   int   // origin of the last leg
	rv     int   // rendezvous node while waiting
	ver    int64 // changes whenever the committed route or status changes
}

type exSnap struct {
	nseg, nrv, nwp int
	length, end    float64
	pos            int
	T              float64
	status, from   int
	rv             int
	ver            int64
}

type exKey struct {
	vis     uint32
	m       int8
	pm      int16
	ost     int8
	oq, opo int16
	rel     uint64
	meet    uint8 // 1 when a rendezvous may be called (face to face: progress since the last one)
	pend    [4]exPend
}

// exPend is a found candidate whose evacuation time is not settled: its
// index, finder and how long before the decision it was found.
type exPend struct {
	c, f int8
	rel  uint64
}

type exPair struct{ T, M float64 }

type fvUndo struct {
	a, v int
	old  float64
}

type exSearch struct {
	ctx      context.Context
	s        *engine.Site
	m        engine.Model
	ag       [2]exAgent
	fv       [2][]float64
	fvLog    []fvUndo
	cand     []int // candidate nodes
	cidx     []int // node -> candidate index or -1
	anchor   []bool
	sub      []uint32 // candidate bits in the subtree of v (rooted at the start)
	settled  []bool
	evac     []float64
	setLog   []int
	inc      float64
	incPlan  *engine.Plan
	incFrom  string
	memo     map[exKey][]exPair
	memoN    int
	states   int64
	stopped  bool
	stopWhy  string
	deadline time.Time
	begin    time.Time
	budget   time.Duration
	lastProg time.Time
	progress func(Progress)
	vmax     float64
	allMask  uint32
	lastMeet uint32 // candidates visited by the last rendezvous: a new one needs progress
	verN     int64
	pcache   []pendCache
	sym      exSym
	cfg      exConfig
}

// exSym breaks the symmetry of two equally fast agents standing on the same
// node at the same time with nothing pending: agent 1's first choice there
// may not come before agent 0's in option order (the swapped plan is the same).
type exSym struct {
	on      bool
	kind, v int
}

// pendCache remembers the bound of a found, unsettled candidate for the
// route versions it was computed on.
type pendCache struct {
	v0, v1 int64
	lb     float64
	ok     bool
}

const exMemoCap = 1_500_000 // about 300 MB at most

// CheckExhaustiveSize returns an error wrapping ErrSiteTooLarge when the
// site exceeds the exhaustive planner's limits.
func CheckExhaustiveSize(s *engine.Site) error {
	nc, ns := 0, 0
	for v := 0; v < s.N; v++ {
		if s.Candidate[v] {
			nc++
		}
		if s.InSearch[v] {
			ns++
		}
	}
	if nc > ExhaustiveMaxCandidates {
		return fmt.Errorf("%w: %d candidates, the limit is %d (use the improve planner)", ErrSiteTooLarge, nc, ExhaustiveMaxCandidates)
	}
	if ns > ExhaustiveMaxNodes {
		return fmt.Errorf("%w: %d nodes in the search tree, the limit is %d (use the improve planner)", ErrSiteTooLarge, ns, ExhaustiveMaxNodes)
	}
	return nil
}

func planExhaustive(ctx context.Context, s *engine.Site, m engine.Model, opt Options) (*engine.Plan, error) {
	p, _, err := Exhaustive(ctx, s, m, opt)
	return p, err
}

// Exhaustive runs the branch and bound of the exhaustive planner and reports
// whether it proved its plan the best of the class. A stopped search (time
// limit Options.Budget, default 10 s, or ctx cancelled) returns the best plan
// so far, not proven. It refuses sites over the limits with an error
// wrapping ErrSiteTooLarge.
func Exhaustive(ctx context.Context, s *engine.Site, m engine.Model, opt Options) (*engine.Plan, ExhaustiveResult, error) {
	return exhaustive(ctx, s, m, opt, exConfig{})
}

// exConfig switches off parts of the search, for tests: noPrune drops the
// bounds, the memo, the symmetry cut and the dominance cuts of parking and
// rendezvous nodes (plain enumeration of the class); noSeed starts without
// the published plans (so the class optimum itself is returned).
// improved, when set, stands in for the seeding improve run (tests that have
// just made the same run pass it in).
type exConfig struct {
	noPrune, noSeed bool
	improved        *engine.Plan
}

func exhaustive(ctx context.Context, s *engine.Site, m engine.Model, opt Options, cfg exConfig) (*engine.Plan, ExhaustiveResult, error) {
	res := ExhaustiveResult{Class: ClassName(m)}
	if err := CheckExhaustiveSize(s); err != nil {
		return nil, res, err
	}
	budget := opt.Budget
	if budget <= 0 {
		budget = DefaultExhaustiveBudget
	}
	seed, seedR, err := published.BestPlan(ctx, s, m)
	if err != nil {
		return nil, res, fmt.Errorf("engine: exhaustive: %w", err)
	}
	x := &exSearch{ctx: ctx, s: s, m: m, inc: seedR.Worst, incPlan: seed, incFrom: seed.Planner,
		memo: map[exKey][]exPair{}, begin: time.Now(), budget: budget, progress: opt.Progress,
		vmax: math.Max(s.Speed[0], s.Speed[1])}
	x.cfg = cfg
	if !cfg.noSeed {
		// a short deterministic improve run from the published plan joins the seed
		ip, ir, err := cfg.improved, ImproveResult{Improved: true}, error(nil)
		if ip == nil {
			ip, ir, err = ImproveFrom(ctx, s, m, seed, Options{Iterations: ExhaustiveImproveIterations, Seed: opt.Seed})
		}
		if err == nil && ir.Improved {
			if r, err := engine.Evaluate(s, ip, m); err == nil && r.Worst < x.inc*(1-1e-12) {
				x.inc, x.incPlan, x.incFrom = r.Worst, ip, "improve"
				ip.Planner = "improve"
			}
		}
	}
	if cfg.noSeed {
		x.inc, x.incPlan, x.incFrom = math.Inf(1), seed, seed.Planner
	}
	x.deadline = x.begin.Add(budget)
	x.lastProg = x.begin
	x.init()
	x.lastMeet = 1 << 31 // no rendezvous yet: one may be called at once
	if len(x.cand) > 0 {
		x.step()
	}
	res.States = x.states
	res.Proven = !x.stopped
	res.Incumbent = x.incFrom
	p := clonePlan(x.incPlan)
	bound := math.Max(engine.ComputeBounds(s).LB, 0)
	switch {
	case !res.Proven:
		p.Note = fmt.Sprintf("NOT proven: the search was stopped (%s) after %d states; best plan found so far, worst %.6g (lower bound %.6g)", x.stopWhy, x.states, x.inc, bound)
		if x.incFrom != "exhaustive" {
			p.Note += fmt.Sprintf("; it is the %s plan (%s)", x.incFrom, x.incPlan.Note)
		}
	case x.incFrom == "exhaustive":
		p.Note = fmt.Sprintf("best of class %q: no plan of the class has a smaller worst case (search finished, %d states); worst %.6g, lower bound %.6g", res.Class, x.states, x.inc, bound)
	case x.incFrom == "improve":
		p.Note = fmt.Sprintf("best of class %q together with the published plans and a %d-iteration improve run (seed %d): no plan of the class beats this improve plan, which lies outside the class; search finished, %d states; worst %.6g, lower bound %.6g", res.Class, ExhaustiveImproveIterations, opt.Seed, x.states, x.inc, bound)
	default:
		p.Note = fmt.Sprintf("best of class %q together with the published plans: no plan of the class beats the %s plan (%s); search finished, %d states", res.Class, x.incFrom, seed.Note, x.states)
	}
	if x.progress != nil {
		x.progress(Progress{Done: 1, Best: x.inc, Note: "exhaustive search done"})
	}
	return p, res, nil
}

func clonePlan(p *engine.Plan) *engine.Plan {
	q := *p
	for a := 0; a < 2; a++ {
		q.Routes[a].Waypoints = append([]engine.Waypoint(nil), p.Routes[a].Waypoints...)
	}
	return &q
}

func (x *exSearch) init() {
	s := x.s
	x.cidx = make([]int, s.N)
	for v := range x.cidx {
		x.cidx[v] = -1
		if s.Candidate[v] {
			x.cidx[v] = len(x.cand)
			x.cand = append(x.cand, v)
		}
	}
	x.allMask = uint32(1)<<len(x.cand) - 1
	x.settled = make([]bool, len(x.cand))
	x.pcache = make([]pendCache, len(x.cand))
	x.evac = make([]float64, len(x.cand))
	x.anchor = make([]bool, s.N)
	x.sub = make([]uint32, s.N)
	for i := s.N - 1; i >= 0; i-- {
		v := int(s.Order[i])
		if !s.InSearch[v] {
			continue
		}
		if c := x.cidx[v]; c >= 0 {
			x.sub[v] |= 1 << c
		}
		if p := s.Parent[v]; p >= 0 {
			x.sub[p] |= x.sub[v]
		}
		deg := 0
		if s.Parent[v] >= 0 {
			deg++
		}
		for _, c := range s.Children(v) {
			if s.InSearch[c] {
				deg++
			}
		}
		x.anchor[v] = v == s.Start || s.Candidate[v] || deg >= 3
	}
	for a := 0; a < 2; a++ {
		x.fv[a] = make([]float64, s.N)
		for v := range x.fv[a] {
			x.fv[a][v] = math.Inf(1)
		}
		x.fv[a][s.Start] = 0
		x.ag[a] = exAgent{tr: engine.NewTrajectory(s, a, engine.At(s.Start)), pos: s.Start, from: s.Start, rv: -1}
	}
}

func (x *exSearch) snap(a int) exSnap {
	g := &x.ag[a]
	return exSnap{nseg: len(g.tr.Segs), nrv: len(g.tr.RVTime), nwp: len(g.wps), length: g.tr.Length, end: g.tr.End,
		pos: g.pos, T: g.T, status: g.status, from: g.from, rv: g.rv, ver: g.ver}
}

// touch gives agent a's route a new version (call after changing it).
func (x *exSearch) touch(a int) {
	x.verN++
	x.ag[a].ver = x.verN
}

func (x *exSearch) restore(a int, sn exSnap) {
	g := &x.ag[a]
	g.tr.Segs = g.tr.Segs[:sn.nseg]
	g.tr.RVTime, g.tr.RVAt, g.tr.RVSegs = g.tr.RVTime[:sn.nrv], g.tr.RVAt[:sn.nrv], g.tr.RVSegs[:sn.nrv]
	g.wps = g.wps[:sn.nwp]
	g.tr.Length, g.tr.End = sn.length, sn.end
	g.pos, g.T, g.status, g.from, g.rv, g.ver = sn.pos, sn.T, sn.status, sn.from, sn.rv, sn.ver
}

// walkTo appends agent a's leg to node v (no waypoint), updating first visits.
func (x *exSearch) walkTo(a, v int) {
	g := &x.ag[a]
	s := x.s
	if v == g.pos {
		g.from = v
		return
	}
	k := len(g.tr.Segs)
	d := s.Dist(g.pos, v)
	g.tr.Walk(engine.At(g.pos), engine.At(v), g.T, s.Speed[a])
	g.tr.Length += d
	g.from = g.pos
	g.pos = v
	g.T = g.tr.Segs[len(g.tr.Segs)-1].T1
	g.tr.End = g.T
	x.touch(a)
	for i := k; i < len(g.tr.Segs); i++ {
		sg := &g.tr.Segs[i]
		if sg.E < 0 {
			continue
		}
		e := int(sg.E)
		if sg.O1 == 0 {
			x.see(a, int(s.EU[e]), sg.T1)
		} else if sg.O1 == s.EW[e] {
			x.see(a, int(s.EV[e]), sg.T1)
		}
	}
}

func (x *exSearch) see(a, v int, t float64) {
	if t < x.fv[a][v] {
		x.fvLog = append(x.fvLog, fvUndo{a, v, x.fv[a][v]})
		x.fv[a][v] = t
	}
}

func (x *exSearch) undoFV(n int) {
	for len(x.fvLog) > n {
		u := x.fvLog[len(x.fvLog)-1]
		x.fv[u.a][u.v] = u.old
		x.fvLog = x.fvLog[:len(x.fvLog)-1]
	}
}

func (x *exSearch) undoSettled(n int) {
	for len(x.setLog) > n {
		c := x.setLog[len(x.setLog)-1]
		x.settled[c] = false
		x.setLog = x.setLog[:len(x.setLog)-1]
	}
}

func (x *exSearch) firstVisit(v int) float64 { return math.Min(x.fv[0][v], x.fv[1][v]) }

// teff is the time up to which agent a's trajectory is fixed (+Inf once it
// stopped or waits at a rendezvous).
func (x *exSearch) teff(a int) float64 {
	if x.ag[a].status != agActive {
		return math.Inf(1)
	}
	return x.ag[a].T
}

func (x *exSearch) trs() [2]*engine.Trajectory { return [2]*engine.Trajectory{x.ag[0].tr, x.ag[1].tr} }

func (x *exSearch) checkStop() {
	x.states++
	if x.states&511 != 0 {
		return
	}
	now := time.Now()
	if err := x.ctx.Err(); err != nil {
		x.stopped, x.stopWhy = true, "cancelled"
		return
	}
	if now.After(x.deadline) {
		x.stopped, x.stopWhy = true, fmt.Sprintf("time limit %v", x.budget)
		return
	}
	if x.progress != nil && now.Sub(x.lastProg) >= 100*time.Millisecond {
		x.lastProg = now
		x.progress(Progress{Done: math.Min(1, float64(now.Sub(x.begin))/float64(x.budget)), Best: x.inc,
			Note: fmt.Sprintf("exhaustive: %d states", x.states)})
	}
}

func (x *exSearch) step() {
	x.checkStop()
	if x.stopped {
		return
	}
	a0, a1 := &x.ag[0], &x.ag[1]
	if a0.status == agWaiting && a1.status == agWaiting {
		x.meet()
		return
	}
	m := -1
	for a := 0; a < 2; a++ {
		if x.ag[a].status == agActive && (m < 0 || x.ag[a].T < x.ag[m].T) {
			m = a
		}
	}
	if m < 0 {
		x.leaf()
		return
	}
	x.decide(m)
}

func (x *exSearch) meet() {
	R := x.ag[0].rv
	tm := math.Max(x.ag[0].T, x.ag[1].T)
	var sn [2]exSnap
	for a := 0; a < 2; a++ {
		sn[a] = x.snap(a)
		g := &x.ag[a]
		if tm > g.T {
			g.tr.AddWait(engine.At(R), g.T, tm)
		}
		g.T, g.tr.End = tm, tm
		g.tr.RVTime = append(g.tr.RVTime, tm)
		g.tr.RVAt = append(g.tr.RVAt, engine.At(R))
		g.tr.RVSegs = append(g.tr.RVSegs, len(g.tr.Segs))
		g.wps = append(g.wps, engine.Waypoint{P: engine.At(R), T: tm, Rendezvous: true})
		g.status, g.rv, g.from = agActive, -1, R
		x.touch(a)
	}
	old := x.lastMeet
	x.lastMeet = 0
	for c, v := range x.cand {
		if x.firstVisit(v) <= tm {
			x.lastMeet |= 1 << c
		}
	}
	x.step()
	x.lastMeet = old
	x.restore(0, sn[0])
	x.restore(1, sn[1])
}

// leaf scores a finished plan.
func (x *exSearch) leaf() {
	trs := x.trs()
	worst := 0.0
	for _, v := range x.cand {
		if math.IsInf(x.firstVisit(v), 1) {
			return
		}
		ex := engine.ExitFull(x.s, trs, x.fv, v, x.m)
		worst = math.Max(worst, ex.EvacAt)
		if worst >= x.inc*(1-1e-12) {
			return
		}
	}
	p := &engine.Plan{Planner: "exhaustive", Model: x.m}
	for a := 0; a < 2; a++ {
		g := &x.ag[a]
		wps := append([]engine.Waypoint(nil), g.wps...)
		if g.status == agWaiting {
			wps = append(wps, engine.Waypoint{P: engine.At(g.pos), T: g.T})
		}
		p.Routes[a] = engine.Route{Waypoints: wps}
	}
	r, err := engine.Evaluate(x.s, p, x.m)
	if err != nil || !r.Complete {
		return
	}
	if r.Worst < x.inc*(1-1e-12) {
		x.inc, x.incPlan, x.incFrom = r.Worst, p, "exhaustive"
	}
}

// settle computes evac for found candidates whose value the rest of the plan
// cannot change, and returns the largest settled value and a lower bound over
// the found but unsettled ones, plus whether any found one is pending.
func (x *exSearch) settle(T float64) (maxSettled, pendLB float64, pending bool) {
	s := x.s
	trs := x.trs()
	for c, v := range x.cand {
		if x.settled[c] {
			maxSettled = math.Max(maxSettled, x.evac[c])
			continue
		}
		t0, t1 := x.fv[0][v], x.fv[1][v]
		t := math.Min(t0, t1)
		if math.IsInf(t, 1) {
			continue
		}
		f := 0
		if t1 < t0 {
			f = 1
		}
		if math.Abs(t0-t1) <= engine.Tol(t) {
			x.settled[c], x.evac[c] = true, t
			x.setLog = append(x.setLog, c)
			maxSettled = math.Max(maxSettled, t)
			continue
		}
		p := 1 - f
		tp := x.teff(p)
		if pc := &x.pcache[c]; pc.ok && pc.v0 == x.ag[0].ver && pc.v1 == x.ag[1].ver {
			pendLB = math.Max(pendLB, pc.lb)
			pending = pending || t <= T
			continue
		}
		if t > tp {
			// the partner may still get there first; it must get there anyway
			g := &x.ag[p]
			lb := g.T + s.Dist(g.pos, v)/s.Speed[p]
			x.pcache[c] = pendCache{v0: x.ag[0].ver, v1: x.ag[1].ver, lb: lb, ok: true}
			pendLB = math.Max(pendLB, lb)
			pending = pending || t <= T
			continue
		}
		ex := engine.ExitFull(s, trs, x.fv, v, x.m)
		ok := x.m.Instant() || math.IsInf(tp, 1)
		if !ok {
			tr := trs[p]
			if k := sort.SearchFloat64s(tr.RVTime, t-engine.Tol(t)); k < len(tr.RVTime) {
				ok = true
			} else if s.Speed[p] <= s.Speed[f] {
				ok = ex.MeetAt <= tp+engine.Tol(tp)
			} else {
				ok = ex.EvacAt <= tp
			}
		}
		if ok {
			x.settled[c], x.evac[c] = true, ex.EvacAt
			x.setLog = append(x.setLog, c)
			maxSettled = math.Max(maxSettled, ex.EvacAt)
			continue
		}
		// radio value at t: never more than the face-to-face one
		lb := t + s.NodeDist(trs[p].PositionAt(t), v)/s.Speed[p]
		if s.Speed[p] <= s.Speed[f] {
			// the meeting comes after tp and τ + d(π(τ), x)/v never decreases
			g := &x.ag[p]
			lb = math.Max(lb, tp+s.Dist(g.pos, v)/s.Speed[p])
		}
		x.pcache[c] = pendCache{v0: x.ag[0].ver, v1: x.ag[1].ver, lb: lb, ok: true}
		pendLB = math.Max(pendLB, lb)
		pending = pending || t <= T
	}
	return
}

// steinerW returns the corridor length of the smallest subtree holding the
// candidates in mask and node v.
func (x *exSearch) steinerW(mask uint32, v int) float64 {
	s := x.s
	if mask == 0 {
		return 0
	}
	w := 0.0
	for u := 0; u < s.N; u++ {
		if u == s.Start || !s.InSearch[u] {
			continue
		}
		in := x.sub[u]&mask != 0
		vin := x.inSub(v, u)
		out := mask&^x.sub[u] != 0
		if (in || vin) && (out || !vin) {
			w += s.EW[s.ParentEdge[u]]
		}
	}
	return w
}

// inSub reports whether node v lies in the subtree of u.
func (x *exSearch) inSub(v, u int) bool {
	s := x.s
	if s.Level[v] < s.Level[u] {
		return false
	}
	return s.LCA(u, v) == u
}

func (x *exSearch) decide(m int) {
	s := x.s
	o := 1 - m
	g := &x.ag[m]
	T := g.T
	// visited by time T
	var vis uint32
	for c, v := range x.cand {
		if x.firstVisit(v) <= T {
			vis |= 1 << c
		}
	}
	setMark := len(x.setLog)
	defer x.undoSettled(setMark)
	if vis == x.allMask {
		sn := x.snap(m)
		g.status = agStopped
		x.touch(m)
		x.step()
		x.restore(m, sn)
		return
	}
	maxSettled, pendLB, pending := x.settle(T)
	lb := math.Max(maxSettled, pendLB)
	if x.cfg.noPrune {
		lb = math.Inf(-1)
	}
	if lb >= x.inc*(1-1e-12) {
		return
	}
	// unvisited candidates: both agents must get there from where they are at T
	og := &x.ag[o]
	po := og.tr.PositionAt(T)
	if og.status == agStopped && T >= og.T {
		po = engine.At(og.pos)
	}
	unv := x.allMask &^ vis
	for c, v := range x.cand {
		if unv&(1<<c) == 0 {
			continue
		}
		b := T + math.Max(s.Dist(g.pos, v)/s.Speed[m], s.NodeDist(po, v)/s.Speed[o])
		if !x.cfg.noPrune {
			lb = math.Max(lb, b)
		}
	}
	if lb >= x.inc*(1-1e-12) {
		return
	}
	sw := x.steinerW(unv, g.pos)
	if b := T + (2*sw-s.NodeDist(po, g.pos))/(2*x.vmax); b > lb && !x.cfg.noPrune {
		lb = b
	}
	if lb >= x.inc*(1-1e-12) {
		return
	}
	// memo (face to face with equal speeds: up to four pending candidates
	// join the key, as their evacuation times then depend only on the future)
	var pend [4]exPend
	np := 0
	if x.cfg.noPrune {
		pending = true
	}
	if pending && s.Speed[0] == s.Speed[1] && !x.cfg.noPrune {
		for c, v := range x.cand {
			t := x.firstVisit(v)
			if x.settled[c] || t > T {
				continue
			}
			if np == len(pend) {
				np = -1
				break
			}
			f := int8(0)
			if x.fv[1][v] < x.fv[0][v] {
				f = 1
			}
			pend[np] = exPend{c: int8(c), f: f, rel: math.Float64bits(T - t)}
			np++
		}
		if np > 0 {
			pending = false
		}
	}
	if !pending {
		k := exKey{vis: vis, m: int8(m), pm: int16(g.pos), ost: int8(og.status), oq: int16(og.from), opo: int16(og.pos), pend: pend}
		rel := og.T - T
		if rel <= 0 {
			rel, k.oq = 0, int16(og.pos)
		}
		k.rel = math.Float64bits(rel)
		if vis != x.lastMeet {
			k.meet = 1
		}
		list := x.memo[k]
		for _, pr := range list {
			if pr.T <= T && pr.M <= maxSettled {
				return
			}
		}
		// a state explored with the symmetry restriction is not fully explored here
		if x.memoN < exMemoCap && !(m == 1 && x.sym.on) {
			kept := list[:0]
			for _, pr := range list {
				if !(T <= pr.T && maxSettled <= pr.M) {
					kept = append(kept, pr)
				}
			}
			x.memo[k] = append(kept, exPair{T, maxSettled})
			x.memoN++
		}
	}

	// options: the frontier of unvisited candidates and the reachable anchors
	type opt struct {
		kind int // 0 target, 1 park, 2 rendezvous, 3 go to the partner's rendezvous
		v    int
		d    float64
	}
	// nearest first, ties by node
	byDist := func(o []opt) {
		sort.Slice(o, func(i, j int) bool {
			if o[i].d != o[j].d {
				return o[i].d < o[j].d
			}
			return o[i].v < o[j].v
		})
	}
	var opts []opt
	var reach []int
	{
		// DFS from g.pos through the search tree, not passing unvisited candidates
		stack := []int{g.pos}
		seen := make([]bool, s.N)
		seen[g.pos] = true
		for len(stack) > 0 {
			u := stack[len(stack)-1]
			stack = stack[:len(stack)-1]
			if c := x.cidx[u]; c >= 0 && unv&(1<<c) != 0 && u != g.pos {
				opts = append(opts, opt{0, u, s.Dist(g.pos, u)})
				continue
			}
			reach = append(reach, u)
			nb := func(w int) {
				if w >= 0 && s.InSearch[w] && !seen[w] {
					seen[w] = true
					stack = append(stack, w)
				}
			}
			nb(int(s.Parent[u]))
			for _, c := range s.Children(u) {
				nb(int(c))
			}
		}
	}
	byDist(opts)
	if og.status == agWaiting {
		opts = append(opts, opt{kind: 3, v: og.rv, d: s.Dist(g.pos, og.rv)})
	} else {
		// parking: allowed unless the partner has stopped with work left
		canStop := og.status == agActive
		if canStop {
			// keep anchors in the Steiner tree of the unvisited and pending candidates and g.pos
			var need uint32 = unv
			for c, v := range x.cand {
				if !x.settled[c] && !math.IsInf(x.firstVisit(v), 1) && x.fv[o][v] < x.fv[m][v] {
					need |= 1 << c
				}
			}
			var parks []opt
			for _, u := range reach {
				if !x.anchor[u] && u != g.pos {
					continue
				}
				if u != g.pos && !x.cfg.noPrune && !x.inSteiner(need, g.pos, u) {
					continue
				}
				parks = append(parks, opt{1, u, s.Dist(g.pos, u)})
			}
			byDist(parks)
			opts = append(opts, parks...)
		}
		if x.m.Rendezvous() && og.status == agActive && vis != x.lastMeet {
			// with equal speeds a rendezvous outside the smallest subtree T*
			// holding the unvisited and pending candidates and both leg ends
			// is dominated by the point where the paths to it leave T*.
			equal := s.Speed[0] == s.Speed[1] && !x.cfg.noPrune
			var need uint32 = unv
			for c, v := range x.cand {
				if !x.settled[c] && !math.IsInf(x.firstVisit(v), 1) {
					need |= 1 << c
				}
			}
			var rvs []opt
			for _, u := range reach {
				if x.anchor[u] && (!equal || x.inSteiner2(need, g.pos, og.pos, u)) {
					rvs = append(rvs, opt{2, u, s.Dist(g.pos, u)})
				}
			}
			byDist(rvs)
			opts = append(opts, rvs...)
		}
	}
	symHere := false
	var lim exSym
	if m == 0 && og.status == agActive && s.Speed[0] == s.Speed[1] && og.pos == g.pos && og.T == T && !pending && np == 0 && !x.cfg.noPrune {
		symHere = true
	}
	if m == 1 && x.sym.on {
		lim = x.sym
		x.sym.on = false
		defer func() { x.sym = lim }()
	}
	for _, op := range opts {
		if x.stopped {
			return
		}
		kind := op.kind
		if kind == 3 {
			kind = 2
		}
		if lim.on && (kind < lim.kind || kind == lim.kind && op.v < lim.v) {
			continue
		}
		if symHere {
			x.sym = exSym{on: true, kind: kind, v: op.v}
		}
		sn := x.snap(m)
		fvMark := len(x.fvLog)
		switch op.kind {
		case 0:
			x.walkTo(m, op.v)
			g.wps = append(g.wps, engine.Waypoint{P: engine.At(op.v), T: g.T})
		case 1:
			x.walkTo(m, op.v)
			if op.v != sn.pos {
				g.wps = append(g.wps, engine.Waypoint{P: engine.At(op.v), T: g.T})
			}
			g.status = agStopped
		case 2, 3:
			x.walkTo(m, op.v)
			g.status, g.rv = agWaiting, op.v
		}
		x.touch(m)
		x.step()
		x.undoFV(fvMark)
		x.restore(m, sn)
		if symHere {
			x.sym = exSym{}
		}
	}
}

// inSteiner reports whether node u lies in the smallest subtree holding the
// candidates in mask and node v.
func (x *exSearch) inSteiner(mask uint32, v, u int) bool {
	s := x.s
	if u == v {
		return true
	}
	if mask == 0 {
		return false
	}
	// u is in the Steiner tree iff u separates (or is one of) the points:
	// some point lies in u's subtree (rooted at the start) and some point
	// outside it, or two of u's child subtrees hold points, or u is a point.
	if c := x.cidx[u]; c >= 0 && mask&(1<<c) != 0 {
		return true
	}
	in := x.sub[u]&mask != 0 || x.inSub(v, u)
	out := mask&^x.sub[u] != 0 || !x.inSub(v, u)
	if in && out {
		return true
	}
	if !in {
		return false
	}
	// all points below u: need two child subtrees with points
	k := 0
	for _, c := range s.Children(u) {
		if x.sub[c]&mask != 0 || x.inSub(v, int(c)) {
			k++
		}
	}
	return k >= 2
}

// inSteiner2 reports whether node u lies in the smallest subtree holding the
// candidates in mask and nodes v and w: u is on the path from v to w, or in
// the subtree holding mask and v, or in the one holding mask and w.
func (x *exSearch) inSteiner2(mask uint32, v, w, u int) bool {
	s := x.s
	if s.Dist(v, u)+s.Dist(u, w) == s.Dist(v, w) {
		return true
	}
	return x.inSteiner(mask, v, u) || x.inSteiner(mask, w, u)
}
