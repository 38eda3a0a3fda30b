package canvas

import (
	"image/png"
	"math"
	"os"
	"testing"

	"fyne.io/fyne/v2"

	"duosweep/engine"
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
	e.SetOverlay(Overlay{
		Evac: []float64{math.NaN(), 10, 30, 24}, EvacMax: 30, Worst: 2, Focus: 3,
		Agents: []AgentMark{
			{Name: "A", At: engine.Point{From: 1, To: 2, Offset: 4}, Trail: []engine.Point{engine.At(0), engine.At(1)}},
			{Name: "B", At: engine.Point{From: 1, To: 3, Offset: 7}, Trail: []engine.Point{engine.At(0), engine.At(1)}, Informed: true},
		},
		Meeting:   &engine.Point{From: 1, To: 3, Offset: 10},
		Unvisited: []int{3},
	})
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
