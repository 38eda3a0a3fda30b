package ui

import (
	"testing"

	"fyne.io/fyne/v2/test"
)

// TestMainWindowMarkup is a structure golden of the main window on the demo in the light theme, planned
// and at playback time 0: toolbar, inspector, canvas, plan panel, timeline and notice. After a deliberate
// change of the layout, inspect testdata/failed/main_window.xml and copy it over testdata/main_window.xml.
func TestMainWindowMarkup(t *testing.T) {
	h := newHarness(t, "")
	test.AssertRendersToMarkup(t, "main_window.xml", h.win.Canvas())
}
