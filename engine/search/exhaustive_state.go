package search

import (
	"fmt"
	"math"
	"sort"
	"time"

	"duosweep/engine"
)

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
