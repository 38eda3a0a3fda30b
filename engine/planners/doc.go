// Package planners is the registry of every planner by name, the one the
// desktop app and the command line use: the published planners of
// engine/published (together, opposite-tours, spine-split, hub-rendezvous)
// and the search planners of engine/search (exhaustive, improve, marked
// Search). Planners and PlannersFor list them, MakePlan runs one by name and
// BestPlan is the "best available" default: the best published plan for a
// model, with its report.
//
// Options and Progress are the search planners' own types (aliases of
// search.Options and search.Progress); the published planners ignore them.
package planners
