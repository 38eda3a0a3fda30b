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
	"errors"
	"fmt"
	"math"
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
var ErrSiteTooLarge = errors.New("engine: exhaustive: site too large")

// ExhaustiveResult is what the exhaustive search reports besides the plan.
type ExhaustiveResult struct {
	Proven    bool   // the search finished: no plan of the class is better
	States    int64  // decision states visited
	Class     string // the class name
	Incumbent string // the planner whose plan won ("exhaustive" when the search found it)
}

// Agent status in the exhaustive search.
const (
	agActive  = iota // choosing legs
	agWaiting        // waiting at a rendezvous node for its partner
	agStopped        // parked for good
)

// exAgent is one agent's committed route in the exhaustive search.
type exAgent struct {
	tr     *engine.Trajectory // the committed route, grown leg by leg
	wps    []engine.Waypoint  // its waypoints (the plan's route)
	pos    int                // node at the end of the committed route
	T      float64            // time at the end of the committed route
	status int                // agActive, agWaiting or agStopped
	from   int                // origin of the last leg
	rv     int                // rendezvous node while waiting
	ver    int64              // changes whenever the committed route or status changes
}

// exSnap is what restore needs to undo an agent's step: the lengths of its
// trajectory's segment, rendezvous and waypoint lists, and its exAgent
// fields (same names) before the step.
type exSnap struct {
	nseg, nrv, nwp int     // len of tr.Segs, tr.RVTime (and RVAt, RVSegs), wps
	length, end    float64 // tr.Length, tr.End
	pos            int
	T              float64
	status, from   int
	rv             int
	ver            int64
}

// exKey is the memo key of a decision state: two states with equal keys
// have the same futures, so the one reached later with a worse settled
// maximum is dominated (see exPair).
type exKey struct {
	vis  uint32    // bit mask of the candidates visited by the decision time
	m    int8      // the agent that decides (0 or 1)
	pm   int16     // the node the deciding agent stands on
	ost  int8      // the other agent's status (agActive, agWaiting, agStopped)
	oq   int16     // the other agent's leg origin (its node once the leg is done)
	opo  int16     // the other agent's leg end node
	rel  uint64    // bits of the time the other agent still needs to end its leg (≥ 0)
	meet uint8     // 1 when a rendezvous may be called (face to face: progress since the last one)
	pend [4]exPend // found candidates whose evacuation time is still open (equal speeds only)
}

// exPend is a found candidate whose evacuation time is not settled: its
// index, finder and how long before the decision it was found.
type exPend struct {
	c   int8   // candidate index
	f   int8   // finder (agent index)
	rel uint64 // bits of the decision time minus the time it was found
}

// exPair is one memo entry of a key: a state reached at decision time T
// with settled maximum evacuation M. A later state with T' ≥ T and
// M' ≥ M is dominated.
type exPair struct{ T, M float64 }

// fvUndo records one first-visit time change, to undo on backtracking.
type fvUndo struct {
	a, v int     // agent and node
	old  float64 // the first-visit time before the change
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
