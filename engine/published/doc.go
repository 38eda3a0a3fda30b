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
// The package knows only the model (package engine); the search planners
// (engine/search) build on it, and engine/planners registers both.
package published
