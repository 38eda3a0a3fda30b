package canvas

import (
	"math"
	"time"

	"fyne.io/fyne/v2"
	"fyne.io/fyne/v2/driver/desktop"
	"fyne.io/fyne/v2/theme"
	"fyne.io/fyne/v2/widget"

	"duosweep/canvas/geom"
	"duosweep/engine"
)

// SelKind says what a Selection points at.
type SelKind int

// Selection kinds.
const (
	SelNone     SelKind = iota // nothing selected
	SelNode                    // Index is into Scenario.Nodes
	SelCorridor                // Index is into Scenario.Corridors
)

// Selection is what the editor has selected.
type Selection struct {
	Kind  SelKind
	Index int
}

// Tool is the editor's pointer mode, set by the ui toolbar.
type Tool int

// Tools.
const (
	ToolSelect      Tool = iota // tap selects, drag moves a junction or pans, Alt/Ctrl-drag connects
	ToolAddJunction             // tap on empty space adds a junction
	ToolConnect                 // drag from junction to junction adds a corridor
)

// Interfaces the editor implements.
var (
	_ fyne.Widget            = (*Editor)(nil)
	_ fyne.Tappable          = (*Editor)(nil)
	_ fyne.SecondaryTappable = (*Editor)(nil)
	_ fyne.Draggable         = (*Editor)(nil)
	_ fyne.Scrollable        = (*Editor)(nil)
	_ fyne.Focusable         = (*Editor)(nil)
	_ fyne.Shortcutable      = (*Editor)(nil)
	_ desktop.Hoverable      = (*Editor)(nil)
	_ desktop.Mouseable      = (*Editor)(nil)
	_ desktop.Keyable        = (*Editor)(nil)
)

// Editor is the interactive tree editor of a site. Create it with NewEditor.
// All methods must be called on the fyne main goroutine.
type Editor struct {
	widget.BaseWidget

	// OnChanged is called with a copy of the scenario after every accepted
	// edit, undo and redo (not after SetScenario).
	OnChanged func(sc engine.Scenario)
	// OnSelectionChanged is called whenever the selection changes.
	OnSelectionChanged func(s Selection)
	// OnMessage reports refusals and hints with the pointer position (widget
	// coordinates); the editor also shows them itself for MessageDuration.
	OnMessage func(msg string, at fyne.Position)
	// OnNodeTapped is called for every tap on a junction.
	OnNodeTapped func(node int)
	// Scale is the number of scenario units per drawing unit (node X, Y);
	// a new corridor's length is its drawn length × Scale. 0 means 1.
	Scale float64
	// HistoryLimit caps the undo history (oldest edits are dropped); 0 means 500.
	HistoryLimit int
	// MessageDuration is how long the editor shows a message; 0 means 3 s.
	// A negative value keeps each message until the next one and starts no
	// timer (useful in tests run with -race, where the hiding timer would
	// touch the widget from another goroutine).
	MessageDuration time.Duration
	// Schedule, when set, runs f on the UI goroutine after d: the editor hides
	// its messages with it. nil means time.AfterFunc followed by fyne.Do. An
	// app whose tests deliver UI work through their own queue sets it so that
	// the hiding never touches the widget from a timer goroutine.
	Schedule func(d time.Duration, f func())

	sc   engine.Scenario
	d    derived
	undo []histEntry
	redo []histEntry

	sel     Selection
	hover   Selection
	tool    Tool
	view    geom.View
	fitWait bool // fit the view once the widget has a size
	overlay Overlay
	help    bool

	press   press
	drag    drag
	lastTap lastTap
	keyMods fyne.KeyModifier
	tapMods fyne.KeyModifier // modifiers of the last press, for the tap after its release
	pointer fyne.Position

	msg   message
	bd    backdropState                   // backdrop image and calibration (backdrop.go)
	after func(d time.Duration, f func()) // timer used to hide messages; replaced in tests
	now   func() time.Time
}

type histEntry struct {
	name string
	sc   engine.Scenario
}

// derived holds what is recomputed from the scenario after every change. O(n + m).
type derived struct {
	index map[string]int
	world []geom.Pt // node drawing coordinates
	ends  [][2]int  // corridor end indices, -1 when the id is unknown
	deg   []int     // corridors per node
	pair  map[[2]int]int
	adjAt []int // neighbours of v: adj[adjAt[v]:adjAt[v+1]]
	adj   []int
	start int
	unit  float64 // median drawn corridor length (drawing units)
}

// NewEditor returns an editor showing sc (see SetScenario).
func NewEditor(sc engine.Scenario) *Editor {
	e := &Editor{view: geom.NewView(), sel: Selection{Kind: SelNone, Index: -1}, hover: Selection{Kind: SelNone, Index: -1}}
	e.overlay = NoOverlay()
	e.now = time.Now
	e.after = func(d time.Duration, f func()) { time.AfterFunc(d, func() { fyne.Do(f) }) }
	e.ExtendBaseWidget(e)
	e.setScenario(sc)
	return e
}

func (e *Editor) scale() float64 {
	if e.Scale > 0 && !math.IsInf(e.Scale, 0) {
		return e.Scale
	}
	return 1
}

// Scenario returns a copy of the current scenario (with the coordinates the
// editor laid out). O(n).
func (e *Editor) Scenario() engine.Scenario { return e.sc.Clone() }

// SetScenario replaces the scenario (e.g. after opening a file): it clears the
// undo history, the selection and the overlay, lays out the nodes that have no
// coordinates (tidy layout, attached below their nearest placed ancestor) and
// fits the view. OnChanged is not called. O(n + m).
func (e *Editor) SetScenario(sc engine.Scenario) {
	old := e.sel
	e.setScenario(sc)
	if old.Kind != SelNone && e.OnSelectionChanged != nil {
		e.OnSelectionChanged(e.sel)
	}
	e.Refresh()
}

func (e *Editor) setScenario(sc engine.Scenario) {
	e.sc = sc.Clone()
	e.undo, e.redo = nil, nil
	e.sel = Selection{Kind: SelNone, Index: -1}
	e.hover = Selection{Kind: SelNone, Index: -1}
	e.drag = drag{}
	e.overlay = NoOverlay()
	e.rebuild()
	e.placeMissing()
	e.rebuild()
	e.fitWait = true
	e.FitView()
}

// placeMissing gives coordinates to nodes with HasXY false.
func (e *Editor) placeMissing() {
	missing := false
	for _, n := range e.sc.Nodes {
		if !n.HasXY {
			missing = true
			break
		}
	}
	if !missing {
		return
	}
	tidy := e.tidyLayout()
	n := len(e.sc.Nodes)
	// parent of every node in the spanning forest used by tidy: recompute by BFS.
	parent := spanningParents(n, e.d.ends, e.d.start)
	order := bfsOrder(parent, e.d.start)
	anyPlaced := false
	box := geom.EmptyRect()
	for _, nd := range e.sc.Nodes {
		if nd.HasXY {
			anyPlaced = true
			box = box.Extend(geom.Pt{X: nd.X, Y: nd.Y})
		}
	}
	// nodes with no placed ancestor: tidy coordinates, shifted right of the placed ones
	shift := geom.Pt{}
	if anyPlaced {
		tb := geom.Bounds(tidy)
		shift = geom.Pt{X: box.Max.X + e.d.unit*2 - tb.Min.X, Y: box.Min.Y - tb.Min.Y}
	}
	for _, v := range order {
		nd := &e.sc.Nodes[v]
		if nd.HasXY {
			continue
		}
		p := tidy[v].Add(shift)
		if u := parent[v]; u >= 0 {
			pu := e.sc.Nodes[u]
			p = geom.Pt{X: pu.X, Y: pu.Y}.Add(tidy[v].Sub(tidy[u]))
		}
		nd.X, nd.Y, nd.HasXY = round3(p.X), round3(p.Y), true
	}
}

func round3(x float64) float64 { return math.Round(x*1000) / 1000 }

// rebuild recomputes the derived state. O(n + m).
func (e *Editor) rebuild() {
	n := len(e.sc.Nodes)
	d := &e.d
	if d.index == nil || len(d.index) > 2*n+16 {
		d.index = make(map[string]int, n)
	} else {
		clear(d.index)
	}
	d.world = resize(d.world, n)
	d.deg = resize(d.deg, n)
	for i, nd := range e.sc.Nodes {
		d.index[nd.ID] = i
		d.world[i] = geom.Pt{X: nd.X, Y: nd.Y}
		d.deg[i] = 0
	}
	m := len(e.sc.Corridors)
	d.ends = resize(d.ends, m)
	if d.pair == nil {
		d.pair = make(map[[2]int]int, m)
	} else {
		clear(d.pair)
	}
	edges := make([]geom.Edge, 0, m)
	for i, c := range e.sc.Corridors {
		a, ok := d.index[c.From]
		if !ok {
			a = -1
		}
		b, ok := d.index[c.To]
		if !ok {
			b = -1
		}
		d.ends[i] = [2]int{a, b}
		if a >= 0 && b >= 0 {
			d.deg[a]++
			d.deg[b]++
			if _, seen := d.pair[pairKey(a, b)]; !seen || !c.Closed {
				d.pair[pairKey(a, b)] = i // an open corridor wins over a closed one between the same two nodes
			}
			edges = append(edges, geom.Edge{A: a, B: b, Len: geom.Dist(d.world[a], d.world[b])})
		}
	}
	d.unit = geom.MedianLen(edges)
	d.adjAt = resize(d.adjAt, n+1)
	d.adjAt[0] = 0
	for v := 0; v < n; v++ {
		d.adjAt[v+1] = d.adjAt[v] + d.deg[v]
	}
	d.adj = resize(d.adj, d.adjAt[n])
	fill := make([]int, n)
	copy(fill, d.adjAt[:n])
	for _, en := range d.ends {
		if en[0] >= 0 && en[1] >= 0 {
			d.adj[fill[en[0]]] = en[1]
			fill[en[0]]++
			d.adj[fill[en[1]]] = en[0]
			fill[en[1]]++
		}
	}
	if s, ok := d.index[e.sc.Start]; ok {
		d.start = s
	} else {
		d.start = -1
	}
}

func resize[T any](s []T, n int) []T {
	if cap(s) >= n {
		return s[:n]
	}
	return make([]T, n)
}

func pairKey(a, b int) [2]int {
	if a > b {
		a, b = b, a
	}
	return [2]int{a, b}
}

// tidyLayout returns tidy drawing coordinates for every node, corridor
// lengths converted to drawing units by Scale.
func (e *Editor) tidyLayout() []geom.Pt {
	edges := make([]geom.Edge, 0, len(e.sc.Corridors))
	for i, c := range e.sc.Corridors {
		a, b := e.d.ends[i][0], e.d.ends[i][1]
		if a >= 0 && b >= 0 {
			edges = append(edges, geom.Edge{A: a, B: b, Len: c.Length / e.scale()})
		}
	}
	root := e.d.start
	if root < 0 {
		root = 0
	}
	return geom.Tidy(len(e.sc.Nodes), edges, root)
}

// spanningParents returns BFS parents of a spanning forest rooted at root
// (then at the lowest unvisited index); -1 for roots.
func spanningParents(n int, ends [][2]int, root int) []int {
	adj := make([][]int, n)
	for _, e := range ends {
		if e[0] >= 0 && e[1] >= 0 && e[0] != e[1] {
			adj[e[0]] = append(adj[e[0]], e[1])
			adj[e[1]] = append(adj[e[1]], e[0])
		}
	}
	parent := make([]int, n)
	seen := make([]bool, n)
	for i := range parent {
		parent[i] = -1
	}
	queue := make([]int, 0, n)
	visit := func(r int) {
		seen[r] = true
		queue = append(queue, r)
		for len(queue) > 0 {
			v := queue[0]
			queue = queue[1:]
			for _, w := range adj[v] {
				if !seen[w] {
					seen[w] = true
					parent[w] = v
					queue = append(queue, w)
				}
			}
		}
	}
	if root >= 0 && root < n {
		visit(root)
	}
	for v := 0; v < n; v++ {
		if !seen[v] {
			visit(v)
		}
	}
	return parent
}

// bfsOrder returns the nodes with every parent before its children.
func bfsOrder(parent []int, root int) []int {
	n := len(parent)
	kids := make([][]int, n)
	var roots []int
	if root >= 0 && root < n && parent[root] < 0 {
		roots = append(roots, root)
	}
	for v, p := range parent {
		if p >= 0 {
			kids[p] = append(kids[p], v)
		} else if v != root {
			roots = append(roots, v)
		}
	}
	order := append(make([]int, 0, n), roots...)
	for i := 0; i < len(order); i++ {
		order = append(order, kids[order[i]]...)
	}
	return order
}

// CreateRenderer is part of fyne.Widget.
func (e *Editor) CreateRenderer() fyne.WidgetRenderer { return newEditorRenderer(e) }

// Resize is part of fyne.CanvasObject; the first non-empty size fits a
// pending view.
func (e *Editor) Resize(s fyne.Size) {
	e.BaseWidget.Resize(s)
	if e.fitWait && s.Width > 0 && s.Height > 0 {
		e.FitView()
	}
}

// MinSize is part of fyne.CanvasObject.
func (e *Editor) MinSize() fyne.Size { return fyne.NewSize(200, 150) }

// Selection returns the current selection.
func (e *Editor) Selection() Selection { return e.sel }

// Select sets the selection (an out-of-range index selects nothing) and
// fires OnSelectionChanged if it changed.
func (e *Editor) Select(s Selection) {
	s = e.validSel(s)
	if s == e.sel {
		return
	}
	e.sel = s
	if e.OnSelectionChanged != nil {
		e.OnSelectionChanged(s)
	}
	e.Refresh()
}

func (e *Editor) validSel(s Selection) Selection {
	switch {
	case s.Kind == SelNode && s.Index >= 0 && s.Index < len(e.sc.Nodes):
		return s
	case s.Kind == SelCorridor && s.Index >= 0 && s.Index < len(e.sc.Corridors):
		return s
	}
	return Selection{Kind: SelNone, Index: -1}
}

// SetTool sets the pointer mode.
func (e *Editor) SetTool(t Tool) {
	if t < ToolSelect || t > ToolConnect {
		t = ToolSelect
	}
	e.tool = t
	e.drag = drag{}
	e.Refresh()
}

// Tool returns the pointer mode.
func (e *Editor) Tool() Tool { return e.tool }

// SetOverlay sets what the plan panel and playback draw on top; indices refer
// to the current scenario (out-of-range ones are ignored). O(n + trail length).
func (e *Editor) SetOverlay(o Overlay) {
	e.overlay = o
	e.Refresh()
}

// Overlay returns the overlay last set.
func (e *Editor) Overlay() Overlay { return e.overlay }

// NodeXY returns where node i is drawn, in widget coordinates (while a
// junction is being dragged, its dragged position).
func (e *Editor) NodeXY(i int) fyne.Position {
	return toPos(e.view.ToScreen(e.nodeWorld(i)))
}

func (e *Editor) nodeWorld(i int) geom.Pt {
	if i < 0 || i >= len(e.d.world) {
		return geom.Pt{}
	}
	if e.drag.kind == dragMove && e.drag.node == i {
		return e.drag.world
	}
	return e.d.world[i]
}

// PointXY returns where an engine point is drawn, in widget coordinates: a
// node's position, or the straight-line interpolation From→To by
// Offset/(Length·effort) of the corridor joining them (offsets are effort-weighted).
func (e *Editor) PointXY(p engine.Point) fyne.Position {
	return toPos(e.view.ToScreen(e.pointWorld(p)))
}

func (e *Editor) pointWorld(p engine.Point) geom.Pt {
	a := e.nodeWorld(p.From)
	if p.To < 0 || p.To >= len(e.sc.Nodes) {
		return a
	}
	b := e.nodeWorld(p.To)
	ci, ok := e.d.pair[pairKey(p.From, p.To)]
	if !ok || !(e.sc.Corridors[ci].Length > 0) {
		return a
	}
	// engine offsets are effort-weighted (engine/effort.go)
	c := e.sc.Corridors[ci]
	w := c.Length * c.EffortFactor()
	if !(w > 0) || math.IsInf(w, 0) {
		return a
	}
	return geom.Lerp(a, b, p.Offset/w)
}

// View returns the zoom (widget units per drawing unit) and the offset of the
// drawing origin in widget coordinates.
func (e *Editor) View() (zoom float64, origin fyne.Position) {
	return e.view.Zoom, toPos(e.view.Off)
}

// FitView zooms and pans so the whole site is visible.
func (e *Editor) FitView() {
	s := e.Size()
	if s.Width <= 0 || s.Height <= 0 {
		e.fitWait = true
		return
	}
	e.fitWait = false
	keep := e.view.Zoom
	if len(e.d.world) <= 1 {
		keep = 1
	}
	e.view = geom.FitExtents(e.d.world, e.fitExtents(), float64(s.Width), float64(s.Height), fitMargin, keep)
	e.viewChanged()
}

// fitMargin is the room FitView leaves around every junction (widget units); labels get more.
const fitMargin = 32

// fitExtents is the room each junction needs on screen (geom.LabelRoom): its marker everywhere, and
// its label to the right and above (where the renderer places a label first), so that a fitted view
// never cuts a label at the edge. Labels are measured as the renderer draws them.
func (e *Editor) fitExtents() []geom.Extent {
	n := len(e.d.world)
	ext := make([]geom.Extent, n)
	ts := theme.SizeForWidget(theme.SizeNameCaptionText, e)
	for i := 0; i < n; i++ {
		sz := fyne.MeasureText(labelText(e.sc.Nodes[i]), ts, fyne.TextStyle{})
		ext[i] = geom.LabelRoom(float64(sz.Width), float64(sz.Height), fitMargin, i == e.d.start)
	}
	return ext
}

// ZoomBy multiplies the zoom by f keeping the drawing point under around fixed.
func (e *Editor) ZoomBy(f float32, around fyne.Position) {
	e.fitWait = false
	e.view = e.view.ZoomAround(float64(f), toPt(around))
	e.viewChanged()
}

// PanBy moves the drawing by d widget units.
func (e *Editor) PanBy(d fyne.Delta) {
	e.fitWait = false
	e.view = e.view.Pan(geom.Pt{X: float64(d.DX), Y: float64(d.DY)})
	e.viewChanged()
}

// viewChanged redraws after a zoom or pan; fyne hands it to the renderer.
func (e *Editor) viewChanged() { e.Refresh() }

func toPos(p geom.Pt) fyne.Position { return fyne.NewPos(float32(p.X), float32(p.Y)) }
func toPt(p fyne.Position) geom.Pt  { return geom.Pt{X: float64(p.X), Y: float64(p.Y)} }
