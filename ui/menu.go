package ui

import (
	"fmt"
	"path/filepath"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/dialog"
	"fyne.io/fyne/v2/driver/desktop"
	"fyne.io/fyne/v2/layout"
	"fyne.io/fyne/v2/theme"
	"fyne.io/fyne/v2/widget"

	"duosweep/canvas"
	"duosweep/engine"
	"duosweep/icons"
)

// widgets are the App's long-lived widgets, built once by the panel functions.
type widgets struct {
	status *widget.Label
	tabs   *container.AppTabs

	// toolbar
	undo, redo *widget.Button
	tool       *widget.RadioGroup

	// plan panel
	model                                                    *widget.RadioGroup
	planner                                                  *widget.Select
	busyBar                                                  *widget.ProgressBarInfinite
	busyLabel                                                *widget.Label
	errLabel, errTitle                                       *widget.Label
	errBox, figures, legend                                  *fyne.Container
	worst, worstExit, lower, gap, expected, routes, planNote *widget.Label
	expectedKey                                              *widget.Label
	incomplete, emptyHint                                    *widget.Label
	legendLo, legendHi                                       *widget.Label
	table                                                    *widget.Table
	search                                                   searchWidgets

	// comparison
	cmpCells                     [2][2]*widget.Label
	cmpCost, cmpCross, cmpStatus *widget.Label

	// inspector
	inspector    *fyne.Container
	inspectorErr *widget.Label

	// timeline
	play, next, rewind, worstBtn *widget.Button
	speed                        *widget.Select
	slider                       *widget.Slider
	clock, replayInfo, rate      *widget.Label
	events                       *widget.List
}

var toolLabels = []string{"Select", "Add junction", "Connect"}

// toolbar holds the file actions, undo and redo, the editor's pointer tool and the view actions.
func (a *App) toolbar() fyne.CanvasObject {
	btn := func(label string, icon fyne.Resource, f func()) *widget.Button {
		b := widget.NewButtonWithIcon(label, icon, f)
		b.Importance = widget.LowImportance
		return b
	}
	a.w.undo = btn("Undo", theme.ContentUndoIcon(), func() { a.editor.Undo() })
	a.w.redo = btn("Redo", theme.ContentRedoIcon(), func() { a.editor.Redo() })
	a.w.tool = widget.NewRadioGroup(toolLabels, func(s string) {
		for i, l := range toolLabels {
			if l == s {
				a.editor.SetTool(canvas.Tool(i))
			}
		}
	})
	a.w.tool.Horizontal = true
	a.w.tool.Required = true
	a.w.tool.SetSelected(toolLabels[0])
	a.refreshUndo()
	return container.NewHBox(
		btn("New", theme.DocumentCreateIcon(), a.newScenario),
		btn("Open…", theme.FolderOpenIcon(), a.openDialog),
		btn("Save", theme.DocumentSaveIcon(), func() { a.save(nil) }),
		widget.NewSeparator(),
		a.w.undo, a.w.redo,
		widget.NewSeparator(),
		a.w.tool,
		widget.NewSeparator(),
		btn("Fit", theme.ZoomFitIcon(), a.fitView),
		btn("Tidy", theme.ViewRefreshIcon(), a.editor.Tidy),
		btn("Delete", theme.DeleteIcon(), func() { a.inspectorError(a.editor.DeleteSelection()) }),
		layout.NewSpacer(),
		btn("Print itinerary…", theme.DocumentPrintIcon(), a.printItinerary),
	)
}

// refreshUndo enables undo and redo as the history allows.
func (a *App) refreshUndo() {
	set := func(b *widget.Button, ok bool) {
		if ok {
			b.Enable()
		} else {
			b.Disable()
		}
	}
	set(a.w.undo, a.editor.CanUndo())
	set(a.w.redo, a.editor.CanRedo())
}

func ctrl(k fyne.KeyName) *desktop.CustomShortcut {
	return &desktop.CustomShortcut{KeyName: k, Modifier: fyne.KeyModifierShortcutDefault}
}

func ctrlShift(k fyne.KeyName) *desktop.CustomShortcut {
	return &desktop.CustomShortcut{KeyName: k, Modifier: fyne.KeyModifierShortcutDefault | fyne.KeyModifierShift}
}

// mainMenu builds File, Edit, Plan and Help.
func (a *App) mainMenu() *fyne.MainMenu {
	item := func(label string, sc fyne.Shortcut, f func()) *fyne.MenuItem {
		it := fyne.NewMenuItem(label, f)
		it.Shortcut = sc
		return it
	}
	recent := fyne.NewMenuItem("Open recent", nil)
	for _, p := range a.recentFiles() {
		p := p
		recent.ChildMenu = appendItem(recent.ChildMenu, fyne.NewMenuItem(filepath.Base(p)+"  —  "+filepath.Dir(p), func() { a.openRecent(p) }))
	}
	if recent.ChildMenu == nil {
		recent.Disabled = true
	}
	quit := item("Quit", ctrl(fyne.KeyQ), a.quit)
	quit.IsQuit = true
	file := fyne.NewMenu("File",
		item("New", ctrl(fyne.KeyN), a.newScenario),
		item("Open…", ctrl(fyne.KeyO), a.openDialog),
		recent,
		fyne.NewMenuItemSeparator(),
		item("Save", ctrl(fyne.KeyS), func() { a.save(nil) }),
		item("Save as…", ctrlShift(fyne.KeyS), func() { a.saveAs(nil) }),
		fyne.NewMenuItemSeparator(),
		fyne.NewMenuItem("Import GeoJSON or CSV…", a.importDialog), // importexport.go
		fyne.NewMenuItem("Export GeoJSON…", a.exportDialog),
		fyne.NewMenuItemSeparator(),
		fyne.NewMenuItem("Backdrop image…", a.backdropDialog), // backdrop.go
		fyne.NewMenuItem("Calibrate backdrop…", a.calibrateBackdrop),
		fyne.NewMenuItem("Backdrop opacity…", a.backdropOpacity),
		fyne.NewMenuItem("Remove backdrop", a.removeBackdrop),
		fyne.NewMenuItemSeparator(),
		item("Print itinerary…", ctrl(fyne.KeyP), a.printItinerary),
		fyne.NewMenuItem("Export briefing…", a.exportBriefing),
		fyne.NewMenuItem("Export picture…", a.exportPicture),
		fyne.NewMenuItem("Export animation…", a.exportAnimation),
		fyne.NewMenuItemSeparator(),
		quit,
	)
	edit := fyne.NewMenu("Edit",
		item("Undo", ctrl(fyne.KeyZ), func() { a.editor.Undo() }),
		item("Redo", ctrlShift(fyne.KeyZ), func() { a.editor.Redo() }),
		fyne.NewMenuItemSeparator(),
		fyne.NewMenuItem("Delete selection", func() { a.inspectorError(a.editor.DeleteSelection()) }),
		fyne.NewMenuItem("Fit site in view", a.fitView),
		fyne.NewMenuItem("Tidy layout", a.editor.Tidy),
	)
	plan := fyne.NewMenu("Plan",
		fyne.NewMenuItem(engine.Radio.Label(), func() { a.setModel(engine.Radio) }),
		fyne.NewMenuItem(engine.FaceToFace.Label(), func() { a.setModel(engine.FaceToFace) }),
		fyne.NewMenuItemSeparator(),
		fyne.NewMenuItem("Radio vs face to face", func() { a.w.tabs.SelectIndex(1) }),
		item("Play / pause", ctrl(fyne.KeySpace), a.togglePlay),
		fyne.NewMenuItem("Replay worst exit", func() { a.replayExit(-1) }),
	)
	help := fyne.NewMenu("Help",
		fyne.NewMenuItem("Keyboard shortcuts", a.showShortcuts),
		fyne.NewMenuItem("About Duosweep", a.showAbout),
	)
	return fyne.NewMainMenu(file, edit, plan, help)
}

func appendItem(m *fyne.Menu, it *fyne.MenuItem) *fyne.Menu {
	if m == nil {
		return fyne.NewMenu("", it)
	}
	m.Items = append(m.Items, it)
	return m
}

// refreshMenu rebuilds the menu (the recent files changed).
func (a *App) refreshMenu() {
	if a.win.MainMenu() != nil {
		a.win.SetMainMenu(a.mainMenu())
	}
}

// addShortcuts registers the window-wide shortcuts (menus on Linux and Windows do not do it themselves).
func (a *App) addShortcuts() {
	c := a.win.Canvas()
	add := func(sc *desktop.CustomShortcut, f func()) { c.AddShortcut(sc, func(fyne.Shortcut) { f() }) }
	add(ctrl(fyne.KeyN), a.newScenario)
	add(ctrl(fyne.KeyO), a.openDialog)
	add(ctrl(fyne.KeyS), func() { a.save(nil) })
	add(ctrlShift(fyne.KeyS), func() { a.saveAs(nil) })
	add(ctrl(fyne.KeyP), a.printItinerary)
	add(ctrl(fyne.KeyQ), a.quit)
	add(ctrl(fyne.KeyZ), func() { a.editor.Undo() })
	add(ctrlShift(fyne.KeyZ), func() { a.editor.Redo() })
	add(ctrl(fyne.KeySpace), a.togglePlay)
}

// showShortcuts lists the editor's shortcuts and gestures and the window's own.
func (a *App) showShortcuts() {
	rows := []fyne.CanvasObject{}
	addRow := func(k, v string) {
		rows = append(rows, widget.NewLabelWithStyle(k, fyne.TextAlignLeading, fyne.TextStyle{Monospace: true}), widget.NewLabel(v))
	}
	for _, h := range a.editor.Shortcuts() {
		addRow(h.Key, h.Action)
	}
	for _, h := range [][2]string{
		{"Ctrl+N / Ctrl+O", "new site / open a file"},
		{"Ctrl+S / Ctrl+Shift+S", "save / save as"},
		{"Ctrl+P", "print the itinerary to a file"},
		{"Ctrl+Space", "play or pause the replay"},
		{"Ctrl+Q", "quit"},
	} {
		addRow(h[0], h[1])
	}
	scroll := container.NewVScroll(container.New(layout.NewFormLayout(), rows...))
	scroll.SetMinSize(fyne.NewSize(620, 460))
	dialog.NewCustom("Keyboard shortcuts and gestures", "Close", scroll, a.win).Show()
}

// showAbout shows the app icon, version and the notice.
func (a *App) showAbout() {
	img := widget.NewIcon(icons.App)
	meta := a.fyneApp.Metadata()
	version := meta.Version
	if version == "" {
		version = "development build"
	}
	body := widget.NewLabel(fmt.Sprintf("Duosweep %s\n\nPlans how a two-person crew sweeps a tree-shaped site (drifts, tunnels, "+
		"passages, corridor wings) when the exit, refuge or casualty could be at any of several junctions, "+
		"with radio or face-to-face contact, and plays the plan back.\n\n%s", version, Notice))
	body.Wrapping = fyne.TextWrapWord
	icon := container.New(&minLayout{min: fyne.NewSize(96, 96)}, img)
	content := container.NewBorder(nil, nil, container.NewVBox(icon), nil, body)
	d := dialog.NewCustom("About Duosweep", "Close", content, a.win)
	d.Resize(fyne.NewSize(560, 300))
	d.Show()
}
