package search

import (
	"math"
	"sort"

	"duosweep/engine"
)

// decide is one decision of the search: agent m has ended a leg at time
// g.T. It settles what it can, prunes by the lower bounds and the memo, then
// tries each option (exOpt) in turn, stepping the search and undoing the
// step afterwards.
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
	og := &x.ag[o]
	unv := x.allMask &^ vis
	if lb = x.unvisitedBound(m, T, unv, lb); lb >= x.inc*(1-1e-12) {
		return
	}
	dominated, pending, np := x.memoize(m, T, vis, maxSettled, pending)
	if dominated {
		return
	}

	opts := x.options(m, vis, unv)
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

// exOpt is one option of a decision: where the deciding agent's next leg goes.
type exOpt struct {
	kind int     // 0 target, 1 park, 2 rendezvous, 3 go to the partner's rendezvous
	v    int     // the node
	d    float64 // its distance from the agent
}

// byDist sorts options nearest first, ties by node.
func byDist(o []exOpt) {
	sort.Slice(o, func(i, j int) bool {
		if o[i].d != o[j].d {
			return o[i].d < o[j].d
		}
		return o[i].v < o[j].v
	})
}

// options lists the decision's options for agent m (vis: the candidates
// visited by its time, unv the others), in the order they are tried: the
// frontier of unvisited candidates reachable without passing another one,
// nearest first; then the partner's rendezvous when it waits, or else the
// parking anchors and (face to face) the rendezvous anchors, each nearest
// first.
func (x *exSearch) options(m int, vis, unv uint32) []exOpt {
	s := x.s
	o := 1 - m
	g, og := &x.ag[m], &x.ag[o]
	var opts []exOpt
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
				opts = append(opts, exOpt{0, u, s.Dist(g.pos, u)})
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
		opts = append(opts, exOpt{kind: 3, v: og.rv, d: s.Dist(g.pos, og.rv)})
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
			var parks []exOpt
			for _, u := range reach {
				if !x.anchor[u] && u != g.pos {
					continue
				}
				if u != g.pos && !x.cfg.noPrune && !x.inSteiner(need, g.pos, u) {
					continue
				}
				parks = append(parks, exOpt{1, u, s.Dist(g.pos, u)})
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
			var rvs []exOpt
			for _, u := range reach {
				if x.anchor[u] && (!equal || x.inSteiner2(need, g.pos, og.pos, u)) {
					rvs = append(rvs, exOpt{2, u, s.Dist(g.pos, u)})
				}
			}
			byDist(rvs)
			opts = append(opts, rvs...)
		}
	}
	return opts
}

// unvisitedBound raises the lower bound lb of a decision of agent m at time
// T with what the unvisited candidates unv still cost: both agents must get
// to each of them from where they are at T, and the Steiner tree of unv
// must be walked (at the faster speed). It returns as soon as lb reaches
// the incumbent.
func (x *exSearch) unvisitedBound(m int, T float64, unv uint32, lb float64) float64 {
	s := x.s
	o := 1 - m
	g, og := &x.ag[m], &x.ag[o]
	// unvisited candidates: both agents must get there from where they are at T
	po := og.tr.PositionAt(T)
	if og.status == agStopped && T >= og.T {
		po = engine.At(og.pos)
	}
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
		return lb
	}
	sw := x.steinerW(unv, g.pos)
	if b := T + (2*sw-s.NodeDist(po, g.pos))/(2*x.vmax); b > lb && !x.cfg.noPrune {
		lb = b
	}
	return lb
}

// memoize looks the decision of agent m at time T up in the memo: it
// reports whether an earlier state with the same key (exKey) dominates this
// one, and otherwise records it. It also returns pending (whether found
// candidates with open evacuation times keep the state out of the memo) and
// np, how many of them joined the key (-1: too many).
func (x *exSearch) memoize(m int, T float64, vis uint32, maxSettled float64, pending bool) (dominated, _ bool, np int) {
	s := x.s
	g, og := &x.ag[m], &x.ag[1-m]
	// memo (face to face with equal speeds: up to four pending candidates
	// join the key, as their evacuation times then depend only on the future)
	var pend [4]exPend
	np = 0
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
				return true, pending, np
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
	return false, pending, np
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
