package engine

// LB3, the last-discovery cover bound (docs/lower-bound.md has the proof).
//
// Let x be the candidate discovered last, at time T, by agent F, and let G
// be the partner, at point p at time T. Every candidate has been visited by
// then, so the two routes up to T cover the search tree: F's a walk from the
// start to x covering a rooted subtree S_F, G's a walk from the start to p
// covering S_G. A walk from s to y covering S is at least 2|S ∪ P_y| − d(s,y)
// long, and G still has to reach x, so
//
//	evac(x) ≥ max( (2|S_F| − D_x)/v_F ,  T + d(p,x)/v_G )
//	        ≥ max( (2|S_F| − D_x)/v_F ,  (2|S_G ∪ P_p| − D_p + d(p,x))/v_G )
//	        ≥ max( (2|S_F| − D_x)/v_F ,  (2|S_G ∪ P_x| − D_x)/v_G ),
//
// the last step because a walk s → (cover S_G) → p → x is a walk from s to x
// covering S_G. Both sets hold the path P_x, so with a and b the lengths of
// the rest of each set:
//
//	worst ≥ LB3 = min over candidates x and covers (a, b) of
//	              max( (D_x + 2a)/v_0 , (D_x + 2b)/v_1 ).
//
// LB3 ≥ W/v_max always (a + b ≥ W − D_x; it can be below LB2), and it is larger when the tree
// does not split evenly: on the star with four unit leaves it is 5, the
// optimum, where LB is 4. Computing it exactly is NP-hard (it decides the
// PARTITION stars of MODEL.md §6), so the covers are held as Pareto
// frontiers of (a, b) that are thinned, when they grow past a cap, only by
// replacing points with a point that dominates them: the value can only get
// smaller, so what is computed is always a valid lower bound, and it is the
// exact LB3 while no frontier reaches the cap.

import (
	"math"
	"slices"
)

// lb3Work caps the work (point pairs summed): LB3 is computed exactly or
// not at all (Bounds.LB3 = 0), and sites that need more are the large ones,
// where an even split is nearly always possible and LB3 hardly exceeds W.
// lb3MaxNodes is the largest search tree it is tried on, and lb3Above the
// cap U = lb3Above·max(LB1, LB2)/v_slower: frontier points that alone push the bound
// past U are dropped, and the result is min(LB3 of the rest, U), still a
// valid bound (covers only grow as they are summed).
const (
	lb3Work     = 250_000
	lb3MaxNodes = 300
	lb3Above    = 1.25
)

type fpt struct{ a, b float64 } // the off-path lengths the two agents cover

// lb3 returns LB3 (a time) for s, of done(x) with a finish (min over the
// last-found x of its cover value + o(x), docs/lower-bound.md), or 0 when the search tree is larger than
// lb3MaxNodes or there is no candidate.
func lb3(s *Site, lb12 float64) float64 {
	n := 0
	for v := 0; v < s.N; v++ {
		if s.InSearch[v] {
			n++
		}
	}
	if s.candidateCount() == 0 || n > lb3MaxNodes {
		return 0
	}
	// lb12 is at the faster speed; LB3 charges each agent its own speed
	U := lb3Above * lb12 * math.Max(s.Speed[0], s.Speed[1]) / math.Min(s.Speed[0], s.Speed[1])
	sc := lb3Scratch{capA: U * s.Speed[0] / 2, capB: U * s.Speed[1] / 2}
	// subtree lengths, cover frontiers and each child's options, children
	// before parents
	wsub := make([]float64, s.N)
	F := make([][]fpt, s.N)
	opt := make([][]fpt, s.N)
	for i := len(s.Order) - 1; i >= 0; i-- {
		v := int(s.Order[i])
		if !s.InSearch[v] {
			continue
		}
		acc := []fpt{{0, 0}}
		for _, c := range s.Children(v) {
			if !s.InSearch[c] {
				continue
			}
			wsub[v] += wsub[c] + s.EW[s.ParentEdge[c]]
			opt[c] = sc.option(s, int(c), wsub, F)
			acc = sc.sum(acc, opt[c])
		}
		F[v] = acc
		if sc.over {
			return 0
		}
	}
	// frontiers of what hangs off the path to each node, parents first
	G := make([][]fpt, s.N)
	G[s.Start] = []fpt{{0, 0}}
	best := math.Inf(1)
	var kids []int
	var opts, pre [][]fpt
	for _, vv := range s.Order {
		v := int(vv)
		if !s.InSearch[v] {
			continue
		}
		if sc.over {
			return 0
		}
		if s.Candidate[v] {
			sc.work += len(G[v]) * len(F[v])
			// with a finish, the last-found x is still to be carried out
			best = math.Min(best, lb3At(s.Depth[v], G[v], F[v], s.Speed)+s.Out(v))
		}
		kids, opts, pre = kids[:0], opts[:0], pre[:0]
		for _, c := range s.Children(v) {
			if s.InSearch[c] {
				kids = append(kids, int(c))
				opts = append(opts, opt[c])
			}
		}
		// G(child i) = G(v) ⊕ options of every sibling: prefix and suffix sums
		acc := G[v]
		for i := range kids {
			pre = append(pre, acc)
			if i+1 < len(kids) {
				acc = sc.sum(acc, opts[i])
			}
		}
		suf := []fpt{{0, 0}}
		for i := len(kids) - 1; i >= 0; i-- {
			G[kids[i]] = sc.sum(pre[i], suf)
			suf = sc.sum(suf, opts[i])
		}
		F[v], G[v], opt[v] = nil, nil, nil // no longer needed
	}
	if sc.over {
		return 0
	}
	// dropped points alone reach U, so with the carry they reach U + min o
	return math.Min(best, U+s.minOut())
}

// lb3At is the bound for the last discovery at a candidate at depth d, with
// off-path frontier g and subtree frontier f.
func lb3At(d float64, g, f []fpt, speed [2]float64) float64 {
	best := math.Inf(1)
	for _, p := range g {
		for _, q := range f {
			t := math.Max((d+2*(p.a+q.a))/speed[0], (d+2*(p.b+q.b))/speed[1])
			best = math.Min(best, t)
		}
	}
	return best
}

type lb3Scratch struct {
	capA, capB float64 // points with a ≥ capA or b ≥ capB are dropped
	buf, tmp   []fpt
	work       int  // point pairs summed so far
	over       bool // the budget ran out
}

// option returns the frontier of ways to cover child c's corridor and
// subtree: all by one agent, all by the other, or both walk the corridor and
// share the subtree.
func (sc *lb3Scratch) option(s *Site, c int, wsub []float64, F [][]fpt) []fpt {
	w := s.EW[s.ParentEdge[c]]
	tot := w + wsub[c]
	out := make([]fpt, 0, len(F[c])+2)
	out = append(out, fpt{0, tot}, fpt{tot, 0})
	for _, q := range F[c] {
		out = append(out, fpt{w + q.a, w + q.b})
	}
	return sc.pareto(out)
}

// sum returns the Minkowski sum of two frontiers (nil once the work budget
// is spent). A frontier may be empty: every cover of that part already
// reaches the cap.
func (sc *lb3Scratch) sum(p, q []fpt) []fpt {
	if len(p) < len(q) {
		p, q = q, p
	}
	sc.work += len(p) * len(q)
	if sc.work > lb3Work {
		sc.over = true
		return nil
	}
	if len(q) == 0 {
		return []fpt{}
	}
	// both are sorted by a with b falling: merge the shifted copies of p one
	// by one, keeping only the frontier (no sort)
	res := append(sc.buf[:0], p...)
	for i := range res {
		res[i] = fpt{res[i].a + q[0].a, res[i].b + q[0].b}
	}
	res = sc.capped(res)
	tmp := sc.tmp[:0]
	for _, y := range q[1:] {
		tmp = tmp[:0]
		i, j, minB := 0, 0, math.Inf(1)
		for i < len(res) || j < len(p) {
			var x fpt
			if j >= len(p) || i < len(res) && (res[i].a < p[j].a+y.a || res[i].a == p[j].a+y.a && res[i].b <= p[j].b+y.b) {
				x = res[i]
				i++
			} else {
				x = fpt{p[j].a + y.a, p[j].b + y.b}
				j++
			}
			if x.b < minB && x.a < sc.capA && x.b < sc.capB {
				tmp = append(tmp, x)
				minB = x.b
			}
		}
		res, tmp = tmp, res
	}
	sc.buf, sc.tmp = res, tmp
	return append([]fpt(nil), res...)
}

// capped drops, in place, the points of a frontier that reach the cap.
func (sc *lb3Scratch) capped(f []fpt) []fpt {
	out := f[:0]
	for _, x := range f {
		if x.a < sc.capA && x.b < sc.capB {
			out = append(out, x)
		}
	}
	return out
}

// pareto sorts pts by a and keeps the points no other point dominates
// (in place; the result aliases pts).
func (sc *lb3Scratch) pareto(pts []fpt) []fpt {
	slices.SortFunc(pts, func(x, y fpt) int {
		switch {
		case x.a < y.a:
			return -1
		case x.a > y.a:
			return 1
		case x.b < y.b:
			return -1
		case x.b > y.b:
			return 1
		}
		return 0
	})
	out := pts[:0]
	minB := math.Inf(1)
	for _, x := range pts {
		if x.a >= sc.capA || x.b >= sc.capB {
			continue
		}
		if x.b < minB {
			out = append(out, x)
			minB = x.b
		}
	}
	return out
}
