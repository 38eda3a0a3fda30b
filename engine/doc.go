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
//     LB = max(LB1, LB2) / (faster speed).
//   - Planners are registered by name: together, opposite-tours, spine-split,
//     hub-rendezvous, and the search planners exhaustive and improve.
//     MakePlan runs one; BestPlan runs every non-search planner for a model
//     and keeps the best. Where a planner has a free choice (child order of a
//     tour, which agent takes which part, where to cut) it builds the few
//     cheap variants, evaluates each exactly and keeps the best.
//   - NewReplay reconstructs what both agents do for one exit, informed part
//     included, with events (found, informed, met, arrived) for playback.
//
// Complexity: NewSite O(n); Evaluate O((n + S) log S) for routes of S
// elementary segments (S is O(n) for every planner here), except face to face
// with a partner faster than the finder, where the forward scan per exit is
// bounded by the evacuation time rather than by a binary search.
//
// Determinism: no map iteration reaches a result; ties are broken by node
// index and by the fixed order in which variants are tried.
package engine
