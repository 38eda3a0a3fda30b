package brief

import (
	"fmt"
	"image/color"
	"math"
	"sort"
	"time"

	"duosweep/canvas/geom"
	"duosweep/engine"
	"duosweep/projects"
)

// Input is what a briefing is made from: a site, a plan and the plan's
// report under one model (engine.Evaluate's result).
type Input struct {
	Site   *engine.Site
	Plan   *engine.Plan
	Report *engine.Report
	// Date is the briefing's date; the zero time means now.
	Date time.Time
}

func (in Input) check() error {
	switch {
	case in.Site == nil:
		return fmt.Errorf("brief: no site")
	case in.Plan == nil:
		return fmt.Errorf("brief: no plan")
	case in.Report == nil:
		return fmt.Errorf("brief: no report")
	case len(in.Report.Exits) > 0 && in.Report.Exits[len(in.Report.Exits)-1].Node >= in.Site.N:
		return fmt.Errorf("brief: the report does not belong to this site")
	}
	return nil
}

func (in Input) date() time.Time {
	if in.Date.IsZero() {
		return time.Now()
	}
	return in.Date
}

// MapOptions choose what a map picture shows.
type MapOptions struct {
	// NoRoutes leaves the agents' routes out (the animation draws them as trails).
	NoRoutes bool
	// NoLegend leaves the legend row and the notice line out (the PDF prints
	// them beside the map instead).
	NoLegend bool
	// Title, when set, is a heading line at the top.
	Title string
	// Notice adds the planning-aid notice as the last line.
	Notice bool
	// Caption reserves a line under the title (the animation's event captions).
	Caption bool
}

// Map is a site map as a Scene, with what the animation needs to draw on top
// of it in the same coordinates.
type Map struct {
	Scene
	in   Input
	proj *projection
	// Area is the rectangle the site is fitted into.
	Area geom.Rect
	// R is the node disc radius, RouteW the first agent's route width, FontSize the label size.
	R, RouteW, FontSize float64
	evacMax             float64
}

// NodePos returns the drawing position of node v.
func (m *Map) NodePos(v int) Pt { return m.proj.node(v) }

// PointPos returns the drawing position of a site point.
func (m *Map) PointPos(p engine.Point) Pt { return m.proj.point(p) }

// RouteVertices returns the drawn vertices of agent a's route: the start,
// then every place where the agent's walk ends a corridor piece (each
// waypoint, and the nodes it passes between two waypoints).
func (m *Map) RouteVertices(a int) ([]Pt, error) {
	tr, err := m.in.Site.Trajectory(m.in.Plan.Routes[a], a)
	if err != nil {
		return nil, err
	}
	return m.proj.trajectoryPolyline(tr, math.Inf(1)), nil
}

// HeatOf returns the heat colour the map gives candidate v, and false for a
// node that is not a candidate.
func (m *Map) HeatOf(v int) (c [4]uint8, ok bool) {
	ex, ok := m.in.Report.ExitFor(v)
	if !ok {
		return c, false
	}
	h := HeatColor(heatFrac(ex.EvacAt, m.evacMax))
	return [4]uint8{h.R, h.G, h.B, h.A}, true
}

// finiteMaxEvac is the largest finite evacuation time of a report (the top of the heat scale).
func finiteMaxEvac(r *engine.Report) float64 {
	m := 0.0
	for _, ex := range r.Exits {
		if !math.IsInf(ex.EvacAt, 0) && ex.EvacAt > m {
			m = ex.EvacAt
		}
	}
	return m
}

// BuildMap lays the site map of in out on a w×h drawing: corridors, both
// routes, the start, the candidates in their heat colours, the worst exit,
// node labels where they fit, a scale bar and (unless opt.NoLegend) a legend.
// O(n log n + route length).
func BuildMap(in Input, w, h float64, opt MapOptions) (*Map, error) {
	if err := in.check(); err != nil {
		return nil, err
	}
	if !(w >= 32 && h >= 32) || w > 1e5 || h > 1e5 {
		return nil, fmt.Errorf("brief: picture size %g×%g: want 32 to 100000 in each direction", w, h)
	}
	s, r := in.Site, in.Report
	m := &Map{Scene: Scene{W: w, H: h, Background: White}, in: in, evacMax: finiteMaxEvac(r)}
	fs := math.Max(7, math.Min(14, math.Min(w, h)/40))
	m.FontSize = fs
	top, bottom := 0.4*fs, h-0.4*fs
	if opt.Title != "" {
		m.add(&Label{At: Pt{X: w / 2, Y: 1.4 * fs}, Text: opt.Title, Size: 1.15 * fs, Color: Ink, Anchor: Middle, Bold: true, Class: "title"})
		top = 2.0 * fs
	}
	if opt.Caption {
		top += 1.5 * fs
	}
	if opt.Notice {
		m.add(&Label{At: Pt{X: w / 2, Y: h - 0.5*fs}, Text: Notice, Size: noticeSize(w, fs), Color: Ink, Anchor: Middle, Class: "notice"})
		bottom = h - 1.6*fs
	}
	var legend []Shape
	if !opt.NoLegend {
		legend, bottom = m.legend(0.5*fs, w-0.5*fs, bottom, fs)
	}
	m.Area = geom.Rect{Min: Pt{X: 0, Y: top}, Max: Pt{X: w, Y: bottom}}
	if m.Area.Max.Y-m.Area.Min.Y < 16 {
		return nil, fmt.Errorf("brief: picture size %g×%g leaves no room for the map", w, h)
	}
	m.proj = newProjection(s, SitePositions(s), m.Area, 1.2*fs+6)
	med := m.proj.medianCorridor()
	m.R = math.Max(1.5, math.Min(0.42*fs, 0.16*med))
	m.RouteW = math.Max(0.9, math.Min(4, 0.8*m.R))

	// corridors: a light band the routes run on
	// closed corridors (on the drawing, never walked): thin and dotted
	for e, c := range s.Scenario.Corridors {
		if c.Closed {
			w := math.Max(0.6, 0.5*m.RouteW)
			m.add(&Path{Pts: m.proj.corridorPts(e), Stroke: Muted, Width: w, Dash: []float64{w, 2 * w}, Class: "closed"})
		} else {
			m.add(&Path{Pts: m.proj.corridorPts(e), Stroke: Faint, Width: 2.4 * m.RouteW, Class: "corridor"})
		}
	}
	if !opt.NoRoutes {
		for a := 0; a < 2; a++ {
			pts, err := m.RouteVertices(a)
			if err != nil {
				return nil, err
			}
			rw := m.routeWidth(a)
			m.add(&Path{Pts: pts, Stroke: AgentColor(a), Width: rw, Dash: AgentDash(a, rw), Class: "route", ID: fmt.Sprintf("route-%d", a)})
		}
	}
	m.nodes()
	if !opt.NoRoutes {
		for _, c := range m.rendezvous() {
			m.add(diamondPath(c, 1.3*m.R+1.5, Transparent, Ink, math.Max(1, 0.3*m.R), "rendezvous"))
		}
	}
	m.scaleBar(fs)
	m.add(legend...)
	return m, nil
}

// routeWidth is agent a's route width: the second agent's dashed line is
// narrower and drawn on top, so where both walk a corridor both show.
func (m *Map) routeWidth(a int) float64 {
	if a == 0 {
		return m.RouteW
	}
	return math.Max(0.7, 0.5*m.RouteW)
}

func noticeSize(w, fs float64) float64 {
	size := 0.8 * fs
	if tw := TextWidth(Notice, size, false); tw > 0.96*w {
		size *= 0.96 * w / tw
	}
	return size
}

// nodes draws the node discs, the start, the worst-exit ring and the labels.
func (m *Map) nodes() {
	s, r := m.in.Site, m.in.Report
	var pl geom.Placer
	pl.Reset(math.Max(4*m.FontSize, 8))
	box := func(c Pt, rad float64) geom.Rect {
		return geom.Rect{Min: Pt{X: c.X - rad, Y: c.Y - rad}, Max: Pt{X: c.X + rad, Y: c.Y + rad}}
	}
	for v := 0; v < s.N; v++ {
		c := m.proj.node(v)
		switch {
		case v == s.Start:
			m.add(squarePath(c, 1.15*m.R, White, Ink, math.Max(0.8, 0.3*m.R), "start"))
		case s.Candidate[v]:
			ex, _ := r.ExitFor(v)
			m.add(&Disc{C: c, R: m.R, Fill: HeatColor(heatFrac(ex.EvacAt, m.evacMax)), Stroke: Ink, Width: math.Max(0.5, 0.18*m.R), Class: "candidate", ID: s.IDs[v]})
		default:
			m.add(&Disc{C: c, R: 0.6 * m.R, Fill: White, Stroke: Muted, Width: math.Max(0.5, 0.2*m.R), Class: "node", ID: s.IDs[v]})
		}
		pl.Add(box(c, m.R))
	}
	ls := 0.85 * m.FontSize
	if r.WorstExit >= 0 {
		c := m.proj.node(r.WorstExit)
		rr := m.R + math.Max(1.5, 0.55*m.R)
		m.add(&Disc{C: c, R: rr, Stroke: WorstInk, Width: math.Max(1.2, 0.45*m.R), Class: "worst", ID: s.IDs[r.WorstExit]})
		pl.Add(box(c, rr))
	}
	// labels: the worst exit and the start first, then candidates, then the rest, by index
	order := make([]int, s.N)
	for i := range order {
		order[i] = i
	}
	rank := func(v int) int {
		switch {
		case v == r.WorstExit:
			return 0
		case v == s.Start:
			return 1
		case s.Candidate[v]:
			return 2
		}
		return 3
	}
	sort.SliceStable(order, func(i, j int) bool { return rank(order[i]) < rank(order[j]) })
	// on a crowded map labels are few and keep a margin, so that the ones
	// drawn can be read: the worst exit and the start always get a try
	maxLabels := s.N
	if s.N > 150 {
		maxLabels = 40
	}
	pad := 0.2 * m.FontSize
	placed := 0
	var dirs, cands []Pt
	for _, v := range order {
		if placed >= maxLabels && rank(v) > 1 {
			break
		}
		text := s.IDs[v]
		bold := false
		if v == r.WorstExit {
			text += " · worst"
			bold = true
		}
		tw := TextWidth(text, ls, bold)
		th := ls * 1.1
		c := m.proj.node(v)
		dirs = dirs[:0]
		for _, u := range m.neighbours(v) {
			dirs = append(dirs, m.proj.node(u).Sub(c))
		}
		gap := m.R + 2 + pad
		if v == r.WorstExit {
			gap = m.R + math.Max(1.5, 0.55*m.R) + 2 + pad
		}
		cands = geom.LabelCandidates(dirs, tw, th, gap, cands[:0])
		for _, off := range cands {
			b := geom.Rect{Min: c.Add(off), Max: c.Add(off).Add(Pt{X: tw, Y: th})}
			if b.Min.X < 1 || b.Max.X > m.W-1 || b.Min.Y < m.Area.Min.Y || b.Max.Y > m.Area.Max.Y || !pl.Free(b.Grow(pad)) {
				continue
			}
			pl.Add(b)
			placed++
			col := Ink
			if v == r.WorstExit {
				col = WorstInk
			}
			m.add(&Label{At: Pt{X: b.Min.X, Y: b.Min.Y + 0.85*ls}, Text: text, Size: ls, Color: col, Bold: bold, Class: "node-label"})
			break
		}
	}
}

func (m *Map) neighbours(v int) []int {
	s := m.in.Site
	var out []int
	if p := s.Parent[v]; p >= 0 {
		out = append(out, int(p))
	}
	for _, c := range s.Children(v) {
		out = append(out, int(c))
	}
	return out
}

// scaleBar draws a bar of a round length in the scenario's unit at the
// bottom left of the map area.
func (m *Map) scaleBar(fs float64) {
	s := m.in.Site
	aw := m.Area.Max.X - m.Area.Min.X
	length := niceLength(aw / 5 / m.proj.zoom)
	bar := length * m.proj.zoom
	x0, y := m.Area.Min.X+0.8*fs, m.Area.Max.Y-0.6*fs
	tick := 0.35 * fs
	m.add(&Path{Pts: []Pt{{X: x0, Y: y - tick}, {X: x0, Y: y}, {X: x0 + bar, Y: y}, {X: x0 + bar, Y: y - tick}}, Stroke: Ink, Width: 1.2, Class: "scale"})
	m.add(&Path{Pts: []Pt{{X: x0 + bar/2, Y: y - 0.6*tick}, {X: x0 + bar/2, Y: y}}, Stroke: Ink, Width: 0.8, Class: "scale"})
	m.add(&Label{At: Pt{X: x0 + bar/2, Y: y - tick - 0.25*fs}, Text: trimNum(length) + " " + s.Unit(), Size: 0.85 * fs, Color: Ink, Anchor: Middle, Class: "scale"})
}

func trimNum(x float64) string { return fmt.Sprintf("%g", x) }

// legend lays the legend out in rows between x0 and x1 ending at bottom and
// returns its shapes and the new bottom of the map area.
func (m *Map) legend(x0, x1, bottom, fs float64) ([]Shape, float64) {
	s, r := m.in.Site, m.in.Report
	ls := 0.85 * fs
	type item struct {
		w    float64
		draw func(x, y float64) []Shape // y: the row's baseline
	}
	var items []item
	text := func(x, y float64, t string) *Label {
		return &Label{At: Pt{X: x, Y: y}, Text: t, Size: ls, Color: Ink, Class: "legend"}
	}
	sw := 2.2 * fs // line sample length
	for a := 0; a < 2; a++ {
		a := a
		t := fmt.Sprintf("%s (%g %s/s)", s.Names[a], s.Speed[a], s.Unit())
		items = append(items, item{w: sw + 0.4*fs + TextWidth(t, ls, false), draw: func(x, y float64) []Shape {
			w := math.Max(1.2, 0.22*fs)
			if a == 1 {
				w *= 0.7
			}
			my := y - 0.3*ls
			return []Shape{
				&Path{Pts: []Pt{{X: x, Y: my}, {X: x + sw, Y: my}}, Stroke: AgentColor(a), Width: w, Dash: AgentDash(a, w), Class: "legend"},
				text(x+sw+0.4*fs, y, t),
			}
		}})
	}
	items = append(items, item{w: 1.2*fs + TextWidth("start", ls, false), draw: func(x, y float64) []Shape {
		c := Pt{X: x + 0.4*fs, Y: y - 0.3*ls}
		return []Shape{squarePath(c, 0.3*fs, White, Ink, 0.8, "legend"), text(x+1.0*fs, y, "start")}
	}})
	if len(r.Exits) > 0 {
		lo, hi := "00:00", projects.FormatDuration(m.evacMax)
		barW := 6 * fs
		t := "reached at " + lo
		w := TextWidth(t, ls, false) + 0.3*fs + barW + 0.3*fs + TextWidth(hi, ls, false)
		items = append(items, item{w: w, draw: func(x, y float64) []Shape {
			out := []Shape{text(x, y, t)}
			bx := x + TextWidth(t, ls, false) + 0.3*fs
			steps := HeatSteps
			for k := 0; k < steps; k++ {
				cx0 := bx + barW*float64(k)/float64(steps)
				cx1 := bx + barW*float64(k+1)/float64(steps)
				out = append(out, rectPath(cx0, y-0.8*ls, cx1+0.6, y, HeatColor(float64(k)/float64(steps-1)), Transparent, 0, "legend"))
			}
			out = append(out, rectPath(bx, y-0.8*ls, bx+barW, y, Transparent, Ink, 0.5, "legend"))
			out = append(out, text(bx+barW+0.3*fs, y, hi))
			return out
		}})
	}
	for _, c := range s.Scenario.Corridors {
		if !c.Closed {
			continue
		}
		items = append(items, item{w: sw + 0.4*fs + TextWidth("closed corridor", ls, false), draw: func(x, y float64) []Shape {
			my := y - 0.3*ls
			w := math.Max(0.6, 0.1*fs)
			return []Shape{&Path{Pts: []Pt{{X: x, Y: my}, {X: x + sw, Y: my}}, Stroke: Muted, Width: w, Dash: []float64{w, 2 * w}, Class: "legend"},
				text(x+sw+0.4*fs, y, "closed corridor")}
		}})
		break
	}
	if m.hasRendezvous() {
		items = append(items, item{w: 1.2*fs + TextWidth("rendezvous", ls, false), draw: func(x, y float64) []Shape {
			c := Pt{X: x + 0.4*fs, Y: y - 0.3*ls}
			return []Shape{diamondPath(c, 0.38*fs, Transparent, Ink, 0.1*fs, "legend"), text(x+1.0*fs, y, "rendezvous")}
		}})
	}
	if r.WorstExit >= 0 {
		items = append(items, item{w: 1.2*fs + TextWidth("worst exit", ls, false), draw: func(x, y float64) []Shape {
			c := Pt{X: x + 0.4*fs, Y: y - 0.3*ls}
			return []Shape{&Disc{C: c, R: 0.32 * fs, Stroke: WorstInk, Width: 0.14 * fs, Class: "legend"}, text(x+1.0*fs, y, "worst exit")}
		}})
	}
	// flow into rows
	gap := 1.2 * fs
	var rows [][]item
	var cur []item
	cw := 0.0
	for _, it := range items {
		if len(cur) > 0 && cw+gap+it.w > x1-x0 {
			rows = append(rows, cur)
			cur, cw = nil, 0
		}
		if len(cur) > 0 {
			cw += gap
		}
		cur = append(cur, it)
		cw += it.w
	}
	if len(cur) > 0 {
		rows = append(rows, cur)
	}
	lh := 1.5 * fs
	var out []Shape
	y := bottom - 0.3*fs - float64(len(rows)-1)*lh
	newBottom := y - 1.1*fs
	for _, row := range rows {
		x := x0
		for _, it := range row {
			out = append(out, it.draw(x, y)...)
			x += it.w + gap
		}
		y += lh
	}
	return out, newBottom
}

// Transparent is the zero colour: no stroke or no fill.
var Transparent = color.NRGBA{}

// hasRendezvous reports whether a route has a rendezvous waypoint.
func (m *Map) hasRendezvous() bool {
	for _, r := range m.in.Plan.Routes {
		for _, wp := range r.Waypoints {
			if wp.Rendezvous {
				return true
			}
		}
	}
	return false
}

// rendezvous returns the drawing positions of the routes' rendezvous
// waypoints (each place once).
func (m *Map) rendezvous() []Pt {
	var out []Pt
	for _, r := range m.in.Plan.Routes {
		for _, wp := range r.Waypoints {
			if !wp.Rendezvous {
				continue
			}
			c := m.PointPos(wp.P)
			dup := false
			for _, q := range out {
				dup = dup || geom.Dist(q, c) < 0.5
			}
			if !dup {
				out = append(out, c)
			}
		}
	}
	return out
}

// diamondPath is a closed diamond of half-diagonal r centred on c.
func diamondPath(c Pt, r float64, fill, stroke color.NRGBA, w float64, class string) *Path {
	return &Path{Pts: []Pt{{X: c.X, Y: c.Y - r}, {X: c.X + r, Y: c.Y}, {X: c.X, Y: c.Y + r}, {X: c.X - r, Y: c.Y}}, Closed: true,
		Fill: fill, Stroke: stroke, Width: w, Class: class}
}
