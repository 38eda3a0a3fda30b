// Package engine is Duosweep's computational core: it plans and evaluates how
// a two-person crew sweeps a tree-shaped site when the place both must reach
// (the exit, a refuge, a casualty) could be at any of several candidate
// junctions. It is pure Go and knows nothing of windows or files.
//
// The model is ../shared/MODEL.md; in short:
//
//   - Scenario is the editable description; NewSite validates it into a Site:
//     a tree rooted at the start, with a heavy-light decomposition for
//     O(log n) distances between nodes and between points inside corridors
//     (Site.Dist, Site.PointDist).
//   - A Plan gives each agent an uninformed Route of timed Waypoints (nodes or
//     corridor-interior points, waits, rendezvous marks). Site.Trajectory
//     expands a route into elementary segments and answers "where is the
//     agent at time t" and "when does it first stand on each node".
//   - Evaluate(site, plan, model) computes, for every candidate x, the first
//     time t(x) an agent stands on it, the finder, and evac(x), the time the
//     second agent arrives there, under the Radio model (the partner walks
//     straight to x from where it is at t(x)) or the FaceToFace model (the
//     finder intercepts its partner, who keeps to its route and waits at its
//     first rendezvous at or after t(x); then both walk to x). The worst case,
//     worst exit, expected time, lower bounds and certified gap come with it.
//   - ComputeBounds gives W, L, L2, LB1 = W, LB2 = L + 2·L2 and the time bound
//     LB = max(LB1/v, LB2/v, LB3) with v the faster speed, where LB3 is the
//     last-discovery cover bound of lb3.go (docs/lower-bound.md).
//   - Planners are registered by name: together, opposite-tours, spine-split,
//     hub-rendezvous, and the search planners exhaustive and improve.
//     MakePlan runs one; BestPlan runs every non-search planner for a model
//     and keeps the best. Where a planner has a free choice (child order of a
//     tour, which agent takes which part, where to cut) it builds the few
//     cheap variants, evaluates each exactly and keeps the best.
//   - NewReplay reconstructs what both agents do for one exit, informed part
//     included, with events (found, informed, met, arrived) for playback.
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
// Complexity: NewSite O(n); Evaluate O((n + S) log S) for routes of S
// elementary segments (S is O(n) for every planner here), except face to face
// with a partner faster than the finder, where the forward scan per exit is
// bounded by the evacuation time rather than by a binary search.
//
// Determinism: no map iteration reaches a result; ties are broken by node
// index and by the fixed order in which variants are tried.
package engine
