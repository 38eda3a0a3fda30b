package engine

import "fmt"

// Model is a communication model (MODEL.md §3 and §4): how the crew shares
// what it finds. It is a small comparable value (a map key, a flag or JSON
// value through String and ParseModel); what a model means lives in a value
// of its own (radio.go, facetoface.go) that the evaluator asks, and
// planners ask the model questions (Rendezvous, Instant) rather than
// comparing it with a constant. A new model is a constant here, an entry in
// modelTable and a file of its own.
type Model int

const (
	// Radio is global communication: the partner learns of the exit at once.
	Radio Model = iota
	// FaceToFace is local communication: agents share what they know only when they meet.
	FaceToFace
)

// Models lists every model in display order.
var Models = []Model{Radio, FaceToFace}

// modelInfo is one row of the model registry.
type modelInfo struct {
	name  string // the file and flag name (String, ParseModel)
	label string // the display label
	comm  communication
}

// modelTable holds every model, indexed by Model.
var modelTable = [...]modelInfo{
	Radio:      {name: "radio", label: "Radio", comm: radio{}},
	FaceToFace: {name: "face-to-face", label: "Face to face", comm: faceToFace{}},
}

// communication is what the evaluator asks a model: the exit x was first
// reached at time t by one agent alone (the finder, speed sf); its partner
// (speed sp) keeps to its uninformed trajectory until it is told. When and
// where does the partner learn of x, and when is the second agent at x?
// hint, when not nil, carries a segment index from one call to the next for
// a finder's exits in order of discovery; it only steers the search, never
// the answer.
type communication interface {
	tell(s *Site, partner *Trajectory, x int, t, sf, sp float64, hint *int) telling
	// rendezvous reports whether an uninformed agent waits at its rendezvous waypoints.
	rendezvous() bool
	// instant reports whether the partner always learns at the moment of
	// discovery, wherever it is (so evac(x) depends on the partner's route
	// only up to t).
	instant() bool
}

// telling is a model's answer for one exit.
type telling struct {
	at    float64 // when the partner learns of the exit (ExitResult.MeetAt)
	where Point   // where finder and partner meet, when met
	evac  float64 // evac(x)
	met   bool    // the message passed face to face (at where), not at a distance
}

func (m Model) valid() bool { return m >= 0 && int(m) < len(modelTable) }

func (m Model) comm() communication {
	if !m.valid() {
		panic(fmt.Sprintf("engine: unknown communication model %d", int(m)))
	}
	return modelTable[m].comm
}

// String returns the model's name as files and flags write it ("radio",
// "face-to-face").
func (m Model) String() string {
	if !m.valid() {
		return fmt.Sprintf("Model(%d)", int(m))
	}
	return modelTable[m].name
}

// Label returns the model's display label ("Radio", "Face to face").
func (m Model) Label() string {
	if !m.valid() {
		return m.String()
	}
	return modelTable[m].label
}

// Others returns every other model, in display order.
func (m Model) Others() []Model {
	out := make([]Model, 0, len(Models)-1)
	for _, o := range Models {
		if o != m {
			out = append(out, o)
		}
	}
	return out
}

// Other returns the first of the other models in display order: with radio
// and face to face, the other one.
func (m Model) Other() Model { return m.Others()[0] }

// Rendezvous reports whether, under m, an uninformed agent waits at its
// rendezvous waypoints for its partner (MODEL.md §4): planners mark
// rendezvous only where it matters.
func (m Model) Rendezvous() bool { return m.comm().rendezvous() }

// Instant reports whether, under m, the partner learns of the exit the
// moment it is found, wherever it is (radio), so that evac(x) depends on the
// partner's route only up to t(x).
func (m Model) Instant() bool { return m.comm().instant() }

// ParseModel parses a model name as String writes it.
func ParseModel(s string) (Model, error) {
	for _, m := range Models {
		if m.String() == s {
			return m, nil
		}
	}
	return 0, fmt.Errorf("engine: model: %q: want %s", s, modelNames())
}

// modelNames lists the model names for messages: "radio or face-to-face".
func modelNames() string {
	out := ""
	for i, m := range Models {
		switch {
		case i == 0:
		case i == len(Models)-1:
			out += " or "
		default:
			out += ", "
		}
		out += m.String()
	}
	return out
}
