package engine

import (
	"fmt"
	"math"
	"sort"
)

// Waypoint is a timed place on an agent's uninformed route (MODEL.md §2): the
// agent walks the tree path to P at full speed, then waits there until T.
// Rendezvous marks a waypoint where, in the face-to-face model, an uninformed
// agent waits for its partner.
type Waypoint struct {
	P          Point
	T          float64
	Rendezvous bool
}

// Route is the uninformed route of one agent. The agent is at the start at
// time 0 before the first waypoint; after the last waypoint it stays put.
type Route struct {
	Waypoints []Waypoint
}

// Plan is a pair of uninformed routes, one per agent (index 0 and 1, in the
// scenario's agent order).
type Plan struct {
	Planner string // the planner that made it, "" for a hand-made plan
	Model   Model  // the model it was made for
	Routes  [2]Route
	Note    string // what the planner chose, in a sentence
}

// Seg is one elementary piece of a trajectory: over [T0, T1] the agent moves
// at constant speed along corridor E from offset O0 to O1 (offsets from
// corridor end EU[E]), or waits (O0 == O1; E < 0 means waiting at Node).
type Seg struct {
	T0, T1 float64
	E      int32
	Node   int32
	O0, O1 float64
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
}

// timeTol is the relative tolerance used for "waypoint time reachable" and for ties.
const timeTol = 1e-9

func tol(t float64) float64 { return timeTol * math.Max(1, math.Abs(t)) }

// Trajectory expands agent a's route into segments, checking that times do
// not go down and never ask for more than full speed. O(waypoints · log n +
// total path length).
func (s *Site) Trajectory(r Route, a int) (*Trajectory, error) {
	tr := &Trajectory{site: s, Agent: a, start: At(s.Start)}
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
		d := s.PointDist(cur, p)
		arrive := t + d/speed
		if wp.T < arrive-tol(arrive) {
			return nil, fmt.Errorf("engine: route of %s, waypoint %d: t=%g but the earliest arrival at full speed is t=%g", s.Names[a], i, wp.T, arrive)
		}
		tr.walk(cur, p, t, speed)
		tr.Length += d
		tEnd := math.Max(wp.T, arrive)
		if tEnd > arrive {
			tr.addWait(p, arrive, tEnd)
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

func (tr *Trajectory) addWait(p Point, t0, t1 float64) {
	sg := Seg{T0: t0, T1: t1, E: -1, Node: int32(p.From)}
	if p.To >= 0 {
		e := tr.site.Edge(p.From, p.To)
		o := p.Offset
		if int(tr.site.EU[e]) != p.From {
			o = tr.site.EW[e] - o
		}
		sg = Seg{T0: t0, T1: t1, E: int32(e), Node: -1, O0: o, O1: o}
	}
	tr.Segs = append(tr.Segs, sg)
}

// move appends a segment along corridor e from offset o0 to o1 (from EU[e]), starting at t.
func (tr *Trajectory) move(e int, o0, o1, t, speed float64) float64 {
	if o0 == o1 {
		return t
	}
	t1 := t + math.Abs(o1-o0)/speed
	tr.Segs = append(tr.Segs, Seg{T0: t, T1: t1, E: int32(e), Node: -1, O0: o0, O1: o1})
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

// walk appends the segments of the shortest path from a to b (canonical points), leaving at t.
func (tr *Trajectory) walk(a, b Point, t, speed float64) {
	s := tr.site
	if a == b {
		return
	}
	// same corridor
	if a.To >= 0 || b.To >= 0 {
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
			tr.move(e, s.offsetOn(a, e), s.offsetOn(b, e), t, speed)
			return
		}
	}
	// leave a through its best end, arrive at b through its best end
	au, adu, av, adv := s.ends(a)
	bu, bdu, bv, bdv := s.ends(b)
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
	if a.To >= 0 {
		e := s.Edge(a.From, a.To)
		t = tr.move(e, s.offsetOn(a, e), s.offsetOn(At(best.x), e), t, speed)
	}
	path := s.Path(best.x, best.y)
	for i := 1; i < len(path); i++ {
		e := s.Edge(path[i-1], path[i])
		t = tr.move(e, s.offsetOn(At(path[i-1]), e), s.offsetOn(At(path[i]), e), t, speed)
	}
	if b.To >= 0 {
		e := s.Edge(b.From, b.To)
		tr.move(e, s.offsetOn(At(best.y), e), s.offsetOn(b, e), t, speed)
	}
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
	s := tr.site
	fv := make([]float64, s.N)
	for i := range fv {
		fv[i] = math.Inf(1)
	}
	fv[s.Start] = 0
	see := func(v int, t float64) {
		if t < fv[v] {
			fv[v] = t
		}
	}
	for i := range tr.Segs {
		g := &tr.Segs[i]
		if g.E < 0 {
			see(int(g.Node), g.T0)
			continue
		}
		e := int(g.E)
		w := s.EW[e]
		if g.O0 == 0 {
			see(int(s.EU[e]), g.T0)
		} else if g.O0 == w {
			see(int(s.EV[e]), g.T0)
		}
		if g.O1 == 0 {
			see(int(s.EU[e]), g.T1)
		} else if g.O1 == w {
			see(int(s.EV[e]), g.T1)
		}
	}
	return fv
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
