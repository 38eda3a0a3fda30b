package ui

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/dialog"
	"fyne.io/fyne/v2/widget"

	"duosweep/importer"
	"duosweep/projects"
)

// File › Import… (GeoJSON or CSV) and File › Export GeoJSON… (docs/import.md).
// An import replaces the open scenario with an untitled, unsaved one; the
// import's messages (coordinate system, corridors closed to break loops,
// pieces dropped) are shown in a dialog.

// importFilter shows GeoJSON and CSV files in the import dialog.
type importFilter struct{}

func (importFilter) Matches(u fyne.URI) bool {
	switch strings.ToLower(filepath.Ext(u.Name())) {
	case ".geojson", ".json", ".csv":
		return true
	}
	return false
}

type csvFilter struct{}

func (csvFilter) Matches(u fyne.URI) bool { return strings.EqualFold(filepath.Ext(u.Name()), ".csv") }

// importDialog asks for a GeoJSON or CSV file (and, for CSV, whether a nodes
// table goes with it) and imports it.
func (a *App) importDialog() {
	a.confirmDiscard("import a file", func() {
		a.openFile(importFilter{}, func(path string) {
			if !strings.EqualFold(filepath.Ext(path), ".csv") {
				a.importPath(path, "", importer.DefaultOptions())
				return
			}
			dialog.NewConfirm("Nodes table",
				"Read a nodes table (id,label,x,y,candidate,probability) with these corridors?",
				func(yes bool) {
					if !yes {
						a.importPath(path, "", importer.DefaultOptions())
						return
					}
					a.openFile(csvFilter{}, func(nodes string) { a.importPath(path, nodes, importer.DefaultOptions()) })
				}, a.win).Show()
		})
	})
}

// openFile shows a file-open dialog with filter and calls then with the chosen path.
func (a *App) openFile(filter interface{ Matches(fyne.URI) bool }, then func(path string)) {
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
		then(path)
	}, a.win)
	d.SetFilter(filter)
	a.dialogLocation(d)
	d.Resize(fyne.NewSize(760, 520))
	d.Show()
}

// importPath imports path (with the nodes table at nodes, for CSV) and puts
// the site in the editor. A network in several pieces is offered to be cut
// to its largest piece. On any error nothing changes.
func (a *App) importPath(path, nodes string, opt importer.Options) error {
	res, err := importFile(path, nodes, opt)
	base := filepath.Base(path)
	if errors.Is(err, importer.ErrSeveralPieces) && !opt.Largest {
		msg := widget.NewLabel(err.Error() + "\n\nKeep the largest piece and drop the others?")
		msg.Wrapping = fyne.TextWrapWord
		d := dialog.NewCustomConfirm("Several pieces", "Keep the largest", "Cancel", container.NewVScroll(msg), func(ok bool) {
			if ok {
				opt.Largest = true
				a.importPath(path, nodes, opt)
			}
		}, a.win)
		d.Resize(fyne.NewSize(620, 320))
		d.Show()
		a.setStatus("Could not import " + base + ": several unconnected pieces")
		return err
	}
	if err != nil {
		a.showError("Could not import "+base+"; nothing was changed", err)
		return err
	}
	sc := res.Scenario
	if sc.Name == "" {
		sc.Name = strings.TrimSuffix(base, filepath.Ext(base))
	}
	a.removeRecovery()
	a.setScenario(sc, "", true)
	closed := 0
	for _, c := range sc.Corridors {
		if c.Closed {
			closed++
		}
	}
	summary := fmt.Sprintf("Imported %s: %d junctions, %d corridors (%d closed). Save it as a scenario to keep it.", base, len(sc.Nodes), len(sc.Corridors), closed)
	a.setStatus(summary)
	if len(res.Messages) > 0 {
		text := widget.NewLabel(strings.Join(res.Messages, "\n\n"))
		text.Wrapping = fyne.TextWrapWord
		d := dialog.NewCustom("Imported "+base, "OK", container.NewBorder(
			widget.NewLabelWithStyle(summary, fyne.TextAlignLeading, fyne.TextStyle{Bold: true}), nil, nil, nil,
			container.NewVScroll(text)), a.win)
		d.Resize(fyne.NewSize(640, 360))
		d.Show()
	}
	return nil
}

// importFile reads path and runs the importer its extension names.
func importFile(path, nodes string, opt importer.Options) (*importer.Result, error) {
	data, err := os.ReadFile(path)
	if err != nil {
		return nil, err
	}
	switch strings.ToLower(filepath.Ext(path)) {
	case ".geojson", ".json":
		return importer.ReadGeoJSON(data, opt)
	case ".csv":
		var nr io.Reader
		if nodes != "" {
			nd, err := os.ReadFile(nodes)
			if err != nil {
				return nil, err
			}
			nr = bytes.NewReader(nd)
		}
		return importer.ReadCSV(bytes.NewReader(data), nr, opt)
	}
	return nil, fmt.Errorf("%s: want a .geojson, .json or .csv file", filepath.Base(path))
}

// exportDialog asks where to write the site and the plan on screen as GeoJSON.
func (a *App) exportDialog() {
	if err := a.exportable(); err != nil {
		a.showError("Nothing to export yet", err)
		return
	}
	d := dialog.NewFileSave(func(wc fyne.URIWriteCloser, err error) {
		if err != nil {
			a.showError("Could not export", err)
			return
		}
		if wc == nil {
			return
		}
		path := wc.URI().Path()
		wc.Close()
		a.exportTo(path)
	}, a.win)
	d.SetFileName(a.suggestedName(".geojson"))
	a.dialogLocation(d)
	d.Resize(fyne.NewSize(760, 520))
	d.Show()
}

// exportable says why the plan on screen cannot be exported, if it cannot.
func (a *App) exportable() error {
	switch p := a.planning; {
	case p.busy:
		return errors.New("the plan is still being made; export when it is shown")
	case p.site == nil && p.err != nil:
		return p.err
	case p.site == nil:
		return errors.New("the site is not a valid tree yet")
	}
	return nil
}

// exportTo writes the site and the plan on screen to path (atomically).
func (a *App) exportTo(path string) error {
	if err := a.exportable(); err != nil {
		a.showError("Nothing to export yet", err)
		return err
	}
	p := a.planning
	err := projects.WriteFileAtomic(path, func(w io.Writer) error { return importer.WriteGeoJSON(w, p.site, p.plan, p.report) })
	if err != nil {
		a.showError("Could not export "+filepath.Base(path), err)
		return err
	}
	a.setStatus("Exported the site and its plan to " + path)
	return nil
}
