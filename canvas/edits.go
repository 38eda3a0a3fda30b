package canvas

import (
	"errors"
	"fmt"
	"math"
	"strconv"

	"fyne.io/fyne/v2"

	"duosweep/canvas/geom"
	"duosweep/engine"
)

// ErrLoop is returned for an edit that would close a cycle.
var ErrLoop = errors.New("would close a loop: the site must be a tree")

// ErrSplit is wrapped by refusals of deletions that would disconnect the site.
var ErrSplit = errors.New("would split the site in two")

// Edit applies fn to a copy of the scenario. If fn returns an error, or the
// result has a cycle (ErrLoop), nothing changes and the error is returned;
// otherwise the result becomes current, joins the undo history under name
// (clearing the redo history) and OnChanged fires. O(n + m) plus fn.
func (e *Editor) Edit(name string, fn func(sc *engine.Scenario) error) error {
	next := e.sc.Clone()
	if err := fn(&next); err != nil {
		return err
	}
	if err := checkAcyclic(next); err != nil {
		return err
	}
	e.commit(name, next)
	return nil
}

func (e *Editor) commit(name string, next engine.Scenario) {
	e.undo = append(e.undo, histEntry{name: name, sc: e.sc})
	limit := e.HistoryLimit
	if limit <= 0 {
		limit = 500
	}
	if over := len(e.undo) - limit; over > 0 {
		copy(e.undo, e.undo[over:])
		for i := len(e.undo) - over; i < len(e.undo); i++ {
			e.undo[i] = histEntry{}
		}
		e.undo = e.undo[:len(e.undo)-over]
	}
	e.redo = nil
	e.install(next)
}

// install makes sc current, fixes the selection and notifies.
func (e *Editor) install(sc engine.Scenario) {
	e.sc = sc
	e.rebuild()
	e.drag = drag{}
	e.hover = e.validSel(e.hover)
	if s := e.validSel(e.sel); s != e.sel {
		e.sel = s
		if e.OnSelectionChanged != nil {
			e.OnSelectionChanged(s)
		}
	}
	e.Refresh()
	if e.OnChanged != nil {
		e.OnChanged(e.sc.Clone())
	}
}

// checkAcyclic reports ErrLoop when the corridors of sc contain a cycle (a
// corridor from a node to itself included). Unknown ids count as nodes of
// their own. O(m α(m)).
func checkAcyclic(sc engine.Scenario) error {
	idx := make(map[string]int, len(sc.Nodes)+8)
	for i, n := range sc.Nodes {
		idx[n.ID] = i
	}
	uf := newUF(len(sc.Nodes))
	id := func(s string) int {
		if i, ok := idx[s]; ok {
			return i
		}
		i := uf.add()
		idx[s] = i
		return i
	}
	for _, c := range sc.Corridors {
		a, b := id(c.From), id(c.To)
		if !uf.union(a, b) {
			return fmt.Errorf("corridor %s–%s %w", c.From, c.To, ErrLoop)
		}
	}
	return nil
}

type uf struct{ p []int }

func newUF(n int) *uf {
	u := &uf{p: make([]int, n)}
	for i := range u.p {
		u.p[i] = i
	}
	return u
}

func (u *uf) add() int { u.p = append(u.p, len(u.p)); return len(u.p) - 1 }

func (u *uf) find(x int) int {
	for u.p[x] != x {
		u.p[x] = u.p[u.p[x]]
		x = u.p[x]
	}
	return x
}

func (u *uf) union(a, b int) bool {
	a, b = u.find(a), u.find(b)
	if a == b {
		return false
	}
	u.p[a] = b
	return true
}

// connected reports whether nodes a and b are joined through the corridors,
// ignoring corridor skip (-1 for none). O(m α(m)).
func (e *Editor) connected(a, b, skip int) bool {
	u := newUF(len(e.sc.Nodes))
	for i, en := range e.d.ends {
		if i != skip && en[0] >= 0 && en[1] >= 0 {
			u.union(en[0], en[1])
		}
	}
	return u.find(a) == u.find(b)
}

// Undo restores the scenario before the last edit; false when there is none.
func (e *Editor) Undo() bool { return e.travel(&e.undo, &e.redo) }

// Redo re-applies the last undone edit; false when there is none.
func (e *Editor) Redo() bool { return e.travel(&e.redo, &e.undo) }

// travel pops the newest entry of from, pushes the current scenario onto to
// under the same name, and installs the popped scenario.
func (e *Editor) travel(from, to *[]histEntry) bool {
	n := len(*from)
	if n == 0 {
		return false
	}
	h := (*from)[n-1]
	(*from)[n-1] = histEntry{}
	*from = (*from)[:n-1]
	*to = append(*to, histEntry{name: h.name, sc: e.sc})
	e.install(h.sc)
	return true
}

// CanUndo reports whether Undo would do something.
func (e *Editor) CanUndo() bool { return len(e.undo) > 0 }

// CanRedo reports whether Redo would do something.
func (e *Editor) CanRedo() bool { return len(e.redo) > 0 }

// UndoName is the name of the edit Undo would revert, "" for none.
func (e *Editor) UndoName() string {
	if len(e.undo) == 0 {
		return ""
	}
	return e.undo[len(e.undo)-1].name
}

// RedoName is the name of the edit Redo would re-apply, "" for none.
func (e *Editor) RedoName() string {
	if len(e.redo) == 0 {
		return ""
	}
	return e.redo[len(e.redo)-1].name
}

func (e *Editor) nodeName(i int) string {
	n := e.sc.Nodes[i]
	return JunctionName(n.ID, n.Label)
}

func (e *Editor) checkNode(i int) error {
	if i < 0 || i >= len(e.sc.Nodes) {
		return fmt.Errorf("canvas: node index %d out of range (%d junctions)", i, len(e.sc.Nodes))
	}
	return nil
}

// DeleteSelection deletes the selected junction (with its corridors) or
// corridor. A junction that joins two or more corridors, and a corridor whose
// removal disconnects its ends, are refused with an error wrapping ErrSplit;
// a leaf junction is always fine (deleting the start moves the start to its
// neighbour). O(n + m).
func (e *Editor) DeleteSelection() error {
	switch e.sel.Kind {
	case SelNode:
		return e.deleteNode(e.sel.Index)
	case SelCorridor:
		return e.deleteCorridor(e.sel.Index)
	}
	return errors.New("nothing selected: tap a junction or corridor first")
}

func (e *Editor) deleteNode(v int) error {
	if err := e.checkNode(v); err != nil {
		return err
	}
	if d := e.d.deg[v]; d >= 2 {
		return fmt.Errorf("junction %s joins %d corridors: deleting it %w; delete the branches beyond it first", e.nodeName(v), d, ErrSplit)
	}
	id := e.sc.Nodes[v].ID
	newStart := e.sc.Start
	if id == e.sc.Start {
		newStart = ""
		for _, en := range e.d.ends {
			if en[0] == v && en[1] >= 0 {
				newStart = e.sc.Nodes[en[1]].ID
			} else if en[1] == v && en[0] >= 0 {
				newStart = e.sc.Nodes[en[0]].ID
			}
		}
		for i := 0; newStart == "" && i < len(e.sc.Nodes); i++ {
			if i != v {
				newStart = e.sc.Nodes[i].ID
			}
		}
	}
	err := e.Edit("Delete junction "+id, func(sc *engine.Scenario) error {
		sc.Nodes = append(sc.Nodes[:v], sc.Nodes[v+1:]...)
		cs := sc.Corridors[:0]
		for _, c := range sc.Corridors {
			if c.From != id && c.To != id {
				cs = append(cs, c)
			}
		}
		sc.Corridors = cs
		sc.Start = newStart
		return nil
	})
	if err != nil {
		return err
	}
	e.Select(Selection{Kind: SelNone, Index: -1})
	if id != newStart && newStart != "" && e.d.start >= 0 && e.sc.Start != id && id == e.undoStart() {
		e.message(fmt.Sprintf("the start moved to %s", e.nodeName(e.d.start)), e.pointer)
	}
	return nil
}

// undoStart is the start id before the last edit.
func (e *Editor) undoStart() string {
	if len(e.undo) == 0 {
		return ""
	}
	return e.undo[len(e.undo)-1].sc.Start
}

func (e *Editor) deleteCorridor(ci int) error {
	if ci < 0 || ci >= len(e.sc.Corridors) {
		return fmt.Errorf("canvas: corridor index %d out of range (%d corridors)", ci, len(e.sc.Corridors))
	}
	c := e.sc.Corridors[ci]
	en := e.d.ends[ci]
	if en[0] >= 0 && en[1] >= 0 && !e.connected(en[0], en[1], ci) {
		return fmt.Errorf("corridor %s–%s: deleting it %w (a site is one connected tree; delete a leaf junction instead)", c.From, c.To, ErrSplit)
	}
	err := e.Edit(fmt.Sprintf("Delete corridor %s–%s", c.From, c.To), func(sc *engine.Scenario) error {
		sc.Corridors = append(sc.Corridors[:ci], sc.Corridors[ci+1:]...)
		return nil
	})
	if err == nil {
		e.Select(Selection{Kind: SelNone, Index: -1})
	}
	return err
}

// SetStart makes node the start.
func (e *Editor) SetStart(node int) error {
	if err := e.checkNode(node); err != nil {
		return err
	}
	id := e.sc.Nodes[node].ID
	if id == e.sc.Start {
		return fmt.Errorf("%s is already the start", e.nodeName(node))
	}
	return e.Edit("Set start "+id, func(sc *engine.Scenario) error {
		sc.Start = id
		return nil
	})
}

// ToggleCandidate marks or unmarks node as a possible exit.
func (e *Editor) ToggleCandidate(node int) error {
	if err := e.checkNode(node); err != nil {
		return err
	}
	n := e.sc.Nodes[node]
	name := "Mark exit candidate " + n.ID
	if n.Candidate {
		name = "Unmark exit candidate " + n.ID
	}
	return e.Edit(name, func(sc *engine.Scenario) error {
		sc.Nodes[node].Candidate = !sc.Nodes[node].Candidate
		return nil
	})
}

// freshID returns the first id "j<N>" not in use, N counting from the number of nodes + 1.
func (e *Editor) freshID() string {
	for k := len(e.sc.Nodes) + 1; ; k++ {
		id := "j" + strconv.Itoa(k)
		if _, used := e.d.index[id]; !used {
			return id
		}
	}
}

// drawnLength converts a drawn distance (drawing units) to a corridor length:
// × Scale, rounded to 0.1, at least 0.1.
func (e *Editor) drawnLength(a, b geom.Pt) float64 {
	l := math.Round(geom.Dist(a, b)*e.scale()*10) / 10
	if l < 0.1 {
		l = 0.1
	}
	return l
}

// AddNode adds a junction at widget position at and selects it. If a junction
// was selected, the new one is joined to it by a corridor of the drawn length
// (so the site stays connected); the first junction of an empty site becomes
// the start. New junctions are exit candidates. It returns the new index.
func (e *Editor) AddNode(at fyne.Position) (int, error) {
	w := e.view.ToWorld(toPt(at))
	w = geom.Pt{X: round3(w.X), Y: round3(w.Y)}
	id := e.freshID()
	from := -1
	if e.sel.Kind == SelNode {
		from = e.sel.Index
	}
	name := "Add junction " + id
	var length float64
	if from >= 0 {
		length = e.drawnLength(e.d.world[from], w)
	}
	err := e.Edit(name, func(sc *engine.Scenario) error {
		sc.Nodes = append(sc.Nodes, engine.Node{ID: id, X: w.X, Y: w.Y, HasXY: true, Candidate: len(sc.Nodes) > 0})
		if sc.Start == "" || sc.NodeIndex(sc.Start) < 0 {
			sc.Start = id
		}
		if from >= 0 {
			sc.Corridors = append(sc.Corridors, engine.Corridor{From: sc.Nodes[from].ID, To: id, Length: length})
		}
		return nil
	})
	if err != nil {
		return -1, err
	}
	idx := len(e.sc.Nodes) - 1
	e.Select(Selection{Kind: SelNode, Index: idx})
	if from < 0 && idx > 0 {
		e.message(fmt.Sprintf("%s is not connected yet: Alt-drag from it to a junction (or select a junction before adding)", id), at)
	}
	return idx, nil
}

// Connect adds a corridor between nodes a and b with the drawn length × Scale
// (rounded to 0.1). It is refused with ErrLoop if a and b are already
// connected through the site. O(n + m).
func (e *Editor) Connect(a, b int) error {
	if err := e.checkNode(a); err != nil {
		return err
	}
	if err := e.checkNode(b); err != nil {
		return err
	}
	if a == b {
		return errors.New("a corridor needs two different junctions")
	}
	if e.connected(a, b, -1) {
		return ErrLoop
	}
	ia, ib := e.sc.Nodes[a].ID, e.sc.Nodes[b].ID
	l := e.drawnLength(e.d.world[a], e.d.world[b])
	return e.Edit(fmt.Sprintf("Connect %s–%s", ia, ib), func(sc *engine.Scenario) error {
		sc.Corridors = append(sc.Corridors, engine.Corridor{From: ia, To: ib, Length: l})
		return nil
	})
}

// MoveNode moves node i to widget position at (one undoable edit).
func (e *Editor) MoveNode(i int, at fyne.Position) error {
	if err := e.checkNode(i); err != nil {
		return err
	}
	return e.moveWorld(i, e.view.ToWorld(toPt(at)))
}

func (e *Editor) moveWorld(i int, w geom.Pt) error {
	w = geom.Pt{X: round3(w.X), Y: round3(w.Y)}
	id := e.sc.Nodes[i].ID
	return e.Edit("Move "+id, func(sc *engine.Scenario) error {
		n := &sc.Nodes[i]
		n.X, n.Y, n.HasXY = w.X, w.Y, true
		return nil
	})
}

// Tidy lays the whole tree out automatically (one undoable edit) and fits the view.
func (e *Editor) Tidy() {
	if len(e.sc.Nodes) == 0 {
		return
	}
	pos := e.tidyLayout()
	err := e.Edit("Tidy layout", func(sc *engine.Scenario) error {
		for i := range sc.Nodes {
			sc.Nodes[i].X, sc.Nodes[i].Y, sc.Nodes[i].HasXY = round3(pos[i].X), round3(pos[i].Y), true
		}
		return nil
	})
	e.report(err, e.pointer) // a loaded draft with a loop cannot be tidied: say so
	e.FitView()
}
