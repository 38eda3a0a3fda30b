package canvas

import (
	"image"
	"math"
	"testing"

	"duosweep/canvas/geom"
	"duosweep/engine"
)

// TestCalibratedScale is worked by hand: points 30 and 40 apart (50 drawing
// units) on an image drawn at 2 units per pixel are 25 pixels apart; a real
// distance of 100 m makes 4 m per pixel, or 2 drawing units per pixel when
// one drawing unit is 2 m.
func TestCalibratedScale(t *testing.T) {
	a, b := geom.Pt{X: 0, Y: 0}, geom.Pt{X: 30, Y: 40}
	if s, err := CalibratedScale(2, a, b, 100, 0); err != nil || s != 4 {
		t.Fatalf("%g %v, want 4", s, err)
	}
	if s, err := CalibratedScale(2, a, b, 100, 2); err != nil || s != 2 {
		t.Fatalf("%g %v, want 2", s, err)
	}
	for _, c := range []struct {
		old, d float64
		b      geom.Pt
	}{{0, 100, b}, {2, 0, b}, {2, -1, b}, {2, math.Inf(1), b}, {2, math.NaN(), b}, {2, 100, geom.Pt{X: 1, Y: 0}}} {
		if _, err := CalibratedScale(c.old, a, c.b, c.d, 1); err == nil {
			t.Errorf("accepted %+v", c)
		}
	}
}

// TestBackdropLayer: the image is placed at its corner with its scaled size,
// a large image is drawn from its small copy at low zoom, and opacity sets
// the translucency.
func TestBackdropLayer(t *testing.T) {
	sc := loopSite()
	sc.Backdrop = &engine.Backdrop{Image: "p.png", X: -10, Y: -20, Scale: 0.05, Opacity: 0.25}
	e, w, _ := newTestEditor(t, sc)
	big := image.NewNRGBA(image.Rect(0, 0, 4000, 2000))
	e.SetBackdropImage(big)
	w.Canvas().Refresh(e)
	r := rendererOf(e)
	r.Refresh()
	img := r.backdrop.img
	if img.Hidden {
		t.Fatal("backdrop hidden")
	}
	zoom, origin := e.View()
	if got, want := img.Position().X, float32(-10*zoom)+origin.X; math.Abs(float64(got-want)) > 0.5 {
		t.Errorf("left edge at %g, want %g", got, want)
	}
	if got, want := img.Size().Width, float32(4000*0.05*zoom); math.Abs(float64(got-want)) > 0.5 {
		t.Errorf("width %g, want %g", got, want)
	}
	if math.Abs(float64(img.Translucency)-0.75) > 1e-9 {
		t.Errorf("translucency %g, want 0.75", img.Translucency)
	}
	if sb := img.Image.Bounds(); sb.Dx() != backdropMaxPx || sb.Dy() != backdropMaxPx/2 {
		t.Errorf("drawn from a %v image; want the %d-pixel copy at this zoom", sb, backdropMaxPx)
	}
	e.SetBackdropImage(nil)
	r.Refresh()
	if !img.Hidden {
		t.Error("removed backdrop still drawn")
	}
}
