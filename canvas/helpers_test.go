package canvas

import (
	"testing"
	"time"

	"math"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/driver/desktop"
	"fyne.io/fyne/v2/test"
	"fyne.io/fyne/v2/theme"

	"duosweep/canvas/geom"
	"duosweep/engine"
)

// small is a hand-made site: s at the top, a below it, b and c below a.
//
//	s(0,0)
//	 |  10
//	a(0,10)
//	 |  \   (10, 14.1)
//	b(0,20) c(10,20)
func small() engine.Scenario {
	return engine.Scenario{
		Name: "small", Unit: "m", Start: "s",
		Nodes: []engine.Node{
			{ID: "s", X: 0, Y: 0, HasXY: true},
			{ID: "a", X: 0, Y: 10, HasXY: true, Candidate: true},
			{ID: "b", X: 0, Y: 20, HasXY: true, Candidate: true, Label: "Sump"},
			{ID: "c", X: 10, Y: 20, HasXY: true, Candidate: true},
		},
		Corridors: []engine.Corridor{
			{From: "s", To: "a", Length: 10},
			{From: "a", To: "b", Length: 10},
			{From: "a", To: "c", Length: 14.1},
		},
	}
}

type rec struct {
	changed []engine.Scenario
	sels    []Selection
	msgs    []string
	msgAt   []fyne.Position
	tapped  []int
	timers  []func()
}

// newTestEditor puts an editor for sc in a 400×400 test window (light theme)
// and records its callbacks.
func newTestEditor(t *testing.T, sc engine.Scenario) (*Editor, fyne.Window, *rec) {
	t.Helper()
	a := test.NewTempApp(t)
	a.Settings().SetTheme(theme.LightTheme())
	e := NewEditor(sc)
	rc := &rec{}
	e.after = func(_ time.Duration, f func()) { rc.timers = append(rc.timers, f) }
	e.OnChanged = func(sc engine.Scenario) { rc.changed = append(rc.changed, sc) }
	e.OnSelectionChanged = func(s Selection) { rc.sels = append(rc.sels, s) }
	e.OnMessage = func(m string, at fyne.Position) { rc.msgs = append(rc.msgs, m); rc.msgAt = append(rc.msgAt, at) }
	e.OnNodeTapped = func(i int) { rc.tapped = append(rc.tapped, i) }
	w := test.NewWindow(e)
	w.SetPadded(false)
	w.Resize(fyne.NewSize(400, 400))
	e.FitView()
	t.Cleanup(w.Close)
	return e, w, rc
}

// dragPtr simulates a real pointer drag: mouse down at from, moves in steps,
// drag end, mouse up (the event positions follow the desktop driver).
func dragPtr(e *Editor, from, to fyne.Position, mods fyne.KeyModifier) {
	e.MouseDown(&desktop.MouseEvent{PointEvent: fyne.PointEvent{Position: from}, Button: desktop.MouseButtonPrimary, Modifier: mods})
	prev := from
	const steps = 4
	for k := 1; k <= steps; k++ {
		f := float32(k) / steps
		p := fyne.NewPos(from.X+(to.X-from.X)*f, from.Y+(to.Y-from.Y)*f)
		e.Dragged(&fyne.DragEvent{PointEvent: fyne.PointEvent{Position: p}, Dragged: fyne.NewDelta(p.X-prev.X, p.Y-prev.Y)})
		prev = p
	}
	e.DragEnd()
	e.MouseUp(&desktop.MouseEvent{PointEvent: fyne.PointEvent{Position: to}, Button: desktop.MouseButtonPrimary})
}

func tapAt(e *Editor, p fyne.Position, mods fyne.KeyModifier) {
	e.MouseDown(&desktop.MouseEvent{PointEvent: fyne.PointEvent{Position: p}, Button: desktop.MouseButtonPrimary, Modifier: mods})
	e.MouseUp(&desktop.MouseEvent{PointEvent: fyne.PointEvent{Position: p}, Button: desktop.MouseButtonPrimary})
	e.Tapped(&fyne.PointEvent{Position: p})
}

var (
	desktopShortcutZ      = desktop.CustomShortcut{KeyName: fyne.KeyZ, Modifier: fyne.KeyModifierControl}
	desktopShortcutShiftZ = desktop.CustomShortcut{KeyName: fyne.KeyZ, Modifier: fyne.KeyModifierControl | fyne.KeyModifierShift}
)

func mouse(p fyne.Position, mods fyne.KeyModifier) *desktop.MouseEvent {
	return &desktop.MouseEvent{PointEvent: fyne.PointEvent{Position: p}, Button: desktop.MouseButtonPrimary, Modifier: mods}
}

func renderMarkup(w fyne.Window) string { return test.RenderToMarkup(w.Canvas()) }

func minPairDist(pts []geom.Pt) float64 {
	md := math.Inf(1)
	for i := range pts {
		for j := i + 1; j < len(pts); j++ {
			md = math.Min(md, geom.Dist(pts[i], pts[j]))
		}
	}
	return md
}

// rendererOf is the renderer fyne made for e (tests look at the objects it draws).
func rendererOf(e *Editor) *editorRenderer { return test.WidgetRenderer(e).(*editorRenderer) }
