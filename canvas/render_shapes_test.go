package canvas

import (
	"math"
	"testing"

	"fyne.io/fyne/v2"

	"duosweep/canvas/geom"
	"duosweep/engine"
)

// loopSite: a square s–a–b–c with the corridor c–s closed, and a–b drawn
// along a path through one bend.
func loopSite() engine.Scenario {
	return engine.Scenario{Start: "s",
		Nodes: []engine.Node{{ID: "s", X: 0, Y: 0, HasXY: true}, {ID: "a", X: 100, Y: 0, HasXY: true, Candidate: true},
			{ID: "b", X: 100, Y: 100, HasXY: true, Candidate: true}, {ID: "c", X: 0, Y: 100, HasXY: true, Candidate: true}},
		Corridors: []engine.Corridor{{From: "s", To: "a", Length: 100}, {From: "a", To: "b", Length: 120, Path: [][2]float64{{130, 50}}},
			{From: "b", To: "c", Length: 100}, {From: "c", To: "s", Length: 100, Closed: true}},
	}
}

func onLine(p, a, b fyne.Position) bool {
	cross := (b.X-a.X)*(p.Y-a.Y) - (b.Y-a.Y)*(p.X-a.X)
	l := math.Hypot(float64(b.X-a.X), float64(b.Y-a.Y))
	return math.Abs(float64(cross))/l < 0.5
}

func TestClosedCorridorDashedAndPathDrawn(t *testing.T) {
	sc := loopSite()
	if _, err := engine.NewSite(sc); err != nil {
		t.Fatal(err)
	}
	e, w, _ := newTestEditor(t, sc)
	w.Canvas().Refresh(e)
	r := rendererOf(e)
	r.Refresh()
	// the straight lines of the closed and the shaped corridor are hidden, the others shown
	for i, want := range []bool{false, true, false, true} {
		if r.corridors.lines[i].Hidden != want {
			t.Errorf("corridor %d straight line hidden = %v, want %v", i, r.corridors.lines[i].Hidden, want)
		}
	}
	c, s := e.NodeXY(3), e.NodeXY(0)
	a, b := e.NodeXY(1), e.NodeXY(2)
	bend := toPos(e.view.ToScreen(geom.Pt{X: 130, Y: 50}))
	dashes, pathSegs := 0, 0
	var covered float64
	for _, l := range r.shapes.segs {
		if l.Hidden {
			continue
		}
		switch {
		case onLine(l.Position1, c, s) && onLine(l.Position2, c, s):
			dashes++
			covered += math.Hypot(float64(l.Position2.X-l.Position1.X), float64(l.Position2.Y-l.Position1.Y))
		case (l.Position1 == a && l.Position2 == bend) || (l.Position1 == bend && l.Position2 == b):
			pathSegs++
		default:
			t.Errorf("a shape segment %v–%v on no corridor", l.Position1, l.Position2)
		}
	}
	whole := math.Hypot(float64(s.X-c.X), float64(s.Y-c.Y))
	// dashed: several pieces covering 60% of the corridor (worked out from the 0.2..0.8 dash pattern)
	if dashes < 3 || math.Abs(covered/whole-0.6) > 0.01 {
		t.Errorf("closed corridor: %d dashes covering %.3f of it; want ≥3 dashes covering 0.6", dashes, covered/whole)
	}
	if pathSegs != 2 {
		t.Errorf("path corridor: %d segments through the bend, want 2", pathSegs)
	}
}
