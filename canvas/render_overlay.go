package canvas

import (
	"image/color"
	"math"

	"fyne.io/fyne/v2"
	fc "fyne.io/fyne/v2/canvas"

	"duosweep/canvas/geom"
)

// markerLayer draws what marks junctions and corridors: the selection and hover highlights, the
// worst exit's ring and tag, the replayed exit's target, the badges of unvisited candidates, the
// meeting point and the rubber band of a connecting drag.
type markerLayer struct {
	selRing, hovRing *fc.Circle // selected and hovered junction
	corrSel, corrHov *fc.Line   // selected and hovered corridor
	worst            *fc.Circle
	worstTag         *fc.Text
	focus            *fc.Circle
	ticks            [4]*fc.Line // the focus target's cross-hair
	badges           []*fc.Circle
	badgeMarks       []*fc.Text
	unvisited        []int // the overlay's unvisited candidates that are junctions of the scenario
	meet             *fc.Rectangle
	meetTag          *fc.Text
	rubber           *fc.Line
}

func (m *markerLayer) init() {
	m.corrSel = fc.NewLine(color.Transparent)
	m.corrHov = fc.NewLine(color.Transparent)
	m.selRing = &fc.Circle{StrokeWidth: 3}
	m.hovRing = &fc.Circle{StrokeWidth: 2}
	m.worst = &fc.Circle{StrokeWidth: 4}
	m.focus = &fc.Circle{StrokeWidth: 2}
	for i := range m.ticks {
		m.ticks[i] = &fc.Line{StrokeWidth: 2}
	}
	m.worstTag = &fc.Text{TextStyle: fyne.TextStyle{Bold: true}}
	m.meetTag = &fc.Text{TextStyle: fyne.TextStyle{Bold: true}}
	m.meet = &fc.Rectangle{StrokeWidth: 2.5}
	m.rubber = &fc.Line{StrokeWidth: 2}
}

func (m *markerLayer) update(e *Editor, f *frame, grown *bool) {
	ov := &e.overlay
	n := len(e.sc.Nodes)
	m.unvisited = m.unvisited[:0]
	for _, v := range ov.Unvisited {
		if v >= 0 && v < n {
			m.unvisited = append(m.unvisited, v)
		}
	}
	m.badges = grow(m.badges, len(ov.Unvisited), grown)
	m.badgeMarks = grow(m.badgeMarks, len(ov.Unvisited), grown)
	setText(m.worstTag, "worst", f.errc, f.textSize)
	setText(m.meetTag, "meet", f.fg, f.textSize)
	m.selRing.StrokeColor, m.selRing.FillColor = f.primary, color.Transparent
	m.hovRing.StrokeColor, m.hovRing.FillColor = withAlpha(f.primary, 0x80), color.Transparent
	m.corrSel.StrokeColor, m.corrSel.StrokeWidth = withAlpha(f.primary, 0xb0), 8
	m.corrHov.StrokeColor, m.corrHov.StrokeWidth = withAlpha(f.primary, 0x60), 7
	m.worst.StrokeColor, m.worst.FillColor = f.errc, color.Transparent
	m.focus.StrokeColor, m.focus.FillColor = f.fg, color.Transparent
	for _, t := range m.ticks {
		t.StrokeColor = f.fg
	}
	for i := range m.badges {
		m.badges[i].FillColor, m.badges[i].StrokeColor, m.badges[i].StrokeWidth = f.errc, f.bg, 1
		m.badgeMarks[i].TextStyle = fyne.TextStyle{Bold: true}
		setText(m.badgeMarks[i], "!", color.White, f.textSize)
	}
	for i := len(m.unvisited); i < len(m.badges); i++ {
		m.badges[i].Hidden, m.badgeMarks[i].Hidden = true, true
	}
	m.meet.StrokeColor, m.meet.FillColor = f.fg, withAlpha(f.bg, 0xc0)
}

// reserve keeps the worst exit's tag, drawn below its junction, free of labels.
func (m *markerLayer) reserve(e *Editor, f *frame) {
	if w := e.overlay.Worst; w >= 0 && w < len(f.pts) && f.vis.Contains(f.pts[w]) {
		f.reserveBelow(m.worstTag, f.pts[w], 17)
	}
}

func (m *markerLayer) layout(e *Editor, f *frame) {
	ov := &e.overlay
	n, pts := len(f.pts), f.pts
	m.layoutSel(e, m.selRing, m.corrSel, e.sel, pts, 12)
	if e.hover == e.sel {
		m.hovRing.Hidden, m.corrHov.Hidden = true, true
	} else {
		m.layoutSel(e, m.hovRing, m.corrHov, e.hover, pts, 11)
	}
	// worst exit: thick ring and tag
	m.worst.Hidden, m.worstTag.Hidden = true, true
	if w := ov.Worst; w >= 0 && w < n {
		m.worst.Hidden, m.worstTag.Hidden = false, false
		place(m.worst, pts[w], 15)
		moveText(m.worstTag, pts[w].X-float64(m.worstTag.Size().Width)/2, pts[w].Y+17)
	}
	// replayed exit: ring and cross-hair ticks
	m.focus.Hidden = true
	for _, t := range m.ticks {
		t.Hidden = true
	}
	if fo := ov.Focus; fo >= 0 && fo < n {
		p := pts[fo]
		m.focus.Hidden = false
		place(m.focus, p, 20)
		d := [4]geom.Pt{{X: 1}, {X: -1}, {Y: 1}, {Y: -1}}
		for k, t := range m.ticks {
			t.Hidden = false
			placeLine(t, p.Add(d[k].Mul(16)), p.Add(d[k].Mul(27)))
		}
	}
	for k, v := range m.unvisited {
		p := pts[v].Add(geom.Pt{X: -nodeR - 3, Y: -nodeR - 3})
		m.badges[k].Hidden, m.badgeMarks[k].Hidden = false, false
		place(m.badges[k], p, 7)
		sz := m.badgeMarks[k].Size()
		moveText(m.badgeMarks[k], p.X-float64(sz.Width)/2, p.Y-float64(sz.Height)/2)
	}
	// meeting point
	m.meet.Hidden, m.meetTag.Hidden = true, true
	if ov.Meeting != nil && validPoint(e, *ov.Meeting) {
		p := e.view.ToScreen(e.pointWorld(*ov.Meeting))
		m.meet.Hidden, m.meetTag.Hidden = false, false
		m.meet.Move(fyne.NewPos(float32(p.X-6), float32(p.Y-6)))
		m.meet.Resize(fyne.NewSize(12, 12))
		moveText(m.meetTag, p.X-float64(m.meetTag.Size().Width)/2, p.Y-6-float64(m.meetTag.Size().Height))
	}
	m.layoutRubber(e, f)
}

// layoutSel rings the selected (or hovered) junction, or highlights the corridor.
func (m *markerLayer) layoutSel(e *Editor, ring *fc.Circle, line *fc.Line, s Selection, pts []geom.Pt, rad float64) {
	ring.Hidden, line.Hidden = true, true
	switch s.Kind {
	case SelNode:
		if s.Index < len(pts) {
			ring.Hidden = false
			place(ring, pts[s.Index], rad)
		}
	case SelCorridor:
		if s.Index < len(e.d.ends) {
			en := e.d.ends[s.Index]
			if en[0] >= 0 && en[1] >= 0 {
				line.Hidden = false
				placeLine(line, pts[en[0]], pts[en[1]])
			}
		}
	}
}

// layoutRubber draws the rubber band of a connecting drag, red when the drop would be refused.
func (m *markerLayer) layoutRubber(e *Editor, f *frame) {
	m.rubber.Hidden = e.drag.kind != dragConnect
	if m.rubber.Hidden {
		return
	}
	m.rubber.StrokeColor, m.rubber.StrokeWidth = f.primary, 2
	if e.drag.loop {
		m.rubber.StrokeColor, m.rubber.StrokeWidth = f.errc, 3 // this drop will be refused
	}
	a := f.pts[e.drag.node]
	b := toPt(e.drag.cur)
	if t := e.drag.target; t >= 0 {
		b = f.pts[t]
	}
	placeLine(m.rubber, a, b)
}

// agentLayer draws the agents (a disc with the name's first letter, ringed when informed) and their
// trails.
type agentLayer struct {
	discs   []*fc.Circle
	letters []*fc.Text
	trails  []*trailPool // per agent
}

// trailPool holds the segments of one agent's trail.
type trailPool struct{ segs []*fc.Line }

func (a *agentLayer) update(e *Editor, f *frame, grown *bool) {
	ov := &e.overlay
	a.discs = grow(a.discs, len(ov.Agents), grown)
	a.letters = grow(a.letters, len(ov.Agents), grown)
	a.trails = grow(a.trails, len(ov.Agents), grown)
	for i, ag := range ov.Agents {
		a.trails[i].segs = grow(a.trails[i].segs, len(ag.Trail), grown)
	}
	for i, ag := range ov.Agents {
		ac := agentColors[i%len(agentColors)]
		c := a.discs[i]
		c.FillColor = ac.fill
		if ag.Informed {
			c.StrokeColor, c.StrokeWidth = f.fg, 3
		} else {
			c.StrokeColor, c.StrokeWidth = f.bg, 1.5
		}
		letter := "?"
		for _, ch := range ag.Name {
			letter = string(ch)
			break
		}
		a.letters[i].TextStyle = fyne.TextStyle{Bold: true}
		setText(a.letters[i], letter, ac.letter, f.textSize)
		segs := a.trails[i].segs
		for _, l := range segs {
			l.StrokeColor, l.StrokeWidth = withAlpha(ac.fill, 0xa0), 3
		}
		for k := len(ag.Trail); k < len(segs); k++ {
			segs[k].Hidden = true
		}
	}
	for i := len(ov.Agents); i < len(a.discs); i++ {
		a.discs[i].Hidden, a.letters[i].Hidden = true, true
		for _, l := range a.trails[i].segs {
			l.Hidden = true
		}
	}
}

func (a *agentLayer) layout(e *Editor, f *frame) {
	ov := &e.overlay
	for i, ag := range ov.Agents {
		c, t := a.discs[i], a.letters[i]
		ok := validPoint(e, ag.At)
		c.Hidden, t.Hidden = !ok, !ok
		p := e.view.ToScreen(e.pointWorld(ag.At))
		if ok {
			// the two agents side by side when they share a place
			if i > 0 && len(ov.Agents) > 1 && ag.At == ov.Agents[0].At {
				p = p.Add(geom.Pt{X: 2*agentR - 2, Y: 0})
			}
			place(c, p, agentR)
			sz := t.Size()
			moveText(t, p.X-float64(sz.Width)/2, p.Y-float64(sz.Height)/2)
		}
		for k, tp := range ag.Trail {
			l := a.trails[i].segs[k]
			q := e.view.ToScreen(e.pointWorld(tp))
			if !validPoint(e, tp) {
				l.Hidden = true
				continue
			}
			next := p
			if k+1 < len(ag.Trail) {
				next = e.view.ToScreen(e.pointWorld(ag.Trail[k+1]))
			}
			l.Hidden = !f.vis.SegTouches(q, next) || !ok
			placeLine(l, q, next)
		}
	}
}

// messageLayer draws the editor's transient message near the pointer.
type messageLayer struct {
	bg   *fc.Rectangle
	text *fc.Text
}

func (m *messageLayer) init() {
	m.bg = &fc.Rectangle{StrokeWidth: 1, CornerRadius: 4}
	m.text = &fc.Text{}
}

func (m *messageLayer) update(e *Editor, f *frame) {
	m.bg.FillColor = f.overlayBg
	m.bg.StrokeColor = f.muted
	setText(m.text, e.msg.text, f.fg, f.textSize)
}

// layout puts the message above and right of where it was raised, inside the widget.
func (m *messageLayer) layout(e *Editor, f *frame) {
	m.text.Hidden = e.msg.text == ""
	m.bg.Hidden = m.text.Hidden
	if m.text.Hidden {
		return
	}
	sz := m.text.Size()
	x := math.Min(float64(e.msg.at.X)+14, float64(f.size.Width)-float64(sz.Width)-8)
	y := float64(e.msg.at.Y) - float64(sz.Height) - 14
	if y < 4 {
		y = float64(e.msg.at.Y) + 18
	}
	x = math.Max(x, 4)
	moveText(m.text, x, y)
	m.bg.Move(fyne.NewPos(float32(x-6), float32(y-3)))
	m.bg.Resize(fyne.NewSize(sz.Width+12, sz.Height+6))
}

// helpLayer draws the list of shortcuts and gestures.
type helpLayer struct {
	bg            *fc.Rectangle
	keys, actions []*fc.Text
}

func (h *helpLayer) init() {
	h.bg = &fc.Rectangle{StrokeWidth: 1, CornerRadius: 6}
	for _, s := range Shortcuts() {
		h.keys = append(h.keys, &fc.Text{Text: s.Key, TextStyle: fyne.TextStyle{Bold: true}})
		h.actions = append(h.actions, &fc.Text{Text: s.Action})
	}
}

func (h *helpLayer) update(f *frame) {
	h.bg.FillColor = f.overlayBg
	h.bg.StrokeColor = f.muted
	for i := range h.keys {
		setText(h.keys[i], h.keys[i].Text, f.fg, f.textSize)
		setText(h.actions[i], h.actions[i].Text, f.fg, f.textSize)
	}
}

// layout shows the help as two columns in a panel at the top left, or hides it.
func (h *helpLayer) layout(shown bool) {
	hide := !shown
	h.bg.Hidden = hide
	for i := range h.keys {
		h.keys[i].Hidden, h.actions[i].Hidden = hide, hide
	}
	if hide {
		return
	}
	const pad, gap = 12, 16
	kw, aw := float32(0), float32(0)
	lh := float32(0)
	for i := range h.keys {
		kw = max(kw, h.keys[i].Size().Width)
		aw = max(aw, h.actions[i].Size().Width)
		lh = max(lh, h.keys[i].Size().Height)
	}
	lh += 2
	x0, y0 := float32(12), float32(12)
	h.bg.Move(fyne.NewPos(x0, y0))
	h.bg.Resize(fyne.NewSize(2*pad+kw+gap+aw, 2*pad+lh*float32(len(h.keys))))
	for i := range h.keys {
		y := y0 + pad + lh*float32(i)
		h.keys[i].Move(fyne.NewPos(x0+pad, y))
		h.actions[i].Move(fyne.NewPos(x0+pad+kw+gap, y))
	}
}
