package canvas

import "duosweep/engine"

// How the editor and the window name things: the ui uses these too, so that a junction or an empty
// overlay is the same everywhere.

// JunctionName is how Duosweep names a junction: "id (label)", or the id when the junction has no
// label of its own (none, or the id again).
func JunctionName(id, label string) string {
	if label != "" && label != id {
		return id + " (" + label + ")"
	}
	return id
}

// NoOverlay is the empty overlay: no heat, nothing marked (Worst and Focus -1), no agents.
func NoOverlay() Overlay { return Overlay{Worst: -1, Focus: -1} }

// labelText is the text of a junction's label on the drawing: its label, else its id.
func labelText(n engine.Node) string {
	if n.Label != "" {
		return n.Label
	}
	return n.ID
}
