package search

import "time"

// Options configure a planner. The zero value is useful: seed 0, the
// planner's default budget, no progress reports.
type Options struct {
	// Seed feeds the planner's random source (search planners only); the same
	// seed gives the same plan.
	Seed int64
	// Budget is the wall-clock time a search planner may use; 0 means its default.
	Budget time.Duration
	// Iterations caps a search planner's iterations; 0 means no cap (Budget rules).
	Iterations int
	// Progress, when set, receives reports from long-running planners. It is
	// called on the planner's goroutine.
	Progress func(Progress)
}

// Progress is a progress report of a long-running planner.
type Progress struct {
	Done float64 // fraction of the budget used, 0..1
	Best float64 // best worst case found so far (seconds)
	Note string  // what it is doing, in a few words
}
