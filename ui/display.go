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
// Models name themselves (engine.Model.Label, Other) and the engine owns the time tolerance
// (engine.Tol). The finder's name and the clock stand in here for engine helpers that are not there yet:
// each is a one-line switch when they are.

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
