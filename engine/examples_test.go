package engine_test

import (
	"fmt"

	"duosweep/engine"
)

// Evaluating a hand-made plan: A walks to the near end and back, B to the far
// end; B's rendezvous at the far end makes it wait there for A when A finds
// the exit first. Figures derived by hand: east is found by A at 1 while B
// is 1 m towards west; by radio B needs 1 + 1 = 2 s more (evac 3); face to
// face A must catch B, who waits at west from 3 s: A reaches it at
// 1 + 4 = 5 s and both walk back 4 m (evac 9). West is found by B at 3 while
// A is back at the portal (radio evac 6); face to face B walks towards A and
// meets it at the portal at 6, both walk 3 m (evac 9).
func ExampleEvaluate() {
	site, _ := engine.NewSite(engine.Scenario{
		Start: "portal",
		Nodes: []engine.Node{{ID: "portal"}, {ID: "east", Candidate: true}, {ID: "west", Candidate: true}},
		Corridors: []engine.Corridor{
			{From: "portal", To: "east", Length: 1},
			{From: "portal", To: "west", Length: 3},
		},
	})
	plan := &engine.Plan{Routes: [2]engine.Route{
		{Waypoints: []engine.Waypoint{{P: engine.At(1), T: 1}, {P: engine.At(0), T: 2}}},
		{Waypoints: []engine.Waypoint{{P: engine.At(2), T: 3, Rendezvous: true}}},
	}}
	for _, m := range engine.Models {
		rep, err := engine.Evaluate(site, plan, m)
		if err != nil {
			fmt.Println(err)
			return
		}
		for _, ex := range rep.Exits {
			fmt.Printf("%s: exit %s found at %g by %s, evacuated at %g\n", m, site.IDs[ex.Node], ex.FoundAt, site.Names[ex.Finder], ex.EvacAt)
		}
		fmt.Printf("%s: worst %g at %s\n", m, rep.Worst, site.IDs[rep.WorstExit])
	}
	// Output:
	// radio: exit east found at 1 by A, evacuated at 3
	// radio: exit west found at 3 by B, evacuated at 6
	// radio: worst 6 at west
	// face-to-face: exit east found at 1 by A, evacuated at 9
	// face-to-face: exit west found at 3 by B, evacuated at 9
	// face-to-face: worst 9 at east
}

// NewSite refuses invalid input with an error naming the field and value.
func ExampleNewSite() {
	_, err := engine.NewSite(engine.Scenario{
		Start:     "portal",
		Nodes:     []engine.Node{{ID: "portal"}, {ID: "east", Candidate: true}},
		Corridors: []engine.Corridor{{From: "portal", To: "east", Length: -2}},
	})
	fmt.Println(err)
	// Output:
	// engine: corridors[0].length: -2: length must be a finite number > 0
}
