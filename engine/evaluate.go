package engine

import (
	"math"
	"sort"
)

// Finder says who first stands on an exit: agent 0, agent 1, both at the
// same moment (within Tol), or nobody (no route visits it). Agent0 and
// Agent1 are the agent indices, so a Finder of one agent indexes per-agent
// arrays directly.
type Finder int

const (
	// Nobody: no route visits the exit.
	Nobody Finder = -1
	// Agent0 is the first agent of the scenario.
	Agent0 Finder = 0
	// Agent1 is the second agent of the scenario.
	Agent1 Finder = 1
	// Both: both agents reach the exit at the same first moment.
	Both Finder = 2
)

// Agent reports whether f is one agent (Agent0 or Agent1).
func (f Finder) Agent() bool { return f == Agent0 || f == Agent1 }

// Name returns the finder's display name: the agent's name from names (the
// site's Names), "both" or "nobody".
func (f Finder) Name(names [2]string) string {
	switch {
	case f == Both:
		return "both"
	case f.Agent():
		return names[f]
	}
	return "nobody"
}

// ExitResult is what happens when the exit is at one candidate node.
type ExitResult struct {
	Node    int
	FoundAt float64 // t(x); +Inf when never visited
	Finder  Finder  // Agent0, Agent1, Both or Nobody
	EvacAt  float64 // evac(x); +Inf when never visited
	// Face-to-face only: where and when the finder meets its partner (MeetAt
	// is FoundAt when no meeting is needed).
	MeetAt    float64
	MeetPoint Point
}

// Report is the evaluation of one plan under one model (MODEL.md §7).
type Report struct {
	Model        Model
	Planner      string
	Exits        []ExitResult // one per candidate, in node order
	Worst        float64      // max evac; +Inf for an incomplete plan, 0 without candidates
	WorstExit    int          // node index of the worst exit (ties: lowest index), -1 without candidates
	Expected     float64      // Σ p·evac, when HasExpected
	HasExpected  bool
	Bounds       Bounds
	Gap          float64 // Worst/LB − 1 (0 when LB is 0)
	Complete     bool
	Unvisited    []int // candidates no route visits
	RouteLengths [2]float64
}

// ExitFor returns the result row for node v, and whether v is a candidate.
func (r *Report) ExitFor(v int) (ExitResult, bool) {
	i := sort.Search(len(r.Exits), func(i int) bool { return r.Exits[i].Node >= v })
	if i < len(r.Exits) && r.Exits[i].Node == v {
		return r.Exits[i], true
	}
	return ExitResult{}, false
}

// Evaluate evaluates plan p on site s under model m exactly (MODEL.md §2–§5).
// With equal speeds, or a partner no faster than the finder, it is
// O((n + W) log W) for n nodes and W route segments; otherwise the
// face-to-face search scans segments forward from the discovery and stops once
// no later meeting can help, O(n·W) in the worst case.
func Evaluate(s *Site, p *Plan, m Model) (*Report, error) {
	trs, err := s.Trajectories(p)
	if err != nil {
		return nil, err
	}
	return evaluateTrajectories(s, trs, p.Planner, m), nil
}

// EvaluateBoth evaluates p under both models, expanding the routes once.
func EvaluateBoth(s *Site, p *Plan) (radio, f2f *Report, err error) {
	trs, err := s.Trajectories(p)
	if err != nil {
		return nil, nil, err
	}
	return evaluateTrajectories(s, trs, p.Planner, Radio), evaluateTrajectories(s, trs, p.Planner, FaceToFace), nil
}

func evaluateTrajectories(s *Site, trs [2]*Trajectory, planner string, m Model) *Report {
	r := &Report{Model: m, Planner: planner, WorstExit: -1, Complete: true, Bounds: ComputeBounds(s)}
	r.RouteLengths = [2]float64{trs[0].Length, trs[1].Length}
	var fv [2][]float64
	var order [2][]int32
	fv[0], order[0] = trs[0].firstVisits()
	fv[1], order[1] = trs[1].firstVisits()
	row := make([]int32, s.N) // node -> index in r.Exits
	r.Exits = make([]ExitResult, 0, s.candidateCount())
	for v := 0; v < s.N; v++ {
		if s.Candidate[v] {
			row[v] = int32(len(r.Exits))
			r.Exits = append(r.Exits, exitResult(fv, v))
		}
	}
	// Per finder, in order of discovery: under radio the partner's position
	// is found by one forward sweep over its segments; face to face,
	// consecutive discoveries tend to meet the partner at nearby moments, so
	// each intercept search starts from the previous answer.
	comm := m.comm()
	for f := 0; f < 2; f++ {
		partner, sf, sp := trs[1-f], s.Speed[f], s.Speed[1-f]
		hint := 0
		// the finder's first visits come in time order: no sort needed
		for _, v := range order[f] {
			if !s.Candidate[v] {
				continue
			}
			ex := &r.Exits[row[v]]
			if ex.Finder != Finder(f) {
				continue
			}
			tl := comm.tell(s, partner, ex.Node, ex.FoundAt, sf, sp, &hint)
			ex.MeetAt, ex.EvacAt = tl.at, tl.evac
			if tl.met {
				ex.MeetPoint = tl.where
			}
		}
	}
	for _, ex := range r.Exits {
		if ex.Finder == Nobody {
			r.Complete = false
			r.Unvisited = append(r.Unvisited, ex.Node)
		}
		if r.WorstExit < 0 || ex.EvacAt > r.Worst {
			r.Worst, r.WorstExit = ex.EvacAt, ex.Node
		}
		if s.HasProb && s.Prob[ex.Node] > 0 {
			r.Expected += s.Prob[ex.Node] * ex.EvacAt
		}
	}
	r.HasExpected = s.HasProb
	if r.Bounds.LB > 0 {
		r.Gap = r.Worst/r.Bounds.LB - 1
	}
	return r
}

// ExitFull is the evaluation of one exit x under m: exitResult with the
// evacuation time worked out. fv holds each agent's first-visit times.
// Searches that grow trajectories leg by leg use it to settle one exit.
func ExitFull(s *Site, trs [2]*Trajectory, fv [2][]float64, x int, m Model) ExitResult {
	ex, _ := exitTelling(s, trs, fv, x, m)
	return ex
}

// exitTelling is ExitFull that also says how the partner was told (the
// zero telling for a tie or an unvisited exit).
func exitTelling(s *Site, trs [2]*Trajectory, fv [2][]float64, x int, m Model) (ExitResult, telling) {
	ex := exitResult(fv, x)
	if ex.Finder != 0 && ex.Finder != 1 {
		return ex, telling{}
	}
	f := ex.Finder
	tl := m.comm().tell(s, trs[1-f], x, ex.FoundAt, s.Speed[f], s.Speed[1-f], nil)
	ex.MeetAt, ex.EvacAt = tl.at, tl.evac
	if tl.met {
		ex.MeetPoint = tl.where
	}
	return ex, tl
}

// exitResult finds t(x) and the finder; for a single finder the evacuation
// time is left to the caller (EvacAt stays +Inf).
func exitResult(fv [2][]float64, x int) ExitResult {
	t0, t1 := fv[0][x], fv[1][x]
	t := math.Min(t0, t1)
	ex := ExitResult{Node: x, FoundAt: t, EvacAt: math.Inf(1), MeetAt: math.Inf(1), MeetPoint: At(x)}
	switch {
	case math.IsInf(t, 1):
		ex.Finder = Nobody
		return ex
	case math.Abs(t0-t1) <= Tol(t):
		ex.Finder = Both
		ex.EvacAt, ex.MeetAt = t, t
		return ex
	case t0 < t1:
		ex.Finder = 0
	default:
		ex.Finder = 1
	}
	return ex
}

// firstTrue returns the first index in [lo, hi) where the monotone predicate
// (false...false true...true) holds, or hi. It searches exponentially outwards
// from hint, then by bisection: O(log |answer − hint|) calls.
func firstTrue(lo, hi, hint int, pred func(int) bool) int {
	if lo >= hi {
		return hi
	}
	hint = max(lo, min(hint, hi-1))
	var a, b int // the answer lies in (a, b]: pred(b) true or b == hi; a < lo or pred(a) false
	if pred(hint) {
		b = hint
		step := 1
		a = hint - step
		for a >= lo && pred(a) {
			b = a
			step *= 2
			a = b - step
		}
		if a < lo {
			a = lo - 1
		}
	} else {
		a = hint
		step := 1
		b = hint + step
		for b < hi && !pred(b) {
			a = b
			step *= 2
			b = a + step
		}
		if b >= hi {
			b = hi
		}
	}
	// invariant: a is false (or below lo), b is true (or hi)
	for b-a > 1 {
		m := a + (b-a)/2
		if pred(m) {
			b = m
		} else {
			a = m
		}
	}
	return b
}

// Better reports whether report a beats b: smaller worst case, then smaller
// expected time. Planner names break remaining ties through the caller's order.
func Better(a, b *Report) bool {
	if d := a.Worst - b.Worst; math.Abs(d) > Tol(b.Worst) {
		return d < 0
	}
	if a.HasExpected && b.HasExpected && math.Abs(a.Expected-b.Expected) > Tol(b.Expected) {
		return a.Expected < b.Expected
	}
	return false
}
