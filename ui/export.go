package ui

import (
	"context"
	"errors"
	"fmt"
	"io"
	"path/filepath"
	"strconv"
	"strings"
	"sync"
	"time"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/dialog"
	"fyne.io/fyne/v2/widget"

	"duosweep/brief"
	"duosweep/engine"
	"duosweep/projects"
)

// File › Export briefing…, Export picture… and Export animation…: the brief package's writers (the same
// code as duosweep-cli brief) run in the background behind a progress dialog with a Cancel button; the
// file is written atomically, and the result reaches the widgets only through a.post (fyne.Do).

// pictureW and pictureH are the size of an exported map picture in pixels.
const pictureW, pictureH = 1600, 1000

// exportJob is one export in flight.
type exportJob struct {
	cancel context.CancelFunc
	dlg    dialog.Dialog
	bar    *widget.ProgressBar
}

// briefInput is the current plan as a briefing's input, or an error when there is none.
func (a *App) briefInput() (brief.Input, error) {
	pl := &a.planning
	if pl.site == nil || pl.plan == nil || pl.report == nil {
		return brief.Input{}, errors.New("there is no valid plan to export: fix the site first (see the plan panel)")
	}
	return brief.Input{Site: pl.site, Plan: pl.plan, Report: pl.report}, nil
}

// askPath shows a save dialog suggesting name and calls then with the chosen path.
func (a *App) askPath(title, name string, then func(path string)) {
	d := dialog.NewFileSave(func(wc fyne.URIWriteCloser, err error) {
		if err != nil {
			a.showError(title+": could not choose the file", err)
			return
		}
		if wc == nil {
			return
		}
		path := wc.URI().Path()
		wc.Close()
		then(path)
	}, a.win)
	d.SetFileName(a.suggestedName(name))
	a.dialogLocation(d)
	d.Resize(fyne.NewSize(760, 520))
	d.Show()
}

func (a *App) exportBriefing() {
	in, err := a.briefInput()
	if err != nil {
		a.showError("No briefing yet", err)
		return
	}
	a.askPath("Export briefing", "-briefing.pdf", func(path string) { a.exportPDF(in, path) })
}

func (a *App) exportPDF(in brief.Input, path string) {
	a.startExport("briefing", path, func(_ context.Context, w io.Writer, _ func(float64)) error {
		_, err := brief.WritePDF(w, in, brief.PDFOptions{})
		return err
	})
}

func (a *App) exportPicture() {
	in, err := a.briefInput()
	if err != nil {
		a.showError("No picture yet", err)
		return
	}
	a.askPath("Export picture", "-map.png", func(path string) { a.exportMap(in, path) })
}

// exportMap writes the map as SVG when path ends in .svg, else as PNG.
func (a *App) exportMap(in brief.Input, path string) {
	svg := strings.EqualFold(filepath.Ext(path), ".svg")
	a.startExport("picture", path, func(_ context.Context, w io.Writer, _ func(float64)) error {
		name := in.Site.Scenario.Name
		if name == "" {
			name = "(unnamed site)"
		}
		title := fmt.Sprintf("%s · %s · worst case %s", name, in.Report.Model, engine.FormatClock(in.Report.Worst))
		m, err := brief.BuildMap(in, pictureW, pictureH, brief.MapOptions{Title: title, Notice: true})
		if err != nil {
			return err
		}
		if svg {
			return brief.WriteSVG(w, &m.Scene)
		}
		return brief.WritePNG(w, &m.Scene)
	})
}

// exportAnimation asks for the animation's exit, second panel, size, fps and length.
func (a *App) exportAnimation() {
	in, err := a.briefInput()
	if err != nil {
		a.showError("No animation yet", err)
		return
	}
	s := in.Site
	exits := []string{"worst exit"}
	for _, v := range s.Candidates() {
		exits = append(exits, s.IDs[v])
	}
	exit := widget.NewSelect(exits, nil)
	exit.SetSelected(exits[0])
	other := in.Report.Model.Other()
	panels := []string{"one panel", "side by side with " + other.String()}
	side := widget.NewSelect(panels, nil)
	side.SetSelected(panels[0])
	sizes := []string{"640×400", "960×600", "1280×800"}
	size := widget.NewSelect(sizes, nil)
	size.SetSelected(sizes[0])
	fps := widget.NewEntry()
	fps.SetText("10")
	secs := widget.NewEntry()
	secs.SetText("20")
	items := []*widget.FormItem{
		widget.NewFormItem("Exit", exit), widget.NewFormItem("Panels", side), widget.NewFormItem("Size", size),
		widget.NewFormItem("Frames per second", fps), widget.NewFormItem("Length (s)", secs),
	}
	dialog.ShowForm("Export animation", "Choose file…", "Cancel", items, func(ok bool) {
		if !ok {
			return
		}
		opt, err := animationOptions(exit.Selected, side.Selected != panels[0], other, size.Selected, fps.Text, secs.Text)
		if err != nil {
			a.showError("Animation not exported", err)
			return
		}
		a.askPath("Export animation", "-replay.gif", func(path string) { a.exportGIF(in, path, opt) })
	}, a.win)
}

// animationOptions checks the animation form's fields; errors name the field and value.
func animationOptions(exit string, twoPanels bool, other engine.Model, size, fps, secs string) (brief.GIFOptions, error) {
	var opt brief.GIFOptions
	if exit != "worst exit" {
		opt.Exit = exit
	}
	if twoPanels {
		opt.Compare = &other
	}
	w, h, ok := strings.Cut(size, "×")
	var err error
	if opt.W, err = strconv.Atoi(w); !ok || err != nil {
		return opt, fmt.Errorf("size %q: want W×H", size)
	}
	if opt.H, err = strconv.Atoi(h); err != nil {
		return opt, fmt.Errorf("size %q: want W×H", size)
	}
	if opt.FPS, err = strconv.Atoi(strings.TrimSpace(fps)); err != nil || opt.FPS < 1 || opt.FPS > 50 {
		return opt, fmt.Errorf("frames per second %q: want a whole number from 1 to 50", fps)
	}
	if opt.Seconds, err = strconv.ParseFloat(strings.TrimSpace(secs), 64); err != nil || !(opt.Seconds >= 0.1 && opt.Seconds <= 600) {
		return opt, fmt.Errorf("length %q: want 0.1 to 600 seconds", secs)
	}
	return opt, nil
}

func (a *App) exportGIF(in brief.Input, path string, opt brief.GIFOptions) {
	a.startExport("animation", path, func(ctx context.Context, w io.Writer, progress func(float64)) error {
		opt.Progress = progress
		return brief.WriteGIF(ctx, w, in, opt)
	})
}

// startExport runs work into path atomically on a background goroutine, behind a progress dialog whose
// Cancel button stops it (nothing is written then). Progress and the result reach the widgets through
// a.post; progress is posted at most ten times a second.
func (a *App) startExport(what, path string, work func(ctx context.Context, w io.Writer, progress func(float64)) error) *exportJob {
	ctx, cancel := context.WithCancel(context.Background())
	job := &exportJob{cancel: cancel, bar: widget.NewProgressBar()}
	stop := widget.NewButton("Cancel", cancel)
	label := widget.NewLabel("Writing the " + what + " to " + filepath.Base(path) + "…")
	job.dlg = dialog.NewCustomWithoutButtons("Exporting", container.NewVBox(label, job.bar, stop), a.win)
	job.dlg.Resize(fyne.NewSize(460, 160))
	job.dlg.Show()
	var mu sync.Mutex
	var last time.Time
	progress := func(f float64) {
		mu.Lock()
		now := time.Now()
		if now.Sub(last) < 100*time.Millisecond && f < 1 {
			mu.Unlock()
			return
		}
		last = now
		mu.Unlock()
		a.post(func() { job.bar.SetValue(f) })
	}
	a.jobs.Add(1)
	go func() {
		defer a.jobs.Done()
		err := projects.WriteFileAtomic(path, func(w io.Writer) error { return work(ctx, w, progress) })
		cancelled := ctx.Err() != nil
		cancel()
		a.post(func() {
			job.dlg.Hide()
			switch {
			case err != nil && cancelled:
				a.setStatus("Export of the " + what + " cancelled: " + filepath.Base(path) + " was not written")
			case err != nil:
				a.showError("The "+what+" was not exported", err)
			default:
				a.setStatus("Exported the " + what + " to " + path)
			}
		})
	}()
	return job
}
