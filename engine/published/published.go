package published

import (
	"context"
	"fmt"

	"duosweep/engine"
)

// LargeSite is the node count above which each published planner builds
// only its canonical variant (the one its guarantee is proven for) instead of
// trying several, so that planning stays near-linear on huge sites.
const LargeSite = 20000

// Orders returns the child orders a planner tries on s.
func Orders(s *engine.Site, all []engine.ChildOrder) []engine.ChildOrder {
	if s.N > LargeSite {
		return []engine.ChildOrder{engine.OrderDeepLast}
	}
	return all
}

// pickBest evaluates every plan under m and returns the best (ties: the
// first). The winner keeps its report so that callers need not evaluate it again.
func pickBest(ctx context.Context, s *engine.Site, m engine.Model, plans []*engine.Plan) (*engine.Plan, error) {
	var best *engine.Plan
	var bestR *engine.Report
	for _, p := range plans {
		if err := ctx.Err(); err != nil {
			return nil, err
		}
		r, err := engine.Evaluate(s, p, m)
		if err != nil {
			return nil, fmt.Errorf("engine: internal planner error: %w", err)
		}
		if bestR == nil || engine.Better(r, bestR) {
			best, bestR = p, r
		}
	}
	if best != nil {
		best.SetEvaluated(bestR)
	}
	return best, nil
}

// lastNewCandidate returns the walk index at which the last candidate is
// first reached (0 when there are none).
func lastNewCandidate(s *engine.Site, w *engine.Walk) int {
	seen := make([]bool, s.N)
	last := 0
	for i, v := range w.Nodes {
		if s.Candidate[v] && !seen[v] {
			seen[v] = true
			last = i
		}
	}
	return last
}

// planTogether: both agents walk the same depth-first tour, stopping when
// the last candidate is reached. Tries every child order.
func planTogether(ctx context.Context, s *engine.Site, m engine.Model) (*engine.Plan, error) {
	var plans []*engine.Plan
	for _, o := range Orders(s, engine.AllOrders) {
		w := s.Tour(o)
		end := lastNewCandidate(s, w)
		p := &engine.Plan{Note: "one depth-first tour walked together, " + o.String()}
		for a := 0; a < 2; a++ {
			b := engine.NewRoute(s, a)
			b.ToNodes(w.Nodes[:end+1])
			p.Routes[a] = b.Route()
		}
		plans = append(plans, p)
	}
	return pickBest(ctx, s, m, plans)
}

// planOpposite: agent 0 walks the tour forwards, agent 1 backwards; they
// stop where they meet (at time 2W/(s0+s1), the midpoint with equal speeds),
// a rendezvous in the face-to-face model. Tries every child order and, with
// unequal speeds, both directions.
func planOpposite(ctx context.Context, s *engine.Site, m engine.Model) (*engine.Plan, error) {
	var plans []*engine.Plan
	dirs := []bool{false}
	if s.Speed[0] != s.Speed[1] {
		dirs = append(dirs, true)
	}
	for _, o := range Orders(s, engine.AllOrders) {
		w := s.Tour(o)
		for _, swap := range dirs {
			fw, bw := 0, 1
			if swap {
				fw, bw = 1, 0
			}
			p := &engine.Plan{Note: fmt.Sprintf("%s walks the tour forwards, %s backwards, %s", s.Names[fw], s.Names[bw], o)}
			p.Routes = OppositeRoutes(s, m, w, fw, BalancedCut(s, w, fw))
			if m.Rendezvous() {
				p.Note += "; rendezvous where they meet"
			}
			plans = append(plans, p)
		}
	}
	return pickBest(ctx, s, m, plans)
}

// BalancedCut is the arclength along the closed tour w where the agent fw
// walking forwards and the partner walking backwards arrive together.
func BalancedCut(s *engine.Site, w *engine.Walk, fw int) float64 {
	return w.Len() * s.Speed[fw] / (s.Speed[0] + s.Speed[1])
}

// OppositeRoutes returns the routes of agent fw walking the closed tour w
// forwards up to arclength cut and of the partner walking it backwards down
// to cut; face to face both mark a rendezvous there.
func OppositeRoutes(s *engine.Site, m engine.Model, w *engine.Walk, fw int, cut float64) [2]engine.Route {
	f, b := engine.NewRoute(s, fw), engine.NewRoute(s, 1-fw)
	f.WalkPrefix(s, w, cut)
	b.WalkSuffixReversed(s, w, cut)
	if m.Rendezvous() {
		f.Rendezvous()
		b.Rendezvous()
	}
	var r [2]engine.Route
	r[fw], r[1-fw] = f.Route(), b.Route()
	return r
}

// spineWalk is the walk down P that explores every side subtree as it
// passes, with the side work done at each walk node.
type spineWalk struct {
	engine.Walk
	side []float64 // side work (length walked off P) up to each node
	onP  []bool
}

func newSpineWalk(s *engine.Site, o engine.ChildOrder) *spineWalk {
	P := s.PathToFar()
	onP := make([]bool, s.N)
	for _, v := range P {
		onP[v] = true
	}
	sw := &spineWalk{onP: onP}
	for _, v := range P {
		sw.Push(s, v)
		s.AppendTour(&sw.Walk, v, o, func(c int) bool { return onP[c] })
	}
	sw.side = make([]float64, len(sw.Nodes))
	for k := 1; k < len(sw.Nodes); k++ {
		d := sw.Arc[k] - sw.Arc[k-1]
		sw.side[k] = sw.side[k-1]
		if !(onP[sw.Nodes[k-1]] && onP[sw.Nodes[k]]) {
			sw.side[k] += d
		}
	}
	return sw
}

// cutAt returns the arclength of the walk at which the side work reaches target.
func (sw *spineWalk) cutAt(target float64) float64 {
	for k := 1; k < len(sw.Nodes); k++ {
		if sw.side[k] >= target && sw.side[k] > sw.side[k-1] {
			return sw.Arc[k-1] + (target - sw.side[k-1])
		}
	}
	return 0
}

// planSpine: the spine split of MODEL.md §6. The first agent walks the spine
// walk up to the cut (where the given share of the side work is done), then
// straight back to P and down to its far end; the second goes straight to
// the cut and walks the rest. Tries child orders, the half cut and the
// speed-weighted cut, and both role assignments.
func planSpine(ctx context.Context, s *engine.Site, m engine.Model) (*engine.Plan, error) {
	b := engine.ComputeBounds(s)
	var plans []*engine.Plan
	shares := []float64{0.5}
	if s.Speed[0] != s.Speed[1] {
		shares = append(shares, s.Speed[0]/(s.Speed[0]+s.Speed[1]), s.Speed[1]/(s.Speed[0]+s.Speed[1]))
	}
	for _, o := range Orders(s, []engine.ChildOrder{engine.OrderDeepLast, engine.OrderIndex, engine.OrderDeepFirst}) {
		sw := newSpineWalk(s, o)
		total := sw.side[len(sw.side)-1]
		for _, share := range shares {
			cut := sw.cutAt(share * total)
			cp, ci := sw.PointAt(s, cut)
			// where the cut's branch leaves P
			attach := sw.Nodes[ci]
			for !sw.onP[attach] {
				attach = int(s.Parent[attach])
			}
			roles := []int{0, 1}
			if s.Speed[0] == s.Speed[1] {
				roles = roles[:1] // the mirror plan is the same plan with the names swapped
			}
			for _, first := range roles {
				p := &engine.Plan{Note: fmt.Sprintf("%s takes the spine walk up to %.0f%% of the side work, %s the rest, %s",
					s.Names[first], share*100, s.Names[1-first], o)}
				ra, rb := engine.NewRoute(s, first), engine.NewRoute(s, 1-first)
				ra.ToNodes(sw.Nodes[:ci+1])
				ra.To(cp)
				ra.To(engine.At(attach))
				ra.To(engine.At(b.Far))
				rb.To(cp)
				rb.ToNodes(sw.Nodes[ci+1:])
				p.Routes[first], p.Routes[1-first] = ra.Route(), rb.Route()
				plans = append(plans, p)
			}
		}
	}
	return pickBest(ctx, s, m, plans)
}
