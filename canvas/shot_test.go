package canvas

import (
	"image/png"
	"os"
	"testing"

	"fyne.io/fyne/v2"
)

// TestShot writes a picture for a person to look at when DUOSWEEP_SHOT names a file.
func TestShot(t *testing.T) {
	path := os.Getenv("DUOSWEEP_SHOT")
	if path == "" {
		t.Skip("set DUOSWEEP_SHOT=file.png to write a picture")
	}
	e, w, _ := newTestEditor(t, small())
	w.Resize(fyne.NewSize(500, 420))
	e.FitView()
	e.Select(Selection{SelNode, 1})
	e.SetOverlay(sampleOverlay())
	if os.Getenv("DUOSWEEP_SHOT_HELP") != "" {
		e.ToggleHelp()
	}
	img := w.Canvas().Capture()
	f, err := os.Create(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	if err := png.Encode(f, img); err != nil {
		t.Fatal(err)
	}
}
