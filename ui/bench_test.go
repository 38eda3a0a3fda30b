package ui

import (
	"testing"

	"fyne.io/fyne/v2/test"
	"fyne.io/fyne/v2/theme"

	"duosweep/engine"
	"duosweep/engine/gen"
)

// benchHarness opens the window on a 2,000-junction random tree (engine/gen, fixed seed), planned.
func benchHarness(b *testing.B) *harness {
	b.Helper()
	sc, err := gen.Generate("random", 2000, 7)
	if err != nil {
		b.Fatal(err)
	}
	fa := test.NewTempApp(b)
	fa.Settings().SetTheme(theme.LightTheme())
	h := newHarnessOn(b, fa, "", "")
	h.app.setScenario(sc, "", false)
	h.wait()
	if h.app.planning.report == nil {
		b.Fatalf("no plan: %v", h.app.planning.err)
	}
	return h
}

// BenchmarkPlaybackFrame is one animation frame on a 2,000-junction site: advance the clock, compute both
// agents' replay positions and trails, move the slider and the event list, and hand the canvas its new
// overlay (which refreshes the editor's renderer).
func BenchmarkPlaybackFrame(b *testing.B) {
	h := benchHarness(b)
	a := h.app
	a.togglePlay()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if !a.playback.playing {
			a.togglePlay()
		}
		h.clock.advance(1.0 / 60)
		a.playback.anim.Tick(0)
	}
}

// BenchmarkEditToReplan is one edit on a 2,000-junction site until the new report is on screen: the
// undoable edit, the background plan (engine best available) and the publish on the UI goroutine. The
// radio-versus-face-to-face comparison, computed after the publish, is not included.
func BenchmarkEditToReplan(b *testing.B) {
	h := benchHarness(b)
	a := h.app
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		l := float64(10 + i%50)
		if err := a.editor.Edit("len", func(s *engine.Scenario) error { s.Corridors[0].Length = l; return nil }); err != nil {
			b.Fatal(err)
		}
		want := a.planning.gen
		for a.planning.shownGen != want {
			<-h.q.signal // wait for posted work: the publish, or a stale run's leftovers
			for _, f := range h.q.drain() {
				f()
			}
		}
	}
}
