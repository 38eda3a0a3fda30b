package search

// The improve planner: anytime local search from the best published plan.
//
// A plan is held as, for each agent, an ordered list of items: a target point
// (a node or a point inside a corridor) with an optional extra wait, or a
// meeting. The k-th meeting item of each agent's list is the k-th rendezvous:
// both walk to its node, the earlier waits for the later, and both waypoints
// are marked rendezvous at the meeting time. Between items an agent walks the
// tree path at full speed. The start plan is converted by dropping the
// waypoints that lie on the path between their neighbours (a depth-first
// tour becomes its list of turning points) and pairing the agents'
// rendezvous waypoints in order.
//
// Moves: swap two items of one agent; move an item or a block of up to three
// to another place, possibly in the partner's list (handing a subtree to the
// other agent); reverse a stretch of a list (reversing a child order); move
// the item that first reaches the current worst exit earlier or to the
// partner; insert a detour to an anchor node (hedging or parking); delete an
// item; snap a corridor point to an end or slide it (moving a split point);
// face to face also add, drop or move a rendezvous, or move a meeting item
// within its list. Every candidate plan is scored by Evaluate.
//
// Before the annealing, a tour phase (toursearch.go) takes the first quarter
// of the budget (or a quarter of the iteration cap, on top of it): local
// search over depth-first tours with free child orders and a free cut point;
// the annealing starts from its plan when that is better than the start.
//
// Acceptance is simulated annealing (Kirkpatrick, Gelatt and Vecchi, 1983):
// a worse candidate is accepted with probability exp(−Δ/T), the temperature
// T falling quadratically from 10% of the start score to zero over the budget
// (the iteration cap when one is set, else the time budget). The score is the
// worst case plus 2% of the mean evacuation time, which gives the search a
// slope on the plateaus of the worst case. One move in three is followed by
// another (compound moves cross ridges a single move cannot). After 1,500
// iterations without a new best the search restarts, alternately from the
// best plan and from another published planner's plan, with three random
// moves. The best plan by exact worst case (then expected time) is
// returned; it is never worse than the start plan, which is returned
// unchanged when nothing better turns up.
//
// Randomness comes only from a PCG source seeded with Options.Seed, and the
// time is read only to stop: with Options.Iterations set and no Budget the
// result depends only on the seed and the iteration count. With a time budget
// (default 5 s when no iteration cap is given) the number of iterations, and
// so the result, depends on the machine and its load.

import (
	"context"
	"fmt"
	"math"
	"math/rand/v2"
	"time"

	"duosweep/engine"
	"duosweep/engine/published"
)

// DefaultImproveBudget is the improve planner's time budget when neither
// Options.Budget nor Options.Iterations is set.
const DefaultImproveBudget = 5 * time.Second

// imItem is one step of an agent's item list: go to P (then wait, meet or
// mark a rendezvous).
type imItem struct {
	P    engine.Point // where the step goes
	Wait float64      // extra wait after arriving (not for meetings)
	Meet bool         // a meeting: the place is the rendezvous node of its ordinal
	RV   bool         // a rendezvous mark without a paired meeting (kept from the start plan)
}

// imState is a candidate plan of the improve search: each agent's item
// list, and the rendezvous places that Meet items refer to.
type imState struct {
	list [2][]imItem    // per agent, in walking order
	meet []engine.Point // rendezvous places, by ordinal
}

func (st *imState) clone() *imState {
	c := &imState{meet: append([]engine.Point(nil), st.meet...)}
	for a := 0; a < 2; a++ {
		c.list[a] = append([]imItem(nil), st.list[a]...)
	}
	return c
}

// ImproveResult reports what the improve search did.
type ImproveResult struct {
	Iterations  int
	Evaluations int
	Accepted    int
	Improved    bool    // a plan better than the start was found
	Start, Best float64 // worst case of the start plan and of the result
	Elapsed     time.Duration
}

func planImprove(ctx context.Context, s *engine.Site, m engine.Model, opt Options) (*engine.Plan, error) {
	p, _, err := Improve(ctx, s, m, opt)
	return p, err
}

// Improve runs the improve planner from the best published plan.
func Improve(ctx context.Context, s *engine.Site, m engine.Model, opt Options) (*engine.Plan, ImproveResult, error) {
	start, _, err := published.BestPlan(ctx, s, m)
	if err != nil {
		return nil, ImproveResult{}, fmt.Errorf("engine: improve: %w", err)
	}
	return ImproveFrom(ctx, s, m, start, opt)
}

// ImproveFrom runs the improve search from the given plan (which must be
// valid on s). The result is never worse than start under m.
func ImproveFrom(ctx context.Context, s *engine.Site, m engine.Model, start *engine.Plan, opt Options) (*engine.Plan, ImproveResult, error) {
	t0 := time.Now()
	var res ImproveResult
	r0, err := engine.Evaluate(s, start, m)
	if err != nil {
		return nil, res, fmt.Errorf("engine: improve: start plan: %w", err)
	}
	res.Start, res.Best = r0.Worst, r0.Worst
	budget := opt.Budget
	if budget <= 0 && opt.Iterations <= 0 {
		budget = DefaultImproveBudget
	}
	var deadline time.Time
	if budget > 0 {
		deadline = t0.Add(budget)
	}
	im := newImprover(s, m, opt.Seed)
	bestP, bestR := clonePlan(start), r0
	cur := im.fromPlan(start)
	for a := 0; a < 2; a++ {
		im.maxItems = max(im.maxItems, len(cur.list[a])+8)
	}
	curP := im.toPlan(cur)
	curR, err := engine.Evaluate(s, curP, m)
	res.Evaluations++
	if err != nil || !curR.Complete {
		// the conversion lost something (it should not): search from it anyway
		curR = r0
	} else if engine.Better(curR, bestR) {
		bestP, bestR = curP, curR
	}
	if len(s.Candidates()) == 0 || math.IsInf(im.score(curR), 1) {
		return im.finish(start, bestP, bestR, r0, res, t0), res, nil
	}
	// the tour phase (toursearch.go) takes the first quarter of the budget;
	// the annealing goes on from its plan when that is better
	tourIters, tourDeadline := 0, time.Time{}
	if opt.Iterations > 0 {
		tourIters = max(1, opt.Iterations/4)
	}
	if budget > 0 {
		tourDeadline = t0.Add(budget / 4)
	}
	if tp, tr := im.tourPhase(ctx, tourIters, tourDeadline, &res); tr != nil && engine.Better(tr, bestR) {
		bestP, bestR = tp, tr
		ts := im.fromPlan(tp)
		if cr, ok := im.eval(ts, &res); ok {
			cur, curR = ts, cr
			for a := 0; a < 2; a++ {
				im.maxItems = max(im.maxItems, len(cur.list[a])+8)
			}
		}
	}
	curScore := im.score(curR)
	t0Temp := 0.1 * curScore
	best := cur.clone()
	sinceBest, restarts := 0, 0
	starts := im.otherStarts(ctx, start)
	lastProg := t0
	for it := 0; opt.Iterations <= 0 || it < opt.Iterations; it++ {
		if it&31 == 0 {
			if ctx.Err() != nil {
				break
			}
			now := time.Now()
			if !deadline.IsZero() && now.After(deadline) {
				break
			}
			if opt.Progress != nil && now.Sub(lastProg) >= 100*time.Millisecond {
				lastProg = now
				done := 0.0
				if budget > 0 {
					done = float64(now.Sub(t0)) / float64(budget)
				}
				if opt.Iterations > 0 {
					done = math.Max(done, float64(it)/float64(opt.Iterations))
				}
				opt.Progress(Progress{Done: math.Min(1, done), Best: bestR.Worst,
					Note: fmt.Sprintf("improve: %d iterations, %d evaluations", it, res.Evaluations)})
			}
		}
		res.Iterations++
		if sinceBest > 1500 {
			// restart from the best, or from another published plan, with a kick
			restarts++
			cur = best.clone()
			if len(starts) > 0 && restarts%2 == 0 {
				cur = starts[(restarts/2)%len(starts)].clone()
			}
			for k := 0; k < 3; k++ {
				if c := im.mutate(cur, curR); c != nil {
					cur = c
				}
			}
			cr, ok := im.eval(cur, &res)
			if ok {
				curR, curScore = cr, im.score(cr)
			} else {
				cur = best.clone()
			}
			sinceBest = 0
		}
		cand := im.mutate(cur, curR)
		for cand != nil && im.rng.IntN(3) == 0 {
			if c2 := im.mutate(cand, nil); c2 != nil {
				cand = c2
			} else {
				break
			}
		}
		sinceBest++
		if cand == nil {
			continue
		}
		cr, ok := im.eval(cand, &res)
		if !ok {
			continue
		}
		sc := im.score(cr)
		// simulated annealing: the temperature falls from 10% of the start
		// score to zero over the budget (iterations, else time)
		frac := 0.0
		if opt.Iterations > 0 {
			frac = float64(it) / float64(opt.Iterations)
		} else if budget > 0 {
			frac = float64(time.Since(t0)) / float64(budget)
		}
		temp := t0Temp * (1 - frac) * (1 - frac)
		if d := sc - curScore; d <= 0 || temp > 0 && im.rng.Float64() < math.Exp(-d/temp) {
			cur, curR, curScore = cand, cr, sc
			res.Accepted++
		}
		if engine.Better(cr, bestR) {
			bestP, bestR = im.toPlan(cand), cr
			best = cand.clone()
			sinceBest = 0
		}
	}
	if bestR != r0 && ctx.Err() == nil {
		bestP, bestR = im.tidy(best, bestP, bestR, &res)
	}
	return im.finish(start, bestP, bestR, r0, res, t0), im.lastRes(res, bestR, t0), nil
}

// tidy drops items from the end of the lists (at most 100 tries per list)
// while the plan gets no worse: local search leaves detours that no exit
// needs, and a shorter plan is easier to follow.
func (im *improver) tidy(st *imState, p *engine.Plan, r *engine.Report, res *ImproveResult) (*engine.Plan, *engine.Report) {
	for a := 0; a < 2; a++ {
		tries := 0
		for i := len(st.list[a]) - 1; i >= 0 && tries < 100; i-- {
			if st.list[a][i].Meet {
				continue
			}
			tries++
			c := st.clone()
			c.list[a] = append(c.list[a][:i:i], c.list[a][i+1:]...)
			cr, ok := im.eval(c, res)
			if ok && !engine.Better(r, cr) && cr.Worst <= r.Worst {
				st, p, r = c, im.toPlan(c), cr
			}
		}
	}
	return p, r
}

func (im *improver) lastRes(res ImproveResult, bestR *engine.Report, t0 time.Time) ImproveResult {
	res.Best = bestR.Worst
	res.Improved = res.Best < res.Start*(1-1e-12)
	res.Elapsed = time.Since(t0)
	return res
}

func (im *improver) finish(start, bestP *engine.Plan, bestR, r0 *engine.Report, res ImproveResult, t0 time.Time) *engine.Plan {
	if !engine.Better(bestR, r0) {
		p := clonePlan(start)
		p.Note = fmt.Sprintf("improve found nothing better than the %s plan in %d iterations (%s)", start.Planner, res.Iterations, start.Note)
		return p
	}
	p := clonePlan(bestP)
	p.Note = fmt.Sprintf("improved the %s plan from worst %.6g to %.6g by local search (%d iterations, seed %d); not proven optimal, certified gap %.3g%%",
		start.Planner, r0.Worst, bestR.Worst, res.Iterations, im.seed, 100*bestR.Gap)
	return p
}

type improver struct {
	s        *engine.Site
	m        engine.Model
	rng      *rand.Rand
	seed     int64
	anchors  []int // start, candidates, branch nodes of the search tree
	cand     []int
	maxItems int // longest list a move may make

	tourNodes []int // search-tree nodes, parents first (the tour phase)
	branch    []int // search-tree nodes with two or more children
}

func newImprover(s *engine.Site, m engine.Model, seed int64) *improver {
	im := &improver{s: s, m: m, seed: seed, rng: rand.New(rand.NewPCG(uint64(seed), 0x1a7e_acce_97))}
	for v := 0; v < s.N; v++ {
		if !s.InSearch[v] {
			continue
		}
		deg := 0
		if p := s.Parent[v]; p >= 0 {
			deg++
		}
		for _, c := range s.Children(v) {
			if s.InSearch[c] {
				deg++
			}
		}
		if v == s.Start || s.Candidate[v] || deg >= 3 {
			im.anchors = append(im.anchors, v)
		}
		if s.Candidate[v] {
			im.cand = append(im.cand, v)
		}
	}
	im.maxItems = 2*len(im.anchors) + 8
	return im
}

// score is what the acceptance rule compares: the worst case plus a small
// share of the mean evacuation time.
func (im *improver) score(r *engine.Report) float64 {
	if !r.Complete || len(r.Exits) == 0 {
		return math.Inf(1)
	}
	sum := 0.0
	for _, e := range r.Exits {
		sum += e.EvacAt
	}
	// a tiny charge on route length keeps detours that no exit needs from piling up
	return r.Worst + 0.02*sum/float64(len(r.Exits)) + 1e-4*(r.RouteLengths[0]/im.s.Speed[0]+r.RouteLengths[1]/im.s.Speed[1])
}

func (im *improver) eval(st *imState, res *ImproveResult) (*engine.Report, bool) {
	p := im.toPlan(st)
	res.Evaluations++
	r, err := engine.Evaluate(im.s, p, im.m)
	if err != nil || !r.Complete {
		return nil, false
	}
	return r, true
}

// fromPlan converts a plan into item lists.
func (im *improver) fromPlan(p *engine.Plan) *imState {
	s := im.s
	st := &imState{}
	var rv [2][]int
	for a := 0; a < 2; a++ {
		for i, w := range p.Routes[a].Waypoints {
			if w.Rendezvous {
				rv[a] = append(rv[a], i)
			}
		}
	}
	paired := len(rv[0]) == len(rv[1]) && im.m.Rendezvous()
	if paired {
		for k := range rv[0] {
			p0 := s.Canon(p.Routes[0].Waypoints[rv[0][k]].P)
			p1 := s.Canon(p.Routes[1].Waypoints[rv[1][k]].P)
			if p0 != p1 {
				paired = false
				break
			}
		}
	}
	if paired {
		for _, i := range rv[0] {
			st.meet = append(st.meet, s.Canon(p.Routes[0].Waypoints[i].P))
		}
	}
	for a := 0; a < 2; a++ {
		wps := p.Routes[a].Waypoints
		cur, t := engine.At(s.Start), 0.0
		var items []imItem
		for i, w := range wps {
			q := s.Canon(w.P)
			arrive := t + s.PointDist(cur, q)/s.Speed[a]
			wait := math.Max(0, w.T-arrive)
			it := imItem{P: q, Wait: wait}
			if w.Rendezvous {
				if paired {
					it = imItem{Meet: true}
				} else if im.m.Rendezvous() {
					it.RV = true
				}
			}
			keep := true
			if !it.Meet && !it.RV && wait <= engine.Tol(w.T) && i+1 < len(wps) && len(items) > 0 {
				prev := cur
				next := s.Canon(wps[i+1].P)
				if d := s.PointDist(prev, q) + s.PointDist(q, next) - s.PointDist(prev, next); d <= 1e-9*math.Max(1, s.PointDist(prev, next)) {
					keep = false
				}
			}
			if keep {
				if !it.Meet && wait <= engine.Tol(w.T) {
					it.Wait = 0
				}
				items = append(items, it)
				cur = q
			}
			t = math.Max(arrive, w.T)
			if !keep {
				cur = q
			}
		}
		st.list[a] = items
	}
	return st
}

// toPlan turns item lists into routes with tight times; meetings wait for
// the later agent.
func (im *improver) toPlan(st *imState) *engine.Plan {
	s := im.s
	p := &engine.Plan{Planner: "improve", Model: im.m}
	var cur [2]engine.Point
	var t [2]float64
	var idx [2]int
	var wps [2][]engine.Waypoint
	cur[0], cur[1] = engine.At(s.Start), engine.At(s.Start)
	wps[0] = make([]engine.Waypoint, 0, len(st.list[0]))
	wps[1] = make([]engine.Waypoint, 0, len(st.list[1]))
	for k := 0; ; k++ {
		// walk each agent up to its next meeting (or the end)
		for a := 0; a < 2; a++ {
			for idx[a] < len(st.list[a]) && !st.list[a][idx[a]].Meet {
				it := st.list[a][idx[a]]
				idx[a]++
				t[a] += s.PointDist(cur[a], it.P) / s.Speed[a]
				t[a] += it.Wait
				cur[a] = it.P
				wps[a] = append(wps[a], engine.Waypoint{P: it.P, T: t[a], Rendezvous: it.RV})
			}
		}
		if k >= len(st.meet) || idx[0] >= len(st.list[0]) || idx[1] >= len(st.list[1]) {
			break
		}
		R := st.meet[k]
		tm := math.Max(t[0]+s.PointDist(cur[0], R)/s.Speed[0], t[1]+s.PointDist(cur[1], R)/s.Speed[1])
		for a := 0; a < 2; a++ {
			idx[a]++
			t[a], cur[a] = tm, R
			wps[a] = append(wps[a], engine.Waypoint{P: R, T: tm, Rendezvous: true})
		}
	}
	p.Routes[0].Waypoints, p.Routes[1].Waypoints = wps[0], wps[1]
	return p
}

// meetCount returns the number of meeting items in a list.
func meetCount(l []imItem) int {
	n := 0
	for _, it := range l {
		if it.Meet {
			n++
		}
	}
	return n
}

// meetRange returns the insert positions in l that put a meeting item k-th
// among the meeting items: after the (k−1)-th and up to the k-th.
func meetRange(l []imItem, k int) (lo, hi int) {
	n := 0
	lo, hi = 0, len(l)
	for i, it := range l {
		if it.Meet {
			if n == k-1 {
				lo = i + 1
			}
			if n == k {
				hi = i
				break
			}
			n++
		}
	}
	return lo, hi
}

// itemTimes returns the time at which agent a finishes each of its items
// (meetings ignoring the partner: a lower estimate, enough to align moves).
func (im *improver) itemTimes(st *imState, a int) []float64 {
	s := im.s
	out := make([]float64, len(st.list[a]))
	cur, t, k := engine.At(s.Start), 0.0, 0
	for i, it := range st.list[a] {
		p := it.P
		if it.Meet {
			if k < len(st.meet) {
				p = st.meet[k]
			}
			k++
		}
		t += s.PointDist(cur, p)/s.Speed[a] + it.Wait
		cur = p
		out[i] = t
	}
	return out
}

// otherStarts converts the plans of the other published planners, for restarts.
func (im *improver) otherStarts(ctx context.Context, start *engine.Plan) []*imState {
	var out []*imState
	for _, info := range published.Planners() {
		if !info.Supports(im.m) || info.Name == start.Planner {
			continue
		}
		p, err := published.MakePlan(ctx, im.s, info.Name, im.m)
		if err != nil {
			continue
		}
		out = append(out, im.fromPlan(p))
	}
	return out
}

// The moves each model draws from (face to face adds the rendezvous moves);
// the tour-structured ones (16–18) are listed twice to draw them more often.
var (
	imMovesRadio = []int{0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 16, 16, 17, 17, 18, 18}
	imMovesF2F   = []int{0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12, 13, 14, 15, 16, 16, 17, 17, 18, 18}
)

// meetCountBefore returns the position just after the last meeting item before end (0 if none).
func meetCountBefore(l []imItem, end int) int {
	for i := end - 1; i >= 0; i-- {
		if l[i].Meet {
			return i + 1
		}
	}
	return 0
}

// under reports whether node x lies in the subtree of v (rooted at the start).
func (im *improver) under(x, v int) bool {
	s := im.s
	if s.Level[x] < s.Level[v] {
		return false
	}
	return s.LCA(x, v) == v
}
