package planners_test

import (
	"context"
	"fmt"

	"duosweep/engine"
	"duosweep/engine/planners"
)

// A drift with two dead ends, 1 m and 3 m from the portal. The lower bound is
// L + 2·L2 = 3 + 2·1 = 5 s, and walking the short end first, together,
// takes 2W − L = 5 s, so the best available plan meets the bound exactly
// (derived by hand).
func ExampleBestPlan() {
	site, err := engine.NewSite(engine.Scenario{
		Start: "portal",
		Nodes: []engine.Node{{ID: "portal"}, {ID: "east", Candidate: true}, {ID: "west", Candidate: true}},
		Corridors: []engine.Corridor{
			{From: "portal", To: "east", Length: 1},
			{From: "portal", To: "west", Length: 3},
		},
	})
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, m := range engine.Models {
		_, rep, err := planners.BestPlan(context.Background(), site, m)
		if err != nil {
			fmt.Println(err)
			return
		}
		fmt.Printf("%s: worst %g s, lower bound %g s, gap %.2f, complete %v\n", m, rep.Worst, rep.Bounds.LB, rep.Gap, rep.Complete)
	}
	// Output:
	// radio: worst 5 s, lower bound 5 s, gap 0.00, complete true
	// face-to-face: worst 5 s, lower bound 5 s, gap 0.00, complete true
}
