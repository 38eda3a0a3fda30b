package ui

import (
	"duosweep/canvas"
	"duosweep/engine"
)

// How the window writes names, times and models: every panel uses these, so that a junction, a time or
// a model reads the same everywhere.
//
// Models name themselves (engine.Model.Label, Other); the engine owns the time tolerance (engine.Tol),
// the clock (engine.FormatClock) and the finder's name (engine.Finder.Name).

// nodeName is how the window names junction v of s: "id (label)", or the id when it has no label of its
// own, "—" for no junction.
func nodeName(s *engine.Site, v int) string {
	if v < 0 || s == nil || v >= s.N {
		return "—"
	}
	return canvas.JunctionName(s.IDs[v], s.Scenario.Nodes[v].Label)
}

// clock is a time as mm:ss (h:mm:ss from an hour), "never" for +Inf.
func clock(sec float64) string { return engine.FormatClock(sec) }

// clockSeconds is a time as mm:ss and in seconds: "06:12 (372.4 s)".
func clockSeconds(sec float64) string { return engine.FormatClockSeconds(sec) }

// finderName names who finds an exit (Report.Exits[i].Finder): an agent's name, "both" or "nobody".
func finderName(s *engine.Site, f engine.Finder) string { return f.Name(s.Names) }

// byOneAgent reports whether f names one agent (not both, not nobody).
func byOneAgent(f engine.Finder) bool { return f.Agent() }
