package projects

import (
	"bytes"
	"math"

	json "github.com/goccy/go-json"

	"duosweep/engine"
)

// The second-wave model fields of FORMATS.md: corridors[].effort (MODEL.md
// §9), finish {node, speed} (MODEL.md §10) and the scenario's model. Here
// they are read and written with their JSON types checked; engine.NewSite
// validates their values (effort in (0, 100], a finish node that exists, a
// carry speed > 0, a model name engine.ParseModel knows) and names the field.

type wireFinish struct {
	Node  *string         `json:"node"`
	Speed json.RawMessage `json:"speed"`
}

type outFinish struct {
	Node  string   `json:"node"`
	Speed *float64 `json:"speed,omitempty"`
}

// effort reads a corridor's effort factor; f names a field of this corridor.
func (c *wireCorridor) effort(f func(string) string, cr *engine.Corridor) error {
	if absent(c.Effort) {
		return nil
	}
	e, err := number(f("effort"), c.Effort)
	if err != nil {
		return err
	}
	cr.Effort = &e
	return nil
}

// finishModel reads the scenario's finish and model.
func (w *wireScenario) finishModel(sc *engine.Scenario) error {
	if !absent(w.Finish) {
		var f wireFinish
		if err := json.Unmarshal(w.Finish, &f); err != nil {
			return errf("finish: %s: want {\"node\": ..., \"speed\": ...}", clip(w.Finish))
		}
		node, err := requiredString("finish.node", f.Node)
		if err != nil {
			return err
		}
		fin := engine.Finish{Node: node}
		if !absent(f.Speed) {
			v, err := number("finish.speed", f.Speed)
			if err != nil {
				return err
			}
			fin.Speed = &v
		}
		sc.Finish = &fin
	}
	if !absent(w.Model) {
		var m string
		if err := json.Unmarshal(w.Model, &m); err != nil {
			return errf("model: %s: not a string (want a model name such as \"radio\")", clip(bytes.TrimSpace(w.Model)))
		}
		sc.Model = m
	}
	return nil
}

// outFinishModel is the finish and model as Save writes them.
func outFinishModel(sc engine.Scenario) (*outFinish, string) {
	var f *outFinish
	if sc.Finish != nil {
		f = &outFinish{Node: sc.Finish.Node, Speed: sc.Finish.Speed}
	}
	return f, sc.Model
}

// checkEffortFinite refuses effort factors and a carry speed that cannot be
// written as JSON numbers (SaveDraft skips the engine's validation).
func checkEffortFinite(sc engine.Scenario) error {
	bad := func(x float64) bool { return math.IsNaN(x) || math.IsInf(x, 0) }
	for i, c := range sc.Corridors {
		if c.Effort != nil && bad(*c.Effort) {
			return errf("save: corridors[%d].effort: %g: not a finite number", i, *c.Effort)
		}
	}
	if sc.Finish != nil && sc.Finish.Speed != nil && bad(*sc.Finish.Speed) {
		return errf("save: finish.speed: %g: not a finite number", *sc.Finish.Speed)
	}
	return nil
}
