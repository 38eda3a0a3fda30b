// Package canvas is Duosweep's interactive tree editor: the Editor widget
// draws a site (junctions, corridors, lengths, labels), lets the user add,
// move, connect and delete junctions with undo and redo, and draws what the
// plan panel and playback hand it on top (heat colours per exit, the worst
// exit, agents and their trails, the meeting point).
//
// The editor changes an engine.Scenario value and never plans: the ui asks the
// engine and passes results back through SetOverlay. Geometry (view transform,
// hit-testing, tidy layout, label spacing) lives in canvas/geom and has no
// fyne import.
//
// As in fyne's own widgets, the Editor holds state (the scenario and what is
// derived from it, selection, view, drag, overlay, message) and its renderer
// draws it: the widget never calls the renderer; fyne calls Refresh after a
// change and Layout after a resize. The renderer draws in layers, each owning
// its objects (render_tree.go: junctions, labels, corridors; render_overlay.go:
// markers, agents, message, help).
package canvas
