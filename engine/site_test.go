package engine_test

// Site validation: every refusal of NewSite is a *engine.FieldError naming
// the offending field and value (FORMATS.md "Invalid input"), and nothing
// invalid gets through.

import (
	"errors"
	"math"
	"strings"
	"testing"

	"duosweep/engine"
	"duosweep/engine/internal/testtrees"
)

// small returns s–a (1), a–b (2), s–c (3); a, b, c candidates.
func small() engine.Scenario {
	return engine.Scenario{
		Start: "s",
		Nodes: []engine.Node{{ID: "s"}, {ID: "a", Candidate: true}, {ID: "b", Candidate: true}, {ID: "c", Candidate: true}},
		Corridors: []engine.Corridor{
			{From: "s", To: "a", Length: 1}, {From: "a", To: "b", Length: 2}, {From: "s", To: "c", Length: 3},
		},
	}
}

func TestNewSiteRefusals(t *testing.T) {
	cases := []struct {
		name         string
		edit         func(sc *engine.Scenario)
		field, value string
	}{
		{"empty id", func(sc *engine.Scenario) { sc.Nodes[2].ID = "" }, "nodes[2].id", `""`},
		{"duplicate id", func(sc *engine.Scenario) { sc.Nodes[3].ID = "a" }, "nodes[3].id", "a"},
		{"start missing", func(sc *engine.Scenario) { sc.Start = "portal" }, "start", "portal"},
		{"start empty", func(sc *engine.Scenario) { sc.Start = "" }, "start", ""},
		{"unknown from", func(sc *engine.Scenario) { sc.Corridors[1].From = "zz" }, "corridors[1].from", "zz"},
		{"unknown to", func(sc *engine.Scenario) { sc.Corridors[2].To = "yy" }, "corridors[2].to", "yy"},
		{"self loop", func(sc *engine.Scenario) { sc.Corridors[1] = engine.Corridor{From: "b", To: "b", Length: 1} }, "corridors[1]", "b-b"},
		{"cycle", func(sc *engine.Scenario) {
			sc.Corridors = append(sc.Corridors, engine.Corridor{From: "b", To: "c", Length: 1})
		}, "corridors[3]", "b-c"},
		{"parallel corridor", func(sc *engine.Scenario) {
			sc.Corridors = append(sc.Corridors, engine.Corridor{From: "a", To: "s", Length: 4})
		}, "corridors[3]", "a-s"},
		{"disconnected", func(sc *engine.Scenario) {
			sc.Nodes = append(sc.Nodes, engine.Node{ID: "d", Candidate: true})
		}, "nodes[4]", "d"},
		{"disconnected pair", func(sc *engine.Scenario) {
			sc.Nodes = append(sc.Nodes, engine.Node{ID: "d"}, engine.Node{ID: "e"})
			sc.Corridors = append(sc.Corridors, engine.Corridor{From: "d", To: "e", Length: 1})
		}, "nodes[4]", "d"},
		{"length NaN", func(sc *engine.Scenario) { sc.Corridors[0].Length = math.NaN() }, "corridors[0].length", "NaN"},
		{"length +Inf", func(sc *engine.Scenario) { sc.Corridors[1].Length = math.Inf(1) }, "corridors[1].length", "+Inf"},
		{"length -Inf", func(sc *engine.Scenario) { sc.Corridors[1].Length = math.Inf(-1) }, "corridors[1].length", "-Inf"},
		{"length 0", func(sc *engine.Scenario) { sc.Corridors[2].Length = 0 }, "corridors[2].length", "0"},
		{"length -1", func(sc *engine.Scenario) { sc.Corridors[2].Length = -1 }, "corridors[2].length", "-1"},
		{"speed 0", func(sc *engine.Scenario) { sc.Agents = []engine.Agent{{Name: "A", Speed: 1}, {Name: "B", Speed: 0}} }, "agents[1].speed", "0"},
		{"speed -2", func(sc *engine.Scenario) { sc.Agents = []engine.Agent{{Name: "A", Speed: -2}, {Name: "B", Speed: 1}} }, "agents[0].speed", "-2"},
		{"speed NaN", func(sc *engine.Scenario) {
			sc.Agents = []engine.Agent{{Name: "A", Speed: math.NaN()}, {Name: "B", Speed: 1}}
		}, "agents[0].speed", "NaN"},
		{"speed Inf", func(sc *engine.Scenario) {
			sc.Agents = []engine.Agent{{Name: "A", Speed: 1}, {Name: "B", Speed: math.Inf(1)}}
		}, "agents[1].speed", "+Inf"},
		{"three agents", func(sc *engine.Scenario) {
			sc.Agents = []engine.Agent{{Name: "A", Speed: 1}, {Name: "B", Speed: 1}, {Name: "C", Speed: 1}}
		}, "agents", "3"},
		{"same names", func(sc *engine.Scenario) {
			sc.Agents = []engine.Agent{{Name: "Kit", Speed: 1}, {Name: "Kit", Speed: 1}}
		}, "agents[1].name", "Kit"},
		{"negative probability", func(sc *engine.Scenario) {
			sc.Nodes[1].Probability, sc.Nodes[1].HasProbability = -0.5, true
			sc.Nodes[2].Probability, sc.Nodes[2].HasProbability = 1.5, true
		}, "nodes[1].probability", "-0.5"},
		{"NaN probability", func(sc *engine.Scenario) { sc.Nodes[3].Probability, sc.Nodes[3].HasProbability = math.NaN(), true }, "nodes[3].probability", "NaN"},
		{"probabilities sum 0.9", func(sc *engine.Scenario) {
			sc.Nodes[1].Probability, sc.Nodes[1].HasProbability = 0.5, true
			sc.Nodes[2].Probability, sc.Nodes[2].HasProbability = 0.4, true
		}, "nodes[].probability", "0.9"},
		{"probabilities sum 1.5", func(sc *engine.Scenario) {
			sc.Nodes[1].Probability, sc.Nodes[1].HasProbability = 1, true
			sc.Nodes[3].Probability, sc.Nodes[3].HasProbability = 0.5, true
		}, "nodes[].probability", "1.5"},
		{"probability on a non-candidate", func(sc *engine.Scenario) {
			sc.Nodes[1].Candidate = false
			sc.Nodes[1].Probability, sc.Nodes[1].HasProbability = 1, true
		}, "nodes[1].probability", "1"},
		{"no nodes", func(sc *engine.Scenario) { sc.Nodes, sc.Corridors = nil, nil }, "nodes", ""},
		{"one agent", func(sc *engine.Scenario) { sc.Agents = []engine.Agent{{Name: "A", Speed: 1}} }, "agents", "1"},
		{"NaN x", func(sc *engine.Scenario) { sc.Nodes[1].X, sc.Nodes[1].Y, sc.Nodes[1].HasXY = math.NaN(), 2, true }, "nodes[1].x", "NaN,2"},
		{"Inf y", func(sc *engine.Scenario) { sc.Nodes[2].X, sc.Nodes[2].Y, sc.Nodes[2].HasXY = 1, math.Inf(-1), true }, "nodes[2].x", "1,-Inf"},
	}
	for _, c := range cases {
		sc := small()
		c.edit(&sc)
		s, err := engine.NewSite(sc)
		if err == nil {
			t.Errorf("%s: accepted (%d nodes)", c.name, s.N)
			continue
		}
		var fe *engine.FieldError
		if !errors.As(err, &fe) {
			t.Errorf("%s: error %v (%T) is not a *engine.FieldError", c.name, err, err)
			continue
		}
		if fe.Field != c.field || fe.Value != c.value {
			t.Errorf("%s: field %q value %q, want field %q value %q (%v)", c.name, fe.Field, fe.Value, c.field, c.value, err)
		}
		msg := err.Error()
		if !strings.HasPrefix(msg, "engine: ") || !strings.Contains(msg, c.field) || !strings.Contains(msg, c.value) {
			t.Errorf("%s: message %q should start with engine: and name %q and %q", c.name, msg, c.field, c.value)
		}
	}
}

func TestNewSiteAccepts(t *testing.T) {
	// probabilities summing to 1 within 1e-6 are accepted; defaults apply
	sc := small()
	sc.Nodes[1].Probability, sc.Nodes[1].HasProbability = 0.3, true
	sc.Nodes[2].Probability, sc.Nodes[2].HasProbability = 0.7+5e-7, true
	s, err := engine.NewSite(sc)
	if err != nil {
		t.Fatalf("within tolerance: %v", err)
	}
	if !s.HasProb || s.Unit() != "m" || s.Speed != [2]float64{1, 1} || s.Names != [2]string{"A", "B"} {
		t.Errorf("defaults: HasProb %v unit %q speeds %v names %v", s.HasProb, s.Unit(), s.Speed, s.Names)
	}
	// a single node (the start) is a valid, empty search
	one, err := engine.NewSite(engine.Scenario{Start: "s", Nodes: []engine.Node{{ID: "s"}}})
	if err != nil {
		t.Fatalf("single node: %v", err)
	}
	if b := engine.ComputeBounds(one); b.W != 0 || b.LB != 0 {
		t.Errorf("single node bounds %+v", b)
	}
	// NewSite keeps a private copy: editing the scenario afterwards changes nothing
	sc2 := small()
	s2 := mustSite(t, sc2)
	sc2.Corridors[0].Length = 100
	sc2.Nodes[1].ID = "zz"
	if s2.Scenario.Corridors[0].Length != 1 || s2.IDs[1] != "a" {
		t.Error("Site shares memory with the caller's scenario")
	}
	// every fixture is valid
	for _, nm := range testtrees.Shapes() {
		if _, err := engine.NewSite(nm.Scenario); err != nil {
			t.Errorf("%s: %v", nm.Name, err)
		}
	}
	for i := 0; i < 200; i++ {
		if _, err := engine.NewSite(treeScenario(i)); err != nil {
			t.Errorf("random tree %d: %v", i, err)
		}
	}
}

// TestSiteStructure checks the rooted structure on a hand tree: the start
// is the root (whatever its index), depths, and the search subtree that
// leaves out branches without candidates (derived by hand).
func TestSiteStructure(t *testing.T) {
	sc := engine.Scenario{
		Start: "s",
		Nodes: []engine.Node{{ID: "x", Candidate: true}, {ID: "y"}, {ID: "s"}, {ID: "z"}},
		Corridors: []engine.Corridor{
			{From: "x", To: "y", Length: 2}, {From: "s", To: "y", Length: 1.5}, {From: "z", To: "s", Length: 4},
		},
	}
	s := mustSite(t, sc)
	if s.Start != 2 || s.Parent[2] != -1 || s.Parent[1] != 2 || s.Parent[0] != 1 || s.Parent[3] != 2 {
		t.Errorf("start %d parents %v", s.Start, s.Parent)
	}
	if s.Depth[0] != 3.5 || s.Depth[3] != 4 {
		t.Errorf("depths %v", s.Depth)
	}
	// z holds no candidate: W = 1.5 + 2 = 3.5 (z's corridor is not searched)
	if want := []bool{true, true, true, false}; !equalBools(s.InSearch, want) {
		t.Errorf("InSearch %v, want %v", s.InSearch, want)
	}
	b := engine.ComputeBounds(s)
	if b.W != 3.5 || b.L != 3.5 || b.L2 != 0 || b.LB != 3.5 || b.Far != 0 {
		t.Errorf("bounds %+v, want W 3.5, L 3.5, L2 0, LB 3.5, Far x", b)
	}
	// L is measured to candidates only (MODEL.md §5 says "to a node"; it must
	// mean a node of the search tree): z is 4 from the start, yet both agents
	// walking to x together finish at 3.5, so no valid bound exceeds 3.5.
	toX := engine.Route{Waypoints: []engine.Waypoint{wp(engine.At(0), 3.5)}}
	r, f := evalBoth(t, s, &engine.Plan{Routes: [2]engine.Route{toX, toX}})
	if r.Worst != 3.5 || f.Worst != 3.5 || r.Gap != 0 {
		t.Errorf("walking to x together: worst %v / %v, gap %v; want 3.5, 3.5, 0", r.Worst, f.Worst, r.Gap)
	}
}

// TestNoCandidates: a site without candidates is valid; every plan has
// worst case 0, no worst exit, and is complete.
func TestNoCandidates(t *testing.T) {
	sc := small()
	for i := range sc.Nodes {
		sc.Nodes[i].Candidate = false
	}
	s := mustSite(t, sc)
	r, f := evalBoth(t, s, &engine.Plan{})
	for _, rep := range []*engine.Report{r, f} {
		if rep.Worst != 0 || rep.WorstExit != -1 || !rep.Complete || len(rep.Exits) != 0 || rep.Bounds.LB != 0 {
			t.Errorf("%s: worst %v at %d, complete %v, %d exits, LB %v", rep.Model, rep.Worst, rep.WorstExit, rep.Complete, len(rep.Exits), rep.Bounds.LB)
		}
	}
}

func equalBools(a, b []bool) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if a[i] != b[i] {
			return false
		}
	}
	return true
}
