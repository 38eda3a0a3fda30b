package projects

import (
	"bytes"
	_ "embed"

	"duosweep/engine"
)

//go:embed demo/training-gallery.sweep.json
var demoJSON []byte

// DemoJSON returns a copy of the bundled demo scenario file: an invented
// training site ("Drill site: East service gallery (invented)") of 30
// junctions with two agents, a start at the entrance and candidate
// probabilities summing to 1.
func DemoJSON() []byte { return append([]byte(nil), demoJSON...) }

// Demo returns the bundled demo scenario. It panics only if the embedded file
// is invalid, which a test rules out.
func Demo() engine.Scenario {
	sc, err := Load(bytes.NewReader(demoJSON))
	if err != nil {
		panic("projects: the embedded demo scenario is invalid: " + err.Error())
	}
	return sc
}
