package engine_test

// Closed corridors (FORMATS.md, second wave): kept in the scenario, never
// walked; a loop of open corridors is refused with its node ids in order; a
// node reached only through closed corridors is refused as disconnected.

import (
	"context"
	"errors"
	"fmt"
	"math"
	"strings"
	"testing"

	"duosweep/engine"
	"duosweep/engine/internal/testtrees"
	"duosweep/engine/planners"
)

func fieldError(t *testing.T, err error) *engine.FieldError {
	t.Helper()
	var fe *engine.FieldError
	if !errors.As(err, &fe) {
		t.Fatalf("want a *engine.FieldError, got %v", err)
	}
	return fe
}

func TestClosedCorridorIsNotWalked(t *testing.T) {
	sc := small() // s–a (1), a–b (2), s–c (3)
	sc.Corridors = append(sc.Corridors, engine.Corridor{From: "b", To: "c", Length: 0.5, Closed: true})
	s, err := engine.NewSite(sc)
	if err != nil {
		t.Fatal(err)
	}
	b, _ := s.Index("b")
	c, _ := s.Index("c")
	// by hand: b–a–s–c = 2 + 1 + 3 = 6; the closed shortcut of 0.5 is not walked
	if d := s.Dist(b, c); d != 6 {
		t.Fatalf("Dist(b, c) = %g, want 6 (the closed corridor is not walked)", d)
	}
	if e := s.Edge(b, c); e != -1 {
		t.Fatalf("Edge(b, c) = %d, want -1 for a closed corridor", e)
	}
	if got := s.OpenCorridors(); got != s.N-1 {
		t.Fatalf("OpenCorridors = %d, want %d", got, s.N-1)
	}
	for v, e := range s.ParentEdge {
		if e >= 0 && sc.Corridors[e].Closed {
			t.Fatalf("node %d hangs from closed corridor %d", v, e)
		}
	}
	if len(s.Scenario.Corridors) != 4 || !s.Scenario.Corridors[3].Closed {
		t.Fatal("the closed corridor is kept in the site's scenario")
	}
}

// TestClosedCorridorsChangeNothing: on random trees, adding closed corridors
// between random node pairs (loops, parallels) leaves every planner's best
// plan and its figures exactly as on the tree alone.
func TestClosedCorridorsChangeNothing(t *testing.T) {
	rng := testtrees.NewRand(9)
	for trial := 0; trial < 60; trial++ {
		tree := testtrees.Random(rng, testtrees.Options{MinNodes: 3, MaxNodes: 25})
		withClosed := tree.Clone()
		for k := 0; k < 1+rng.IntN(4); k++ {
			a, b := rng.IntN(len(tree.Nodes)), rng.IntN(len(tree.Nodes))
			if a == b {
				continue
			}
			c := engine.Corridor{From: tree.Nodes[a].ID, To: tree.Nodes[b].ID, Length: 0.1 + rng.Float64(), Closed: true}
			at := rng.IntN(len(withClosed.Corridors) + 1) // anywhere in the corridor order
			withClosed.Corridors = append(withClosed.Corridors[:at], append([]engine.Corridor{c}, withClosed.Corridors[at:]...)...)
		}
		s1, err := engine.NewSite(tree)
		if err != nil {
			t.Fatal(err)
		}
		s2, err := engine.NewSite(withClosed)
		if err != nil {
			t.Fatalf("trial %d: %v", trial, err)
		}
		for u := 0; u < s1.N; u++ {
			for v := 0; v < s1.N; v++ {
				if s1.Dist(u, v) != s2.Dist(u, v) {
					t.Fatalf("trial %d: Dist(%d, %d) %g vs %g", trial, u, v, s1.Dist(u, v), s2.Dist(u, v))
				}
			}
		}
		for _, m := range engine.Models {
			_, r1, err := planners.BestPlan(context.Background(), s1, m)
			if err != nil {
				t.Fatal(err)
			}
			_, r2, err := planners.BestPlan(context.Background(), s2, m)
			if err != nil {
				t.Fatal(err)
			}
			if r1.Worst != r2.Worst || r1.WorstExit != r2.WorstExit || r1.Bounds != r2.Bounds {
				t.Fatalf("trial %d model %v: worst %g/%d bounds %+v vs %g/%d bounds %+v", trial, m, r1.Worst, r1.WorstExit, r1.Bounds, r2.Worst, r2.WorstExit, r2.Bounds)
			}
		}
	}
}

func TestOpenLoopRefusedWithItsNodes(t *testing.T) {
	// a square s–a–b–c–s plus a tail c–d; the fourth corridor closes the loop
	sc := engine.Scenario{Start: "s",
		Nodes: []engine.Node{{ID: "s"}, {ID: "a", Candidate: true}, {ID: "b", Candidate: true}, {ID: "c", Candidate: true}, {ID: "d", Candidate: true}},
		Corridors: []engine.Corridor{{From: "s", To: "a", Length: 1}, {From: "a", To: "b", Length: 1}, {From: "c", To: "d", Length: 1},
			{From: "b", To: "c", Length: 1}, {From: "c", To: "s", Length: 1}},
	}
	_, err := engine.NewSite(sc)
	fe := fieldError(t, err)
	if fe.Field != "corridors[4]" || fe.Value != "c-s" {
		t.Fatalf("field %q value %q, want corridors[4] c-s", fe.Field, fe.Value)
	}
	// worked by hand: the loop from c through the earlier corridors back to c
	if !strings.Contains(fe.Msg, "c → b → a → s → c") || !strings.Contains(fe.Msg, "cycle") {
		t.Fatalf("message does not name the loop in order: %s", fe.Msg)
	}
	// closing it makes a valid site; so does closing another corridor of the loop
	for _, k := range []int{4, 1, 3} {
		sc2 := sc.Clone()
		sc2.Corridors[k].Closed = true
		if _, err := engine.NewSite(sc2); err != nil {
			t.Fatalf("closing corridors[%d]: %v", k, err)
		}
	}
	// closing the tail instead leaves the loop and cuts d off
	sc3 := sc.Clone()
	sc3.Corridors[2].Closed = true
	if _, err := engine.NewSite(sc3); err == nil || !strings.Contains(err.Error(), "cycle") {
		t.Fatalf("want the loop refused, got %v", err)
	}
}

func TestReachedOnlyThroughClosed(t *testing.T) {
	sc := small()
	sc.Corridors[1].Closed = true // a–b: b hangs only from a closed corridor
	_, err := engine.NewSite(sc)
	fe := fieldError(t, err)
	if fe.Field != "nodes[2]" || fe.Value != "b" || !strings.Contains(fe.Msg, "disconnected") || !strings.Contains(fe.Msg, "closed") {
		t.Fatalf("got %v", err)
	}
	// a node with no corridor at all keeps the plain message
	sc = small()
	sc.Nodes = append(sc.Nodes, engine.Node{ID: "lost"})
	_, err = engine.NewSite(sc)
	fe = fieldError(t, err)
	if fe.Value != "lost" || strings.Contains(fe.Msg, "closed") || !strings.Contains(fe.Msg, "not connected") {
		t.Fatalf("got %v", err)
	}
	// a closed corridor still needs valid ends and a valid length
	for _, c := range []engine.Corridor{{From: "a", To: "zz", Length: 1, Closed: true}, {From: "a", To: "a", Length: 1, Closed: true}, {From: "a", To: "c", Length: math.NaN(), Closed: true}} {
		sc = small()
		sc.Corridors = append(sc.Corridors, c)
		if _, err := engine.NewSite(sc); err == nil || !strings.Contains(err.Error(), "corridors[3]") {
			t.Fatalf("%+v: got %v", c, err)
		}
	}
}

func TestDrawingFieldsValidated(t *testing.T) {
	good := &engine.Backdrop{Image: "plan.png", Scale: 0.25, Opacity: 0.5}
	cases := []struct {
		edit         func(sc *engine.Scenario)
		field, value string
	}{
		{func(sc *engine.Scenario) { sc.Corridors[1].Path = [][2]float64{{1, 2}, {math.NaN(), 0}} }, "corridors[1].path[1]", "NaN,0"},
		{func(sc *engine.Scenario) { sc.Backdrop = &engine.Backdrop{Scale: 1, Opacity: 1} }, "backdrop.image", `""`},
		{func(sc *engine.Scenario) { b := *good; b.Scale = 0; sc.Backdrop = &b }, "backdrop.scale", "0"},
		{func(sc *engine.Scenario) { b := *good; b.Scale = math.Inf(1); sc.Backdrop = &b }, "backdrop.scale", "+Inf"},
		{func(sc *engine.Scenario) { b := *good; b.Opacity = 1.5; sc.Backdrop = &b }, "backdrop.opacity", "1.5"},
		{func(sc *engine.Scenario) { b := *good; b.X = math.NaN(); sc.Backdrop = &b }, "backdrop.x", "NaN,0"},
		{func(sc *engine.Scenario) { sc.GeoRef = &engine.GeoRef{CRS: "utm", Scale: [2]float64{1, 1}} }, "georef.crs", "utm"},
		{func(sc *engine.Scenario) { sc.GeoRef = &engine.GeoRef{CRS: "planar", Scale: [2]float64{1, 0}} }, "georef.scale[1]", "0"},
		{func(sc *engine.Scenario) {
			sc.GeoRef = &engine.GeoRef{CRS: "lonlat", Origin: [2]float64{math.Inf(-1), 0}, Scale: [2]float64{1, 1}}
		}, "georef.origin", "-Inf,0"},
	}
	for i, c := range cases {
		sc := small()
		c.edit(&sc)
		_, err := engine.NewSite(sc)
		fe := fieldError(t, err)
		if fe.Field != c.field || fe.Value != c.value {
			t.Errorf("case %d: field %q value %q, want %q %q", i, fe.Field, fe.Value, c.field, c.value)
		}
	}
	sc := small()
	sc.Backdrop = good
	sc.GeoRef = &engine.GeoRef{CRS: "lonlat", Origin: [2]float64{7, 46}, Scale: [2]float64{77000, 111000}}
	sc.Corridors[0].Path = [][2]float64{{0.5, 0.5}}
	if _, err := engine.NewSite(sc); err != nil {
		t.Fatal(err)
	}
	// Clone copies the drawing fields deeply
	cl := sc.Clone()
	cl.Corridors[0].Path[0][0] = 9
	cl.Backdrop.Scale = 3
	cl.GeoRef.Origin[0] = 1
	if sc.Corridors[0].Path[0][0] != 0.5 || sc.Backdrop.Scale != 0.25 || sc.GeoRef.Origin[0] != 7 {
		t.Fatal("Clone shares drawing fields with the original")
	}
	// GeoRef maps back and forth
	g := *sc.GeoRef
	x, y := g.ToDrawing(7.001, 45.999)
	e, n := g.FromDrawing(x, y)
	if math.Abs(e-7.001) > 1e-12 || math.Abs(n-45.999) > 1e-12 || !(y > 0) {
		t.Fatal(fmt.Sprint("georef round trip ", e, n, x, y))
	}
}
