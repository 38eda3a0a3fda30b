package brief

import (
	"math"

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
	edges := make([]geom.Edge, len(s.EU))
	for e := range s.EU {
		edges[e] = geom.Edge{A: int(s.EU[e]), B: int(s.EV[e]), Len: s.EW[e]}
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
}

func newProjection(s *engine.Site, world []Pt, area geom.Rect, margin float64) *projection {
	w, h := area.Max.X-area.Min.X, area.Max.Y-area.Min.Y
	v := geom.Fit(geom.Bounds(world), w, h, margin, 1)
	pr := &projection{site: s, pos: make([]Pt, len(world)), zoom: v.Zoom}
	for i, p := range world {
		pr.pos[i] = v.ToScreen(p).Add(area.Min)
	}
	return pr
}

// node returns the drawing position of node v.
func (pr *projection) node(v int) Pt { return pr.pos[v] }

// point returns the drawing position of a site point (a node or a point
// inside a corridor, drawn on the straight line between its ends).
func (pr *projection) point(p engine.Point) Pt {
	if p.To < 0 {
		return pr.pos[p.From]
	}
	w := pr.site.EW[pr.site.Edge(p.From, p.To)]
	return geom.Lerp(pr.pos[p.From], pr.pos[p.To], p.Offset/w)
}

// onEdge returns the drawing position at offset o from EU[e] on corridor e.
func (pr *projection) onEdge(e int, o float64) Pt {
	s := pr.site
	return geom.Lerp(pr.pos[s.EU[e]], pr.pos[s.EV[e]], o/s.EW[e])
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
		push(pr.onEdge(int(sg.E), o))
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
