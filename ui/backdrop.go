package ui

import (
	"fmt"
	"image"
	_ "image/jpeg" // backdrop images: JPEG
	_ "image/png"  // and PNG
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/dialog"
	"fyne.io/fyne/v2/widget"

	"duosweep/canvas"
	"duosweep/canvas/geom"
	"duosweep/engine"
)

// The backdrop: File › Backdrop image… puts a scanned or exported site plan
// under the site; Calibrate backdrop… takes two clicks on it and their real
// distance and sets its scale, so that corridors drawn over it get real
// lengths; Backdrop opacity… and Remove backdrop. The image path is saved
// relative to the scenario file (absolute while the scenario is untitled).
// A missing image is a warning: the site loads without it.

type imageFilter struct{}

func (imageFilter) Matches(u fyne.URI) bool {
	switch strings.ToLower(filepath.Ext(u.Name())) {
	case ".png", ".jpg", ".jpeg":
		return true
	}
	return false
}

func (a *App) backdropDialog() { a.openFile(imageFilter{}, func(p string) { a.setBackdropFile(p) }) }

// backdropPath resolves a backdrop image path against the scenario's folder.
func (a *App) backdropPath(image string) string {
	if filepath.IsAbs(image) || a.path == "" {
		return image
	}
	return filepath.Join(filepath.Dir(a.path), image)
}

// decodeImage reads a PNG or JPEG file.
func decodeImage(path string) (image.Image, error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, err
	}
	defer f.Close()
	img, _, err := image.Decode(f)
	if err != nil {
		return nil, fmt.Errorf("%s: not a PNG or JPEG image: %v", filepath.Base(path), err)
	}
	return img, nil
}

// setBackdropFile puts the image at path under the site (an undoable edit):
// its top-left at the site's top-left corner, scaled to the site's width
// (1 unit per pixel on an empty site), opacity 0.5. Calibrate it next.
func (a *App) setBackdropFile(path string) error {
	img, err := decodeImage(path)
	if err != nil {
		a.showError("Could not use the image", err)
		return err
	}
	sc := a.editor.Scenario()
	bd := engine.Backdrop{Image: path, Scale: 1, Opacity: 0.5}
	if a.path != "" {
		if rel, err := filepath.Rel(filepath.Dir(a.path), path); err == nil {
			bd.Image = rel
		}
	}
	var pts []geom.Pt
	for _, n := range sc.Nodes {
		if n.HasXY {
			pts = append(pts, geom.Pt{X: n.X, Y: n.Y})
		}
	}
	if box := geom.Bounds(pts); len(pts) > 1 && box.Max.X > box.Min.X {
		bd.X, bd.Y = box.Min.X, box.Min.Y
		bd.Scale = (box.Max.X - box.Min.X) / float64(img.Bounds().Dx())
	}
	if err := a.editor.Edit("Set backdrop", func(s *engine.Scenario) error { s.Backdrop = &bd; return nil }); err != nil {
		a.showError("Could not set the backdrop", err)
		return err
	}
	a.editor.SetBackdropImage(img)
	a.setStatus("Backdrop " + filepath.Base(path) + ": click Calibrate backdrop… and two points whose distance you know")
	return nil
}

// loadBackdrop decodes the scenario's backdrop image, or warns that it is
// missing (the site is shown without it).
func (a *App) loadBackdrop() {
	bd := a.editor.Scenario().Backdrop
	if bd == nil {
		a.editor.SetBackdropImage(nil)
		return
	}
	img, err := decodeImage(a.backdropPath(bd.Image))
	if err != nil {
		a.editor.SetBackdropImage(nil)
		msg := "Warning: backdrop image " + bd.Image + " could not be read (" + oneLine(err.Error()) + "); the site is shown without it"
		a.setStatus(msg)
		if a.post != nil {
			a.post(func() { a.setStatus(msg) }) // after the caller's own "Opened …"
		}
		return
	}
	a.editor.SetBackdropImage(img)
}

func oneLine(s string) string { return strings.Join(strings.Fields(s), " ") }

// calibrateBackdrop asks for two clicks on the backdrop, then their distance.
func (a *App) calibrateBackdrop() {
	if a.editor.Scenario().Backdrop == nil {
		a.showError("No backdrop", fmt.Errorf("choose File › Backdrop image… first"))
		return
	}
	a.editor.CalibrationPoints(func(p, q geom.Pt) {
		unit := a.editor.Scenario().Unit
		if unit == "" {
			unit = "m"
		}
		entry := widget.NewEntry()
		entry.SetPlaceHolder("distance in " + unit)
		d := dialog.NewForm("Calibrate backdrop", "Set scale", "Cancel",
			[]*widget.FormItem{widget.NewFormItem("Real distance ("+unit+")", entry)},
			func(ok bool) {
				if ok {
					a.applyCalibration(p, q, entry.Text)
				}
			}, a.win)
		d.Resize(fyne.NewSize(420, 180))
		d.Show()
		a.win.Canvas().Focus(entry)
	})
}

// applyCalibration sets the backdrop's scale so that p and q (drawing
// coordinates) are text scenario units apart (an undoable edit).
func (a *App) applyCalibration(p, q geom.Pt, text string) error {
	bd := a.editor.Scenario().Backdrop
	if bd == nil {
		return fmt.Errorf("no backdrop")
	}
	dist, err := strconv.ParseFloat(strings.TrimSpace(text), 64)
	if err != nil {
		err = fmt.Errorf("%q: not a number", text)
		a.showError("Could not calibrate", err)
		return err
	}
	scale, err := canvas.CalibratedScale(bd.Scale, p, q, dist, a.editor.Scale)
	if err != nil {
		a.showError("Could not calibrate", err)
		return err
	}
	nb := *bd
	nb.Scale = scale
	if err := a.editor.Edit("Calibrate backdrop", func(s *engine.Scenario) error { s.Backdrop = &nb; return nil }); err != nil {
		a.showError("Could not calibrate", err)
		return err
	}
	a.setStatus(fmt.Sprintf("Backdrop calibrated: %.4g %s per image pixel; corridors drawn over it now get its lengths", scale, a.editor.Scenario().Unit))
	return nil
}

// backdropOpacity shows a slider for the backdrop's opacity.
func (a *App) backdropOpacity() {
	bd := a.editor.Scenario().Backdrop
	if bd == nil {
		a.showError("No backdrop", fmt.Errorf("choose File › Backdrop image… first"))
		return
	}
	s := widget.NewSlider(0, 1)
	s.Step = 0.05
	s.Value = bd.Opacity
	s.OnChangeEnded = func(v float64) { a.setBackdropOpacity(v) }
	d := dialog.NewCustom("Backdrop opacity", "Close", container.NewVBox(widget.NewLabel("From invisible (left) to opaque (right)"), s), a.win)
	d.Resize(fyne.NewSize(360, 160))
	d.Show()
}

func (a *App) setBackdropOpacity(v float64) error {
	bd := a.editor.Scenario().Backdrop
	if bd == nil {
		return fmt.Errorf("no backdrop")
	}
	nb := *bd
	nb.Opacity = math.Max(0, math.Min(1, v))
	return a.editor.Edit("Backdrop opacity", func(s *engine.Scenario) error { s.Backdrop = &nb; return nil })
}

func (a *App) removeBackdrop() {
	if a.editor.Scenario().Backdrop == nil {
		return
	}
	if err := a.editor.Edit("Remove backdrop", func(s *engine.Scenario) error { s.Backdrop = nil; return nil }); err == nil {
		a.editor.SetBackdropImage(nil)
	}
}
