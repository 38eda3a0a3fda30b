package ui

import (
	"fmt"
	"math"
	"sort"
	"time"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/container"
	"fyne.io/fyne/v2/layout"
	"fyne.io/fyne/v2/theme"
	"fyne.io/fyne/v2/widget"

	"duosweep/canvas"
	"duosweep/engine"
)

// PlaySeconds is how long playback of the whole timeline takes at 1×; the speed choice scales it
// (0.5× to 16×). The real-time factor is shown beside the choice.
const PlaySeconds = 30.0

// Playback speeds offered, as labels and factors.
var (
	speedLabels  = []string{"0.5×", "1×", "2×", "4×", "8×", "16×"}
	speedFactors = []float64{0.5, 1, 2, 4, 8, 16}
)

// playbackState is the replay on the canvas and where playback stands in it.
type playbackState struct {
	focus    int            // candidate replayed on request (OnNodeTapped), -1 for the worst exit
	replay   *engine.Replay // nil when there is nothing to replay
	trails   [2]trail       // the agents' trajectories of replay as polylines
	t        float64        // playback time, in [0, tMax]
	tMax     float64        // end of the timeline
	speed    float64        // playback speed factor (speedFactors)
	playing  bool
	anim     *fyne.Animation // drives playback frames (tick)
	lastTick time.Time       // wall-clock time of the last frame
	syncing  bool            // true while code (not the user) moves the slider or the event list
}

func newPlaybackState() playbackState { return playbackState{focus: -1, speed: 1} }

// trail is an agent's replay trajectory as a polyline: the corner points of its segments with the times
// it passes them.
type trail struct {
	t []float64
	p []engine.Point
}

// newTrail takes the corners of trajectory tr (every segment start, and the end of the last one).
func newTrail(tr *engine.Trajectory) trail {
	var tl trail
	add := func(t float64) {
		p := tr.PositionAt(t)
		if n := len(tl.p); n > 0 && tl.p[n-1] == p {
			return
		}
		tl.t = append(tl.t, t)
		tl.p = append(tl.p, p)
	}
	add(0)
	for _, g := range tr.Segs {
		add(g.T0)
	}
	if n := len(tr.Segs); n > 0 {
		add(tr.Segs[n-1].T1)
	}
	return tl
}

// upTo returns the corners passed by time t followed by pos (a new slice).
func (tl trail) upTo(t float64, pos engine.Point) []engine.Point {
	k := sort.Search(len(tl.t), func(i int) bool { return tl.t[i] > t })
	out := make([]engine.Point, 0, k+1)
	out = append(out, tl.p[:k]...)
	if k == 0 || tl.p[k-1] != pos {
		out = append(out, pos)
	}
	return out
}

// timelinePanel is the playback bar: play/pause, step to the next event, speed, the time slider, what is
// being replayed, and the event list kept in step with the slider.
func (a *App) timelinePanel() fyne.CanvasObject {
	w := &a.w
	w.play = widget.NewButtonWithIcon("", theme.MediaPlayIcon(), a.togglePlay)
	w.next = widget.NewButtonWithIcon("", theme.MediaSkipNextIcon(), a.stepNext)
	w.rewind = widget.NewButtonWithIcon("", theme.MediaSkipPreviousIcon(), func() { a.stop(); a.setTime(0) })
	w.worstBtn = widget.NewButton("Replay worst exit", func() { a.replayExit(-1) })
	w.speed = widget.NewSelect(speedLabels, func(s string) {
		for i, l := range speedLabels {
			if l == s {
				a.playback.speed = speedFactors[i]
			}
		}
		a.refreshRate()
	})
	w.rate = widget.NewLabel("")
	w.rate.Importance = widget.LowImportance
	w.speed.SetSelected("1×")
	w.slider = widget.NewSlider(0, 1)
	w.slider.Step = 0.001
	w.slider.OnChanged = func(v float64) {
		if !a.playback.syncing {
			a.setTime(v)
		}
	}
	w.clock = widget.NewLabelWithStyle("00:00 / 00:00", fyne.TextAlignTrailing, fyne.TextStyle{Monospace: true})
	w.replayInfo = widget.NewLabel("")
	w.replayInfo.Truncation = fyne.TextTruncateEllipsis

	w.events = widget.NewList(
		func() int {
			if a.playback.replay == nil {
				return 0
			}
			return len(a.playback.replay.Events)
		},
		func() fyne.CanvasObject {
			l := widget.NewLabel("")
			l.Truncation = fyne.TextTruncateEllipsis
			return l
		},
		func(i widget.ListItemID, o fyne.CanvasObject) {
			if a.playback.replay == nil || i >= len(a.playback.replay.Events) {
				return
			}
			ev := a.playback.replay.Events[i]
			o.(*widget.Label).SetText(fmt.Sprintf("%s  %s — %s", clock(ev.T), ev.Kind, ev.Text))
		},
	)
	w.events.OnSelected = func(i widget.ListItemID) {
		if a.playback.syncing || a.playback.replay == nil || i >= len(a.playback.replay.Events) {
			return
		}
		a.stop()
		a.setTime(a.playback.replay.Events[i].T)
	}

	controls := container.NewHBox(w.rewind, w.play, w.next, w.speed, w.rate, w.worstBtn)
	left := container.NewVBox(
		container.NewBorder(nil, nil, widget.NewLabel("Time"), w.clock, w.slider),
		container.NewBorder(nil, nil, controls, nil, w.replayInfo),
	)
	list := container.New(&minLayout{min: fyne.NewSize(440, 112)}, w.events)
	a.playback.anim = &fyne.Animation{Duration: time.Second, RepeatCount: fyne.AnimationRepeatForever, Curve: fyne.AnimationLinear, Tick: a.tick}
	return container.NewBorder(nil, nil, nil, list, container.NewVBox(layout.NewSpacer(), left, layout.NewSpacer()))
}

// minLayout stacks its objects and asks for at least min.
type minLayout struct{ min fyne.Size }

func (l *minLayout) Layout(objs []fyne.CanvasObject, size fyne.Size) {
	for _, o := range objs {
		o.Move(fyne.NewPos(0, 0))
		o.Resize(size)
	}
}

func (l *minLayout) MinSize(objs []fyne.CanvasObject) fyne.Size {
	m := l.min
	for _, o := range objs {
		m = m.Max(fyne.NewSize(0, o.MinSize().Height))
	}
	return m
}

// replayExit replays the exit at node v, or the worst exit for v < 0.
func (a *App) replayExit(v int) {
	a.playback.focus = v
	a.rebuildReplay()
}

// nodeTapped replays a tapped candidate (OnNodeTapped of the canvas).
func (a *App) nodeTapped(v int) {
	if a.planning.report == nil {
		return
	}
	if _, ok := a.planning.report.ExitFor(v); ok {
		a.replayExit(v)
	}
}

// rebuildReplay builds the replay of the focused (or worst) exit of the current plan.
func (a *App) rebuildReplay() {
	if a.planning.report == nil || a.planning.plan == nil {
		a.setReplay(nil)
		return
	}
	exit := a.playback.focus
	if exit < 0 {
		exit = a.planning.report.WorstExit
	}
	if exit < 0 {
		a.setReplay(nil)
		return
	}
	rp, err := engine.NewReplay(a.planning.site, a.planning.plan, a.model, exit)
	if err != nil {
		a.setReplay(nil)
		a.setStatus(err.Error())
		return
	}
	a.setReplay(rp)
}

// setReplay installs a replay (nil: none) and redraws at the current time, clamped to the new range.
func (a *App) setReplay(rp *engine.Replay) {
	a.playback.replay = rp
	a.playback.tMax = 0
	if rp != nil {
		a.playback.trails = [2]trail{newTrail(rp.Trajectory(0)), newTrail(rp.Trajectory(1))}
		a.playback.tMax = finiteMax(a.planning.report)
		if !math.IsInf(rp.End, 0) && rp.End > a.playback.tMax {
			a.playback.tMax = rp.End
		}
		if math.IsInf(rp.End, 0) {
			for ag := 0; ag < 2; ag++ {
				a.playback.tMax = math.Max(a.playback.tMax, rp.Trajectory(ag).End)
			}
		}
	} else {
		a.stop()
	}
	if a.w.slider != nil {
		a.playback.syncing = true
		a.w.slider.Max = math.Max(a.playback.tMax, 1e-9)
		a.w.slider.Step = math.Max(a.playback.tMax/2000, 1e-6)
		a.playback.syncing = false
		a.w.events.UnselectAll()
		a.w.events.Refresh()
	}
	a.refreshReplayInfo()
	a.refreshRate()
	a.setTime(math.Min(a.playback.t, a.playback.tMax))
}

func (a *App) refreshReplayInfo() {
	if a.w.replayInfo == nil {
		return
	}
	rp := a.playback.replay
	if rp == nil {
		a.w.replayInfo.SetText("Nothing to replay")
		return
	}
	which := "tap a candidate to replay it instead"
	if a.planning.report != nil && rp.Exit == a.planning.report.WorstExit {
		which = "the worst case; " + which
	}
	how := ""
	switch f := rp.Result.Finder; f {
	case engine.Nobody:
		how = ": never found"
	case engine.Both:
		how = fmt.Sprintf(": found by both at %s", clock(rp.Result.FoundAt))
	default:
		how = fmt.Sprintf(": found by %s at %s", finderName(a.planning.site, f), clock(rp.Result.FoundAt))
	}
	a.w.replayInfo.SetText(fmt.Sprintf("Exit at %s%s (%s)", nodeName(a.planning.site, rp.Exit), how, which))
}

// setTime moves playback to t: slider, clock, event list and the agents on the canvas.
func (a *App) setTime(t float64) {
	if t < 0 || math.IsNaN(t) {
		t = 0
	}
	if t > a.playback.tMax {
		t = a.playback.tMax
	}
	a.playback.t = t
	if a.w.slider != nil {
		a.playback.syncing = true
		a.w.slider.Value = t
		a.w.slider.Refresh()
		a.w.clock.SetText(clock(t) + " / " + clock(a.playback.tMax))
		a.syncEvents()
		a.playback.syncing = false
	}
	a.drawAgents()
}

// syncEvents selects the last event at or before the current time.
func (a *App) syncEvents() {
	if a.playback.replay == nil {
		return
	}
	i := a.currentEvent()
	if i < 0 {
		a.w.events.UnselectAll()
		return
	}
	a.w.events.Select(i)
	a.w.events.ScrollTo(i)
}

// currentEvent is the index of the last event at or before a.playback.t, -1 before the first.
func (a *App) currentEvent() int {
	evs := a.playback.replay.Events
	return sort.Search(len(evs), func(i int) bool { return evs[i].T > a.playback.t+engine.Tol(a.playback.t) }) - 1
}

// agentsAt returns the agent marks of the current replay at time t.
func (a *App) agentsAt(t float64) []canvas.AgentMark {
	if a.playback.replay == nil {
		return nil
	}
	marks := make([]canvas.AgentMark, 2)
	for ag := 0; ag < 2; ag++ {
		pos := a.playback.replay.Position(ag, t)
		marks[ag] = canvas.AgentMark{
			Name:     a.planning.site.Names[ag],
			At:       pos,
			Trail:    a.playback.trails[ag].upTo(t, pos),
			Informed: a.playback.replay.Informed(ag, t),
		}
	}
	return marks
}

// drawAgents hands the canvas the heat overlay plus the agents at the current time.
func (a *App) drawAgents() {
	o := a.planning.heat
	if a.playback.replay != nil {
		o.Focus = a.playback.replay.Exit
		o.Agents = a.agentsAt(a.playback.t)
		res := a.playback.replay.Result
		if a.playback.replay.Model == engine.FaceToFace && byOneAgent(res.Finder) && a.playback.t >= res.MeetAt-engine.Tol(res.MeetAt) {
			mp := res.MeetPoint
			o.Meeting = &mp
		}
	}
	a.editor.SetOverlay(o)
}

// togglePlay starts or pauses playback; at the end it starts again from 0.
func (a *App) togglePlay() {
	if a.playback.playing {
		a.stop()
		return
	}
	if a.playback.replay == nil {
		return
	}
	if a.playback.t >= a.playback.tMax-engine.Tol(a.playback.tMax) {
		a.setTime(0)
	}
	a.playback.playing = true
	a.playback.lastTick = a.now()
	a.w.play.SetIcon(theme.MediaPauseIcon())
	a.playback.anim.Start()
}

// stop pauses playback.
func (a *App) stop() {
	if !a.playback.playing {
		return
	}
	a.playback.playing = false
	a.playback.anim.Stop()
	if a.w.play != nil {
		a.w.play.SetIcon(theme.MediaPlayIcon())
	}
}

// tick is the animation callback: it advances playback by the wall-clock time since the last frame
// times the speed, and stops at the end.
func (a *App) tick(float32) {
	if !a.playback.playing {
		return
	}
	now := a.now()
	dt := now.Sub(a.playback.lastTick).Seconds()
	a.playback.lastTick = now
	if dt <= 0 {
		return
	}
	t := a.playback.t + dt*a.rate()
	if t >= a.playback.tMax {
		a.setTime(a.playback.tMax)
		a.stop()
		return
	}
	a.setTime(t)
}

// rate is the playback rate in site seconds per wall-clock second.
func (a *App) rate() float64 { return a.playback.speed * a.playback.tMax / PlaySeconds }

// refreshRate shows the real-time factor of the chosen speed.
func (a *App) refreshRate() {
	if a.w.rate == nil {
		return
	}
	if r := a.rate(); r >= 10 {
		a.w.rate.SetText(fmt.Sprintf("%.0f× real time", r))
	} else if r > 0 {
		a.w.rate.SetText(fmt.Sprintf("%.2g× real time", r))
	} else {
		a.w.rate.SetText("")
	}
}

// stepNext jumps to the next event after the current time.
func (a *App) stepNext() {
	if a.playback.replay == nil {
		return
	}
	for _, ev := range a.playback.replay.Events {
		if ev.T > a.playback.t+engine.Tol(a.playback.t) {
			a.stop()
			a.setTime(ev.T)
			return
		}
	}
	a.stop()
	a.setTime(a.playback.tMax)
}
