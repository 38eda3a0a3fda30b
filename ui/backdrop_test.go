package ui

import (
	"image"
	"image/color"
	"image/png"
	"math"
	"os"
	"path/filepath"
	"testing"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/test"
	"fyne.io/fyne/v2/widget"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"duosweep/canvas"
	"duosweep/canvas/geom"
	"duosweep/engine"
)

func writePNG(t *testing.T, w, h int) string {
	t.Helper()
	img := image.NewNRGBA(image.Rect(0, 0, w, h))
	for y := 0; y < h; y++ {
		for x := 0; x < w; x++ {
			img.Set(x, y, color.NRGBA{uint8(x), uint8(y), 128, 255})
		}
	}
	p := filepath.Join(t.TempDir(), "plan.png")
	f, err := os.Create(p)
	require.NoError(t, err)
	require.NoError(t, png.Encode(f, img))
	require.NoError(t, f.Close())
	return p
}

func findInOverlays[T fyne.CanvasObject](c fyne.Canvas, ok func(T) bool) T {
	var found T
	for _, o := range c.Overlays().List() {
		if walk(o, func(x fyne.CanvasObject) bool {
			if v, is := x.(T); is && ok(v) {
				found = v
				return true
			}
			return false
		}) {
			break
		}
	}
	return found
}

// TestBackdropCalibration: two clicks on the backdrop and a distance give
// the scale (worked by hand: the clicks are 50 drawing units apart on an
// image drawn at 0.5 units per pixel, so 100 pixels; typing 25 m makes it
// 0.25 m per pixel), and a corridor drawn over the image between two image
// pixels 100 pixels apart then gets the calibrated length, 25 m.
func TestBackdropCalibration(t *testing.T) {
	h := newHarness(t, "")
	a := h.app
	png := writePNG(t, 400, 200)
	require.NoError(t, a.setBackdropFile(png))
	w, hh := a.editor.BackdropImageSize()
	assert.Equal(t, [2]int{400, 200}, [2]int{w, hh})
	require.NotNil(t, a.editor.Scenario().Backdrop)
	assert.Equal(t, png, a.editor.Scenario().Backdrop.Image, "absolute while the scenario is untitled")

	// a known scale and place to work from
	require.NoError(t, a.editor.Edit("place", func(s *engine.Scenario) error {
		s.Backdrop = &engine.Backdrop{Image: png, X: 0, Y: 0, Scale: 0.5, Opacity: 0.5}
		return nil
	}))
	zoom, origin := a.editor.View()
	screen := func(x, y float64) fyne.Position {
		return fyne.NewPos(float32(x*zoom)+origin.X, float32(y*zoom)+origin.Y)
	}
	a.calibrateBackdrop()
	a.editor.Tapped(&fyne.PointEvent{Position: screen(10, 10)})
	a.editor.Tapped(&fyne.PointEvent{Position: screen(60, 10)})
	entry := findInOverlays(h.win.Canvas(), func(e *widget.Entry) bool { return e.PlaceHolder == "distance in m" })
	require.NotNil(t, entry, "the distance dialog is shown")
	entry.SetText("25")
	btn := findButton(h.win.Canvas(), "Set scale")
	require.NotNil(t, btn)
	test.Tap(btn)
	bd := a.editor.Scenario().Backdrop
	// the taps land on whole screen pixels: allow for that in the measured 50 units
	assert.InDelta(t, 0.25, bd.Scale, 0.25*2/(50*zoom))

	// draw over the calibrated image: pixels (20, 40) and (120, 40) are 100 pixels apart
	a.editor.Select(canvas.Selection{Kind: canvas.SelNone, Index: -1})
	_, err := a.editor.AddNode(screen(bd.X+20*bd.Scale, bd.Y+40*bd.Scale))
	require.NoError(t, err)
	_, err = a.editor.AddNode(screen(bd.X+120*bd.Scale, bd.Y+40*bd.Scale))
	require.NoError(t, err)
	sc := a.editor.Scenario()
	c := sc.Corridors[len(sc.Corridors)-1]
	assert.InDelta(t, 25, c.Length, 0.01+2/zoom, "a corridor drawn over 100 image pixels is 25 m")

	// bad distances are refused, the scale kept
	for _, bad := range []string{"", "x", "0", "-3"} {
		assert.Error(t, a.applyCalibration(canvasPt(0, 0), canvasPt(10, 0), bad))
	}
	assert.Equal(t, bd.Scale, a.editor.Scenario().Backdrop.Scale)

	// opacity and removal are edits; undo brings the backdrop back
	require.NoError(t, a.setBackdropOpacity(0.8))
	assert.Equal(t, 0.8, a.editor.Scenario().Backdrop.Opacity)
	a.removeBackdrop()
	assert.Nil(t, a.editor.Scenario().Backdrop)
	a.editor.Undo()
	assert.NotNil(t, a.editor.Scenario().Backdrop)
}

// TestBackdropMissingImage: a scenario whose image is missing loads, with a warning.
func TestBackdropMissingImage(t *testing.T) {
	dir := t.TempDir()
	p := filepath.Join(dir, "s.sweep.json")
	data := `{"format":"duosweep-scenario","version":1,"start":"s","nodes":[{"id":"s","x":0,"y":0},{"id":"a","x":10,"y":0}],` +
		`"corridors":[{"from":"s","to":"a","length":10}],"backdrop":{"image":"gone.png","scale":0.1}}`
	require.NoError(t, os.WriteFile(p, []byte(data), 0o644))
	h := newHarness(t, p)
	assert.Len(t, h.app.editor.Scenario().Nodes, 2)
	assert.Contains(t, h.app.w.status.Text, "gone.png")
	assert.Contains(t, h.app.w.status.Text, "without it")
	w, hh := h.app.editor.BackdropImageSize()
	assert.Zero(t, w+hh)
	assert.False(t, math.IsNaN(h.app.editor.Scenario().Backdrop.Scale))
}

func canvasPt(x, y float64) geom.Pt { return geom.Pt{X: x, Y: y} }
