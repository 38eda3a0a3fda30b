// Package ui assembles the Duosweep desktop window: the tree-editor canvas in the centre, an inspector
// and a plan panel at the side, a playback timeline below, menus, file handling and the recovery autosave.
//
// The window computes nothing of its own: every figure comes from the engine (plans, reports, replays),
// every file from projects. Planning runs off the UI thread: each edit cancels the previous run through
// its context and starts a new one, and the result reaches the widgets only through fyne.Do. Playback
// runs on a fyne.Animation. Panels are functions returning fyne.CanvasObject.
//
// App's state is split by concern: planningState (planning.go: runs in flight and the result on
// screen), searchState (search.go), playbackState (timeline.go) and candidateTable (candidates.go);
// display.go is the one home of how names, times and models are written.
//
// The package never imports fyne.io/fyne/v2/app, so its tests run as pure Go (CGO_ENABLED=0) on fyne's
// test driver; cmd/duosweep creates the real application and calls New.
package ui
