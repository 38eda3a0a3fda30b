package ui

import (
	"fmt"
	"math"
	"strings"

	"fyne.io/fyne/v2"
	fcanvas "fyne.io/fyne/v2/canvas"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/layout"
	"fyne.io/fyne/v2/widget"

	"duosweep/canvas"
	"duosweep/engine"
	"duosweep/engine/planners"
)

// Labels of the models in the model choice, in engine.Models order.
var modelLabels = func() []string {
	out := make([]string, len(engine.Models))
	for i, m := range engine.Models {
		out[i] = m.Label()
	}
	return out
}()

const bestAvailable = "Best available"

// planPanel is the model and planner choice, the results of the current plan, the heat legend and the
// candidate table.
func (a *App) planPanel() fyne.CanvasObject {
	w := &a.w
	w.model = widget.NewRadioGroup(modelLabels, func(s string) {
		for _, m := range engine.Models {
			if m.Label() == s {
				a.setModel(m)
			}
		}
	})
	w.model.Horizontal = true
	w.model.Required = true
	w.model.SetSelected(engine.Models[0].Label())

	w.planner = widget.NewSelect(nil, func(s string) {
		name := ""
		if s != bestAvailable {
			name = strings.TrimSuffix(s, " (search)")
		}
		if name != a.planner {
			a.planner = name
			a.replan()
		}
	})
	a.fillPlannerChoices()

	w.busyBar = widget.NewProgressBarInfinite()
	w.busyBar.Hide()
	w.busyLabel = widget.NewLabel("")
	w.busyLabel.Importance = widget.LowImportance

	choices := container.New(layout.NewFormLayout(),
		widget.NewLabel("Model"), w.model,
		widget.NewLabel("Planner"), w.planner,
	)

	w.errLabel = widget.NewLabel("")
	w.errLabel.Wrapping = fyne.TextWrapWord
	w.errLabel.Importance = widget.DangerImportance
	w.errTitle = widget.NewLabelWithStyle("", fyne.TextAlignLeading, fyne.TextStyle{Bold: true})
	w.errBox = container.NewVBox(w.errTitle, w.errLabel)
	w.errBox.Hide()

	val := func() *widget.Label {
		l := widget.NewLabel("—")
		l.Wrapping = fyne.TextWrapWord
		return l
	}
	w.worst, w.worstExit, w.lower, w.gap, w.expected, w.routes, w.planNote = val(), val(), val(), val(), val(), val(), val()
	w.worst.TextStyle.Bold = true
	w.expectedKey = widget.NewLabel("Expected time")
	w.figures = container.New(layout.NewFormLayout(),
		widget.NewLabel("Worst case"), w.worst,
		widget.NewLabel("Worst exit"), w.worstExit,
		widget.NewLabel("Lower bound"), w.lower,
		widget.NewLabel("Certified gap"), w.gap,
		w.expectedKey, w.expected,
		widget.NewLabel("Route lengths"), w.routes,
		widget.NewLabel("Plan"), w.planNote,
	)
	w.emptyHint = widget.NewLabel("Nothing to plan yet: add junctions (double-tap the canvas, or pick Add junction in the toolbar) " +
		"and join them with corridors (Connect, or Alt-drag from one junction to another). Every junction but the start may hold the exit.")
	w.emptyHint.Wrapping = fyne.TextWrapWord
	w.emptyHint.Hide()
	w.incomplete = widget.NewLabel("")
	w.incomplete.Wrapping = fyne.TextWrapWord
	w.incomplete.Importance = widget.DangerImportance
	w.incomplete.Hide()

	// the figures come first, right under the choices that produce them, so the
	// worst case, bound and gap are visible without scrolling
	top := container.NewVBox(
		choices,
		container.NewBorder(nil, nil, nil, w.busyLabel, w.busyBar),
		w.errBox,
		w.emptyHint,
		w.figures,
		w.incomplete,
		a.searchPanel(),
		a.legend(),
	)
	hint := widget.NewLabelWithStyle("Candidates: click a header to sort, a row to replay that exit", fyne.TextAlignLeading, fyne.TextStyle{Italic: true})
	hint.Truncation = fyne.TextTruncateEllipsis
	split := container.NewVSplit(container.NewVScroll(top), container.NewBorder(hint, nil, nil, nil, a.table.build(a.replayExit)))
	split.Offset = 0.68
	return split
}

// fillPlannerChoices lists "best available" and every planner that supports the current model.
func (a *App) fillPlannerChoices() {
	opts := []string{bestAvailable}
	sel := bestAvailable
	for _, p := range planners.PlannersFor(a.model) {
		label := p.Name
		if p.Search {
			label += " (search)"
		}
		opts = append(opts, label)
		if p.Name == a.planner {
			sel = label
		}
	}
	if sel == bestAvailable {
		a.planner = ""
	}
	a.w.planner.Options = opts
	a.w.planner.SetSelected(sel)
}

// setModel switches the model and replans.
func (a *App) setModel(m engine.Model) {
	if m == a.model {
		return
	}
	a.model = m
	a.w.model.SetSelected(m.Label())
	a.fillPlannerChoices()
	a.replan()
}

// refreshResults copies the published result into the plan panel and the canvas overlay.
func (a *App) refreshResults() {
	w := &a.w
	if a.planning.err != nil {
		if a.planning.site == nil {
			w.errTitle.SetText("The site is not valid yet")
		} else {
			w.errTitle.SetText("The planner could not plan this site")
		}
		w.errLabel.SetText(a.planning.err.Error())
		w.errBox.Show()
		w.emptyHint.Hide()
		w.figures.Hide()
		w.incomplete.Hide()
		a.refreshTable()
		return
	}
	w.errBox.Hide()
	s, r, p := a.planning.site, a.planning.report, a.planning.plan
	if len(r.Exits) == 0 {
		w.emptyHint.Show()
		w.figures.Hide()
		w.incomplete.Hide()
		a.refreshTable()
		return
	}
	w.emptyHint.Hide()
	w.figures.Show()
	unit := s.Unit()
	w.worst.SetText(clockSeconds(r.Worst))
	if r.WorstExit >= 0 {
		w.worstExit.SetText(nodeName(s, r.WorstExit) + "  (ringed on the canvas)")
	} else {
		w.worstExit.SetText("no candidates")
	}
	b := r.Bounds
	lb3 := ""
	if b.LB3 > 0 {
		lb3 = "\nlast-find cover split " + clockSeconds(b.LB3)
	}
	w.lower.SetText(fmt.Sprintf("%s\nW = %.1f %s, L + 2·L2 = %.1f %s%s", clockSeconds(b.LB), b.LB1, unit, b.LB2, unit, lb3))
	if math.IsInf(r.Worst, 1) {
		w.gap.SetText("none (incomplete plan)")
	} else {
		w.gap.SetText(fmt.Sprintf("%.1f %% above the lower bound", 100*r.Gap))
	}
	if r.HasExpected {
		w.expectedKey.Show()
		w.expected.Show()
		w.expected.SetText(clockSeconds(r.Expected))
	} else {
		w.expectedKey.Hide()
		w.expected.Hide()
	}
	w.routes.SetText(fmt.Sprintf("%s %.1f %s · %s %.1f %s", s.Names[0], r.RouteLengths[0], unit, s.Names[1], r.RouteLengths[1], unit))
	note := p.Planner
	if p.Note != "" {
		note += ": " + p.Note
	}
	w.planNote.SetText(note)
	if !r.Complete {
		names := make([]string, len(r.Unvisited))
		for i, v := range r.Unvisited {
			names[i] = nodeName(s, v)
		}
		w.incomplete.SetText("Incomplete plan: no route visits " + strings.Join(names, ", ") + ". Its worst case is unbounded.")
		w.incomplete.Show()
	} else {
		w.incomplete.Hide()
	}
	a.refreshTable()
}

// refreshTable redraws the legend and the candidate table for the current report.
func (a *App) refreshTable() {
	a.refreshLegend()
	if a.planning.err != nil {
		a.table.show(nil, nil)
		return
	}
	a.table.show(a.planning.site, a.planning.report)
}

// heatOverlay is the per-report part of the canvas overlay: evacuation time per candidate, the worst
// exit and the unvisited candidates.
func heatOverlay(s *engine.Site, r *engine.Report) canvas.Overlay {
	o := canvas.NoOverlay()
	o.Evac = make([]float64, s.N)
	for i := range o.Evac {
		o.Evac[i] = math.NaN()
	}
	for _, ex := range r.Exits {
		o.Evac[ex.Node] = ex.EvacAt
	}
	o.EvacMax = finiteMax(r)
	o.Worst = r.WorstExit
	o.Unvisited = append([]int(nil), r.Unvisited...)
	return o
}

const legendSteps = 24

// legend is the colour scale of the heat colouring, from 0 to the largest evacuation time.
func (a *App) legend() fyne.CanvasObject {
	cells := make([]fyne.CanvasObject, legendSteps)
	for i := range cells {
		r := fcanvas.NewRectangle(canvas.HeatColor(float64(i) / (legendSteps - 1)))
		r.SetMinSize(fyne.NewSize(8, 14))
		cells[i] = r
	}
	bar := container.NewGridWithColumns(legendSteps, cells...)
	a.w.legendLo = widget.NewLabel("00:00")
	a.w.legendHi = widget.NewLabel("—")
	a.w.legendLo.Importance = widget.LowImportance
	a.w.legendHi.Importance = widget.LowImportance
	title := widget.NewLabelWithStyle("Evacuation time per candidate", fyne.TextAlignCenter, fyne.TextStyle{})
	a.w.legend = container.NewVBox(
		container.NewBorder(nil, nil, a.w.legendLo, a.w.legendHi, title),
		container.NewPadded(bar),
	)
	return a.w.legend
}

// refreshLegend shows the scale of the current report, and hides it when there is nothing coloured.
func (a *App) refreshLegend() {
	if a.planning.report == nil || a.planning.err != nil || len(a.planning.report.Exits) == 0 {
		a.w.legend.Hide()
		return
	}
	a.w.legendHi.SetText(clock(finiteMax(a.planning.report)))
	a.w.legend.Show()
}
