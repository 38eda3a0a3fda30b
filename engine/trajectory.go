package engine

import (
	"fmt"
	"math"
	"sort"
)

// Seg is one elementary piece of a trajectory: over [T0, T1] the agent moves
// at constant speed along corridor E from offset O0 to O1 (offsets from
// corridor end EU[E]), or waits (O0 == O1; E < 0 means waiting at Node).
type Seg struct {
	T0, T1 float64
	E      int32
	Node   int32
	O0, O1 float64
	// N0 and N1 are the nodes where the segment starts and ends, -1 inside a corridor.
	N0, N1 int32
}

// Trajectory is a route expanded into elementary segments. Build it with
// Site.Trajectory; it answers position queries in O(log segments).
type Trajectory struct {
	site   *Site
	Agent  int
	Segs   []Seg
	Length float64 // total length walked
	End    float64 // time of the last waypoint (0 for an empty route)
	// Rendezvous waypoints in time order: time, place, and how many
	// segments the trajectory has up to that moment.
	RVTime []float64
	RVAt   []Point
	RVSegs []int
	RVWp   []int     // waypoint index of each rendezvous
	WpTime []float64 // when the agent leaves each waypoint (its time, or its arrival if later within tolerance)
	start  Point
	down   []int32 // scratch for walkNodes
}

// NewTrajectory returns an empty trajectory of agent a standing at start,
// for searches that grow a trajectory leg by leg (Walk, AddWait).
func NewTrajectory(s *Site, a int, start Point) *Trajectory {
	return &Trajectory{site: s, Agent: a, start: start}
}

// Trajectory expands agent a's route into segments, checking that times do
// not go down and never ask for more than full speed. O(waypoints · log n +
// total path length).
func (s *Site) Trajectory(r Route, a int) (*Trajectory, error) {
	tr := &Trajectory{site: s, Agent: a, start: At(s.Start), Segs: make([]Seg, 0, 2*len(r.Waypoints)+1)}
	speed := s.Speed[a]
	cur := At(s.Start)
	t := 0.0
	for i, wp := range r.Waypoints {
		if err := s.CheckPoint(wp.P); err != nil {
			return nil, fmt.Errorf("engine: route of %s, waypoint %d: %w", s.Names[a], i, err)
		}
		if !finite(wp.T) {
			return nil, fmt.Errorf("engine: route of %s, waypoint %d: time %g is not finite", s.Names[a], i, wp.T)
		}
		p := s.Canon(wp.P)
		mark := len(tr.Segs)
		d := tr.Walk(cur, p, t, speed)
		arrive := t + d/speed
		if wp.T < arrive-Tol(arrive) {
			return nil, fmt.Errorf("engine: route of %s, waypoint %d: t=%g but the earliest arrival at full speed is t=%g", s.Names[a], i, wp.T, arrive)
		}
		if n := len(tr.Segs); n > mark {
			tr.Segs[n-1].T1 = arrive // the sum of the pieces, exactly as the check used
		}
		tr.Length += d
		tEnd := math.Max(wp.T, arrive)
		if tEnd > arrive {
			tr.AddWait(p, arrive, tEnd)
		}
		t, cur = tEnd, p
		tr.WpTime = append(tr.WpTime, t)
		if wp.Rendezvous {
			tr.RVTime = append(tr.RVTime, t)
			tr.RVAt = append(tr.RVAt, p)
			tr.RVSegs = append(tr.RVSegs, len(tr.Segs))
			tr.RVWp = append(tr.RVWp, i)
		}
	}
	tr.End = t
	return tr, nil
}

// AddWait appends a wait at p from t0 to t1 (for searches that grow a
// trajectory leg by leg).
func (tr *Trajectory) AddWait(p Point, t0, t1 float64) {
	sg := Seg{T0: t0, T1: t1, E: -1, Node: int32(p.From), N0: int32(p.From), N1: int32(p.From)}
	if p.To >= 0 {
		e := tr.site.Edge(p.From, p.To)
		o := p.Offset
		if int(tr.site.EU[e]) != p.From {
			o = tr.site.EW[e] - o
		}
		sg = Seg{T0: t0, T1: t1, E: int32(e), Node: -1, O0: o, O1: o, N0: -1, N1: -1}
	}
	tr.Segs = append(tr.Segs, sg)
}

// move appends a segment along corridor e from offset o0 to o1 (from EU[e]), starting at t.
func (tr *Trajectory) move(e int, o0, o1, t, speed float64) float64 {
	if o0 == o1 {
		return t
	}
	t1 := t + math.Abs(o1-o0)/speed
	tr.Segs = append(tr.Segs, Seg{T0: t, T1: t1, E: int32(e), Node: -1, O0: o0, O1: o1,
		N0: tr.site.nodeAtOffset(e, o0), N1: tr.site.nodeAtOffset(e, o1)})
	return t1
}

// offsetOn returns the offset of point p from EU[e], p lying on corridor e.
func (s *Site) offsetOn(p Point, e int) float64 {
	if p.To < 0 {
		if p.From == int(s.EU[e]) {
			return 0
		}
		return s.EW[e]
	}
	if p.From == int(s.EU[e]) {
		return p.Offset
	}
	return s.EW[e] - p.Offset
}

// Walk appends the segments of the shortest path from a to b (canonical
// points), leaving at t, and returns the length walked.
func (tr *Trajectory) Walk(a, b Point, t, speed float64) float64 {
	s := tr.site
	if a == b {
		return 0
	}
	if a.To < 0 && b.To < 0 {
		return tr.walkNodes(a.From, b.From, t, speed)
	}
	// same corridor
	var e int
	if a.To >= 0 {
		e = s.Edge(a.From, a.To)
	} else {
		e = s.Edge(b.From, b.To)
	}
	onE := func(p Point) bool {
		if p.To >= 0 {
			return s.Edge(p.From, p.To) == e
		}
		return p.From == int(s.EU[e]) || p.From == int(s.EV[e])
	}
	if onE(a) && onE(b) {
		o0, o1 := s.offsetOn(a, e), s.offsetOn(b, e)
		tr.move(e, o0, o1, t, speed)
		return math.Abs(o1 - o0)
	}
	// leave a through its best end, arrive at b through its best end
	au, adu, av, adv := s.Ends(a)
	bu, bdu, bv, bdv := s.Ends(b)
	type opt struct {
		x, y int
		d    float64
	}
	best := opt{au, bu, adu + bdu + s.Dist(au, bu)}
	for _, o := range []opt{{av, bu, adv + bdu + s.Dist(av, bu)}, {au, bv, adu + bdv + s.Dist(au, bv)}, {av, bv, adv + bdv + s.Dist(av, bv)}} {
		if o.d < best.d {
			best = o
		}
	}
	d := 0.0
	if a.To >= 0 {
		e := s.Edge(a.From, a.To)
		o0, o1 := s.offsetOn(a, e), s.offsetOn(At(best.x), e)
		t = tr.move(e, o0, o1, t, speed)
		d += math.Abs(o1 - o0)
	}
	dn := tr.walkNodes(best.x, best.y, t, speed)
	t += dn / speed
	d += dn
	if b.To >= 0 {
		e := s.Edge(b.From, b.To)
		o0, o1 := s.offsetOn(At(best.y), e), s.offsetOn(b, e)
		tr.move(e, o0, o1, t, speed)
		d += math.Abs(o1 - o0)
	}
	return d
}

// walkNodes appends the corridors of the tree path from node u to node v.
func (tr *Trajectory) walkNodes(u, v int, t, speed float64) float64 {
	s := tr.site
	if u == v {
		return 0
	}
	step := func(x, y int) {
		e := s.Edge(x, y)
		w := s.EW[e]
		o0, o1 := 0.0, w
		if int(s.EU[e]) != x {
			o0, o1 = w, 0
		}
		t = tr.move(e, o0, o1, t, speed)
	}
	d := 0.0
	if e := s.Edge(u, v); e >= 0 { // neighbours: the common case in tours
		step(u, v)
		return s.EW[e]
	}
	a := s.LCA(u, v)
	for x := u; x != a; x = int(s.Parent[x]) {
		step(x, int(s.Parent[x]))
		d += s.EW[s.ParentEdge[x]]
	}
	tr.down = tr.down[:0]
	for x := v; x != a; x = int(s.Parent[x]) {
		tr.down = append(tr.down, int32(x))
	}
	prev := a
	for i := len(tr.down) - 1; i >= 0; i-- {
		x := int(tr.down[i])
		step(prev, x)
		d += s.EW[s.ParentEdge[x]]
		prev = x
	}
	return d
}

// nodeAtOffset returns the node at offset o of corridor e (from EU[e]), or -1 inside it.
func (s *Site) nodeAtOffset(e int, o float64) int32 {
	if o == 0 {
		return s.EU[e]
	}
	if o == s.EW[e] {
		return s.EV[e]
	}
	return -1
}

// segPoint returns the position within segment g at time t (clamped to it).
func (s *Site) segPoint(g *Seg, t float64) Point {
	if g.E < 0 {
		return At(int(g.Node))
	}
	o := g.O0
	if g.T1 > g.T0 {
		f := (t - g.T0) / (g.T1 - g.T0)
		f = math.Max(0, math.Min(1, f))
		o = g.O0 + (g.O1-g.O0)*f
	}
	e := int(g.E)
	return s.Canon(Point{From: int(s.EU[e]), To: int(s.EV[e]), Offset: o})
}

// PositionAt returns where the agent is at time t, following only its
// uninformed route. O(log segments).
func (tr *Trajectory) PositionAt(t float64) Point {
	if len(tr.Segs) == 0 || t <= tr.Segs[0].T0 {
		if len(tr.Segs) == 0 {
			return tr.start
		}
		return tr.site.segPoint(&tr.Segs[0], tr.Segs[0].T0)
	}
	i := sort.Search(len(tr.Segs), func(i int) bool { return tr.Segs[i].T1 >= t })
	if i == len(tr.Segs) {
		g := &tr.Segs[len(tr.Segs)-1]
		return tr.site.segPoint(g, g.T1)
	}
	return tr.site.segPoint(&tr.Segs[i], t)
}

// positionFrom is PositionAt for a caller whose times never go down: hint is
// the segment index the previous call returned. Amortised O(1) per call.
func (tr *Trajectory) positionFrom(t float64, hint int) (Point, int) {
	n := len(tr.Segs)
	if n == 0 || t <= tr.Segs[0].T0 {
		return tr.PositionAt(t), 0
	}
	j := hint
	for j < n && tr.Segs[j].T1 < t {
		j++
	}
	if j == n {
		return tr.FinalPoint(), n
	}
	return tr.site.segPoint(&tr.Segs[j], t), j
}

// FinalPoint returns where the agent stays after its last waypoint.
func (tr *Trajectory) FinalPoint() Point {
	if len(tr.Segs) == 0 {
		return tr.start
	}
	g := &tr.Segs[len(tr.Segs)-1]
	return tr.site.segPoint(g, g.T1)
}

// FirstVisits returns, for every node, the first time the agent stands on it
// (passing through counts), +Inf for nodes never reached. O(segments + n).
func (tr *Trajectory) FirstVisits() []float64 {
	fv, _ := tr.firstVisits()
	return fv
}

// firstVisits returns the first-visit times and the nodes in the order the
// agent first reaches them (the start first).
func (tr *Trajectory) firstVisits() ([]float64, []int32) {
	s := tr.site
	fv := make([]float64, s.N)
	for i := range fv {
		fv[i] = math.Inf(1)
	}
	order := make([]int32, 0, 64)
	fv[s.Start] = 0
	order = append(order, int32(s.Start))
	see := func(v int32, t float64) {
		if v >= 0 && t < fv[v] {
			if math.IsInf(fv[v], 1) {
				order = append(order, v)
			}
			fv[v] = t
		}
	}
	for i := range tr.Segs {
		g := &tr.Segs[i]
		see(g.N0, g.T0)
		see(g.N1, g.T1)
	}
	return fv, order
}

// Trajectories expands both routes of a plan.
func (s *Site) Trajectories(p *Plan) ([2]*Trajectory, error) {
	var out [2]*Trajectory
	for a := 0; a < 2; a++ {
		tr, err := s.Trajectory(p.Routes[a], a)
		if err != nil {
			return out, err
		}
		out[a] = tr
	}
	return out, nil
}
