package canvas

import (
	"image/color"
	"math"
	"strconv"

	"fyne.io/fyne/v2"
	fc "fyne.io/fyne/v2/canvas"
	"fyne.io/fyne/v2/theme"

	"duosweep/canvas/geom"
	"duosweep/engine"
)

// Sizes in widget units.
const (
	nodeR        = 7
	startHalf    = 8
	agentR       = 9
	labelMinZoom = 26 // median corridor on screen, below which node labels hide
	lengthMinPx  = 56 // corridor on screen, below which its length label hides
	cullMargin   = 24
)

// editorRenderer keeps one canvas object per node, corridor and label and
// reuses them (pools only grow); Refresh copies state into them, Layout moves
// them and hides what is off screen.
type editorRenderer struct {
	e *Editor

	bg      *fc.Rectangle
	corrSel *fc.Line
	corrHov *fc.Line
	corr    []*fc.Line
	corrLbl []*fc.Text
	selRing *fc.Circle
	hovRing *fc.Circle
	worst   *fc.Circle
	focus   *fc.Circle
	ticks   [4]*fc.Line
	nodes   []*fc.Circle
	nodeLbl []*fc.Text
	startSq *fc.Rectangle
	tags    [3]*fc.Text // start, worst, meet
	badge   []*fc.Circle
	badgeT  []*fc.Text
	meet    *fc.Rectangle
	trails  [][]*fc.Line
	agents  []*fc.Circle
	agentT  []*fc.Text
	rubber  *fc.Line
	msgBg   *fc.Rectangle
	msgT    *fc.Text
	helpBg  *fc.Rectangle
	helpK   []*fc.Text
	helpA   []*fc.Text

	objects []fyne.CanvasObject
	grown   bool
	corrLen []float64 // length shown by each corridor label
	unit    string

	// per frame
	fg, bgc, primary, errc, muted color.Color
	textSize                      float32
	pts                           []geom.Pt
	dirs                          []geom.Pt // scratch: corridor directions of one node
	cands                         []geom.Pt // scratch: label candidates of one node
	placer                        geom.Placer
	unvisited                     []int // valid unvisited nodes
}

const (
	tagStart = iota
	tagWorst
	tagMeet
)

func newEditorRenderer(e *Editor) *editorRenderer {
	r := &editorRenderer{e: e}
	r.bg = fc.NewRectangle(color.Transparent)
	r.corrSel = fc.NewLine(color.Transparent)
	r.corrHov = fc.NewLine(color.Transparent)
	r.selRing = &fc.Circle{StrokeWidth: 3}
	r.hovRing = &fc.Circle{StrokeWidth: 2}
	r.worst = &fc.Circle{StrokeWidth: 4}
	r.focus = &fc.Circle{StrokeWidth: 2}
	for i := range r.ticks {
		r.ticks[i] = &fc.Line{StrokeWidth: 2}
	}
	r.startSq = &fc.Rectangle{StrokeWidth: 2.5}
	for i := range r.tags {
		r.tags[i] = &fc.Text{TextStyle: fyne.TextStyle{Bold: true}}
	}
	r.meet = &fc.Rectangle{StrokeWidth: 2.5}
	r.rubber = &fc.Line{StrokeWidth: 2}
	r.msgBg = &fc.Rectangle{StrokeWidth: 1, CornerRadius: 4}
	r.msgT = &fc.Text{}
	r.helpBg = &fc.Rectangle{StrokeWidth: 1, CornerRadius: 6}
	for _, h := range Shortcuts() {
		r.helpK = append(r.helpK, &fc.Text{Text: h.Key, TextStyle: fyne.TextStyle{Bold: true}})
		r.helpA = append(r.helpA, &fc.Text{Text: h.Action})
	}
	r.grown = true
	return r
}

// Objects is part of fyne.WidgetRenderer, in drawing order.
func (r *editorRenderer) Objects() []fyne.CanvasObject {
	if r.grown {
		r.grown = false
		o := r.objects[:0]
		o = append(o, r.bg, r.corrHov, r.corrSel)
		for _, l := range r.corr {
			o = append(o, l)
		}
		for _, t := range r.corrLbl {
			o = append(o, t)
		}
		for _, l := range r.trails {
			for _, s := range l {
				o = append(o, s)
			}
		}
		o = append(o, r.hovRing, r.selRing, r.worst, r.focus, r.ticks[0], r.ticks[1], r.ticks[2], r.ticks[3])
		for _, c := range r.nodes {
			o = append(o, c)
		}
		o = append(o, r.startSq)
		for _, t := range r.nodeLbl {
			o = append(o, t)
		}
		for i := range r.badge {
			o = append(o, r.badge[i], r.badgeT[i])
		}
		o = append(o, r.meet)
		for i := range r.agents {
			o = append(o, r.agents[i], r.agentT[i])
		}
		o = append(o, r.tags[0], r.tags[1], r.tags[2], r.rubber, r.msgBg, r.msgT, r.helpBg)
		for i := range r.helpK {
			o = append(o, r.helpK[i], r.helpA[i])
		}
		r.objects = o
	}
	return r.objects
}

// Destroy is part of fyne.WidgetRenderer.
func (r *editorRenderer) Destroy() {}

// MinSize is part of fyne.WidgetRenderer.
func (r *editorRenderer) MinSize() fyne.Size { return r.e.MinSize() }

// live reports whether canvas objects can be touched: fyne's test driver
// panics on refreshes before any window exists.
func live() bool {
	a := fyne.CurrentApp()
	return a != nil && a.Driver() != nil && len(a.Driver().AllWindows()) > 0
}

func (r *editorRenderer) dirty() {
	if live() {
		fc.Refresh(r.bg)
	}
}

func withAlpha(c color.Color, a uint8) color.NRGBA {
	n := color.NRGBAModel.Convert(c).(color.NRGBA)
	n.A = a
	return n
}

// setText updates t and refreshes its texture only when something changed.
func setText(t *fc.Text, s string, c color.Color, size float32, refresh bool) {
	if t.Text == s && t.TextSize == size && t.Color == c {
		return
	}
	t.Text, t.Color, t.TextSize = s, c, size
	t.Resize(t.MinSize())
	if refresh {
		fc.Refresh(t)
	}
}

func growCircles(s []*fc.Circle, n int, g *bool) []*fc.Circle {
	for len(s) < n {
		s = append(s, &fc.Circle{})
		*g = true
	}
	return s
}

func growTexts(s []*fc.Text, n int, g *bool) []*fc.Text {
	for len(s) < n {
		s = append(s, &fc.Text{})
		*g = true
	}
	return s
}

func growLines(s []*fc.Line, n int, g *bool) []*fc.Line {
	for len(s) < n {
		s = append(s, &fc.Line{})
		*g = true
	}
	return s
}

// Refresh is part of fyne.WidgetRenderer: it copies the editor's state into
// the pooled objects, then lays them out. O(n + m + overlay).
func (r *editorRenderer) Refresh() {
	if !live() {
		return
	}
	e := r.e
	ov := &e.overlay
	n, m := len(e.sc.Nodes), len(e.sc.Corridors)
	r.fg = theme.ColorForWidget(theme.ColorNameForeground, e)
	r.bgc = theme.ColorForWidget(theme.ColorNameBackground, e)
	r.primary = theme.ColorForWidget(theme.ColorNamePrimary, e)
	r.errc = theme.ColorForWidget(theme.ColorNameError, e)
	r.muted = withAlpha(r.fg, 0x99)
	r.textSize = theme.SizeForWidget(theme.SizeNameCaptionText, e)
	fg, ts := r.fg, r.textSize

	r.nodes = growCircles(r.nodes, n, &r.grown)
	r.nodeLbl = growTexts(r.nodeLbl, n, &r.grown)
	r.corr = growLines(r.corr, m, &r.grown)
	r.corrLbl = growTexts(r.corrLbl, m, &r.grown)
	r.unvisited = r.unvisited[:0]
	for _, v := range ov.Unvisited {
		if v >= 0 && v < n {
			r.unvisited = append(r.unvisited, v)
		}
	}
	r.badge = growCircles(r.badge, len(ov.Unvisited), &r.grown)
	r.badgeT = growTexts(r.badgeT, len(ov.Unvisited), &r.grown)
	r.agents = growCircles(r.agents, len(ov.Agents), &r.grown)
	r.agentT = growTexts(r.agentT, len(ov.Agents), &r.grown)
	for len(r.trails) < len(ov.Agents) {
		r.trails = append(r.trails, nil)
		r.grown = true
	}
	for i, a := range ov.Agents {
		r.trails[i] = growLines(r.trails[i], len(a.Trail), &r.grown)
	}

	r.bg.FillColor = r.bgc
	unit := e.sc.Unit
	if unit == "" {
		unit = "m"
	}
	for i, nd := range e.sc.Nodes {
		c := r.nodes[i]
		c.StrokeColor, c.StrokeWidth = fg, 1.5
		switch f, ok := ov.evacFrac(i); {
		case nd.Candidate && ok:
			c.FillColor = heatPalette[int(math.Round(f*255))]
		case nd.Candidate:
			c.FillColor = r.primary
		default:
			c.FillColor, c.StrokeWidth = r.bgc, 2
		}
		lbl := nd.Label
		if lbl == "" {
			lbl = nd.ID
		}
		setText(r.nodeLbl[i], lbl, fg, ts, true)
	}
	for i := n; i < len(r.nodes); i++ {
		r.nodes[i].Hidden, r.nodeLbl[i].Hidden = true, true
	}
	if len(r.corrLen) < m {
		r.corrLen = append(r.corrLen, make([]float64, m-len(r.corrLen))...)
	}
	for i, c := range e.sc.Corridors {
		l := r.corr[i]
		l.StrokeColor, l.StrokeWidth = r.muted, 2
		txt := r.corrLbl[i].Text
		if c.Length != r.corrLen[i] || unit != r.unit || txt == "" {
			txt = strconv.FormatFloat(c.Length, 'f', -1, 64) + " " + unit
			r.corrLen[i] = c.Length
		}
		setText(r.corrLbl[i], txt, r.muted, ts*0.9, true)
	}
	r.unit = unit
	for i := m; i < len(r.corr); i++ {
		r.corr[i].Hidden, r.corrLbl[i].Hidden = true, true
	}
	// start
	r.startSq.StrokeColor = fg
	r.startSq.FillColor = r.bgc
	if s := e.d.start; s >= 0 {
		r.startSq.FillColor = r.nodes[s].FillColor
	}
	setText(r.tags[tagStart], "start", fg, ts, true)
	setText(r.tags[tagWorst], "worst", r.errc, ts, true)
	setText(r.tags[tagMeet], "meet", fg, ts, true)
	// highlights
	r.selRing.StrokeColor, r.selRing.FillColor = r.primary, color.Transparent
	r.hovRing.StrokeColor, r.hovRing.FillColor = withAlpha(r.primary, 0x80), color.Transparent
	r.corrSel.StrokeColor, r.corrSel.StrokeWidth = withAlpha(r.primary, 0xb0), 8
	r.corrHov.StrokeColor, r.corrHov.StrokeWidth = withAlpha(r.primary, 0x60), 7
	r.worst.StrokeColor, r.worst.FillColor = r.errc, color.Transparent
	r.focus.StrokeColor, r.focus.FillColor = fg, color.Transparent
	for _, t := range r.ticks {
		t.StrokeColor = fg
	}
	for i := range r.badge {
		r.badge[i].FillColor, r.badge[i].StrokeColor, r.badge[i].StrokeWidth = r.errc, r.bgc, 1
		r.badgeT[i].TextStyle = fyne.TextStyle{Bold: true}
		setText(r.badgeT[i], "!", color.White, ts, true)
	}
	for i := len(r.unvisited); i < len(r.badge); i++ {
		r.badge[i].Hidden, r.badgeT[i].Hidden = true, true
	}
	r.meet.StrokeColor, r.meet.FillColor = fg, withAlpha(r.bgc, 0xc0)
	for i, a := range ov.Agents {
		ac := agentColors[i%len(agentColors)]
		c := r.agents[i]
		c.FillColor = ac.fill
		if a.Informed {
			c.StrokeColor, c.StrokeWidth = fg, 3
		} else {
			c.StrokeColor, c.StrokeWidth = r.bgc, 1.5
		}
		letter := "?"
		for _, ch := range a.Name {
			letter = string(ch)
			break
		}
		r.agentT[i].TextStyle = fyne.TextStyle{Bold: true}
		setText(r.agentT[i], letter, ac.letter, ts, true)
		for _, l := range r.trails[i] {
			l.StrokeColor, l.StrokeWidth = withAlpha(ac.fill, 0xa0), 3
		}
		for k := len(a.Trail); k < len(r.trails[i]); k++ {
			r.trails[i][k].Hidden = true
		}
	}
	for i := len(ov.Agents); i < len(r.agents); i++ {
		r.agents[i].Hidden, r.agentT[i].Hidden = true, true
		for _, l := range r.trails[i] {
			l.Hidden = true
		}
	}
	r.msgBg.FillColor = theme.ColorForWidget(theme.ColorNameOverlayBackground, e)
	r.msgBg.StrokeColor = r.muted
	setText(r.msgT, e.msg.text, fg, ts, true)
	r.helpBg.FillColor = theme.ColorForWidget(theme.ColorNameOverlayBackground, e)
	r.helpBg.StrokeColor = r.muted
	for i := range r.helpK {
		setText(r.helpK[i], r.helpK[i].Text, fg, ts, true)
		setText(r.helpA[i], r.helpA[i].Text, fg, ts, true)
	}
	r.Layout(e.Size())
	fc.Refresh(r.bg)
}

// needSync reports whether the pools are smaller than the state they draw.
func (r *editorRenderer) needSync() bool {
	e := r.e
	if len(r.nodes) < len(e.sc.Nodes) || len(r.corr) < len(e.sc.Corridors) || len(r.agents) < len(e.overlay.Agents) || len(r.badge) < len(e.overlay.Unvisited) {
		return true
	}
	for i, a := range e.overlay.Agents {
		if len(r.trails[i]) < len(a.Trail) {
			return true
		}
	}
	return false
}

func place(c *fc.Circle, p geom.Pt, rad float64) {
	c.Position1 = fyne.NewPos(float32(p.X-rad), float32(p.Y-rad))
	c.Position2 = fyne.NewPos(float32(p.X+rad), float32(p.Y+rad))
}

func placeLine(l *fc.Line, a, b geom.Pt) {
	l.Position1 = fyne.NewPos(float32(a.X), float32(a.Y))
	l.Position2 = fyne.NewPos(float32(b.X), float32(b.Y))
}

func moveText(t *fc.Text, x, y float64) { t.Move(fyne.NewPos(float32(x), float32(y))) }

// Layout is part of fyne.WidgetRenderer: it moves every object to the
// current view and hides what is off screen. O(n + m + overlay).
func (r *editorRenderer) Layout(size fyne.Size) {
	if !live() {
		return
	}
	if r.needSync() {
		r.Refresh() // first layout before any refresh: fill the pools
		return
	}
	e := r.e
	ov := &e.overlay
	r.bg.Resize(size)
	r.bg.Move(fyne.NewPos(0, 0))
	n := len(e.sc.Nodes)
	if cap(r.pts) < n {
		r.pts = make([]geom.Pt, n)
	}
	pts := r.pts[:n]
	for i := range pts {
		pts[i] = e.view.ToScreen(e.nodeWorld(i))
	}
	screen := geom.Rect{Max: geom.Pt{X: float64(size.Width), Y: float64(size.Height)}}
	vis := screen.Grow(cullMargin)
	showLabels := e.d.unit*e.view.Zoom >= labelMinZoom || n <= 12
	start := e.d.start
	// nodes, then labels placed greedily where they overlap no node and no
	// earlier label (important ones first); labels that find no room hide.
	r.placer.Reset(64)
	for i, p := range pts {
		c := r.nodes[i]
		on := vis.Contains(p)
		c.Hidden = !on || i == start
		if on {
			place(c, p, nodeR)
			r.placer.Add(geom.Rect{Min: p.Sub(geom.Pt{X: nodeR, Y: nodeR}), Max: p.Add(geom.Pt{X: nodeR, Y: nodeR})})
		}
		r.nodeLbl[i].Hidden = true
	}
	// the start's square and tag and the worst exit's tag are drawn below their junctions: keep labels
	// off them
	tagBox := func(t *fc.Text, p geom.Pt, dy float64) {
		sz := t.Size()
		w, h := float64(sz.Width), float64(sz.Height)
		r.placer.Add(geom.Rect{Min: geom.Pt{X: p.X - w/2, Y: p.Y + dy}, Max: geom.Pt{X: p.X + w/2, Y: p.Y + dy + h}})
	}
	if start >= 0 && start < n && vis.Contains(pts[start]) {
		p := pts[start]
		r.placer.Add(geom.Rect{Min: p.Sub(geom.Pt{X: startHalf, Y: startHalf}), Max: p.Add(geom.Pt{X: startHalf, Y: startHalf})})
		tagBox(r.tags[tagStart], p, startHalf+2)
	}
	if w := ov.Worst; w >= 0 && w < n && vis.Contains(pts[w]) {
		tagBox(r.tags[tagWorst], pts[w], 17)
	}
	forced := [...]int{-1, -1, start, ov.Worst, ov.Focus}
	if e.sel.Kind == SelNode {
		forced[0] = e.sel.Index
	}
	if e.hover.Kind == SelNode {
		forced[1] = e.hover.Index
	}
	for _, i := range forced {
		if i >= 0 && i < n && r.nodeLbl[i].Hidden {
			r.placeNodeLabel(i, pts, vis, true)
		}
	}
	if showLabels {
		for i := range pts {
			if r.nodeLbl[i].Hidden {
				r.placeNodeLabel(i, pts, vis, false)
			}
		}
	}
	for i, en := range e.d.ends {
		l, t := r.corr[i], r.corrLbl[i]
		if en[0] < 0 || en[1] < 0 {
			l.Hidden, t.Hidden = true, true
			continue
		}
		a, b := pts[en[0]], pts[en[1]]
		l.Hidden = !vis.SegTouches(a, b)
		if !l.Hidden {
			placeLine(l, a, b)
		}
		mid := geom.Lerp(a, b, 0.5)
		length := geom.Dist(a, b)
		t.Hidden = true
		if l.Hidden || length < lengthMinPx || !screen.Contains(mid) {
			continue
		}
		// beside the line, on the side of its normal that points up, else the other side
		nx, ny := -(b.Y-a.Y)/length, (b.X-a.X)/length
		if ny > 0 {
			nx, ny = -nx, -ny
		}
		sz := t.Size()
		w, h := float64(sz.Width), float64(sz.Height)
		for _, side := range [2]float64{1, -1} {
			// the box corner nearest the line sits 3 units from it
			cx := mid.X + side*nx*(3+w/2*math.Abs(nx)+h/2*math.Abs(ny))
			cy := mid.Y + side*ny*(3+w/2*math.Abs(nx)+h/2*math.Abs(ny))
			box := geom.Rect{Min: geom.Pt{X: cx - w/2, Y: cy - h/2}, Max: geom.Pt{X: cx + w/2, Y: cy + h/2}}
			if r.placer.Free(box) && r.inside(box) {
				r.placer.Add(box)
				t.Hidden = false
				moveText(t, box.Min.X, box.Min.Y)
				break
			}
		}
	}
	// start square and tag
	st := r.tags[tagStart]
	r.startSq.Hidden, st.Hidden = true, true
	if start >= 0 && vis.Contains(pts[start]) {
		p := pts[start]
		r.startSq.Hidden, st.Hidden = false, false
		r.startSq.Move(fyne.NewPos(float32(p.X-startHalf), float32(p.Y-startHalf)))
		r.startSq.Resize(fyne.NewSize(2*startHalf, 2*startHalf))
		moveText(st, p.X-float64(st.Size().Width)/2, p.Y+startHalf+2)
	}
	// selection and hover
	r.layoutSel(r.selRing, r.corrSel, e.sel, pts, 12)
	if e.hover == e.sel {
		r.hovRing.Hidden, r.corrHov.Hidden = true, true
	} else {
		r.layoutSel(r.hovRing, r.corrHov, e.hover, pts, 11)
	}
	// worst exit: thick ring and tag
	wt := r.tags[tagWorst]
	r.worst.Hidden, wt.Hidden = true, true
	if w := ov.Worst; w >= 0 && w < n {
		r.worst.Hidden, wt.Hidden = false, false
		place(r.worst, pts[w], 15)
		moveText(wt, pts[w].X-float64(wt.Size().Width)/2, pts[w].Y+17)
	}
	// replayed exit: ring and cross-hair ticks
	r.focus.Hidden = true
	for _, t := range r.ticks {
		t.Hidden = true
	}
	if f := ov.Focus; f >= 0 && f < n {
		p := pts[f]
		r.focus.Hidden = false
		place(r.focus, p, 20)
		d := [4]geom.Pt{{X: 1}, {X: -1}, {Y: 1}, {Y: -1}}
		for k, t := range r.ticks {
			t.Hidden = false
			placeLine(t, p.Add(d[k].Mul(16)), p.Add(d[k].Mul(27)))
		}
	}
	for k, v := range r.unvisited {
		p := pts[v].Add(geom.Pt{X: -nodeR - 3, Y: -nodeR - 3})
		r.badge[k].Hidden, r.badgeT[k].Hidden = false, false
		place(r.badge[k], p, 7)
		sz := r.badgeT[k].Size()
		moveText(r.badgeT[k], p.X-float64(sz.Width)/2, p.Y-float64(sz.Height)/2)
	}
	// meeting point
	mt := r.tags[tagMeet]
	r.meet.Hidden, mt.Hidden = true, true
	if ov.Meeting != nil && r.validPoint(*ov.Meeting) {
		p := e.view.ToScreen(e.pointWorld(*ov.Meeting))
		r.meet.Hidden, mt.Hidden = false, false
		r.meet.Move(fyne.NewPos(float32(p.X-6), float32(p.Y-6)))
		r.meet.Resize(fyne.NewSize(12, 12))
		moveText(mt, p.X-float64(mt.Size().Width)/2, p.Y-6-float64(mt.Size().Height))
	}
	// agents and trails
	for i, a := range ov.Agents {
		c, t := r.agents[i], r.agentT[i]
		ok := r.validPoint(a.At)
		c.Hidden, t.Hidden = !ok, !ok
		p := e.view.ToScreen(e.pointWorld(a.At))
		if ok {
			// the two agents side by side when they share a place
			if i > 0 && len(ov.Agents) > 1 && a.At == ov.Agents[0].At {
				p = p.Add(geom.Pt{X: 2*agentR - 2, Y: 0})
			}
			place(c, p, agentR)
			sz := t.Size()
			moveText(t, p.X-float64(sz.Width)/2, p.Y-float64(sz.Height)/2)
		}
		for k, tp := range a.Trail {
			l := r.trails[i][k]
			q := e.view.ToScreen(e.pointWorld(tp))
			if !r.validPoint(tp) {
				l.Hidden = true
				continue
			}
			next := p
			if k+1 < len(a.Trail) {
				next = e.view.ToScreen(e.pointWorld(a.Trail[k+1]))
			}
			l.Hidden = !vis.SegTouches(q, next) || !ok
			placeLine(l, q, next)
		}
	}
	// rubber band while connecting
	r.rubber.Hidden = e.drag.kind != dragConnect
	if !r.rubber.Hidden {
		r.rubber.StrokeColor, r.rubber.StrokeWidth = r.primary, 2
		if e.drag.loop {
			r.rubber.StrokeColor, r.rubber.StrokeWidth = r.errc, 3 // this drop will be refused
		}
		a := pts[e.drag.node]
		b := toPt(e.drag.cur)
		if t := e.drag.target; t >= 0 {
			b = pts[t]
		}
		placeLine(r.rubber, a, b)
	}
	// transient message near the pointer
	r.msgT.Hidden = e.msg.text == ""
	r.msgBg.Hidden = r.msgT.Hidden
	if !r.msgT.Hidden {
		sz := r.msgT.Size()
		x := math.Min(float64(e.msg.at.X)+14, float64(size.Width)-float64(sz.Width)-8)
		y := float64(e.msg.at.Y) - float64(sz.Height) - 14
		if y < 4 {
			y = float64(e.msg.at.Y) + 18
		}
		x = math.Max(x, 4)
		moveText(r.msgT, x, y)
		r.msgBg.Move(fyne.NewPos(float32(x-6), float32(y-3)))
		r.msgBg.Resize(fyne.NewSize(sz.Width+12, sz.Height+6))
	}
	r.layoutHelp()
}

// placeNodeLabel puts node i's label in the best free spot beside it (a
// forced label takes the best spot even if it overlaps), or leaves it hidden.
func (r *editorRenderer) placeNodeLabel(i int, pts []geom.Pt, vis geom.Rect, force bool) {
	e, ov := r.e, &r.e.overlay
	p := pts[i]
	if !vis.Contains(p) {
		return
	}
	t := r.nodeLbl[i]
	gap := float64(nodeR + 4)
	dirs := r.dirs[:0]
	for _, w := range e.d.adj[e.d.adjAt[i]:e.d.adjAt[i+1]] {
		dirs = append(dirs, pts[w].Sub(p))
	}
	if i == e.d.start || i == ov.Worst || i == ov.Focus {
		gap = 21                                   // clear of the square, ring or target marker
		dirs = append(dirs, geom.Pt{X: 0.3, Y: 1}) // keep the tag below free
	}
	r.dirs = dirs
	sz := t.Size()
	w, h := float64(sz.Width), float64(sz.Height)
	r.cands = geom.LabelCandidates(dirs, w, h, gap, r.cands[:0])
	for k, o := range r.cands {
		box := geom.Rect{Min: p.Add(o), Max: p.Add(o).Add(geom.Pt{X: w, Y: h})}
		if (r.placer.Free(box) && r.inside(box)) || (force && k == len(r.cands)-1) {
			if !r.placer.Free(box) {
				o = r.cands[0]
				box = geom.Rect{Min: p.Add(o), Max: p.Add(o).Add(geom.Pt{X: w, Y: h})}
			}
			r.placer.Add(box)
			t.Hidden = false
			moveText(t, box.Min.X, box.Min.Y)
			return
		}
	}
}

// inside reports whether box lies within the widget.
func (r *editorRenderer) inside(box geom.Rect) bool {
	s := r.e.Size()
	return box.Min.X >= 0 && box.Min.Y >= 0 && box.Max.X <= float64(s.Width) && box.Max.Y <= float64(s.Height)
}

// validPoint reports whether p names a node, or a corridor, of the current scenario.
func (r *editorRenderer) validPoint(p engine.Point) bool {
	n := len(r.e.sc.Nodes)
	if p.From < 0 || p.From >= n {
		return false
	}
	if p.To < 0 {
		return true
	}
	_, ok := r.e.d.pair[pairKey(p.From, p.To)]
	return p.To < n && ok
}

func (r *editorRenderer) layoutSel(ring *fc.Circle, line *fc.Line, s Selection, pts []geom.Pt, rad float64) {
	ring.Hidden, line.Hidden = true, true
	switch s.Kind {
	case SelNode:
		if s.Index < len(pts) {
			ring.Hidden = false
			place(ring, pts[s.Index], rad)
		}
	case SelCorridor:
		if s.Index < len(r.e.d.ends) {
			en := r.e.d.ends[s.Index]
			if en[0] >= 0 && en[1] >= 0 {
				line.Hidden = false
				placeLine(line, pts[en[0]], pts[en[1]])
			}
		}
	}
}

func (r *editorRenderer) layoutHelp() {
	h := !r.e.help
	r.helpBg.Hidden = h
	for i := range r.helpK {
		r.helpK[i].Hidden, r.helpA[i].Hidden = h, h
	}
	if h {
		return
	}
	const pad, gap = 12, 16
	kw, aw := float32(0), float32(0)
	lh := float32(0)
	for i := range r.helpK {
		kw = max(kw, r.helpK[i].Size().Width)
		aw = max(aw, r.helpA[i].Size().Width)
		lh = max(lh, r.helpK[i].Size().Height)
	}
	lh += 2
	x0, y0 := float32(12), float32(12)
	r.helpBg.Move(fyne.NewPos(x0, y0))
	r.helpBg.Resize(fyne.NewSize(2*pad+kw+gap+aw, 2*pad+lh*float32(len(r.helpK))))
	for i := range r.helpK {
		y := y0 + pad + lh*float32(i)
		r.helpK[i].Move(fyne.NewPos(x0+pad, y))
		r.helpA[i].Move(fyne.NewPos(x0+pad+kw+gap, y))
	}
}
