package ui

import (
	"fmt"
	"math"

	"duosweep/canvas"
	"duosweep/engine"
	"duosweep/projects"
)

// How the window writes names, times and models: every panel uses these, so that a junction, a time or
// a model reads the same everywhere.
//
// Some stand in for engine helpers of the engine-rooms work (issue 8) until it lands: the time tolerance,
// the finder's name, the models' labels and the clock. Each is a one-line switch then.

// nodeName is how the window names junction v of s: "id (label)", or the id when it has no label of its
// own, "—" for no junction.
func nodeName(s *engine.Site, v int) string {
	if v < 0 || s == nil || v >= s.N {
		return "—"
	}
	return canvas.JunctionName(s.IDs[v], s.Scenario.Nodes[v].Label)
}

// clock is a time as mm:ss (h:mm:ss from an hour), "never" for +Inf.
func clock(sec float64) string { return projects.FormatDuration(sec) }

// clockSeconds is a time as mm:ss and in seconds: "06:12 (372.4 s)".
func clockSeconds(sec float64) string {
	if math.IsInf(sec, 0) || math.IsNaN(sec) {
		return clock(sec)
	}
	return fmt.Sprintf("%s (%.1f s)", clock(sec), sec)
}

// timeTol is how far apart two times near t may be and still count as the same moment.
func timeTol(t float64) float64 { return 1e-9 * math.Max(1, math.Abs(t)) }

// finderName names who finds an exit (Report.Exits[i].Finder): an agent's name, "both" or "nobody".
func finderName(s *engine.Site, f int) string {
	switch f {
	case engine.Both:
		return "both"
	case engine.Nobody:
		return "nobody"
	}
	return s.Names[f]
}

// byOneAgent reports whether f names one agent (not both, not nobody).
func byOneAgent(f int) bool { return f != engine.Both && f != engine.Nobody }

// modelLabel is the name of model m in the model choice and the menu.
func modelLabel(m engine.Model) string { return modelLabels[m] }

// modelLabels are the labels of the models, in engine.Models order.
var modelLabels = []string{"Radio", "Face to face"}

// otherModel is the model that is not m.
func otherModel(m engine.Model) engine.Model { return 1 - m }
