package ui

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/theme"
	"fyne.io/fyne/v2/widget"

	"duosweep/canvas"
	"duosweep/engine"
)

// inspectorPanel shows and edits the selected junction or corridor and the site itself. Text fields
// apply on Enter or with the Apply button; bad input is refused with a message and changes nothing.
func (a *App) inspectorPanel() fyne.CanvasObject {
	a.w.inspector = container.NewVBox()
	a.w.inspectorErr = widget.NewLabel("")
	a.w.inspectorErr.Wrapping = fyne.TextWrapWord
	a.w.inspectorErr.Importance = widget.DangerImportance
	a.w.inspectorErr.Hide()
	return container.NewVScroll(container.NewVBox(a.w.inspectorErr, a.w.inspector))
}

// refreshInspector rebuilds the inspector for the current selection and scenario.
func (a *App) refreshInspector() {
	if a.w.inspector == nil {
		return
	}
	sc := a.editor.Scenario()
	sel := a.editor.Selection()
	var objs []fyne.CanvasObject
	switch {
	case sel.Kind == canvas.SelNode && sel.Index >= 0 && sel.Index < len(sc.Nodes):
		objs = a.nodeInspector(sc, sel.Index)
	case sel.Kind == canvas.SelCorridor && sel.Index >= 0 && sel.Index < len(sc.Corridors):
		objs = a.corridorInspector(sc, sel.Index)
	default:
		hint := widget.NewLabel("Tap a junction or corridor to inspect it.")
		hint.Importance = widget.LowImportance
		objs = []fyne.CanvasObject{heading("Selection"), hint}
	}
	objs = append(objs, widget.NewSeparator())
	objs = append(objs, a.siteInspector(sc)...)
	a.w.inspector.Objects = objs
	a.w.inspector.Refresh()
}

func heading(s string) *widget.Label {
	return widget.NewLabelWithStyle(s, fyne.TextAlignLeading, fyne.TextStyle{Bold: true})
}

// field is a form row: an entry that applies fn on Enter or with the row's Apply button.
type field struct {
	label string
	entry *widget.Entry
}

// formWithApply lays out fields and one Apply button that applies all of them.
func (a *App) formWithApply(fields []field, apply func() error) fyne.CanvasObject {
	form := widget.NewForm()
	run := func() {
		if err := apply(); err != nil {
			a.inspectorError(err)
			return
		}
		a.inspectorError(nil)
	}
	for _, f := range fields {
		f.entry.OnSubmitted = func(string) { run() }
		form.Append(f.label, f.entry)
	}
	btn := widget.NewButtonWithIcon("Apply", theme.ConfirmIcon(), run)
	return container.NewVBox(form, container.NewHBox(btn))
}

// inspectorError shows err under the inspector (nil hides it).
func (a *App) inspectorError(err error) {
	if err == nil {
		a.w.inspectorErr.Hide()
		return
	}
	a.w.inspectorErr.SetText(err.Error())
	a.w.inspectorErr.Show()
	a.setStatus(err.Error())
}

func entryWith(text string) *widget.Entry {
	e := widget.NewEntry()
	e.SetText(text)
	return e
}

func fmtNum(x float64) string { return strconv.FormatFloat(x, 'g', -1, 64) }

// parsePositive parses a finite number > 0 for the named field.
func parsePositive(name, text string) (float64, error) {
	v, err := strconv.ParseFloat(strings.TrimSpace(text), 64)
	if err != nil {
		return 0, fmt.Errorf("%s: %q is not a number", name, text)
	}
	if !(v > 0) || math.IsInf(v, 0) {
		return 0, fmt.Errorf("%s: %s must be a finite number > 0", name, text)
	}
	return v, nil
}

// parseProbability parses "" (no probability) or a number in [0, 1].
func parseProbability(text string) (float64, bool, error) {
	text = strings.TrimSpace(text)
	if text == "" {
		return 0, false, nil
	}
	v, err := strconv.ParseFloat(text, 64)
	if err != nil {
		return 0, false, fmt.Errorf("probability: %q is not a number (leave it empty for none)", text)
	}
	if !(v >= 0 && v <= 1) {
		return 0, false, fmt.Errorf("probability: %s must be between 0 and 1", text)
	}
	return v, true, nil
}

func (a *App) nodeInspector(sc engine.Scenario, i int) []fyne.CanvasObject {
	n := sc.Nodes[i]
	id, label := entryWith(n.ID), entryWith(n.Label)
	prob := entryWith("")
	if n.HasProbability {
		prob.SetText(fmtNum(n.Probability))
	}
	prob.SetPlaceHolder("none")
	apply := func() error {
		newID := strings.TrimSpace(id.Text)
		p, hasP, err := parseProbability(prob.Text)
		if err != nil {
			return err
		}
		if newID == "" {
			return fmt.Errorf("id: must not be empty")
		}
		if j := sc.NodeIndex(newID); j >= 0 && j != i {
			return fmt.Errorf("id: %q is already used by another junction", newID)
		}
		return a.editor.Edit("Edit junction "+n.ID, func(s *engine.Scenario) error {
			old := s.Nodes[i].ID
			s.Nodes[i].ID = newID
			s.Nodes[i].Label = strings.TrimSpace(label.Text)
			s.Nodes[i].Probability, s.Nodes[i].HasProbability = p, hasP
			if newID != old {
				for k := range s.Corridors {
					if s.Corridors[k].From == old {
						s.Corridors[k].From = newID
					}
					if s.Corridors[k].To == old {
						s.Corridors[k].To = newID
					}
				}
				if s.Start == old {
					s.Start = newID
				}
			}
			return nil
		})
	}
	form := a.formWithApply([]field{{"Id", id}, {"Label", label}, {"Probability", prob}}, apply)
	cand := widget.NewCheck("Possible exit (candidate)", nil)
	cand.SetChecked(n.Candidate)
	cand.OnChanged = func(bool) { a.inspectorError(a.editor.ToggleCandidate(i)) }
	isStart := n.ID == sc.Start
	start := widget.NewButtonWithIcon("Make this the start", theme.HomeIcon(), func() { a.inspectorError(a.editor.SetStart(i)) })
	if isStart {
		start.SetText("This is the start")
		start.Disable()
	}
	del := widget.NewButtonWithIcon("Delete", theme.DeleteIcon(), func() { a.inspectorError(a.editor.DeleteSelection()) })
	title := "Junction " + n.ID
	if isStart {
		title += " (start)"
	}
	return []fyne.CanvasObject{heading(title), form, cand, container.NewHBox(start, del)}
}

func (a *App) corridorInspector(sc engine.Scenario, ci int) []fyne.CanvasObject {
	c := sc.Corridors[ci]
	unit := sc.Unit
	if unit == "" {
		unit = "m"
	}
	length := entryWith(fmtNum(c.Length))
	apply := func() error {
		v, err := parsePositive("length", length.Text)
		if err != nil {
			return err
		}
		return a.editor.Edit(fmt.Sprintf("Set length %s–%s", c.From, c.To), func(s *engine.Scenario) error {
			s.Corridors[ci].Length = v
			return nil
		})
	}
	form := a.formWithApply([]field{{"Length (" + unit + ")", length}}, apply)
	del := widget.NewButtonWithIcon("Delete", theme.DeleteIcon(), func() { a.inspectorError(a.editor.DeleteSelection()) })
	return []fyne.CanvasObject{heading(fmt.Sprintf("Corridor %s – %s", c.From, c.To)), form, container.NewHBox(del)}
}

func (a *App) siteInspector(sc engine.Scenario) []fyne.CanvasObject {
	agents := sc.Agents
	if len(agents) != 2 {
		agents = engine.DefaultAgents()
	}
	name, unit := entryWith(sc.Name), entryWith(sc.Unit)
	unit.SetPlaceHolder("m")
	n0, s0 := entryWith(agents[0].Name), entryWith(fmtNum(agents[0].Speed))
	n1, s1 := entryWith(agents[1].Name), entryWith(fmtNum(agents[1].Speed))
	apply := func() error {
		sp0, err := parsePositive("speed of the first agent", s0.Text)
		if err != nil {
			return err
		}
		sp1, err := parsePositive("speed of the second agent", s1.Text)
		if err != nil {
			return err
		}
		a0, a1 := strings.TrimSpace(n0.Text), strings.TrimSpace(n1.Text)
		if a0 == "" || a1 == "" {
			return fmt.Errorf("agents: both agents need a name")
		}
		if a0 == a1 {
			return fmt.Errorf("agents: the two agents need different names (both are %q)", a0)
		}
		return a.editor.Edit("Edit site", func(s *engine.Scenario) error {
			s.Name = strings.TrimSpace(name.Text)
			s.Unit = strings.TrimSpace(unit.Text)
			s.Agents = []engine.Agent{{Name: a0, Speed: sp0}, {Name: a1, Speed: sp1}}
			return nil
		})
	}
	u := sc.Unit
	if u == "" {
		u = "m"
	}
	form := a.formWithApply([]field{
		{"Name", name}, {"Unit", unit},
		{"Agent 1", n0}, {"Speed (" + u + "/s)", s0},
		{"Agent 2", n1}, {"Speed (" + u + "/s) ", s1},
	}, apply)
	even := widget.NewButton("Equal probabilities", func() { a.inspectorError(a.spreadProbabilities(true)) })
	clear := widget.NewButton("No probabilities", func() { a.inspectorError(a.spreadProbabilities(false)) })
	return []fyne.CanvasObject{heading("Site"), form, container.NewHBox(even, clear)}
}

// spreadProbabilities gives every candidate the same probability (even) or removes all probabilities.
func (a *App) spreadProbabilities(even bool) error {
	name := "Remove probabilities"
	if even {
		name = "Equal probabilities"
	}
	return a.editor.Edit(name, func(s *engine.Scenario) error {
		k := 0
		for _, n := range s.Nodes {
			if n.Candidate {
				k++
			}
		}
		if even && k == 0 {
			return fmt.Errorf("no candidates: mark at least one junction as a possible exit")
		}
		for i := range s.Nodes {
			s.Nodes[i].HasProbability = even && s.Nodes[i].Candidate
			s.Nodes[i].Probability = 0
			if s.Nodes[i].HasProbability {
				s.Nodes[i].Probability = 1 / float64(k)
			}
		}
		return nil
	})
}
