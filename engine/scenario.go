package engine

// Scenario is the editable, unvalidated description of a site: what a file
// holds and what the editor changes. NewSite validates it into a Site.
//
// Node and corridor order is preserved everywhere; node indices used across
// the engine (Site, Plan, Report) are indices into Nodes.
type Scenario struct {
	Name      string
	Unit      string // length unit, "m" when empty
	Start     string // id of the start node
	Agents    []Agent
	Nodes     []Node
	Corridors []Corridor
	// Backdrop is an image drawn under the site (drawing only), or nil.
	Backdrop *Backdrop
	// GeoRef says how drawing coordinates map back to an imported source's
	// coordinates (drawing only), or nil. See drawing.go.
	GeoRef *GeoRef
}

// Node is a junction, dead end or chamber.
type Node struct {
	ID    string
	Label string
	// X, Y are drawing coordinates in the scenario's unit; HasXY is false
	// when the file gave none (the editor lays such trees out).
	X, Y  float64
	HasXY bool
	// Candidate marks a node that can hold the exit.
	Candidate bool
	// Probability is the chance that the exit is here; only meaningful when
	// HasProbability is set.
	Probability    float64
	HasProbability bool
}

// Corridor joins two nodes; Length is in the scenario's unit and must be > 0.
type Corridor struct {
	From, To string
	Length   float64
	// Closed marks a corridor that stays on the drawing but is never walked
	// (barricaded, flooded, or left out to break a loop). The open corridors
	// must form a tree over all nodes.
	Closed bool
	// Path is the corridor's drawn shape: its interior vertices in drawing
	// coordinates, in order from From to To (the end nodes' own positions are
	// the two ends). Drawing only: Length is what the model uses.
	Path [][2]float64
}

// Agent is one member of the crew. Speed is in unit per second and must be > 0.
type Agent struct {
	Name  string
	Speed float64
}

// DefaultAgents returns the two agents used when a scenario names none:
// A and B with speed 1.
func DefaultAgents() []Agent {
	return []Agent{{Name: "A", Speed: 1}, {Name: "B", Speed: 1}}
}

// Clone returns a deep copy of the scenario.
func (sc Scenario) Clone() Scenario {
	out := sc
	out.Agents = append([]Agent(nil), sc.Agents...)
	out.Nodes = append([]Node(nil), sc.Nodes...)
	out.Corridors = append([]Corridor(nil), sc.Corridors...)
	cloneDrawing(&out)
	return out
}

// NodeIndex returns the index of the node with the given id, or -1.
// It is O(n); a Site offers an O(1) lookup.
func (sc Scenario) NodeIndex(id string) int {
	for i, n := range sc.Nodes {
		if n.ID == id {
			return i
		}
	}
	return -1
}
