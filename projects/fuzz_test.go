package projects

import (
	"bytes"
	stdjson "encoding/json"
	"os"
	"path/filepath"
	"reflect"
	"testing"
)

// FuzzLoad: Load never panics; whatever it accepts is valid JSON for the
// standard library's encoding/json (a reference parser outside this package),
// and saves and loads back to an equal scenario.
func FuzzLoad(f *testing.F) {
	files, _ := filepath.Glob("testdata/*.sweep.json")
	for _, p := range files {
		if b, err := os.ReadFile(p); err == nil {
			f.Add(b)
		}
	}
	f.Add(DemoJSON())
	f.Add([]byte(base))
	f.Add([]byte(`{"format":"duosweep-scenario","version":1,"start":"a","nodes":[{"id":"a"}]}`))
	// second-wave drawing fields: closed corridors closing a loop, paths, backdrop, georef
	f.Add([]byte(`{"format":"duosweep-scenario","version":1,"start":"a","nodes":[{"id":"a"},{"id":"b"},{"id":"c"}],"corridors":[{"from":"a","to":"b","length":1,"path":[[0.5,1]]},{"from":"b","to":"c","length":1},{"from":"c","to":"a","length":2,"closed":true}],"backdrop":{"image":"p.png","scale":0.5},"georef":{"crs":"lonlat","origin":[7,46],"scale":[77000,111000]}}`))
	f.Fuzz(func(t *testing.T, data []byte) {
		sc, err := Load(bytes.NewReader(data))
		if err != nil {
			if len(sc.Nodes) != 0 || sc.Start != "" {
				t.Fatalf("half-loaded scenario on error %v", err)
			}
			return
		}
		if !stdjson.Valid(data) {
			t.Fatalf("Load accepted input that encoding/json calls invalid: %q", data)
		}
		var buf bytes.Buffer
		if err := Save(&buf, sc); err != nil {
			t.Fatalf("Save refused a loaded scenario: %v", err)
		}
		back, err := Load(bytes.NewReader(buf.Bytes()))
		if err != nil {
			t.Fatalf("saved file does not load: %v\n%s", err, buf.Bytes())
		}
		if !reflect.DeepEqual(sc, back) {
			t.Fatalf("round trip changed the scenario:\n%+v\n%+v", sc, back)
		}
	})
}
