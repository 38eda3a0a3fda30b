package canvas

import (
	"fmt"
	"math"
	"time"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/driver/desktop"
	"fyne.io/fyne/v2/widget"

	"duosweep/canvas/geom"
)

// Hit radii in widget units.
const (
	nodeHitRadius     = 12
	corridorHitRadius = 6
	doubleTapWindow   = 450 * time.Millisecond
	doubleTapSlop     = 8
)

type dragKind int

const (
	dragNone dragKind = iota
	dragMove
	dragConnect
	dragPan
)

// press is the last mouse-down, kept until the drag or tap it starts.
type press struct {
	valid bool
	at    fyne.Position
	mods  fyne.KeyModifier
}

type drag struct {
	kind   dragKind
	node   int     // moved node, or connect source
	grab   geom.Pt // node position minus grab point, drawing units
	world  geom.Pt // dragged node position (move)
	start  fyne.Position
	cur    fyne.Position
	target int  // node under the pointer while connecting, -1 none
	loop   bool // connecting to target would close a loop
	moved  bool
}

type lastTap struct {
	at   time.Time
	pos  fyne.Position
	prev Selection // selection before that tap
	ok   bool
}

type message struct {
	text string
	at   fyne.Position
	gen  int
}

// screenNodes returns the widget coordinates of all nodes.
func (e *Editor) screenNodes() []geom.Pt {
	pts := make([]geom.Pt, len(e.sc.Nodes))
	for i := range pts {
		pts[i] = e.view.ToScreen(e.nodeWorld(i))
	}
	return pts
}

// nodeAt returns the junction under widget position p, or -1.
func (e *Editor) nodeAt(p fyne.Position, skip int) int {
	return geom.NearestPoint(e.screenNodes(), toPt(p), nodeHitRadius, skip)
}

// hitTest returns the junction or corridor under p (junctions first).
func (e *Editor) hitTest(p fyne.Position) Selection {
	pts := e.screenNodes()
	if i := geom.NearestPoint(pts, toPt(p), nodeHitRadius, -1); i >= 0 {
		return Selection{Kind: SelNode, Index: i}
	}
	segs := make([]geom.Seg, len(e.d.ends))
	far := geom.Pt{X: math.Inf(1), Y: math.Inf(1)}
	for i, en := range e.d.ends {
		if en[0] < 0 || en[1] < 0 {
			segs[i] = geom.Seg{A: far, B: far}
			continue
		}
		segs[i] = geom.Seg{A: pts[en[0]], B: pts[en[1]]}
	}
	if i := geom.NearestSeg(segs, toPt(p), corridorHitRadius); i >= 0 {
		return Selection{Kind: SelCorridor, Index: i}
	}
	return Selection{Kind: SelNone, Index: -1}
}

// message reports msg through OnMessage and shows it near at for MessageDuration.
func (e *Editor) message(msg string, at fyne.Position) {
	if e.OnMessage != nil {
		e.OnMessage(msg, at)
	}
	e.msg.gen++
	e.msg.text, e.msg.at = msg, at
	gen := e.msg.gen
	d := e.MessageDuration
	if d == 0 {
		d = 3 * time.Second
	}
	if d < 0 {
		e.Refresh() // shown until the next message
		return
	}
	after := e.after
	if e.Schedule != nil {
		after = e.Schedule
	}
	after(d, func() {
		if e.msg.gen == gen {
			e.msg.text = ""
			e.Refresh()
		}
	})
	e.Refresh()
}

// Message returns the message the editor is showing, "" for none.
func (e *Editor) Message() string { return e.msg.text }

func (e *Editor) report(err error, at fyne.Position) {
	if err != nil {
		e.message(err.Error(), at)
	}
}

func (e *Editor) mods() fyne.KeyModifier {
	m := e.keyMods | e.tapMods
	if e.press.valid {
		m |= e.press.mods
	}
	return m
}

// Tapped is part of fyne.Tappable: select what is under the pointer; on empty
// space deselect, or add a junction with the add tool, Shift-tap or a
// double tap.
func (e *Editor) Tapped(ev *fyne.PointEvent) {
	e.requestFocus()
	pos := ev.Position
	e.pointer = pos
	mods := e.mods()
	e.press, e.tapMods = press{}, 0
	if e.captureTap(pos) { // calibrating the backdrop (backdrop.go)
		return
	}
	hit := e.hitTest(pos)
	switch hit.Kind {
	case SelNode:
		e.lastTap = lastTap{}
		if e.tool == ToolConnect && e.sel.Kind == SelNode && e.sel.Index != hit.Index {
			src := e.sel.Index
			if err := e.Connect(src, hit.Index); err != nil {
				e.report(err, pos)
				return
			}
		}
		e.Select(hit)
		if e.OnNodeTapped != nil {
			e.OnNodeTapped(hit.Index)
		}
	case SelCorridor:
		e.lastTap = lastTap{}
		e.Select(hit)
	default:
		now := e.now()
		double := e.lastTap.ok && now.Sub(e.lastTap.at) <= doubleTapWindow &&
			math.Hypot(float64(pos.X-e.lastTap.pos.X), float64(pos.Y-e.lastTap.pos.Y)) <= doubleTapSlop
		if e.tool == ToolAddJunction || mods&fyne.KeyModifierShift != 0 || double {
			if double {
				e.Select(e.lastTap.prev) // the first tap of the pair deselected
			}
			e.lastTap = lastTap{}
			if _, err := e.AddNode(pos); err != nil {
				e.report(err, pos)
			}
			return
		}
		e.lastTap = lastTap{at: now, pos: pos, prev: e.sel, ok: true}
		e.Select(Selection{Kind: SelNone, Index: -1})
	}
}

// TappedSecondary is part of fyne.SecondaryTappable: a context menu for the
// junction or corridor under the pointer, or for empty space.
func (e *Editor) TappedSecondary(ev *fyne.PointEvent) {
	pos := ev.Position
	e.pointer = pos
	e.press, e.tapMods = press{}, 0
	if e.captureTap(pos) { // calibrating the backdrop (backdrop.go)
		return
	}
	hit := e.hitTest(pos)
	if hit.Kind != SelNone {
		e.Select(hit)
	}
	var items []*fyne.MenuItem
	switch hit.Kind {
	case SelNode:
		i := hit.Index
		items = append(items,
			fyne.NewMenuItem("Make start (S)", func() { e.report(e.SetStart(i), pos) }),
			fyne.NewMenuItem("Toggle exit candidate (C)", func() { e.report(e.ToggleCandidate(i), pos) }),
			fyne.NewMenuItem("Add junction below (Shift-tap)", func() {
				e.Select(Selection{Kind: SelNode, Index: i})
				p := e.NodeXY(i)
				_, err := e.AddNode(fyne.NewPos(p.X, p.Y+60))
				e.report(err, pos)
			}),
			fyne.NewMenuItem("Delete junction (Del)", func() { e.report(e.DeleteSelection(), pos) }))
	case SelCorridor:
		items = append(items, fyne.NewMenuItem("Delete corridor (Del)", func() { e.report(e.DeleteSelection(), pos) }))
	default:
		items = append(items,
			fyne.NewMenuItem("Add junction here", func() { e.report(second(e.AddNode(pos)), pos) }),
			fyne.NewMenuItem("Fit view (F)", e.FitView),
			fyne.NewMenuItem("Tidy layout (T)", e.Tidy))
	}
	items = append(items, fyne.NewMenuItemSeparator(), fyne.NewMenuItem("Shortcuts and gestures (?)", e.ToggleHelp))
	c := fyne.CurrentApp().Driver().CanvasForObject(e)
	if c == nil {
		return
	}
	widget.ShowPopUpMenuAtPosition(fyne.NewMenu("", items...), c, ev.AbsolutePosition)
}

// requestFocus gives the editor the keyboard (fyne's desktop driver does not
// focus a widget on click by itself).
func (e *Editor) requestFocus() {
	if !live() {
		return
	}
	if c := fyne.CurrentApp().Driver().CanvasForObject(e); c != nil && c.Focused() != e {
		c.Focus(e)
	}
}

func second(_ int, err error) error { return err }

// MouseDown is part of desktop.Mouseable: it records where a drag starts and
// with which modifiers.
func (e *Editor) MouseDown(ev *desktop.MouseEvent) {
	e.requestFocus()
	e.tapMods = 0
	e.press = press{valid: true, at: ev.Position, mods: ev.Modifier}
	e.pointer = ev.Position
}

// MouseUp is part of desktop.Mouseable.
func (e *Editor) MouseUp(ev *desktop.MouseEvent) {
	if e.drag.kind == dragNone && e.press.valid {
		e.tapMods = e.press.mods // the tap that follows the release
	}
	e.press = press{}
}

// Dragged is part of fyne.Draggable. A drag from a junction moves it (with
// Alt, Ctrl or the connect tool it draws a corridor to another junction); a
// drag on empty space pans.
func (e *Editor) Dragged(ev *fyne.DragEvent) {
	if e.drag.kind == dragNone {
		var start, cur fyne.Position
		mods := e.keyMods
		if e.press.valid {
			// real pointer: the press is where the drag began
			start, cur = e.press.at, ev.Position
			mods |= e.press.mods
		} else {
			// synthetic drag (no mouse-down): the event gives the start and the move
			start = ev.Position
			cur = ev.Position.Add(ev.Dragged)
		}
		e.press = press{}
		e.lastTap = lastTap{}
		d := drag{start: start, cur: start, node: -1, target: -1}
		if n := e.nodeAt(start, -1); n >= 0 {
			d.node = n
			if e.tool == ToolConnect || mods&(fyne.KeyModifierAlt|fyne.KeyModifierControl|fyne.KeyModifierSuper) != 0 {
				d.kind = dragConnect
			} else {
				d.kind = dragMove
				d.world = e.d.world[n]
				d.grab = e.d.world[n].Sub(e.view.ToWorld(toPt(start)))
			}
		} else {
			d.kind = dragPan
		}
		e.drag = d
		e.dragTo(cur)
		return
	}
	if e.press.valid {
		e.dragTo(ev.Position)
		return
	}
	e.dragTo(e.drag.cur.Add(ev.Dragged))
}

func (e *Editor) dragTo(cur fyne.Position) {
	prev := e.drag.cur
	e.drag.cur = cur
	e.pointer = cur
	if cur != e.drag.start {
		e.drag.moved = true
	}
	switch e.drag.kind {
	case dragMove:
		e.drag.world = e.view.ToWorld(toPt(cur)).Add(e.drag.grab)
		e.Refresh()
	case dragConnect:
		t := e.nodeAt(cur, e.drag.node)
		if t != e.drag.target {
			e.drag.target = t
			e.drag.loop = t >= 0 && e.connected(e.drag.node, t, -1)
			e.hover = Selection{Kind: SelNone, Index: -1}
			if t >= 0 {
				e.hover = Selection{Kind: SelNode, Index: t}
			}
		}
		e.Refresh()
	case dragPan:
		e.PanBy(fyne.NewDelta(cur.X-prev.X, cur.Y-prev.Y))
	}
}

// DragEnd is part of fyne.Draggable: it resolves the drop.
func (e *Editor) DragEnd() {
	d := e.drag
	e.drag = drag{}
	e.press = press{}
	switch d.kind {
	case dragMove:
		if d.moved && d.world != e.d.world[d.node] {
			e.report(e.moveWorld(d.node, d.world), d.cur)
		} else {
			e.Refresh()
		}
	case dragConnect:
		t := e.nodeAt(d.cur, d.node)
		if t < 0 {
			e.Refresh() // dropped on empty space: cancelled
			return
		}
		if err := e.Connect(d.node, t); err != nil {
			e.Refresh()
			e.report(err, d.cur)
			return
		}
		e.Select(Selection{Kind: SelNode, Index: t})
	}
}

// Scrolled is part of fyne.Scrollable: vertical scrolling zooms around the
// pointer, horizontal scrolling pans.
func (e *Editor) Scrolled(ev *fyne.ScrollEvent) {
	if dy := ev.Scrolled.DY; dy != 0 {
		e.ZoomBy(float32(math.Pow(1.1, float64(dy)/10)), ev.Position)
	}
	if dx := ev.Scrolled.DX; dx != 0 {
		e.PanBy(fyne.NewDelta(dx, 0))
	}
}

// MouseIn is part of desktop.Hoverable.
func (e *Editor) MouseIn(ev *desktop.MouseEvent) { e.MouseMoved(ev) }

// MouseMoved is part of desktop.Hoverable: it updates the hover highlight.
func (e *Editor) MouseMoved(ev *desktop.MouseEvent) {
	e.pointer = ev.Position
	if e.drag.kind != dragNone {
		return
	}
	if h := e.hitTest(ev.Position); h != e.hover {
		e.hover = h
		e.Refresh()
	}
}

// MouseOut is part of desktop.Hoverable.
func (e *Editor) MouseOut() {
	if e.hover.Kind != SelNone {
		e.hover = Selection{Kind: SelNone, Index: -1}
		e.Refresh()
	}
}

// Hover returns what the pointer is over.
func (e *Editor) Hover() Selection { return e.hover }

// FocusGained is part of fyne.Focusable.
func (e *Editor) FocusGained() {}

// FocusLost is part of fyne.Focusable.
func (e *Editor) FocusLost() { e.keyMods = 0 }

// KeyDown is part of desktop.Keyable: it tracks the modifier keys.
func (e *Editor) KeyDown(ev *fyne.KeyEvent) { e.keyMods |= modOf(ev.Name) }

// KeyUp is part of desktop.Keyable.
func (e *Editor) KeyUp(ev *fyne.KeyEvent) { e.keyMods &^= modOf(ev.Name) }

func modOf(k fyne.KeyName) fyne.KeyModifier {
	switch k {
	case desktop.KeyShiftLeft, desktop.KeyShiftRight:
		return fyne.KeyModifierShift
	case desktop.KeyAltLeft, desktop.KeyAltRight:
		return fyne.KeyModifierAlt
	case desktop.KeyControlLeft, desktop.KeyControlRight:
		return fyne.KeyModifierControl
	case desktop.KeySuperLeft, desktop.KeySuperRight:
		return fyne.KeyModifierSuper
	}
	return 0
}

const panStep = 40

// TypedRune is part of fyne.Focusable: + − zoom, f fit, s start, c candidate,
// t tidy, ? help.
func (e *Editor) TypedRune(r rune) {
	switch r {
	case '+', '=':
		e.ZoomBy(1.25, e.centre())
	case '-', '_':
		e.ZoomBy(0.8, e.centre())
	case 'f', 'F':
		e.FitView()
	case 's', 'S':
		e.withNode(e.SetStart)
	case 'c', 'C':
		e.withNode(e.ToggleCandidate)
	case 't', 'T':
		e.Tidy()
	case '?':
		e.ToggleHelp()
	}
}

func (e *Editor) withNode(f func(int) error) {
	if e.sel.Kind != SelNode {
		e.message("select a junction first", e.pointer)
		return
	}
	e.report(f(e.sel.Index), e.pointer)
}

func (e *Editor) centre() fyne.Position {
	s := e.Size()
	return fyne.NewPos(s.Width/2, s.Height/2)
}

// TypedKey is part of fyne.Focusable: arrows pan, Delete/Backspace delete,
// F1 help, Escape cancels.
func (e *Editor) TypedKey(ev *fyne.KeyEvent) {
	switch ev.Name {
	case fyne.KeyUp:
		e.PanBy(fyne.NewDelta(0, panStep))
	case fyne.KeyDown:
		e.PanBy(fyne.NewDelta(0, -panStep))
	case fyne.KeyLeft:
		e.PanBy(fyne.NewDelta(panStep, 0))
	case fyne.KeyRight:
		e.PanBy(fyne.NewDelta(-panStep, 0))
	case fyne.KeyDelete, fyne.KeyBackspace:
		e.report(e.DeleteSelection(), e.pointer)
	case fyne.KeyF1:
		e.ToggleHelp()
	case fyne.KeyEscape:
		switch {
		case e.drag.kind != dragNone:
			e.drag = drag{}
			e.Refresh()
		case e.help:
			e.ToggleHelp()
		default:
			e.Select(Selection{Kind: SelNone, Index: -1})
		}
	case fyne.KeyEqual, fyne.KeyPlus:
		// handled as runes
	}
}

// TypedShortcut is part of fyne.Shortcutable: Ctrl+Z undo, Ctrl+Shift+Z and
// Ctrl+Y redo (Cmd on macOS).
func (e *Editor) TypedShortcut(s fyne.Shortcut) {
	switch sc := s.(type) {
	case *fyne.ShortcutUndo:
		e.undoOrSay()
	case *fyne.ShortcutRedo:
		e.redoOrSay()
	case *desktop.CustomShortcut:
		cmd := sc.Modifier&(fyne.KeyModifierControl|fyne.KeyModifierSuper) != 0
		shift := sc.Modifier&fyne.KeyModifierShift != 0
		switch {
		case cmd && shift && sc.KeyName == fyne.KeyZ:
			e.redoOrSay()
		case cmd && !shift && sc.KeyName == fyne.KeyZ:
			e.undoOrSay()
		case cmd && sc.KeyName == fyne.KeyY:
			e.redoOrSay()
		}
	}
}

func (e *Editor) undoOrSay() {
	name := e.UndoName()
	if !e.Undo() {
		e.message("nothing to undo", e.pointer)
		return
	}
	e.message(fmt.Sprintf("undid: %s", name), e.pointer)
}

func (e *Editor) redoOrSay() {
	name := e.RedoName()
	if !e.Redo() {
		e.message("nothing to redo", e.pointer)
		return
	}
	e.message(fmt.Sprintf("redid: %s", name), e.pointer)
}

// ToggleHelp shows or hides the overlay listing every shortcut and gesture.
func (e *Editor) ToggleHelp() {
	e.help = !e.help
	e.Refresh()
}

// HelpVisible reports whether the help overlay is shown.
func (e *Editor) HelpVisible() bool { return e.help }
