package main

import (
	"flag"
	"fmt"
	"math"

	"duosweep/engine"
)

func init() {
	register(command{
		name:    "bounds",
		args:    "SCENARIO",
		summary: "print the lower bounds W, L, L2, LB1, LB2 and LB of a scenario",
		run:     runBounds,
	})
	flagSets["bounds"] = func() *flag.FlagSet { return newFlags("bounds") }
}

func runBounds(e *env, args []string) error {
	pos, err := parseArgs(newFlags("bounds"), args, 1, 1, "SCENARIO")
	if err != nil {
		return err
	}
	s, err := loadSite(pos[0])
	if err != nil {
		return err
	}
	b := engine.ComputeBounds(s)
	u := s.Unit()
	speed := math.Max(s.Speed[0], s.Speed[1])
	w := e.stdout
	fmt.Fprintf(w, "site:                %s\n", s.Scenario.Name)
	fmt.Fprintf(w, "nodes:               %d (%d candidates)\n", s.N, len(s.Candidates()))
	fmt.Fprintf(w, "W:                   %.2f %s (corridor length of the tree to search)\n", b.W, u)
	fmt.Fprintf(w, "L:                   %.2f %s (farthest candidate from the start)\n", b.L, u)
	fmt.Fprintf(w, "L2:                  %.2f %s (farthest candidate from the path to it)\n", b.L2, u)
	fmt.Fprintf(w, "LB1 = W:             %.2f %s\n", b.LB1, u)
	fmt.Fprintf(w, "LB2 = L + 2*L2:      %.2f %s\n", b.LB2, u)
	if b.LB3 > 0 {
		fmt.Fprintf(w, "LB3 (cover split):   %.2f s (the last find: both routes end there and share the tree; docs/lower-bound.md)\n", b.LB3)
	} else {
		fmt.Fprintf(w, "LB3 (cover split):   not computed (site too large for the exact split)\n")
	}
	fmt.Fprintf(w, "LB:                  %.2f s (%s) = max(LB1 / v, LB2 / v, LB3), v = %g %s/s the faster speed\n", b.LB, engine.FormatClock(b.LB), speed, u)
	fmt.Fprintf(w, "farthest candidate:  %s\n", nodeLabel(s, b.Far))
	return nil
}

func nodeLabel(s *engine.Site, v int) string {
	if l := s.Scenario.Nodes[v].Label; l != "" && l != s.IDs[v] {
		return s.IDs[v] + " (" + l + ")"
	}
	return s.IDs[v]
}
