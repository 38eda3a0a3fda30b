package ui

import (
	"path/filepath"
	"strings"
	"sync"
	"time"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/dialog"
	"fyne.io/fyne/v2/widget"

	"duosweep/canvas"
	"duosweep/engine"
	"duosweep/icons"
	"duosweep/projects"
)

// Notice is the line the window always shows (MODEL.md: plans may be relied on in an emergency).
const Notice = projects.Disclaimer

// App is one Duosweep window: the scenario being edited, its current plan and the playback state.
// All fields are owned by the UI goroutine; background planning hands results back through post.
type App struct {
	fyneApp fyne.App
	win     fyne.Window
	editor  *canvas.Editor

	path  string // file of the scenario, "" while untitled
	dirty bool

	// planning choices
	model   engine.Model
	planner string // "" is "best available"

	planning planningState  // runs in flight and the result on screen (planning.go)
	search   searchState    // the "search for a better plan" action (search.go)
	playback playbackState  // the replay being played back (timeline.go)
	table    candidateTable // the candidate table of the plan panel (candidates.go)

	// post delivers a function to the UI goroutine (fyne.Do; tests swap in a queue).
	post func(func())
	// now is the clock of playback (tests drive frames with a fake clock).
	now func() time.Time
	// jobs counts background planning runs whose results are not yet posted.
	jobs sync.WaitGroup

	fit           *fitLayout
	autosaveTimer *time.Timer
	recovery      string // recovery file path (computed once; tests set it)

	w widgets
}

// New builds the Duosweep window content in w for application a and opens path, or the bundled demo when
// path is empty. A file that cannot be loaded is reported in a dialog and the demo opens instead. The
// demo (or file) is planned at once in the background; the caller shows the window.
func New(a fyne.App, w fyne.Window, path string) *App {
	return newApp(a, w, path, options{post: fyne.Do})
}

// options are the seams tests use: how work reaches the UI goroutine, and where the recovery file lives
// ("" for the app's storage root).
type options struct {
	post     func(func())
	recovery string
}

func newApp(a fyne.App, w fyne.Window, path string, opt options) *App {
	app := &App{fyneApp: a, win: w, post: opt.post, now: time.Now, recovery: opt.recovery}
	app.playback = newPlaybackState()
	sc := projects.Demo()
	var loadErr error
	if path != "" {
		if abs, err := filepath.Abs(path); err == nil {
			path = abs
		}
		if got, err := projects.LoadFile(path); err != nil {
			loadErr = err
			path = ""
		} else {
			sc = got
		}
	}
	app.path = path
	app.editor = canvas.NewEditor(sc)
	app.editor.OnChanged = app.scenarioChanged
	app.editor.OnSelectionChanged = func(canvas.Selection) { app.refreshInspector() }
	app.editor.OnNodeTapped = app.nodeTapped
	app.editor.OnMessage = func(msg string, _ fyne.Position) { app.setStatus(msg) }
	// the editor's message timer reaches the widget through post, like every background result
	app.editor.Schedule = func(d time.Duration, f func()) { time.AfterFunc(d, func() { app.post(f) }) }

	w.SetIcon(icons.App)
	w.SetContent(app.layout())
	w.SetMainMenu(app.mainMenu())
	app.addShortcuts()
	w.SetCloseIntercept(app.quit)
	if path != "" {
		app.addRecent(path)
	}
	app.updateTitle()
	app.refreshInspector()
	app.planAtStart()
	app.loadBackdrop() // backdrop.go
	if loadErr != nil {
		app.showError("Could not open the file; the demo site is open instead", loadErr)
	} else {
		app.offerRecovery()
	}
	return app
}

// Window returns the window the app lives in.
func (a *App) Window() fyne.Window { return a.win }

// Editor returns the tree-editor canvas.
func (a *App) Editor() *canvas.Editor { return a.editor }

// layout assembles the window: canvas centre, inspector and plan panel at the side, timeline and notice
// below.
func (a *App) layout() fyne.CanvasObject {
	a.fit = &fitLayout{editor: a.editor}
	centre := container.New(a.fit, a.editor)
	right := container.NewHSplit(centre, a.sideTabs())
	right.Offset = 0.62
	main := container.NewHSplit(a.inspectorPanel(), right)
	main.Offset = 0.2
	a.w.status = widget.NewLabel("")
	a.w.status.Truncation = fyne.TextTruncateEllipsis
	notice := widget.NewLabelWithStyle(Notice, fyne.TextAlignTrailing, fyne.TextStyle{Italic: true})
	bottom := container.NewVBox(widget.NewSeparator(), a.timelinePanel(), widget.NewSeparator(),
		container.NewBorder(nil, nil, nil, notice, a.w.status))
	return container.NewBorder(a.toolbar(), bottom, nil, nil, main)
}

// fitLayout gives the editor its whole cell and keeps the site fitted in view while the window
// changes size, until the user pans or zooms.
type fitLayout struct {
	editor *canvas.Editor
	fitted bool
	zoom   float64
	origin fyne.Position
}

func (l *fitLayout) Layout(objs []fyne.CanvasObject, size fyne.Size) {
	z, o := l.editor.View()
	untouched := !l.fitted || (z == l.zoom && o == l.origin)
	for _, obj := range objs {
		obj.Move(fyne.NewPos(0, 0))
		obj.Resize(size)
	}
	if untouched && size.Width > 0 && size.Height > 0 {
		l.fitNow()
	}
}

// fitNow fits the site and remembers the view as "not moved by the user".
func (l *fitLayout) fitNow() {
	l.editor.FitView()
	l.zoom, l.origin = l.editor.View()
	l.fitted = true
}

func (l *fitLayout) MinSize(objs []fyne.CanvasObject) fyne.Size { return l.editor.MinSize() }

// sideTabs holds the plan panel and the radio-versus-face-to-face view.
func (a *App) sideTabs() fyne.CanvasObject {
	a.w.tabs = container.NewAppTabs(
		container.NewTabItem("Plan", a.planPanel()),
		container.NewTabItem("Radio vs face to face", a.comparePanel()),
	)
	return a.w.tabs
}

// scenarioChanged runs after every edit on the canvas or in the inspector.
func (a *App) scenarioChanged(engine.Scenario) {
	a.setDirty(true)
	a.refreshUndo()
	a.refreshInspector()
	a.replan()
}

// setScenario replaces the scenario (New, Open, Recover) and replans; it starts a new undo history.
func (a *App) setScenario(sc engine.Scenario, path string, dirty bool) {
	a.stop()
	a.playback.focus = -1
	a.playback.t = 0
	a.path = path
	a.editor.SetScenario(sc)
	a.loadBackdrop() // backdrop.go
	a.editor.Select(canvas.Selection{Kind: canvas.SelNone})
	a.fit.fitNow()
	a.setDirty(dirty)
	a.refreshUndo()
	a.refreshInspector()
	a.replan()
}

func (a *App) setDirty(d bool) {
	a.dirty = d
	if d {
		a.scheduleAutosave()
	}
	a.updateTitle()
}

// title is "Duosweep — NAME", with " •" while there are unsaved changes.
func (a *App) title() string {
	name := a.editor.Scenario().Name
	if name == "" && a.path != "" {
		name = strings.TrimSuffix(filepath.Base(a.path), ".sweep.json")
	}
	if name == "" {
		name = "Untitled site"
	}
	t := "Duosweep — " + name
	if a.dirty {
		t += " •"
	}
	return t
}

func (a *App) updateTitle() { a.win.SetTitle(a.title()) }

func (a *App) setStatus(msg string) {
	if a.w.status != nil {
		a.w.status.SetText(msg)
	}
}

// showError shows err in a dialog under a one-line summary.
func (a *App) showError(summary string, err error) {
	msg := widget.NewLabel(err.Error())
	msg.Wrapping = fyne.TextWrapWord
	content := container.NewVBox(widget.NewLabelWithStyle(summary, fyne.TextAlignLeading, fyne.TextStyle{Bold: true}), msg)
	d := dialog.NewCustom("Duosweep", "OK", content, a.win)
	d.Resize(fyne.NewSize(560, 200))
	d.Show()
	a.setStatus(summary)
}

// fitView fits the site in view (toolbar and menu) and keeps it fitted while the window is resized.
func (a *App) fitView() { a.fit.fitNow() }
