package projects

import (
	"bytes"
	_ "embed"
	"io"

	"duosweep/engine"
)

//go:embed demo/training-gallery.sweep.json
var demoJSON []byte

// DemoJSON returns a copy of the bundled demo scenario file: an invented
// training site ("Drill site: East service gallery (invented)") of 30
// junctions with two agents, a start at the entrance, candidate
// probabilities summing to 1, a radio-covered main gallery, two slow
// corridors (effort 2.5 and 1.8) and a finish at the portal.
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

// SaveDemoFile writes the bundled demo file to path exactly as bundled,
// atomically (see SaveFile).
func SaveDemoFile(path string) error {
	return writeFileAtomic(path, func(w io.Writer) error {
		if _, err := w.Write(demoJSON); err != nil {
			return errf("save: %v", err)
		}
		return nil
	})
}
