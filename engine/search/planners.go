package search

import (
	"context"
	"fmt"

	"duosweep/engine"
)

// Planner is one search planner: its name, the models it works under, a
// one-line summary, and how to run it with Options (seed, budget, iteration
// cap, progress).
type Planner struct {
	Name    string
	Models  []engine.Model
	Summary string
	Make    func(ctx context.Context, s *engine.Site, m engine.Model, opt Options) (*engine.Plan, error)
}

// Planners returns the search planners, sorted by name.
func Planners() []Planner {
	return []Planner{
		{Name: "exhaustive", Models: engine.Models,
			Summary: fmt.Sprintf("branch and bound over target-sequence plans (face to face: with node rendezvous); proves the best plan of that class; sites of at most %d candidates and %d search-tree nodes", ExhaustiveMaxCandidates, ExhaustiveMaxNodes),
			Make:    planExhaustive},
		{Name: "improve", Models: engine.Models,
			Summary: "anytime local search (simulated annealing) from the best published plan, every plan scored exactly; never worse than its start",
			Make:    planImprove},
	}
}
