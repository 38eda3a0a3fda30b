// Package search holds the search planners: exhaustive (branch and bound
// over a plan class, proving the best plan of that class on small sites),
// improve (anytime simulated annealing from the best published plan, every
// plan scored exactly) and the tour search improve starts with. They are
// slower than the published planners, take Options (seed, budget, iteration
// cap, progress) and are never worse than published.BestPlan, which seeds
// them. See docs/search.md.
//
// The exhaustive planner searches the plan class "target sequences"
// (radio) or "target sequences with node rendezvous" (face to face). Each
// agent's route is a sequence of legs; a leg follows the tree path at full
// speed and ends at a node, with no waiting except at a rendezvous. When an
// agent finishes a leg at time T (agent 0 first at equal times), its next leg
// goes to a target (a candidate nobody has stood on by T, with no other such
// candidate on the way), or to a parking node where it stops for good (an
// anchor: the start, a candidate, a node with three or more corridors in the
// search tree, or the node it stands on, reached without passing a
// candidate still unvisited at T), or, face to face only, to a rendezvous
// node (an anchor, same rule) where it waits while its partner finishes its
// target legs and walks there; both waypoints are marked rendezvous at the
// later arrival and both set off again. A rendezvous may be called at once,
// and after that only once some candidate has been visited since the
// previous one. An agent stops once every candidate has been visited by T;
// the last moving agent may not stop while candidates remain, and no agent
// may stop while its partner waits for it. Waiting elsewhere, turning or
// stopping inside a corridor, and detours to visited nodes in mid-route are
// outside the class. The result is reported as "best of class", never as
// "optimal"; a search stopped by its time limit or by cancellation says it
// is not proven. Sites with more than 24 candidates or 48 search-tree nodes
// are refused. The improve planner is simulated annealing from BestPlan over
// per-agent item lists (targets, corridor points, detours, rendezvous),
// scored by Evaluate: never worse than its start, deterministic for a seed
// and an iteration cap. See docs/search.md.
//
// The package imports the model (engine) and the published planners; only
// engine/planners imports it.
package search
