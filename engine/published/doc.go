// Package published holds the planners whose guarantees are published
// results (MODEL.md §6): together, opposite-tours, spine-split and
// hub-rendezvous, and BestPlan, the best of them for a model.
//
// Where a planner has a free choice (the child order of a tour, which agent
// takes which part, where to cut) it builds the few cheap variants,
// evaluates each exactly with engine.Evaluate and keeps the best; above
// LargeSite nodes it builds only the canonical variant its guarantee is
// proven for. Planners lists them by name, MakePlan runs one, and BestPlan
// runs them all (skipping a planner whose proven Floor cannot beat the best
// plan so far) and keeps the plan with the smallest worst case. The
// hub-rendezvous planner is described in docs/hub-rendezvous.md.
//
// With a finish (MODEL.md §10) the planners build the same routes; since
// Evaluate's worst case is then over done(x) = evac(x) + d(x, F)/v_c, the
// variant each planner keeps and BestPlan's choice are the best for the crew
// out at the finish (for instance a tour order that sweeps the far side of
// the finish first, where a planner tries child orders), but no planner
// builds a route for the finish on purpose, and the guarantees of MODEL.md §6
// are of evac(x). Effort (MODEL.md §9) needs nothing: lengths are weighted.
//
// The package knows only the model (package engine); the search planners
// (engine/search) build on it, and engine/planners registers both.
package published
