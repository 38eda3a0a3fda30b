package ui

import (
	"fmt"
	"math"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/widget"

	"duosweep/engine"
)

// comparePanel is the "Radio vs face to face" view: the best available plan under each model, each
// evaluated under both models, and what losing the radio costs.
func (a *App) comparePanel() fyne.CanvasObject {
	w := &a.w
	intro := widget.NewLabel("The best available plan for each model, and the same plan walked under the other model. " +
		"Rows: the model the plan was made for. Columns: how the crew communicates on the day.")
	intro.Wrapping = fyne.TextWrapWord
	for i := range w.cmpCells {
		for j := range w.cmpCells[i] {
			l := widget.NewLabel("—")
			l.Wrapping = fyne.TextWrapWord
			w.cmpCells[i][j] = l
		}
		w.cmpCells[i][i].TextStyle.Bold = true
	}
	head := func(s string) fyne.CanvasObject {
		return widget.NewLabelWithStyle(s, fyne.TextAlignLeading, fyne.TextStyle{Bold: true})
	}
	row := func(objs ...fyne.CanvasObject) fyne.CanvasObject { return container.NewGridWithColumns(3, objs...) }
	grid := container.NewVBox(
		row(widget.NewLabel(""), head("walked with radio"), head("walked face to face")),
		row(head("plan for radio"), w.cmpCells[0][0], w.cmpCells[0][1]),
		row(head("plan for face to face"), w.cmpCells[1][0], w.cmpCells[1][1]),
	)
	w.cmpCost = widget.NewLabel("")
	w.cmpCost.Wrapping = fyne.TextWrapWord
	w.cmpCost.TextStyle.Bold = true
	w.cmpCross = widget.NewLabel("")
	w.cmpCross.Wrapping = fyne.TextWrapWord
	w.cmpStatus = widget.NewLabel("")
	w.cmpStatus.Wrapping = fyne.TextWrapWord
	w.cmpStatus.Importance = widget.LowImportance
	show := func(m engine.Model) func() {
		return func() {
			a.planner = ""
			a.setModel(m)
			a.fillPlannerChoices()
			w.tabs.SelectIndex(0)
		}
	}
	buttons := container.NewHBox(
		widget.NewButton("Replay the radio plan", show(engine.Radio)),
		widget.NewButton("Replay the face-to-face plan", show(engine.FaceToFace)),
	)
	return container.NewVScroll(container.NewVBox(intro, grid, widget.NewSeparator(), w.cmpCost, w.cmpCross, buttons, w.cmpStatus))
}

// refreshComparison copies a.planning.comparison into the view.
func (a *App) refreshComparison() {
	w := &a.w
	if w.cmpCost == nil {
		return
	}
	c := a.planning.comparison
	clear := func(status string) {
		for i := range w.cmpCells {
			for j := range w.cmpCells[i] {
				w.cmpCells[i][j].SetText("—")
			}
		}
		w.cmpCost.SetText("")
		w.cmpCross.SetText("")
		w.cmpStatus.SetText(status)
	}
	switch {
	case a.planning.err != nil && a.planning.site == nil:
		clear("No comparison: " + a.planning.err.Error())
		return
	case c == nil:
		clear("comparing…")
		return
	case c.err != nil:
		clear("No comparison: " + c.err.Error())
		return
	}
	for i := range c.cell {
		for j := range c.cell[i] {
			r := c.cell[i][j]
			text := clockSeconds(r.Worst)
			if i == j {
				text += "\n" + c.plans[i].Planner
			} else if d, ok := costText(c.cell[j][j].Worst, r.Worst); ok {
				text += "\n" + d + " vs the " + engine.Models[j].String() + " plan"
			}
			w.cmpCells[i][j].SetText(text)
		}
	}
	radio, f2f := c.cell[0][0].Worst, c.cell[1][1].Worst
	if d, ok := costText(radio, f2f); ok {
		w.cmpCost.SetText("Losing radio costs " + d + " on the worst case (" +
			clock(radio) + " with radio, " + clock(f2f) + " face to face).")
	} else {
		w.cmpCost.SetText("No finite worst case to compare.")
	}
	if d, ok := costText(radio, c.cell[0][1].Worst); ok {
		w.cmpCross.SetText("Walking the radio plan without radio: " + d + " over the radio figure. " +
			"A plan is never slower with radio than without.")
	} else {
		w.cmpCross.SetText("")
	}
	w.cmpStatus.SetText("Both models planned with the best available planners.")
}

// costText is "+X s (+Y %)" for the change from base to other.
func costText(base, other float64) (string, bool) {
	if math.IsInf(base, 0) || math.IsInf(other, 0) || math.IsNaN(base) || math.IsNaN(other) {
		return "", false
	}
	d := other - base
	if base == 0 {
		return fmt.Sprintf("%+.1f s", d), true
	}
	return fmt.Sprintf("%+.1f s (%+.1f %%)", d, 100*d/base), true
}
