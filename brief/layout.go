package brief

import (
	"math"
	"sort"

	"duosweep/canvas/geom"
	"duosweep/engine"
)

// SitePositions returns the drawing position (in the scenario's units, y
// down) of every node: its x, y when the file gives them; otherwise the
// tidy layout the site editor uses (geom.Tidy), each unplaced node put at
// its parent's position plus its tidy offset from the parent, the way the
// editor places nodes without coordinates. O(n + m log m).
func SitePositions(s *engine.Site) []Pt {
	sc := s.Scenario
	pos := make([]Pt, s.N)
	missing := false
	for i, n := range sc.Nodes {
		pos[i] = Pt{X: n.X, Y: n.Y}
		if !n.HasXY {
			missing = true
		}
	}
	if !missing {
		return pos
	}
	edges := make([]geom.Edge, 0, len(s.EU))
	for e := range s.EU {
		if !sc.Corridors[e].Closed {
			edges = append(edges, geom.Edge{A: int(s.EU[e]), B: int(s.EV[e]), Len: s.EW[e]})
		}
	}
	tidy := geom.Tidy(s.N, edges, s.Start)
	for _, v32 := range s.Order { // parents before children
		v := int(v32)
		if sc.Nodes[v].HasXY {
			continue
		}
		if u := int(s.Parent[v]); u >= 0 {
			pos[v] = pos[u].Add(tidy[v].Sub(tidy[u]))
		} else {
			pos[v] = tidy[v]
		}
	}
	return pos
}

// projection maps site coordinates into a drawing area.
type projection struct {
	site *engine.Site
	pos  []Pt // node positions in drawing units
	zoom float64
	// shape[e] is corridor e's drawn polyline from EU[e] to EV[e] with its
	// interior vertices (corridors[].path), nil for a straight corridor; cum[e]
	// holds the fractions of its drawn length at each vertex.
	shape [][]Pt
	cum   [][]float64
}

func newProjection(s *engine.Site, world []Pt, area geom.Rect, margin float64) *projection {
	w, h := area.Max.X-area.Min.X, area.Max.Y-area.Min.Y
	box := geom.Bounds(world)
	for _, c := range s.Scenario.Corridors {
		for _, q := range c.Path {
			box = box.Extend(Pt{X: q[0], Y: q[1]})
		}
	}
	v := geom.Fit(box, w, h, margin, 1)
	pr := &projection{site: s, pos: make([]Pt, len(world)), zoom: v.Zoom, shape: make([][]Pt, len(s.EU)), cum: make([][]float64, len(s.EU))}
	for i, p := range world {
		pr.pos[i] = v.ToScreen(p).Add(area.Min)
	}
	for e, c := range s.Scenario.Corridors {
		if len(c.Path) == 0 {
			continue
		}
		pts := []Pt{pr.pos[s.EU[e]]}
		for _, q := range c.Path {
			pts = append(pts, v.ToScreen(Pt{X: q[0], Y: q[1]}).Add(area.Min))
		}
		pts = append(pts, pr.pos[s.EV[e]])
		cum := make([]float64, len(pts))
		for i := 1; i < len(pts); i++ {
			cum[i] = cum[i-1] + geom.Dist(pts[i-1], pts[i])
		}
		if total := cum[len(cum)-1]; total > 0 {
			for i := range cum {
				cum[i] /= total
			}
			pr.shape[e], pr.cum[e] = pts, cum
		}
	}
	return pr
}

// node returns the drawing position of node v.
func (pr *projection) node(v int) Pt { return pr.pos[v] }

// point returns the drawing position of a site point: a node, or a point
// inside a corridor at the same fraction of the corridor's drawn length as
// of its real length.
func (pr *projection) point(p engine.Point) Pt {
	if p.To < 0 {
		return pr.pos[p.From]
	}
	s := pr.site
	e := s.Edge(p.From, p.To)
	o := p.Offset
	if int(s.EU[e]) != p.From {
		o = s.EW[e] - o
	}
	return pr.onEdge(e, o)
}

// corridorPts returns corridor e's drawn polyline from EU[e] to EV[e].
func (pr *projection) corridorPts(e int) []Pt {
	if pr.shape[e] != nil {
		return pr.shape[e]
	}
	return []Pt{pr.pos[pr.site.EU[e]], pr.pos[pr.site.EV[e]]}
}

// onEdge returns the drawing position at offset o from EU[e] on corridor e.
func (pr *projection) onEdge(e int, o float64) Pt {
	s := pr.site
	f := math.Max(0, math.Min(1, o/s.EW[e]))
	pts, cum := pr.shape[e], pr.cum[e]
	if pts == nil {
		return geom.Lerp(pr.pos[s.EU[e]], pr.pos[s.EV[e]], f)
	}
	i := sort.SearchFloat64s(cum, f)
	switch {
	case i == 0:
		return pts[0]
	case i >= len(cum):
		return pts[len(pts)-1]
	}
	d := cum[i] - cum[i-1]
	if d <= 0 {
		return pts[i]
	}
	return geom.Lerp(pts[i-1], pts[i], (f-cum[i-1])/d)
}

// walkEdge appends to out the drawn vertices met walking corridor e from
// offset o0 to o1 (from EU[e]): the interior vertices strictly between,
// then the end point.
func (pr *projection) walkEdge(out []Pt, e int, o0, o1 float64) []Pt {
	if cum := pr.cum[e]; cum != nil {
		w := pr.site.EW[e]
		f0, f1 := o0/w, o1/w
		if f0 < f1 {
			for i := 1; i < len(cum)-1; i++ {
				if cum[i] > f0 && cum[i] < f1 {
					out = append(out, pr.shape[e][i])
				}
			}
		} else {
			for i := len(cum) - 2; i >= 1; i-- {
				if cum[i] < f0 && cum[i] > f1 {
					out = append(out, pr.shape[e][i])
				}
			}
		}
	}
	return append(out, pr.onEdge(e, o1))
}

// trajectoryPolyline returns the vertices of a trajectory: the start, then
// the end of every moving segment, consecutive repeats dropped; up to time
// t when t is finite (the last vertex then is the position at t).
func (pr *projection) trajectoryPolyline(tr *engine.Trajectory, t float64) []Pt {
	s := pr.site
	out := []Pt{pr.node(s.Start)}
	push := func(p Pt) {
		if q := out[len(out)-1]; math.Abs(q.X-p.X) > 1e-9 || math.Abs(q.Y-p.Y) > 1e-9 {
			out = append(out, p)
		}
	}
	for _, sg := range tr.Segs {
		if sg.T0 >= t {
			break
		}
		if sg.E < 0 || sg.O0 == sg.O1 {
			continue
		}
		o := sg.O1
		if sg.T1 > t {
			o = sg.O0 + (sg.O1-sg.O0)*(t-sg.T0)/(sg.T1-sg.T0)
		}
		var buf [8]Pt
		for _, p := range pr.walkEdge(buf[:0], int(sg.E), sg.O0, o) {
			push(p)
		}
	}
	return out
}

// medianCorridor returns the median drawn corridor length.
func (pr *projection) medianCorridor() float64 {
	s := pr.site
	edges := make([]geom.Edge, len(s.EU))
	for e := range s.EU {
		edges[e] = geom.Edge{Len: geom.Dist(pr.pos[s.EU[e]], pr.pos[s.EV[e]])}
	}
	return geom.MedianLen(edges)
}
