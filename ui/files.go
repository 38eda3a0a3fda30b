package ui

import (
	"bytes"
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"time"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/dialog"
	"fyne.io/fyne/v2/storage"
	"fyne.io/fyne/v2/widget"

	"duosweep/engine"
	"duosweep/projects"
)

const (
	scenarioSuffix = ".sweep.json"
	prefRecent     = "recent"
	prefRecSource  = "recovery.source"
	maxRecent      = 8
	// AutosaveDelay is how long after a change the recovery file is written.
	AutosaveDelay = 10 * time.Second
)

// scenarioFilter shows only scenario files (*.sweep.json) in the file dialogs.
type scenarioFilter struct{}

func (scenarioFilter) Matches(u fyne.URI) bool {
	return strings.HasSuffix(strings.ToLower(u.Name()), scenarioSuffix)
}

// blankScenario is what New starts from: one start junction and the default crew.
func blankScenario() engine.Scenario {
	return engine.Scenario{
		Name: "New site", Unit: "m", Start: "start", Agents: engine.DefaultAgents(),
		Nodes: []engine.Node{{ID: "start", Label: "Start", HasXY: true}},
	}
}

// confirmDiscard runs then at once when there are no unsaved changes; otherwise it asks whether to
// save them first, discard them, or cancel.
func (a *App) confirmDiscard(action string, then func()) {
	if !a.dirty {
		then()
		return
	}
	var d dialog.Dialog
	msg := widget.NewLabel(fmt.Sprintf("“%s” has unsaved changes. Save them before you %s?", a.displayName(), action))
	msg.Wrapping = fyne.TextWrapWord
	save := widget.NewButton("Save", func() {
		d.Hide()
		a.save(then)
	})
	save.Importance = widget.HighImportance
	discard := widget.NewButton("Discard changes", func() {
		d.Hide()
		then()
	})
	discard.Importance = widget.DangerImportance
	cancel := widget.NewButton("Cancel", func() { d.Hide() })
	d = dialog.NewCustomWithoutButtons("Unsaved changes", container.NewVBox(msg, container.NewHBox(cancel, discard, save)), a.win)
	d.Resize(fyne.NewSize(480, 160))
	d.Show()
}

func (a *App) displayName() string {
	return strings.TrimSuffix(strings.TrimPrefix(a.title(), "Duosweep — "), " •")
}

// newScenario starts an empty site.
func (a *App) newScenario() {
	a.confirmDiscard("start a new site", func() {
		a.removeRecovery()
		a.setScenario(blankScenario(), "", false)
	})
}

// openDialog asks for a scenario file and opens it.
func (a *App) openDialog() {
	a.confirmDiscard("open another file", func() {
		d := dialog.NewFileOpen(func(rc fyne.URIReadCloser, err error) {
			if err != nil {
				a.showError("Could not open the file", err)
				return
			}
			if rc == nil {
				return
			}
			path := rc.URI().Path()
			rc.Close()
			a.openPath(path)
		}, a.win)
		d.SetFilter(scenarioFilter{})
		a.dialogLocation(d)
		d.Resize(fyne.NewSize(760, 520))
		d.Show()
	})
}

// dialogLocation starts a file dialog in the folder of the current file.
func (a *App) dialogLocation(d interface{ SetLocation(fyne.ListableURI) }) {
	if a.path == "" {
		return
	}
	if l, err := storage.ListerForURI(storage.NewFileURI(filepath.Dir(a.path))); err == nil {
		d.SetLocation(l)
	}
}

// openPath loads the scenario at path. On error the current scenario stays as it was and the engine's
// message (file, field, value) is shown; it returns that error.
func (a *App) openPath(path string) error {
	sc, err := projects.LoadFile(path)
	if err != nil {
		a.showError("Could not open "+filepath.Base(path)+"; nothing was changed", err)
		return err
	}
	a.removeRecovery()
	a.setScenario(sc, path, false)
	a.addRecent(path)
	a.setStatus("Opened " + path)
	return nil
}

// openRecent opens a file of the recent list after the unsaved-changes check.
func (a *App) openRecent(path string) {
	a.confirmDiscard("open another file", func() { a.openPath(path) })
}

// save writes the scenario to its file (Save As when untitled) and then runs then (may be nil).
func (a *App) save(then func()) {
	if a.path == "" {
		a.saveAs(then)
		return
	}
	if a.saveTo(a.path) && then != nil {
		then()
	}
}

// saveTo saves atomically to path; on success the scenario is clean and the recovery file is gone.
func (a *App) saveTo(path string) bool {
	if err := projects.SaveFile(path, a.editor.Scenario()); err != nil {
		a.showError("Not saved: a scenario file must hold a valid site (your work is kept, and autosaved for recovery)", err)
		return false
	}
	a.path = path
	a.removeRecovery()
	a.setDirty(false)
	a.addRecent(path)
	a.setStatus("Saved " + path)
	return true
}

// saveAs asks for a file name and saves there.
func (a *App) saveAs(then func()) {
	d := dialog.NewFileSave(func(wc fyne.URIWriteCloser, err error) {
		if err != nil {
			a.showError("Could not save the file", err)
			return
		}
		if wc == nil {
			return
		}
		path := wc.URI().Path()
		wc.Close()
		if a.saveTo(path) && then != nil {
			then()
		}
	}, a.win)
	d.SetFilter(scenarioFilter{})
	d.SetFileName(a.suggestedName(scenarioSuffix))
	a.dialogLocation(d)
	d.Resize(fyne.NewSize(760, 520))
	d.Show()
}

// suggestedName is the current file name, or one made from the site's name, with suffix.
func (a *App) suggestedName(suffix string) string {
	base := ""
	if a.path != "" {
		base = strings.TrimSuffix(filepath.Base(a.path), scenarioSuffix)
	} else {
		base = strings.ToLower(strings.TrimSpace(a.editor.Scenario().Name))
		base = strings.Map(func(r rune) rune {
			switch {
			case r >= 'a' && r <= 'z', r >= '0' && r <= '9', r == '-', r == '_':
				return r
			}
			return '-'
		}, base)
		for strings.Contains(base, "--") {
			base = strings.ReplaceAll(base, "--", "-")
		}
		base = strings.Trim(base, "-")
	}
	if base == "" {
		base = "site"
	}
	return base + suffix
}

// recentFiles returns the recent files, newest first.
func (a *App) recentFiles() []string { return a.fyneApp.Preferences().StringList(prefRecent) }

func (a *App) addRecent(path string) {
	list := []string{path}
	for _, p := range a.recentFiles() {
		if p != path && len(list) < maxRecent {
			list = append(list, p)
		}
	}
	a.fyneApp.Preferences().SetStringList(prefRecent, list)
	a.refreshMenu()
}

// recoveryPath is where the autosave goes: the app's storage root, else the user config folder.
func (a *App) recoveryPath() string {
	if a.recovery != "" {
		return a.recovery
	}
	if st := a.fyneApp.Storage(); st != nil && st.RootURI() != nil && st.RootURI().Scheme() == "file" {
		a.recovery = filepath.Join(st.RootURI().Path(), "recovery"+scenarioSuffix)
	} else if dir, err := os.UserConfigDir(); err == nil {
		a.recovery = filepath.Join(dir, "duosweep", "recovery"+scenarioSuffix)
	}
	return a.recovery
}

// scheduleAutosave writes the recovery file AutosaveDelay after the first unsaved change.
func (a *App) scheduleAutosave() {
	if a.autosaveTimer != nil {
		return
	}
	a.autosaveTimer = time.AfterFunc(AutosaveDelay, func() { a.post(a.autosave) })
}

// autosave writes the draft (no tree validation: half-drawn sites are kept too).
func (a *App) autosave() {
	a.autosaveTimer = nil
	if !a.dirty {
		return
	}
	p := a.recoveryPath()
	if p == "" {
		return
	}
	if err := os.MkdirAll(filepath.Dir(p), 0o755); err != nil {
		a.setStatus("Autosave failed: " + err.Error())
		return
	}
	if err := projects.SaveDraftFile(p, a.editor.Scenario()); err != nil {
		a.setStatus("Autosave failed: " + err.Error())
		return
	}
	a.fyneApp.Preferences().SetString(prefRecSource, a.path)
	a.setStatus("Autosaved for recovery at " + time.Now().Format("15:04:05"))
}

// removeRecovery deletes the recovery file (after a clean save, a discard or a clean quit).
func (a *App) removeRecovery() {
	if a.autosaveTimer != nil {
		a.autosaveTimer.Stop()
		a.autosaveTimer = nil
	}
	if p := a.recoveryPath(); p != "" {
		if err := os.Remove(p); err != nil && !errors.Is(err, os.ErrNotExist) {
			a.setStatus("Could not remove the recovery file: " + err.Error())
		}
	}
}

// offerRecovery asks, at start, whether to restore a recovery file left by a crash.
func (a *App) offerRecovery() {
	p := a.recoveryPath()
	info, err := os.Stat(p)
	if p == "" || err != nil {
		return
	}
	f, err := os.Open(p)
	if err != nil {
		return
	}
	sc, err := projects.LoadDraft(f)
	f.Close()
	if err != nil {
		a.removeRecovery()
		a.setStatus("A damaged recovery file was removed: " + err.Error())
		return
	}
	source := a.fyneApp.Preferences().String(prefRecSource)
	name := sc.Name
	if name == "" {
		name = "an untitled site"
	}
	msg := fmt.Sprintf("Duosweep was closed with unsaved changes to “%s” (autosaved %s). Recover them?", name, info.ModTime().Format("2006-01-02 15:04"))
	dialog.ShowConfirm("Recover unsaved work?", msg, func(ok bool) {
		if !ok {
			a.removeRecovery()
			return
		}
		a.setScenario(sc, source, true)
		a.setStatus("Recovered unsaved work; save it to keep it")
	}, a.win)
}

// printItinerary writes the printable itinerary of the current plan to a file the user picks and shows it.
func (a *App) printItinerary() {
	if a.planning.plan == nil || a.planning.report == nil {
		a.showError("No itinerary yet", errors.New("there is no valid plan to print: fix the site first (see the plan panel)"))
		return
	}
	var buf bytes.Buffer
	if err := projects.WriteItinerary(&buf, a.planning.site, a.planning.plan, a.planning.report); err != nil {
		a.showError("Could not write the itinerary", err)
		return
	}
	text := buf.String()
	d := dialog.NewFileSave(func(wc fyne.URIWriteCloser, err error) {
		if err != nil {
			a.showError("Could not save the itinerary", err)
			return
		}
		if wc == nil {
			return
		}
		_, werr := wc.Write([]byte(text))
		cerr := wc.Close()
		if werr == nil {
			werr = cerr
		}
		if werr != nil {
			a.showError("Could not save the itinerary", werr)
			return
		}
		a.setStatus("Itinerary saved to " + wc.URI().Path())
		a.showItinerary(text, wc.URI().Path())
	}, a.win)
	d.SetFileName(a.suggestedName("-itinerary.txt"))
	a.dialogLocation(d)
	d.Resize(fyne.NewSize(760, 520))
	d.Show()
}

// showItinerary shows the itinerary text in a dialog.
func (a *App) showItinerary(text, path string) {
	l := widget.NewLabelWithStyle(text, fyne.TextAlignLeading, fyne.TextStyle{Monospace: true})
	scroll := container.NewScroll(l)
	scroll.SetMinSize(fyne.NewSize(720, 440))
	d := dialog.NewCustom("Itinerary — saved to "+filepath.Base(path), "Close", scroll, a.win)
	d.Show()
}

// quit leaves after the unsaved-changes check; a clean quit removes the recovery file.
func (a *App) quit() {
	a.confirmDiscard("quit", func() {
		a.stop()
		a.removeRecovery()
		a.fyneApp.Quit()
	})
}
