package canvas

import (
	"errors"
	"fmt"
	"math"
	"reflect"
	"strings"
	"testing"
	"time"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/test"

	"duosweep/canvas/geom"
	"duosweep/engine"
)

func near(a, b fyne.Position, tol float32) bool {
	return math.Abs(float64(a.X-b.X)) <= float64(tol) && math.Abs(float64(a.Y-b.Y)) <= float64(tol)
}

func TestAddJunctionShiftTapConnectsToSelection(t *testing.T) {
	e, _, rc := newTestEditor(t, small())
	tapAt(e, e.NodeXY(3), 0) // select c
	if e.Selection() != (Selection{SelNode, 3}) || len(rc.tapped) != 1 || rc.tapped[0] != 3 {
		t.Fatalf("selection %v, tapped %v", e.Selection(), rc.tapped)
	}
	zoom, _ := e.View()
	at := e.NodeXY(3).Add(fyne.NewPos(float32(-3*zoom), float32(-4*zoom))) // 3, 4 drawing units away: distance 5
	tapAt(e, at, fyne.KeyModifierShift)
	sc := e.Scenario()
	if len(sc.Nodes) != 5 || sc.Nodes[4].ID != "j5" || !sc.Nodes[4].Candidate || !sc.Nodes[4].HasXY {
		t.Fatalf("nodes %+v", sc.Nodes)
	}
	if got := sc.Corridors[len(sc.Corridors)-1]; got.From != "c" || got.To != "j5" || got.Length != 5 {
		t.Fatalf("new corridor %+v, want c–j5 of drawn length 5", got)
	}
	if !near(e.NodeXY(4), at, 0.01) {
		t.Fatalf("new node drawn at %v, tapped at %v", e.NodeXY(4), at)
	}
	if e.Selection() != (Selection{SelNode, 4}) {
		t.Fatalf("new node not selected: %v", e.Selection())
	}
	if len(rc.changed) != 1 || len(rc.changed[0].Nodes) != 5 {
		t.Fatalf("OnChanged %d times", len(rc.changed))
	}
	if _, err := engine.NewSite(sc); err != nil {
		t.Fatalf("result is not a valid site: %v", err)
	}
	if e.UndoName() != "Add junction j5" || !e.Undo() || len(e.Scenario().Nodes) != 4 || len(e.Scenario().Corridors) != 3 {
		t.Fatalf("undo of add failed: %q %+v", e.UndoName(), e.Scenario())
	}
	if e.RedoName() != "Add junction j5" || !e.Redo() || len(e.Scenario().Nodes) != 5 {
		t.Fatal("redo of add failed")
	}
}

func TestAddJunctionByDoubleTapAndTool(t *testing.T) {
	e, _, rc := newTestEditor(t, small())
	e.Select(Selection{SelNode, 2})
	empty := fyne.NewPos(380, 200)
	tapAt(e, empty, 0)
	if e.Selection().Kind != SelNone || len(e.Scenario().Nodes) != 4 {
		t.Fatal("a single tap on empty space must only deselect")
	}
	tapAt(e, empty, 0) // second tap of a double tap
	sc := e.Scenario()
	if len(sc.Nodes) != 5 || sc.Corridors[3].From != "b" {
		t.Fatalf("double tap: want a junction joined to the previously selected b, got %+v", sc.Corridors)
	}
	// with the add tool and nothing selected, a tap adds an unconnected junction and says so
	e.Select(Selection{Kind: SelNone})
	e.SetTool(ToolAddJunction)
	tapAt(e, fyne.NewPos(30, 30), 0)
	if n := len(e.Scenario().Nodes); n != 6 || len(e.Scenario().Corridors) != 4 {
		t.Fatalf("add tool: %d nodes", n)
	}
	if len(rc.msgs) == 0 || !strings.Contains(rc.msgs[len(rc.msgs)-1], "not connected") {
		t.Fatalf("want a hint about the unconnected junction, got %q", rc.msgs)
	}
	if e.Message() == "" {
		t.Fatal("editor does not show the message itself")
	}
	rc.timers[len(rc.timers)-1]() // the 3 s timer fires
	if e.Message() != "" {
		t.Fatal("message not hidden after its timer")
	}
}

func TestAddFirstJunctionBecomesStart(t *testing.T) {
	e, _, _ := newTestEditor(t, engine.Scenario{})
	if _, err := e.AddNode(fyne.NewPos(100, 100)); err != nil {
		t.Fatal(err)
	}
	if _, err := e.AddNode(fyne.NewPos(100, 160)); err != nil { // the first is selected: joined to it
		t.Fatal(err)
	}
	sc := e.Scenario()
	if sc.Start != "j1" || sc.Nodes[0].Candidate || !sc.Nodes[1].Candidate || len(sc.Corridors) != 1 {
		t.Fatalf("%+v", sc)
	}
	if _, err := engine.NewSite(sc); err != nil {
		t.Fatal(err)
	}
}

func TestMoveByDrag(t *testing.T) {
	e, _, rc := newTestEditor(t, small())
	before := e.Scenario()
	from := e.NodeXY(3)
	to := from.Add(fyne.NewPos(30, -20))
	dragPtr(e, from, to, 0)
	if !near(e.NodeXY(3), to, 0.05) {
		t.Fatalf("node at %v after drag to %v", e.NodeXY(3), to)
	}
	if len(rc.changed) != 1 || e.UndoName() != "Move c" {
		t.Fatalf("a move must be one edit, got %d changes, undo %q", len(rc.changed), e.UndoName())
	}
	zoom, _ := e.View()
	n := e.Scenario().Nodes[3]
	if math.Abs(n.X-(10+30/zoom)) > 0.01 || math.Abs(n.Y-(20-20/zoom)) > 0.01 {
		t.Fatalf("scenario coordinates %v,%v", n.X, n.Y)
	}
	if e.Scenario().Corridors[2].Length != 14.1 {
		t.Fatal("moving a junction must not change corridor lengths")
	}
	e.Undo()
	if e.Scenario().Nodes[3] != before.Nodes[3] || !near(e.NodeXY(3), from, 0.01) {
		t.Fatal("undo did not restore the position")
	}
	e.Redo()
	if !near(e.NodeXY(3), to, 0.05) {
		t.Fatal("redo did not re-apply the move")
	}
}

func TestSyntheticDragFromFyneTest(t *testing.T) {
	// fyne's test.Drag sends one event with the start position and the delta, no mouse-down.
	e, _, _ := newTestEditor(t, small())
	from := e.NodeXY(2)
	e.Dragged(&fyne.DragEvent{PointEvent: fyne.PointEvent{Position: from}, Dragged: fyne.NewDelta(-40, 0)})
	e.DragEnd()
	if !near(e.NodeXY(2), from.Add(fyne.NewPos(-40, 0)), 0.05) {
		t.Fatalf("node at %v", e.NodeXY(2))
	}
}

func TestConnectByDragAndRefuseCycle(t *testing.T) {
	sc := small()
	sc.Nodes = append(sc.Nodes, engine.Node{ID: "d", X: 20, Y: 10, HasXY: true, Candidate: true})
	e, _, rc := newTestEditor(t, sc)
	// Alt-drag from c to the unconnected d adds a corridor of the drawn length (14.142 → 14.1)
	dragPtr(e, e.NodeXY(3), e.NodeXY(4), fyne.KeyModifierAlt)
	got := e.Scenario().Corridors
	if len(got) != 4 || !reflect.DeepEqual(got[3], engine.Corridor{From: "c", To: "d", Length: 14.1}) {
		t.Fatalf("corridors %+v", got)
	}
	if e.UndoName() != "Connect c–d" {
		t.Fatalf("undo name %q", e.UndoName())
	}
	if _, err := engine.NewSite(e.Scenario()); err != nil {
		t.Fatal(err)
	}
	// connect tool: b to d would close a loop: refused, message at the drop position
	e.SetTool(ToolConnect)
	drop := e.NodeXY(4)
	dragPtr(e, e.NodeXY(2), drop, 0)
	if len(e.Scenario().Corridors) != 4 {
		t.Fatal("a loop was accepted")
	}
	if len(rc.msgs) == 0 || !strings.Contains(rc.msgs[len(rc.msgs)-1], "would close a loop: the site must be a tree") {
		t.Fatalf("messages %q", rc.msgs)
	}
	if !near(rc.msgAt[len(rc.msgAt)-1], drop, 0.01) {
		t.Fatalf("message at %v, dropped at %v", rc.msgAt[len(rc.msgAt)-1], drop)
	}
	// dropping on empty space cancels
	n := len(rc.changed)
	dragPtr(e, e.NodeXY(2), fyne.NewPos(390, 10), 0)
	if len(rc.changed) != n || len(e.Scenario().Corridors) != 4 {
		t.Fatal("a drop on empty space changed the site")
	}
	// undo/redo of the connection
	e.Undo()
	if len(e.Scenario().Corridors) != 3 {
		t.Fatal("undo of connect")
	}
	e.Redo()
	if len(e.Scenario().Corridors) != 4 {
		t.Fatal("redo of connect")
	}
	if err := e.Connect(0, 4); !errors.Is(err, ErrLoop) {
		t.Fatalf("Connect(s, d) = %v, want ErrLoop", err)
	}
}

func TestRubberBandFollowsPointer(t *testing.T) {
	e, w, _ := newTestEditor(t, small())
	from := e.NodeXY(2)
	e.MouseDown(mouse(from, fyne.KeyModifierControl))
	mid := from.Add(fyne.NewPos(60, 10))
	e.Dragged(&fyne.DragEvent{PointEvent: fyne.PointEvent{Position: mid}, Dragged: fyne.NewDelta(60, 10)})
	if !strings.Contains(renderMarkup(w), "<line ") || e.drag.kind != dragConnect {
		t.Fatal("no connect drag")
	}
	if rendererOf(e).markers.rubber.Hidden || !near(rendererOf(e).markers.rubber.Position2, mid, 0.01) || !near(rendererOf(e).markers.rubber.Position1, from, 0.01) {
		t.Fatalf("rubber band %v–%v", rendererOf(e).markers.rubber.Position1, rendererOf(e).markers.rubber.Position2)
	}
	e.TypedKey(&fyne.KeyEvent{Name: fyne.KeyEscape})
	if e.drag.kind != dragNone {
		t.Fatal("escape did not cancel")
	}
}

func TestDeleteAndRefuseSplit(t *testing.T) {
	e, _, rc := newTestEditor(t, small())
	// a joins three corridors: refused
	e.Select(Selection{SelNode, 1})
	err := e.DeleteSelection()
	if !errors.Is(err, ErrSplit) || len(e.Scenario().Nodes) != 4 {
		t.Fatalf("delete a = %v", err)
	}
	// a corridor of a tree: refused
	e.Select(Selection{SelCorridor, 2})
	if err := e.DeleteSelection(); !errors.Is(err, ErrSplit) {
		t.Fatalf("delete corridor = %v", err)
	}
	// the Delete key reports the refusal at the pointer
	e.MouseMoved(mouse(fyne.NewPos(5, 5), 0))
	e.Select(Selection{SelNode, 1})
	e.TypedKey(&fyne.KeyEvent{Name: fyne.KeyDelete})
	if len(rc.msgs) == 0 || !strings.Contains(rc.msgs[len(rc.msgs)-1], "split") || rc.msgAt[len(rc.msgAt)-1] != fyne.NewPos(5, 5) {
		t.Fatalf("messages %q at %v", rc.msgs, rc.msgAt)
	}
	// leaf c: fine, with its corridor
	e.Select(Selection{SelNode, 3})
	e.TypedKey(&fyne.KeyEvent{Name: fyne.KeyBackspace})
	sc := e.Scenario()
	if len(sc.Nodes) != 3 || len(sc.Corridors) != 2 || sc.NodeIndex("c") >= 0 || e.Selection().Kind != SelNone {
		t.Fatalf("after delete: %+v", sc)
	}
	if _, err := engine.NewSite(sc); err != nil {
		t.Fatal(err)
	}
	e.Undo()
	if len(e.Scenario().Nodes) != 4 || len(e.Scenario().Corridors) != 3 {
		t.Fatal("undo of delete")
	}
	e.Redo()
	if len(e.Scenario().Nodes) != 3 {
		t.Fatal("redo of delete")
	}
	// deleting the start leaf moves the start to its neighbour
	e.Select(Selection{SelNode, 0})
	if err := e.DeleteSelection(); err != nil {
		t.Fatal(err)
	}
	if sc := e.Scenario(); sc.Start != "a" {
		t.Fatalf("start %q", sc.Start)
	}
	if _, err := engine.NewSite(e.Scenario()); err != nil {
		t.Fatal(err)
	}
}

func TestDeleteCorridorOfLoadedCycle(t *testing.T) {
	sc := small()
	sc.Corridors = append(sc.Corridors, engine.Corridor{From: "b", To: "c", Length: 10})
	e, _, _ := newTestEditor(t, sc) // a file may hold a cycle; the editor lets the user break it
	e.Select(Selection{SelCorridor, 3})
	if err := e.DeleteSelection(); err != nil {
		t.Fatal(err)
	}
	if _, err := engine.NewSite(e.Scenario()); err != nil {
		t.Fatal(err)
	}
}

func TestSetStartAndToggleCandidateKeys(t *testing.T) {
	e, _, rc := newTestEditor(t, small())
	e.Select(Selection{SelNode, 2})
	e.TypedRune('s')
	if e.Scenario().Start != "b" || e.UndoName() != "Set start b" {
		t.Fatalf("start %q", e.Scenario().Start)
	}
	e.TypedRune('c')
	if e.Scenario().Nodes[2].Candidate || e.UndoName() != "Unmark exit candidate b" {
		t.Fatal("toggle candidate off")
	}
	e.TypedRune('C')
	if !e.Scenario().Nodes[2].Candidate {
		t.Fatal("toggle candidate on")
	}
	// undo all three, then redo
	e.TypedShortcut(&fyne.ShortcutUndo{})
	if e.Scenario().Nodes[2].Candidate {
		t.Fatal("undo toggle")
	}
	e.Undo()
	e.Undo()
	if e.Scenario().Start != "s" || e.CanUndo() {
		t.Fatal("undo set start")
	}
	e.TypedShortcut(&fyne.ShortcutRedo{})
	if e.Scenario().Start != "b" {
		t.Fatal("redo set start (Ctrl+Y)")
	}
	if len(rc.changed) != 7 { // 3 edits, 3 undos, 1 redo
		t.Fatalf("OnChanged %d times, want 7", len(rc.changed))
	}
	if err := e.SetStart(2); err == nil {
		t.Fatal("setting the start again must say so")
	}
	e.Select(Selection{Kind: SelNone})
	e.TypedRune('s')
	if !strings.Contains(rc.msgs[len(rc.msgs)-1], "select a junction") {
		t.Fatal("no hint without selection")
	}
}

func TestUndoRedoShortcutsAndEditAPI(t *testing.T) {
	e, _, rc := newTestEditor(t, small())
	err := e.Edit("Rename b", func(sc *engine.Scenario) error { sc.Nodes[2].Label = "Chamber"; return nil })
	if err != nil || e.Scenario().Nodes[2].Label != "Chamber" || len(rc.changed) != 1 {
		t.Fatal(err)
	}
	bad := errors.New("bad value")
	if err := e.Edit("x", func(sc *engine.Scenario) error { sc.Nodes[2].Label = "X"; return bad }); err != bad {
		t.Fatal(err)
	}
	err = e.Edit("loop", func(sc *engine.Scenario) error {
		sc.Corridors = append(sc.Corridors, engine.Corridor{From: "b", To: "c", Length: 1})
		return nil
	})
	if !errors.Is(err, ErrLoop) || len(e.Scenario().Corridors) != 3 || e.Scenario().Nodes[2].Label != "Chamber" || len(rc.changed) != 1 {
		t.Fatalf("refused edits changed something: %v", err)
	}
	e.TypedShortcut(&desktopShortcutZ)
	if e.Scenario().Nodes[2].Label != "Sump" || !e.CanRedo() || e.RedoName() != "Rename b" {
		t.Fatal("Ctrl+Z")
	}
	e.TypedShortcut(&desktopShortcutShiftZ)
	if e.Scenario().Nodes[2].Label != "Chamber" {
		t.Fatal("Ctrl+Shift+Z")
	}
	// a new edit clears the redo history
	e.Undo()
	_ = e.Edit("Rename c", func(sc *engine.Scenario) error { sc.Nodes[3].Label = "Refuge"; return nil })
	if e.CanRedo() || e.Redo() {
		t.Fatal("redo after a new edit")
	}
	// history limit
	e.HistoryLimit = 3
	for i := 0; i < 5; i++ {
		_ = e.Edit("n", func(sc *engine.Scenario) error { sc.Name += "x"; return nil })
	}
	k := 0
	for e.Undo() {
		k++
	}
	if k != 3 {
		t.Fatalf("undid %d edits with a limit of 3", k)
	}
}

func TestSetScenarioClearsHistoryAndLaysOut(t *testing.T) {
	e, _, rc := newTestEditor(t, small())
	_ = e.ToggleCandidate(1)
	e.Select(Selection{SelNode, 1})
	sc := small()
	for i := range sc.Nodes {
		sc.Nodes[i].HasXY = false
		sc.Nodes[i].X, sc.Nodes[i].Y = 0, 0
	}
	n := len(rc.changed)
	e.SetScenario(sc)
	if e.CanUndo() || e.CanRedo() || e.Selection().Kind != SelNone || len(rc.changed) != n {
		t.Fatal("SetScenario must clear history and selection and not fire OnChanged")
	}
	got := e.Scenario()
	for i, nd := range got.Nodes {
		if !nd.HasXY {
			t.Fatalf("node %d not laid out", i)
		}
	}
	// every node inside the 400×400 widget after the fit
	for i := range got.Nodes {
		p := e.NodeXY(i)
		if p.X < 0 || p.Y < 0 || p.X > 400 || p.Y > 400 {
			t.Fatalf("node %d drawn at %v, outside the view", i, p)
		}
	}
	// only missing coordinates are filled in: a's given position stays
	sc = small()
	sc.Nodes[3].HasXY = false
	e.SetScenario(sc)
	got = e.Scenario()
	if got.Nodes[1].X != 0 || got.Nodes[1].Y != 10 || !got.Nodes[3].HasXY {
		t.Fatalf("%+v", got.Nodes)
	}
	if d := math.Hypot(got.Nodes[3].X-got.Nodes[1].X, got.Nodes[3].Y-got.Nodes[1].Y); d < 5 {
		t.Fatalf("c placed %.2f from its parent a", d)
	}
}

func TestPanZoomChangeViewNotScenario(t *testing.T) {
	e, _, rc := newTestEditor(t, small())
	before := e.Scenario()
	p0 := e.NodeXY(1)
	z0, _ := e.View()
	// drag on empty space pans
	dragPtr(e, fyne.NewPos(390, 390), fyne.NewPos(360, 370), 0)
	if p := e.NodeXY(1); !near(p, p0.Add(fyne.NewPos(-30, -20)), 0.01) {
		t.Fatalf("pan: %v → %v", p0, p)
	}
	// wheel zooms around the pointer: the point under it stays put
	at := e.NodeXY(2)
	e.Scrolled(&fyne.ScrollEvent{PointEvent: fyne.PointEvent{Position: at}, Scrolled: fyne.NewDelta(0, 10)})
	z1, _ := e.View()
	if !(z1 > z0*1.09) || !near(e.NodeXY(2), at, 0.01) {
		t.Fatalf("zoom %v → %v, node b %v → %v", z0, z1, at, e.NodeXY(2))
	}
	e.TypedRune('-')
	e.TypedRune('+')
	e.TypedKey(&fyne.KeyEvent{Name: fyne.KeyLeft})
	e.ZoomBy(2, fyne.NewPos(0, 0))
	e.TypedRune('f')
	if p := e.NodeXY(1); !near(p, p0, 0.01) {
		t.Fatalf("fit: %v, want %v", p, p0)
	}
	after := e.Scenario()
	if len(rc.changed) != 0 || e.CanUndo() {
		t.Fatal("view changes must not be edits")
	}
	for i := range before.Nodes {
		if before.Nodes[i] != after.Nodes[i] {
			t.Fatal("view change moved a node")
		}
	}
}

func TestPointXYInterpolatesCorridors(t *testing.T) {
	e, _, _ := newTestEditor(t, small())
	a, c := e.NodeXY(1), e.NodeXY(3)
	p := e.PointXY(engine.Point{From: 1, To: 3, Offset: 14.1 / 4})
	want := fyne.NewPos(a.X+(c.X-a.X)/4, a.Y+(c.Y-a.Y)/4)
	if !near(p, want, 0.01) {
		t.Fatalf("PointXY = %v, want %v", p, want)
	}
	// reversed orientation: offset from c
	q := e.PointXY(engine.Point{From: 3, To: 1, Offset: 14.1 / 4})
	want = fyne.NewPos(c.X+(a.X-c.X)/4, c.Y+(a.Y-c.Y)/4)
	if !near(q, want, 0.01) {
		t.Fatalf("reversed PointXY = %v, want %v", q, want)
	}
	if e.PointXY(engine.At(2)) != e.NodeXY(2) {
		t.Fatal("node point")
	}
	// every interior point of a corridor lies strictly between its ends
	for _, off := range []float64{0.1, 3, 7.05, 14} {
		p := e.PointXY(engine.Point{From: 1, To: 3, Offset: off})
		d1 := geom.Dist(toPt(p), toPt(a))
		d2 := geom.Dist(toPt(p), toPt(c))
		if math.Abs(d1+d2-geom.Dist(toPt(a), toPt(c))) > 1e-3 || d1 == 0 || d2 == 0 {
			t.Fatalf("offset %v: %v not between %v and %v", off, p, a, c)
		}
	}
}

func TestHoverAndSelectCorridor(t *testing.T) {
	e, _, rc := newTestEditor(t, small())
	mid := e.PointXY(engine.Point{From: 0, To: 1, Offset: 5})
	e.MouseMoved(mouse(mid, 0))
	if e.Hover() != (Selection{SelCorridor, 0}) {
		t.Fatalf("hover %v", e.Hover())
	}
	tapAt(e, mid, 0)
	if e.Selection() != (Selection{SelCorridor, 0}) || len(rc.sels) != 1 {
		t.Fatalf("selection %v", e.Selection())
	}
	e.MouseOut()
	if e.Hover().Kind != SelNone {
		t.Fatal("hover after mouse out")
	}
	tapAt(e, fyne.NewPos(390, 5), 0)
	if e.Selection().Kind != SelNone {
		t.Fatal("tap on empty space must deselect")
	}
}

func TestHelpOverlayToggles(t *testing.T) {
	e, w, _ := newTestEditor(t, small())
	e.TypedRune('?')
	m := renderMarkup(w)
	for _, s := range e.Shortcuts() {
		if !strings.Contains(m, s.Action) {
			t.Fatalf("help overlay lacks %q", s.Action)
		}
	}
	e.TypedKey(&fyne.KeyEvent{Name: fyne.KeyF1})
	if e.HelpVisible() || strings.Contains(renderMarkup(w), e.Shortcuts()[0].Action) {
		t.Fatal("F1 did not hide the help")
	}
}

func TestTidyIsUndoable(t *testing.T) {
	e, _, _ := newTestEditor(t, small())
	before := e.Scenario()
	e.TypedRune('t')
	if e.UndoName() != "Tidy layout" {
		t.Fatal(e.UndoName())
	}
	after := e.Scenario()
	pts := make([]geom.Pt, len(after.Nodes))
	for i, n := range after.Nodes {
		pts[i] = geom.Pt{X: n.X, Y: n.Y}
	}
	if md := minPairDist(pts); md < 4 {
		t.Fatalf("tidy nodes %.2f apart", md)
	}
	e.Undo()
	if e.Scenario().Nodes[3] != before.Nodes[3] {
		t.Fatal("undo tidy")
	}
}

func TestLabelsHideWhenZoomedOut(t *testing.T) {
	e, _, _ := newTestEditor(t, randomScenario(60, 5, true))
	visible := func() (nodes, corridors int) {
		for i := range e.Scenario().Nodes {
			if !rendererOf(e).junctions.labels[i].Hidden {
				nodes++
			}
		}
		for i := range e.Scenario().Corridors {
			if !rendererOf(e).corridors.labels[i].Hidden {
				corridors++
			}
		}
		return
	}
	e.ZoomBy(0.05, e.centre())
	if n, c := visible(); n != 1 || c != 0 || rendererOf(e).junctions.labels[0].Hidden {
		t.Fatalf("zoomed out: %d node and %d corridor labels shown, want only the start's", n, c)
	}
	e.Select(Selection{SelNode, 7})
	if n, _ := visible(); n != 2 || rendererOf(e).junctions.labels[7].Hidden {
		t.Fatal("the selected junction's label must stay visible")
	}
	e.FitView()
	e.ZoomBy(4, e.NodeXY(7))
	n, c := visible()
	if n == 0 || c == 0 {
		t.Fatalf("zoomed in: %d node and %d corridor labels", n, c)
	}
	// shown labels never overlap each other
	var boxes []geom.Rect
	for i := range e.Scenario().Nodes {
		if t := rendererOf(e).junctions.labels[i]; !t.Hidden {
			boxes = append(boxes, geom.Rect{Min: toPt(t.Position()), Max: toPt(t.Position().Add(t.Size()))})
		}
	}
	for i := range e.Scenario().Corridors {
		if t := rendererOf(e).corridors.labels[i]; !t.Hidden {
			boxes = append(boxes, geom.Rect{Min: toPt(t.Position()), Max: toPt(t.Position().Add(t.Size()))})
		}
	}
	for i := range boxes {
		for j := i + 1; j < len(boxes); j++ {
			if boxes[i].Overlaps(boxes[j]) {
				t.Fatalf("labels overlap: %v and %v", boxes[i], boxes[j])
			}
		}
	}
}

func TestContextMenu(t *testing.T) {
	e, w, _ := newTestEditor(t, small())
	e.TappedSecondary(&fyne.PointEvent{Position: e.NodeXY(3), AbsolutePosition: e.NodeXY(3)})
	if e.Selection() != (Selection{SelNode, 3}) || w.Canvas().Overlays().Top() == nil {
		t.Fatal("right-click on a junction must select it and open a menu")
	}
	m := test.RenderToMarkup(w.Canvas())
	for _, s := range []string{"Make start", "Toggle exit candidate", "Delete junction"} {
		if !strings.Contains(m, s) {
			t.Fatalf("menu lacks %q", s)
		}
	}
}

func TestFitViewLeavesRoomForLabels(t *testing.T) {
	// a straight gallery drawn left to right whose far end has a long label:
	// the fitted view must show that label whole, at its preferred place
	// (right of the junction), not push it elsewhere or cut it at the edge
	sc := engine.Scenario{Name: "gallery", Unit: "m", Start: "s"}
	prev := "s"
	sc.Nodes = append(sc.Nodes, engine.Node{ID: "s", HasXY: true})
	for i := 1; i <= 6; i++ {
		id := fmt.Sprintf("g%d", i)
		nd := engine.Node{ID: id, X: float64(40 * i), HasXY: true, Candidate: true}
		if i == 6 {
			nd.Label = "East face of the far gallery"
		}
		sc.Nodes = append(sc.Nodes, nd)
		sc.Corridors = append(sc.Corridors, engine.Corridor{From: prev, To: id, Length: 40})
		prev = id
	}
	e, _, _ := newTestEditor(t, sc)
	e.FitView()
	last := len(sc.Nodes) - 1
	lbl := rendererOf(e).junctions.labels[last]
	if lbl.Hidden {
		t.Fatal("the far end's label is hidden after FitView")
	}
	box := geom.Rect{Min: toPt(lbl.Position()), Max: toPt(lbl.Position().Add(lbl.Size()))}
	size := e.Size()
	if box.Min.X < 0 || box.Min.Y < 0 || box.Max.X > float64(size.Width) || box.Max.Y > float64(size.Height) {
		t.Fatalf("label box %v leaves the %v widget", box, size)
	}
	if x := float64(e.NodeXY(last).X); box.Min.X <= x {
		t.Fatalf("label starts at x %.1f, left of its junction at %.1f: the fit left it no room on the right", box.Min.X, x)
	}
	for i := range sc.Nodes {
		p := e.NodeXY(i)
		if p.X < 0 || p.Y < 0 || p.X > size.Width || p.Y > size.Height {
			t.Fatalf("junction %d at %v is outside the view", i, p)
		}
	}
}

func TestScheduleHidesMessages(t *testing.T) {
	e, _, rc := newTestEditor(t, small())
	var queued []func()
	e.Schedule = func(_ time.Duration, f func()) { queued = append(queued, f) }
	e.TypedShortcut(&desktopShortcutZ) // nothing to undo: a message
	if e.Message() != "nothing to undo" || len(queued) != 1 || len(rc.timers) != 0 {
		t.Fatalf("message %q, %d scheduled, %d on the default timer", e.Message(), len(queued), len(rc.timers))
	}
	queued[0]()
	if e.Message() != "" {
		t.Fatalf("message %q still shown after its timer", e.Message())
	}
}
