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
//   - Tour, SearchChildren and RouteBuilder are the building blocks every
//     planner shares: depth-first tours in a choice of child orders, and a
//     builder that turns walks into timed routes.
//   - NewReplay reconstructs what both agents do for one exit, informed part
//     included, with events (found, informed, met, arrived) for playback.
//
// The model room knows no planner: the planners live in engine/published
// (the planners with published guarantees, and BestPlan), engine/search
// (exhaustive, improve, the tour search) and engine/planners (the registry
// by name that the app and the command line use). Imports run one way:
// planners → search → published → engine.
//
// Complexity: NewSite O(n); Evaluate O((n + S) log S) for routes of S
// elementary segments (S is O(n) for every published planner), except face to face
// with a partner faster than the finder, where the forward scan per exit is
// bounded by the evacuation time rather than by a binary search.
//
// Determinism: no map iteration reaches a result; ties are broken by node
// index and by the fixed order in which variants are tried.
package engine
