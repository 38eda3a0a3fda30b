package engine

import "math"

// TimeTol is the engine's one relative time tolerance: two times within
// Tol of each other are the same moment (ties between finders, "waypoint
// time reachable", "better than"). The app and the files use it too.
const TimeTol = 1e-9

// Tol returns the absolute tolerance at time t: TimeTol·max(1, |t|).
func Tol(t float64) float64 { return TimeTol * math.Max(1, math.Abs(t)) }
