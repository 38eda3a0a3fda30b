package search

// The tour phase of the improve planner: local search over the
// opposite-tours class with free child orders and a free split point.
//
// A state is a depth-first tour of the search tree (any child order at every
// node) and a cut point on it: one agent walks the tour forwards up to the
// cut, the other walks it backwards up to the cut (face to face: both mark a
// rendezvous there). The published opposite-tours planner is the special
// case of one fixed child rule and the cut that balances the two walks. The
// item-list moves of improve.go cannot easily change the order of children
// whose subtrees the cut divides between the agents (that hands whole
// subtrees across); in this representation it is one swap. Moves: swap two
// children of a branch node (often one on the path to the cut point),
// reverse a node's children, slide the cut, swap the agents' directions.
// Every state is scored by Evaluate; a move is kept when the score (the
// improve score: worst plus a small share of the mean) does not get worse.

import (
	"context"
	"math"
	"time"

	"duosweep/engine"
	"duosweep/engine/published"
)

type tourState struct {
	kids [][]int // search children of each node, in tour order
	cut  float64 // arclength of the cut along the tour
	fw   int     // the agent that walks forwards
}

func (ts *tourState) clone() *tourState {
	c := &tourState{kids: make([][]int, len(ts.kids)), cut: ts.cut, fw: ts.fw}
	copy(c.kids, ts.kids) // the per-node slices are copied on write
	return c
}

// tourWalk returns the closed tour of the search tree in ts's child order.
func (im *improver) tourWalk(ts *tourState) *engine.Walk {
	s := im.s
	w := &engine.Walk{Nodes: make([]int, 0, 2*len(im.tourNodes)), Arc: make([]float64, 0, 2*len(im.tourNodes))}
	w.Push(s, s.Start)
	s.AppendTourWith(w, s.Start, func(v int) []int { return ts.kids[v] }, nil)
	return w
}

// tourPlan returns the plan of state ts and its tour.
func (im *improver) tourPlan(ts *tourState) (*engine.Plan, *engine.Walk) {
	w := im.tourWalk(ts)
	return im.tourPlanOn(ts, w), w
}

// tourPlanOn returns the plan of state ts on its tour w.
func (im *improver) tourPlanOn(ts *tourState, w *engine.Walk) *engine.Plan {
	return &engine.Plan{Planner: "improve", Model: im.m, Routes: published.OppositeRoutes(im.s, im.m, w, ts.fw, ts.cut)}
}

// tourStart returns the best state over the child rules and directions
// (the opposite-tours plans, with the balanced cut), with its plan, tour and
// report, stopping early at the deadline or on cancellation (nil when not
// even one was scored).
func (im *improver) tourStart(ctx context.Context, deadline time.Time, res *ImproveResult) (*tourState, *engine.Plan, *engine.Walk, *engine.Report) {
	s := im.s
	var best *tourState
	var bestP *engine.Plan
	var bestW *engine.Walk
	var bestR *engine.Report
	for _, o := range published.Orders(s, engine.AllOrders) {
		for fw := 0; fw < 2; fw++ {
			if ctx.Err() != nil || !deadline.IsZero() && time.Now().After(deadline) {
				return best, bestP, bestW, bestR
			}
			ts := &tourState{kids: make([][]int, s.N), fw: fw}
			for _, v := range im.tourNodes {
				ts.kids[v] = s.SearchChildren(v, o) // shared, never written: moves copy
			}
			w := im.tourWalk(ts)
			ts.cut = published.BalancedCut(s, w, fw)
			p := im.tourPlanOn(ts, w)
			r, err := engine.Evaluate(s, p, im.m)
			res.Evaluations++
			if err != nil || !r.Complete {
				continue
			}
			if bestR == nil || im.score(r) < im.score(bestR) {
				best, bestP, bestW, bestR = ts, p, w, r
			}
		}
	}
	return best, bestP, bestW, bestR
}

// tourMutate returns a changed copy of ts (w is ts's tour), or nil.
func (im *improver) tourMutate(ts *tourState, w *engine.Walk) *tourState {
	s := im.s
	rng := im.rng
	c := ts.clone()
	twoW := w.Len()
	switch k := rng.IntN(10); {
	case k < 5: // swap two children of a branch node, half the time one on the path to the cut
		if len(im.branch) == 0 {
			return nil
		}
		v := im.branch[rng.IntN(len(im.branch))]
		if k < 3 {
			_, i := w.PointAt(s, ts.cut)
			var path []int
			for u := w.Nodes[i]; u >= 0; u = int(s.Parent[u]) {
				if len(ts.kids[u]) >= 2 {
					path = append(path, u)
				}
			}
			if len(path) > 0 {
				v = path[rng.IntN(len(path))]
			}
		}
		kv := append([]int(nil), ts.kids[v]...)
		i, j := rng.IntN(len(kv)), rng.IntN(len(kv))
		if i == j {
			return nil
		}
		kv[i], kv[j] = kv[j], kv[i]
		c.kids[v] = kv
	case k < 6: // reverse a node's children
		if len(im.branch) == 0 {
			return nil
		}
		v := im.branch[rng.IntN(len(im.branch))]
		kv := append([]int(nil), ts.kids[v]...)
		for i, j := 0, len(kv)-1; i < j; i, j = i+1, j-1 {
			kv[i], kv[j] = kv[j], kv[i]
		}
		c.kids[v] = kv
	case k < 9: // slide the cut a little or a lot
		scale := 0.01
		if rng.IntN(3) == 0 {
			scale = 0.1
		}
		c.cut = math.Max(0, math.Min(twoW, ts.cut+(rng.Float64()-0.5)*2*scale*twoW))
	default: // the other agent walks forwards
		c.fw = 1 - ts.fw
		c.cut = twoW - ts.cut
	}
	return c
}

// tourPhase runs the tour search for at most iters iterations (when > 0) or
// until the deadline, and returns its best plan and report.
func (im *improver) tourPhase(ctx context.Context, iters int, deadline time.Time, res *ImproveResult) (*engine.Plan, *engine.Report) {
	s := im.s
	if im.tourNodes == nil {
		for _, v := range s.Order {
			if s.InSearch[v] {
				im.tourNodes = append(im.tourNodes, int(v))
				if n := len(s.SearchChildren(int(v), 0)); n >= 2 {
					im.branch = append(im.branch, int(v))
				}
			}
		}
	}
	cur, curP, curW, curR := im.tourStart(ctx, deadline, res)
	if cur == nil {
		return nil, nil
	}
	bestP, bestR := curP, curR
	curScore := im.score(curR)
	for it := 0; iters <= 0 || it < iters; it++ {
		if it&15 == 0 && (ctx.Err() != nil || !deadline.IsZero() && time.Now().After(deadline)) {
			break
		}
		res.Iterations++
		c := im.tourMutate(cur, curW)
		if c == nil {
			continue
		}
		p, w := im.tourPlan(c)
		r, err := engine.Evaluate(s, p, im.m)
		res.Evaluations++
		if err != nil || !r.Complete {
			continue
		}
		if sc := im.score(r); sc <= curScore {
			cur, curW, curScore = c, w, sc
			res.Accepted++
		}
		if engine.Better(r, bestR) {
			bestP, bestR = p, r
		}
	}
	return bestP, bestR
}
