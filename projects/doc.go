// Package projects reads and writes Duosweep's files: scenarios
// (*.sweep.json), plan reports and plan files, and the printable itinerary.
// The formats are documented in ../shared/FORMATS.md; their field names are
// fixed because other programs read them.
//
// Every error is prefixed "projects: " and names the offending field and
// value. Loading is all-or-nothing: on error the returned scenario is zero.
//
// The package is pure Go (no fyne import; a test enforces it) and depends
// only on engine.
package projects
