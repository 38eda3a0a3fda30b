package canvas

import (
	"math"
	"testing"

	"fyne.io/fyne/v2/test"

	"duosweep/engine"
)

// sampleOverlay is the overlay of the small test site drawn by the golden
// and the picture test: heat colours, the worst exit, a replayed exit, two
// agents with trails, a meeting point and an unvisited candidate.
func sampleOverlay() Overlay {
	return Overlay{
		Evac: []float64{math.NaN(), 10, 30, 24}, EvacMax: 30, Worst: 2, Focus: 3,
		Agents: []AgentMark{
			{Name: "A", At: engine.Point{From: 1, To: 2, Offset: 4}, Trail: []engine.Point{engine.At(0), engine.At(1)}},
			{Name: "B", At: engine.Point{From: 1, To: 3, Offset: 7}, Trail: []engine.Point{engine.At(0), engine.At(1)}, Informed: true},
		},
		Meeting:   &engine.Point{From: 1, To: 3, Offset: 10},
		Unvisited: []int{3},
	}
}

// TestGoldenOverlay checks the structure of the drawing of a small site with
// a selection, heat colours, the worst exit, a replayed exit, two agents with
// trails, a meeting point and an unvisited candidate (light theme).
func TestGoldenOverlay(t *testing.T) {
	e, w, _ := newTestEditor(t, small())
	e.Select(Selection{SelNode, 1})
	e.SetOverlay(sampleOverlay())
	test.AssertRendersToMarkup(t, "editor_overlay.xml", w.Canvas())

	// out-of-range overlay indices (a stale overlay) are ignored, not drawn or crashed on
	e.SetOverlay(Overlay{Evac: []float64{1}, Worst: 99, Focus: -7, Unvisited: []int{42},
		Agents: []AgentMark{{Name: "A", At: engine.Point{From: 0, To: 3, Offset: 1}}}})
	if !rendererOf(e).markers.worst.Hidden || !rendererOf(e).markers.focus.Hidden || !rendererOf(e).agents.discs[0].Hidden {
		t.Fatal("stale overlay drawn")
	}
	e.SetOverlay(NoOverlay())
	test.AssertRendersToMarkup(t, "editor_plain.xml", w.Canvas())
}

func TestHeatColorScale(t *testing.T) {
	// lightness (relative luminance, ITU-R BT.709 weights on linearised sRGB)
	// must rise monotonically along the scale so it reads in grey.
	lin := func(c uint32) float64 {
		v := float64(c) / 0xffff
		if v <= 0.04045 {
			return v / 12.92
		}
		return math.Pow((v+0.055)/1.055, 2.4)
	}
	prev := -1.0
	for i := 0; i <= 100; i++ {
		r, g, b, a := HeatColor(float64(i) / 100).RGBA()
		if a != 0xffff {
			t.Fatal("heat colours must be opaque")
		}
		y := 0.2126*lin(r) + 0.7152*lin(g) + 0.0722*lin(b)
		if y <= prev {
			t.Fatalf("luminance not increasing at %d%%: %.4f after %.4f", i, y, prev)
		}
		prev = y
	}
	if HeatColor(-1) != HeatColor(0) || HeatColor(2) != HeatColor(1) || HeatColor(math.NaN()) != HeatColor(0) {
		t.Fatal("clamping")
	}
	// the two agent colours differ in lightness, not only in hue
	l := func(i int) float64 {
		r, g, b, _ := AgentColor(i).RGBA()
		return 0.2126*lin(r) + 0.7152*lin(g) + 0.0722*lin(b)
	}
	if math.Abs(l(0)-l(1)) < 0.3 {
		t.Fatalf("agent colours too close in luminance: %.3f vs %.3f", l(0), l(1))
	}
}
