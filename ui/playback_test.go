package ui

import (
	"math"
	"testing"

	"duosweep/engine"
	"duosweep/projects"
)

// engineReplay builds the replay the window should show, straight from the engine.
func engineReplay(t *testing.T, m engine.Model, exit int) (*engine.Site, *engine.Replay) {
	t.Helper()
	s, p, r := engineBest(t, projects.Demo(), m)
	if exit < 0 {
		exit = r.WorstExit
	}
	rp, err := engine.NewReplay(s, p, m, exit)
	if err != nil {
		t.Fatal(err)
	}
	return s, rp
}

// checkAgentsAt asserts that the agents drawn at the window's current time are where the engine's replay
// puts them, compared in canvas coordinates (PointXY), and that trails end at the agents.
func checkAgentsAt(t *testing.T, h *harness, rp *engine.Replay) {
	t.Helper()
	a := h.app
	ov := a.editor.Overlay()
	if len(ov.Agents) != 2 {
		t.Fatalf("%d agents drawn, want 2", len(ov.Agents))
	}
	for ag := 0; ag < 2; ag++ {
		want := a.editor.PointXY(rp.Position(ag, a.playback.t))
		got := a.editor.PointXY(ov.Agents[ag].At)
		if !posNear(got, want) {
			t.Fatalf("t=%.2f agent %d drawn at %v, engine replay at %v", a.playback.t, ag, got, want)
		}
		tr := ov.Agents[ag].Trail
		if len(tr) == 0 || !posNear(a.editor.PointXY(tr[len(tr)-1]), want) {
			t.Fatalf("t=%.2f agent %d: trail does not end at the agent", a.playback.t, ag)
		}
		if ov.Agents[ag].Informed != rp.Informed(ag, a.playback.t) {
			t.Fatalf("t=%.2f agent %d informed %v, engine %v", a.playback.t, ag, ov.Agents[ag].Informed, rp.Informed(ag, a.playback.t))
		}
	}
}

func TestAgentsAtSliderTimeMatchEngineReplay(t *testing.T) {
	for _, m := range engine.Models {
		t.Run(m.String(), func(t *testing.T) {
			h := newHarness(t, "")
			a := h.app
			if m == engine.FaceToFace {
				a.w.model.SetSelected("Face to face")
				h.wait()
			}
			_, rp := engineReplay(t, m, -1)
			if a.playback.replay.Exit != rp.Exit || !near(a.playback.replay.End, rp.End) {
				t.Fatalf("window replays exit %d (end %v), engine worst exit %d (end %v)", a.playback.replay.Exit, a.playback.replay.End, rp.Exit, rp.End)
			}
			if !near(a.w.slider.Max, a.planning.report.Worst) {
				t.Fatalf("slider max %v, want the worst case %v", a.w.slider.Max, a.planning.report.Worst)
			}
			for _, f := range []float64{0, 0.013, 0.25, 0.5, 0.77, 0.9, 0.999, 1} {
				a.w.slider.SetValue(f * a.w.slider.Max) // as a user drags it
				if math.Abs(a.playback.t-a.w.slider.Value) > 1e-9 {
					t.Fatalf("slider %v but playback time %v", a.w.slider.Value, a.playback.t)
				}
				checkAgentsAt(t, h, rp)
			}
			// every event time, too (discovery, call or meeting, arrivals)
			for _, ev := range rp.Events {
				a.setTime(ev.T)
				checkAgentsAt(t, h, rp)
			}
			if m == engine.FaceToFace && rp.Result.Finder != engine.Both {
				a.setTime(rp.Result.MeetAt)
				if mp := a.editor.Overlay().Meeting; mp == nil || !posNear(a.editor.PointXY(*mp), a.editor.PointXY(rp.Result.MeetPoint)) {
					t.Fatal("meeting point not drawn at the engine's meeting point")
				}
			}
		})
	}
}

func TestPlaybackFramesFollowTheClock(t *testing.T) {
	h := newHarness(t, "")
	a := h.app
	_, rp := engineReplay(t, engine.Radio, -1)
	a.togglePlay()
	if !a.playback.playing || a.w.play.Icon.Name() == "" {
		t.Fatal("not playing")
	}
	a.setTime(0)
	rate := a.playback.tMax / PlaySeconds // 1×
	h.clock.advance(0.5)
	a.playback.anim.Tick(0.1) // the tick fraction is ignored: frames follow wall-clock time
	if !near(a.playback.t, 0.5*rate) {
		t.Fatalf("after 0.5 s at 1×: t=%v, want %v", a.playback.t, 0.5*rate)
	}
	checkAgentsAt(t, h, rp)
	a.w.speed.SetSelected("16×")
	h.clock.advance(0.25)
	a.playback.anim.Tick(0.2)
	if want := 0.5*rate + 0.25*16*rate; !near(a.playback.t, want) {
		t.Fatalf("after 0.25 s at 16×: t=%v, want %v", a.playback.t, want)
	}
	checkAgentsAt(t, h, rp)
	if got := a.w.slider.Value; !near(got, a.playback.t) {
		t.Fatalf("slider %v, time %v", got, a.playback.t)
	}
	// the event list follows: the selected row is the last event at or before t
	h.clock.advance(PlaySeconds)
	a.playback.anim.Tick(0.3)
	if a.playback.playing || a.playback.t != a.playback.tMax {
		t.Fatalf("at the end: playing %v t=%v max %v", a.playback.playing, a.playback.t, a.playback.tMax)
	}
	if i := a.currentEvent(); i != len(rp.Events)-1 {
		t.Fatalf("current event %d at the end, want the last (%d)", i, len(rp.Events)-1)
	}
	// play again restarts from 0
	a.togglePlay()
	if a.playback.t != 0 || !a.playback.playing {
		t.Fatalf("replay from the end: t=%v playing %v", a.playback.t, a.playback.playing)
	}
	a.togglePlay()
	if a.playback.playing {
		t.Fatal("pause did not stop")
	}
}

func TestStepToNextEvent(t *testing.T) {
	h := newHarness(t, "")
	a := h.app
	_, rp := engineReplay(t, engine.Radio, -1)
	a.setTime(0)
	seen := 0
	for i := 0; i < len(rp.Events)+1; i++ {
		prev := a.playback.t
		a.stepNext()
		if a.playback.t <= prev && a.playback.t != a.playback.tMax {
			t.Fatalf("step %d did not move forward (t=%v)", i, a.playback.t)
		}
		for seen < len(rp.Events) && rp.Events[seen].T <= a.playback.t+1e-9 {
			seen++
		}
		if seen > 0 && a.currentEvent() != seen-1 {
			t.Fatalf("t=%v: current event %d, want %d", a.playback.t, a.currentEvent(), seen-1)
		}
	}
	if a.playback.t != a.playback.tMax {
		t.Fatalf("stepping past the last event ends at %v, want %v", a.playback.t, a.playback.tMax)
	}
	// selecting an event in the list jumps there
	a.w.events.Select(0)
	if a.playback.t != rp.Events[0].T {
		t.Fatalf("event click: t=%v want %v", a.playback.t, rp.Events[0].T)
	}
}

func TestTappedCandidateIsReplayed(t *testing.T) {
	h := newHarness(t, "")
	a := h.app
	var other int = -1
	for _, ex := range a.planning.report.Exits {
		if ex.Node != a.planning.report.WorstExit && ex.Finder != engine.Nobody {
			other = ex.Node
			break
		}
	}
	a.editor.OnNodeTapped(other)
	_, rp := engineReplay(t, engine.Radio, other)
	if a.playback.replay.Exit != other || a.editor.Overlay().Focus != other {
		t.Fatalf("tapped %d, replaying %d", other, a.playback.replay.Exit)
	}
	if a.editor.Overlay().Worst != a.planning.report.WorstExit {
		t.Fatal("the worst exit is no longer marked")
	}
	a.setTime(rp.End / 2)
	checkAgentsAt(t, h, rp)
	// tapping a non-candidate (the start) changes nothing
	s, _ := engine.NewSite(projects.Demo())
	a.editor.OnNodeTapped(s.Start)
	if a.playback.replay.Exit != other {
		t.Fatal("tapping the start changed the replay")
	}
	// the focus survives a replan; "Replay worst exit" goes back
	a.w.model.SetSelected("Face to face")
	h.wait()
	if a.playback.replay.Exit != other {
		t.Fatalf("after a model switch replaying %d, want %d", a.playback.replay.Exit, other)
	}
	a.replayExit(-1)
	if a.playback.replay.Exit != a.planning.report.WorstExit {
		t.Fatal("not back on the worst exit")
	}
}
