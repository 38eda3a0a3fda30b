package engine

// Waypoint is a timed place on an agent's uninformed route (MODEL.md §2): the
// agent walks the tree path to P at full speed, then waits there until T.
// Rendezvous marks a waypoint where, in the face-to-face model, an uninformed
// agent waits for its partner.
type Waypoint struct {
	P          Point
	T          float64
	Rendezvous bool
}

// Route is the uninformed route of one agent. The agent is at the start at
// time 0 before the first waypoint; after the last waypoint it stays put.
type Route struct {
	Waypoints []Waypoint
}

// Plan is a pair of uninformed routes, one per agent (index 0 and 1, in the
// scenario's agent order).
type Plan struct {
	Planner string // the planner that made it, "" for a hand-made plan
	Model   Model  // the model it was made for
	Routes  [2]Route
	Note    string  // what the planner chose, in a sentence
	cached  *Report // the planner's own evaluation under Model, if any
}

// Evaluated returns the planner's own evaluation of p under p.Model, if it
// kept one (nil otherwise). It saves evaluating the plan again.
func (p *Plan) Evaluated() *Report { return p.cached }

// SetEvaluated records r as the evaluation of p under r.Model.
func (p *Plan) SetEvaluated(r *Report) { p.cached = r }
