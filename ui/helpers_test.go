package ui

import (
	"math"
	"sync"
	"testing"
	"time"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/test"
	"fyne.io/fyne/v2/theme"
	"fyne.io/fyne/v2/widget"

	"duosweep/engine"
	"duosweep/engine/planners"
)

// uiQueue stands in for fyne.Do in tests: background work queues functions, and waitIdle runs them on
// the test goroutine, so widgets are only ever touched from one goroutine (checked with -race).
type uiQueue struct {
	mu     sync.Mutex
	fns    []func()
	signal chan struct{} // receives a token when work is queued (benchmarks wait on it)
}

func newQueue() *uiQueue { return &uiQueue{signal: make(chan struct{}, 1)} }

func (q *uiQueue) push(f func()) {
	q.mu.Lock()
	q.fns = append(q.fns, f)
	q.mu.Unlock()
	select {
	case q.signal <- struct{}{}:
	default:
	}
}

func (q *uiQueue) drain() []func() {
	q.mu.Lock()
	defer q.mu.Unlock()
	fns := q.fns
	q.fns = nil
	return fns
}

// waitIdle runs posted UI work on the calling goroutine until no planning run is in flight and nothing
// is queued.
func (a *App) waitIdle(q *uiQueue) {
	for {
		a.jobs.Wait()
		fns := q.drain()
		if len(fns) == 0 {
			return
		}
		for _, f := range fns {
			f()
		}
	}
}

// fakeClock is the playback clock of a test.
type fakeClock struct{ t time.Time }

func (c *fakeClock) now() time.Time { return c.t }

func (c *fakeClock) advance(sec float64) { c.t = c.t.Add(time.Duration(sec * float64(time.Second))) }

type harness struct {
	t     testing.TB
	app   *App
	q     *uiQueue
	win   fyne.Window
	clock *fakeClock
}

// newHarness builds the main window on a test app (light theme) for path ("" for the demo) and waits
// for the first plan.
func newHarness(t testing.TB, path string) *harness {
	t.Helper()
	fa := test.NewTempApp(t)
	fa.Settings().SetTheme(theme.LightTheme())
	return newHarnessOn(t, fa, path, "")
}

func newHarnessOn(t testing.TB, fa fyne.App, path, recovery string) *harness {
	t.Helper()
	if recovery == "" {
		recovery = t.TempDir() + "/recovery.sweep.json"
	}
	w := test.NewTempWindow(t, nil)
	q := newQueue()
	h := &harness{t: t, q: q, win: w, clock: &fakeClock{t: time.Unix(1_000_000, 0)}}
	h.app = newApp(fa, w, path, options{post: q.push, recovery: recovery})
	h.app.now = h.clock.now
	w.Resize(fyne.NewSize(1360, 860))
	h.wait()
	return h
}

func (h *harness) wait() { h.app.waitIdle(h.q) }

// edit applies an undoable edit through the editor (as the inspector does) and waits for the replan.
func (h *harness) edit(name string, fn func(*engine.Scenario) error) {
	h.t.Helper()
	if err := h.app.editor.Edit(name, fn); err != nil {
		h.t.Fatalf("edit %s: %v", name, err)
	}
	h.wait()
}

// engineBest plans sc with the engine directly (the reference the window must agree with).
func engineBest(t testing.TB, sc engine.Scenario, m engine.Model) (*engine.Site, *engine.Plan, *engine.Report) {
	t.Helper()
	s, err := engine.NewSite(sc)
	if err != nil {
		t.Fatal(err)
	}
	p, r, err := planners.BestPlan(t.Context(), s, m)
	if err != nil {
		t.Fatal(err)
	}
	return s, p, r
}

func near(a, b float64) bool { return math.Abs(a-b) <= 1e-9*math.Max(1, math.Abs(b)) }

func posNear(a, b fyne.Position) bool {
	return math.Abs(float64(a.X-b.X)) < 1e-3 && math.Abs(float64(a.Y-b.Y)) < 1e-3
}

// findButton returns the first button labelled text in the window's overlays (dialogs), or nil.
func findButton(c fyne.Canvas, text string) *widget.Button {
	var found *widget.Button
	for _, o := range c.Overlays().List() {
		walk(o, func(x fyne.CanvasObject) bool {
			if b, ok := x.(*widget.Button); ok && b.Text == text {
				found = b
				return true
			}
			return false
		})
		if found != nil {
			break
		}
	}
	return found
}

// walk calls fn for o and everything inside it (containers and widget renderers).
func walk(o fyne.CanvasObject, fn func(fyne.CanvasObject) bool) bool {
	if o == nil {
		return false
	}
	if fn(o) {
		return true
	}
	switch x := o.(type) {
	case *fyne.Container:
		for _, ch := range x.Objects {
			if walk(ch, fn) {
				return true
			}
		}
	case fyne.Widget:
		for _, ch := range test.WidgetRenderer(x).Objects() {
			if walk(ch, fn) {
				return true
			}
		}
	}
	return false
}

func findEntryWhere(t testing.TB, a *App, ok func(*widget.Entry) bool) *widget.Entry {
	t.Helper()
	var found *widget.Entry
	walk(a.w.inspector, func(o fyne.CanvasObject) bool {
		if e, is := o.(*widget.Entry); is && ok(e) {
			found = e
			return true
		}
		return false
	})
	if found == nil {
		t.Fatal("entry not found in the inspector")
	}
	return found
}

func findEntry(t testing.TB, a *App, text string) *widget.Entry {
	return findEntryWhere(t, a, func(e *widget.Entry) bool { return e.Text == text })
}

func findEntryByPlaceholder(t testing.TB, a *App, ph string) *widget.Entry {
	return findEntryWhere(t, a, func(e *widget.Entry) bool { return e.PlaceHolder == ph })
}

func widgetCell(row, col int) widget.TableCellID { return widget.TableCellID{Row: row, Col: col} }

func hdrButton(o fyne.CanvasObject) *widget.Button { return o.(*widget.Button) }
