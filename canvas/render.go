package canvas

import (
	"image/color"

	"fyne.io/fyne/v2"
	fc "fyne.io/fyne/v2/canvas"
	"fyne.io/fyne/v2/theme"

	"duosweep/canvas/geom"
	"duosweep/engine"
)

// Sizes in widget units.
const (
	nodeR        = geom.NodeRadius
	startHalf    = 8
	agentR       = 9
	labelMinZoom = 26 // median corridor on screen, below which node labels hide
	lengthMinPx  = 56 // corridor on screen, below which its length label hides
	cullMargin   = 24
)

// editorRenderer draws an Editor. It reads the editor's state and never changes it, and the editor
// never calls it: fyne calls Refresh after the state changed (the layers copy colours, texts and
// pool sizes into their objects, then lay them out) and Layout when the size changed (the layers
// move their objects to the view and hide what is off screen). Each layer owns its objects and
// reuses them; pools only grow.
type editorRenderer struct {
	e *Editor

	bg        *fc.Rectangle
	backdrop  backdropLayer // the traced site plan under everything (backdrop.go)
	corridors corridorLayer
	shapes    shapeLayer // closed and shaped corridors (render_shapes.go)
	junctions junctionLayer
	markers   markerLayer
	agents    agentLayer
	message   messageLayer
	help      helpLayer

	objects []fyne.CanvasObject
	grown   bool // a pool grew since Objects last listed them
	f       frame
}

// frame is what the layers share while they draw one frame.
type frame struct {
	fg, bg, primary, errc, muted, overlayBg color.Color
	textSize                                float32

	size   fyne.Size
	pts    []geom.Pt   // junction centres in widget coordinates
	screen geom.Rect   // the widget
	vis    geom.Rect   // the widget grown by cullMargin: what is drawn at all
	placer geom.Placer // the boxes of the labels (and markers) placed so far
}

func newEditorRenderer(e *Editor) *editorRenderer {
	r := &editorRenderer{e: e, bg: fc.NewRectangle(color.Transparent), grown: true}
	r.junctions.init()
	r.backdrop.init()
	r.markers.init()
	r.message.init()
	r.help.init()
	return r
}

// Objects is part of fyne.WidgetRenderer, in drawing order: corridors under trails under junctions,
// markers and agents on top, then the tags, the rubber band, the message and the help.
func (r *editorRenderer) Objects() []fyne.CanvasObject {
	if !r.grown {
		return r.objects
	}
	r.grown = false
	c, j, m, ag := &r.corridors, &r.junctions, &r.markers, &r.agents
	o := append(r.objects[:0], r.bg, r.backdrop.img, m.corrHov, m.corrSel)
	o = appendAll(o, c.lines)
	o = appendAll(o, r.shapes.segs)
	o = appendAll(o, c.labels)
	for _, t := range ag.trails {
		o = appendAll(o, t.segs)
	}
	o = append(o, m.hovRing, m.selRing, m.worst, m.focus, m.ticks[0], m.ticks[1], m.ticks[2], m.ticks[3])
	o = appendAll(o, j.nodes)
	o = append(o, j.startSq)
	o = appendAll(o, j.labels)
	for i := range m.badges {
		o = append(o, m.badges[i], m.badgeMarks[i])
	}
	o = append(o, m.meet)
	for i := range ag.discs {
		o = append(o, ag.discs[i], ag.letters[i])
	}
	o = append(o, j.startTag, m.worstTag, m.meetTag, m.rubber, r.message.bg, r.message.text, r.help.bg)
	for i := range r.help.keys {
		o = append(o, r.help.keys[i], r.help.actions[i])
	}
	r.objects = o
	return o
}

func appendAll[T fyne.CanvasObject](o []fyne.CanvasObject, s []T) []fyne.CanvasObject {
	for _, x := range s {
		o = append(o, x)
	}
	return o
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

// Refresh is part of fyne.WidgetRenderer: it copies the editor's state into
// the layers, then lays them out. O(n + m + overlay).
func (r *editorRenderer) Refresh() {
	if !live() {
		return
	}
	r.update()
	r.Layout(r.e.Size())
	fc.Refresh(r.bg)
}

// update copies the editor's state into every layer's objects, growing the pools as needed.
// O(n + m + overlay).
func (r *editorRenderer) update() {
	e, f := r.e, &r.f
	f.fg = theme.ColorForWidget(theme.ColorNameForeground, e)
	f.bg = theme.ColorForWidget(theme.ColorNameBackground, e)
	f.primary = theme.ColorForWidget(theme.ColorNamePrimary, e)
	f.errc = theme.ColorForWidget(theme.ColorNameError, e)
	f.muted = withAlpha(f.fg, 0x99)
	f.overlayBg = theme.ColorForWidget(theme.ColorNameOverlayBackground, e)
	f.textSize = theme.SizeForWidget(theme.SizeNameCaptionText, e)
	r.bg.FillColor = f.bg
	r.junctions.update(e, f, &r.grown)
	r.backdrop.update(e)
	r.corridors.update(e, f, &r.grown)
	r.shapes.update(e, f, &r.grown)
	r.markers.update(e, f, &r.grown)
	r.agents.update(e, f, &r.grown)
	r.message.update(e, f)
	r.help.update(f)
}

// needSync reports whether the pools are smaller than the state they draw (a layout before the
// first refresh).
func (r *editorRenderer) needSync() bool {
	e := r.e
	ag := &r.agents
	if len(r.junctions.nodes) < len(e.sc.Nodes) || len(r.corridors.lines) < len(e.sc.Corridors) ||
		len(ag.discs) < len(e.overlay.Agents) || len(r.markers.badges) < len(e.overlay.Unvisited) {
		return true
	}
	for i, a := range e.overlay.Agents {
		if len(ag.trails[i].segs) < len(a.Trail) {
			return true
		}
	}
	return false
}

// Layout is part of fyne.WidgetRenderer: it moves every layer's objects to
// the current view and hides what is off screen. O(n + m + overlay).
func (r *editorRenderer) Layout(size fyne.Size) {
	if !live() {
		return
	}
	sync := r.needSync()
	if sync {
		r.update() // first layout before any refresh: fill the pools
	}
	e, f := r.e, &r.f
	r.bg.Resize(size)
	r.bg.Move(fyne.NewPos(0, 0))
	f.begin(e, size)
	// junctions, then labels placed greedily where they overlap no junction, marker, tag or earlier
	// label (important ones first); labels that find no room hide. Corridor lengths come last.
	r.backdrop.layout(e, f)
	r.junctions.layoutMarks(e, f)
	r.markers.reserve(e, f)
	r.junctions.layoutLabels(e, f)
	r.corridors.layout(e, f)
	r.shapes.layout(e, f)
	r.markers.layout(e, f)
	r.agents.layout(e, f)
	r.message.layout(e, f)
	r.help.layout(e.help)
	if sync {
		fc.Refresh(r.bg)
	}
}

// begin starts a frame of size: junction positions on screen, the visible area, an empty placer.
func (f *frame) begin(e *Editor, size fyne.Size) {
	n := len(e.sc.Nodes)
	if cap(f.pts) < n {
		f.pts = make([]geom.Pt, n)
	}
	f.pts = f.pts[:n]
	for i := range f.pts {
		f.pts[i] = e.view.ToScreen(e.nodeWorld(i))
	}
	f.size = size
	f.screen = geom.Rect{Max: geom.Pt{X: float64(size.Width), Y: float64(size.Height)}}
	f.vis = f.screen.Grow(cullMargin)
	f.placer.Reset(64)
}

// inside reports whether box lies within the widget.
func (f *frame) inside(box geom.Rect) bool {
	return box.Min.X >= 0 && box.Min.Y >= 0 && box.Max.X <= float64(f.size.Width) && box.Max.Y <= float64(f.size.Height)
}

// reserveBelow keeps the box of tag t, centred under p at dy, free of labels.
func (f *frame) reserveBelow(t *fc.Text, p geom.Pt, dy float64) {
	sz := t.Size()
	w, h := float64(sz.Width), float64(sz.Height)
	f.placer.Add(geom.Rect{Min: geom.Pt{X: p.X - w/2, Y: p.Y + dy}, Max: geom.Pt{X: p.X + w/2, Y: p.Y + dy + h}})
}

// validPoint reports whether p names a node, or a corridor, of the editor's scenario.
func validPoint(e *Editor, p engine.Point) bool {
	n := len(e.sc.Nodes)
	if p.From < 0 || p.From >= n {
		return false
	}
	if p.To < 0 {
		return true
	}
	_, ok := e.d.pair[pairKey(p.From, p.To)]
	return p.To < n && ok
}

// grow extends pool to at least n new objects and records in *grown that it did.
func grow[T any, P interface{ *T }](pool []P, n int, grown *bool) []P {
	for len(pool) < n {
		pool = append(pool, P(new(T)))
		*grown = true
	}
	return pool
}

func withAlpha(c color.Color, a uint8) color.NRGBA {
	n := color.NRGBAModel.Convert(c).(color.NRGBA)
	n.A = a
	return n
}

// setText updates t and refreshes its texture only when something changed.
func setText(t *fc.Text, s string, c color.Color, size float32) {
	if t.Text == s && t.TextSize == size && t.Color == c {
		return
	}
	t.Text, t.Color, t.TextSize = s, c, size
	t.Resize(t.MinSize())
	fc.Refresh(t)
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
