package projects

import (
	"bytes"
	"encoding/json"
	"errors"
	"flag"
	"io"
	"math"
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"duosweep/engine"
)

var update = flag.Bool("update", false, "rewrite the golden files in testdata/golden")

// golden compares got with testdata/golden/name, or rewrites it with -update.
func golden(t *testing.T, name string, got []byte) {
	t.Helper()
	path := filepath.Join("testdata", "golden", name)
	if *update {
		require.NoError(t, os.MkdirAll(filepath.Dir(path), 0o755))
		require.NoError(t, os.WriteFile(path, got, 0o644))
		return
	}
	want, err := os.ReadFile(path)
	require.NoError(t, err, "missing golden file; run go test ./projects/ -update")
	assert.Equal(t, string(want), string(got), "golden %s differs; run go test ./projects/ -update if the change is intended", name)
}

func load(t *testing.T, text string) (engine.Scenario, error) {
	t.Helper()
	return Load(strings.NewReader(text))
}

func TestLoadDefaults(t *testing.T) {
	sc, err := LoadFile("testdata/minimal.sweep.json")
	require.NoError(t, err)
	assert.Equal(t, "m", sc.Unit)
	assert.Equal(t, engine.DefaultAgents(), sc.Agents)
	require.Len(t, sc.Nodes, 4)
	assert.False(t, sc.Nodes[0].Candidate, "the start is not a candidate by default")
	assert.True(t, sc.Nodes[1].Candidate)
	assert.True(t, sc.Nodes[2].Candidate)
	assert.False(t, sc.Nodes[3].Candidate, "explicit candidate false stays false")
	for _, n := range sc.Nodes {
		assert.False(t, n.HasXY)
		assert.False(t, n.HasProbability)
	}
	assert.Equal(t, 1000.0, sc.Corridors[2].Length)

	sc, err = LoadFile("testdata/gallery-wing.sweep.json")
	require.NoError(t, err)
	assert.True(t, sc.Nodes[0].Candidate, "explicit candidate true on the start is kept")
	assert.Equal(t, `Room "101" <plant>`, sc.Nodes[3].Label)
	assert.Equal(t, "ft", sc.Unit)
	assert.Equal(t, []engine.Agent{{Name: "Lead", Speed: 2.5}, {Name: "Second", Speed: 3}}, sc.Agents)
}

// base is a valid scenario; the invalid cases below each break one thing in it.
const base = `{"format": "duosweep-scenario", "version": 1, "start": "s",
 "agents": [{"name": "A", "speed": 1}, {"name": "B", "speed": 1}],
 "nodes": [{"id": "s"}, {"id": "a", "probability": 0.5}, {"id": "b", "probability": 0.5}],
 "corridors": [{"from": "s", "to": "a", "length": 3}, {"from": "a", "to": "b", "length": 4}]}`

func TestLoadBase(t *testing.T) {
	sc, err := load(t, base)
	require.NoError(t, err)
	assert.Len(t, sc.Nodes, 3)
}

// TestLoadInvalid covers every invalid input listed in FORMATS.md; each error
// must name the field and the value.
func TestLoadInvalid(t *testing.T) {
	r := func(old, new string) string {
		require.Contains(t, base, old)
		return strings.Replace(base, old, new, 1)
	}
	cases := []struct {
		name, in string
		want     []string
	}{
		{"not JSON", `{"format": "duosweep-scenario",`, []string{"not a scenario file"}},
		{"not an object", `[1, 2]`, []string{"not a scenario file"}},
		{"trailing garbage", base + " x", []string{"not a scenario file"}},
		{"empty", ``, []string{"not a scenario file"}},
		{"wrong format", r(`"duosweep-scenario"`, `"duosweep-report"`), []string{"format", `"duosweep-report"`}},
		{"missing format", r(`"format": "duosweep-scenario",`, ``), []string{"format: missing"}},
		{"wrong version", r(`"version": 1`, `"version": 2`), []string{"version: 2"}},
		{"version string", r(`"version": 1`, `"version": "1"`), []string{"version", `"1"`, "not a number"}},
		{"missing version", r(`"version": 1,`, ``), []string{"version: missing"}},
		{"missing start", r(`"start": "s",`, ``), []string{"start: missing"}},
		{"unknown start", r(`"start": "s"`, `"start": "zz"`), []string{"start: zz", "no node"}},
		{"unknown corridor from", r(`"from": "s"`, `"from": "j9"`), []string{"corridors[0].from: j9", "no node"}},
		{"unknown corridor to", r(`"to": "b"`, `"to": "j9"`), []string{"corridors[1].to: j9", "no node"}},
		{"missing node id", r(`{"id": "b", `, `{`), []string{"nodes[2].id: missing"}},
		{"empty node id", r(`{"id": "b", `, `{"id": "", `), []string{"nodes[2].id", `""`}},
		{"duplicate id", r(`{"id": "b", `, `{"id": "a", `), []string{"nodes[2].id: a", "duplicate"}},
		{"self loop", r(`"to": "b"`, `"to": "a"`), []string{"corridors[1]", "a-a", "itself"}},
		{"cycle", r(`"length": 4}]`, `"length": 4}, {"from": "b", "to": "s", "length": 2}]`), []string{"corridors[2]", "b-s", "cycle"}},
		{"disconnected node", r(`{"id": "b", "probability": 0.5}`, `{"id": "b", "probability": 0.5}, {"id": "lost", "candidate": false}`), []string{"nodes[3]", "lost", "not connected"}},
		{"length zero", r(`"length": 4`, `"length": 0`), []string{"corridors[1].length: 0", "> 0"}},
		{"length negative", r(`"length": 4`, `"length": -4`), []string{"corridors[1].length: -4", "> 0"}},
		{"length NaN literal", r(`"length": 4`, `"length": NaN`), []string{"not a scenario file"}},
		{"length NaN string", r(`"length": 4`, `"length": "NaN"`), []string{"corridors[1].length", `"NaN"`, "not a number"}},
		{"length overflow", r(`"length": 4`, `"length": 1e999`), []string{"corridors[1].length: 1e999", "not a finite number"}},
		{"length Infinity", r(`"length": 4`, `"length": Infinity`), []string{"not a scenario file"}},
		{"length missing", r(`, "length": 4`, ``), []string{"corridors[1].length: missing"}},
		{"length null", r(`"length": 4`, `"length": null`), []string{"corridors[1].length: missing"}},
		{"corridor from missing", r(`"from": "a", `, ``), []string{"corridors[1].from: missing"}},
		{"speed zero", r(`"name": "B", "speed": 1`, `"name": "B", "speed": 0`), []string{"agents[1].speed: 0", "> 0"}},
		{"speed negative", r(`"name": "A", "speed": 1`, `"name": "A", "speed": -1.5`), []string{"agents[0].speed: -1.5", "> 0"}},
		{"speed missing", r(`, "speed": 1}, {"name": "B"`, `}, {"name": "B"`), []string{"agents[0].speed: missing"}},
		{"one agent", r(`, {"name": "B", "speed": 1}`, ``), []string{"agents: 1 agents", "exactly 2"}},
		{"same agent names", r(`"name": "B"`, `"name": "A"`), []string{"agents[1].name: A", "different names"}},
		{"probability negative", r(`"id": "a", "probability": 0.5`, `"id": "a", "probability": -0.5`), []string{"nodes[1].probability: -0.5", ">= 0"}},
		{"probabilities sum", r(`"id": "a", "probability": 0.5`, `"id": "a", "probability": 0.6`), []string{"nodes[].probability: 1.1", "sum to 1"}},
		{"probability on non-candidate", r(`{"id": "a", "probability": 0.5}`, `{"id": "a", "candidate": false, "probability": 0.5}`), []string{"nodes[1].probability: 0.5", "not a candidate"}},
		{"x without y", r(`{"id": "s"}`, `{"id": "s", "x": 1}`), []string{"nodes[0].y: missing"}},
		{"x not a number", r(`{"id": "s"}`, `{"id": "s", "x": true, "y": 0}`), []string{"nodes[0].x: true", "not a number"}},
		{"nodes missing", r(`"nodes": [{"id": "s"}, {"id": "a", "probability": 0.5}, {"id": "b", "probability": 0.5}],`, ``), []string{"nodes: missing"}},
		{"wrong type id", r(`{"id": "b", `, `{"id": 7, `), []string{"not a scenario file"}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			sc, err := load(t, c.in)
			require.Error(t, err)
			assert.Equal(t, engine.Scenario{}, sc, "nothing half-loaded")
			msg := err.Error()
			assert.True(t, strings.HasPrefix(msg, "projects: "), msg)
			assert.NotContains(t, msg, "engine: engine:")
			for _, w := range c.want {
				assert.Contains(t, msg, w)
			}
		})
	}
}

func TestLoadFileErrors(t *testing.T) {
	_, err := LoadFile("testdata/does-not-exist.sweep.json")
	require.Error(t, err)
	assert.True(t, strings.HasPrefix(err.Error(), "projects: testdata/does-not-exist.sweep.json: "), err.Error())

	dir := t.TempDir()
	p := filepath.Join(dir, "bad.sweep.json")
	require.NoError(t, os.WriteFile(p, []byte(strings.Replace(base, `"length": 4`, `"length": -4`, 1)), 0o644))
	_, err = LoadFile(p)
	require.Error(t, err)
	assert.Equal(t, "projects: "+p+": corridors[1].length: -4: length must be a finite number > 0", err.Error())
	var fe *engine.FieldError
	require.True(t, errors.As(err, &fe), "the engine's FieldError is wrapped")
	assert.Equal(t, "corridors[1].length", fe.Field)
}

func TestDraft(t *testing.T) {
	// a junction not yet connected: a draft, not a site
	mid := strings.Replace(base, `{"id": "b", "probability": 0.5}`, `{"id": "b", "probability": 0.5}, {"id": "new", "candidate": false, "x": 3, "y": 4}`, 1)
	_, err := load(t, mid)
	require.Error(t, err)
	sc, err := LoadDraft(strings.NewReader(mid))
	require.NoError(t, err)
	assert.Len(t, sc.Nodes, 4)
	var buf bytes.Buffer
	require.Error(t, Save(&buf, sc), "Save refuses what NewSite refuses")
	buf.Reset()
	require.NoError(t, SaveDraft(&buf, sc))
	back, err := LoadDraft(&buf)
	require.NoError(t, err)
	assert.Equal(t, sc, back)

	for _, bad := range []string{`{`, strings.Replace(base, `"version": 1`, `"version": 3`, 1),
		strings.Replace(base, `"duosweep-scenario"`, `"x"`, 1), strings.Replace(base, `"length": 4`, `"length": 1e400`, 1)} {
		_, err := LoadDraft(strings.NewReader(bad))
		assert.Error(t, err)
	}
	sc.Corridors[0].Length = math.NaN()
	err = SaveDraft(&buf, sc)
	require.Error(t, err)
	assert.Contains(t, err.Error(), "corridors[0].length: NaN")
}

func TestSaveRefusesInvalid(t *testing.T) {
	sc, err := load(t, base)
	require.NoError(t, err)
	sc.Corridors[1].Length = -2
	var buf bytes.Buffer
	err = Save(&buf, sc)
	require.Error(t, err)
	assert.Contains(t, err.Error(), "projects: save: corridors[1].length: -2")
	assert.Zero(t, buf.Len())
}

// TestGoldenRoundTrip loads every testdata scenario, saves it (compared with
// a golden file) and loads the saved file back to an equal scenario.
func TestGoldenRoundTrip(t *testing.T) {
	files, err := filepath.Glob("testdata/*.sweep.json")
	require.NoError(t, err)
	require.NotEmpty(t, files)
	for _, f := range files {
		t.Run(filepath.Base(f), func(t *testing.T) {
			sc, err := LoadFile(f)
			require.NoError(t, err)
			var buf bytes.Buffer
			require.NoError(t, Save(&buf, sc))
			golden(t, strings.TrimSuffix(filepath.Base(f), ".sweep.json")+".saved.json", buf.Bytes())
			back, err := Load(bytes.NewReader(buf.Bytes()))
			require.NoError(t, err)
			assert.Equal(t, sc, back)
			var again bytes.Buffer
			require.NoError(t, Save(&again, back))
			assert.Equal(t, buf.String(), again.String(), "saving is stable")
		})
	}
}

func TestSaveWritesFields(t *testing.T) {
	sc, err := LoadFile("testdata/minimal.sweep.json")
	require.NoError(t, err)
	var buf bytes.Buffer
	require.NoError(t, Save(&buf, sc))
	out := buf.String()
	assert.Equal(t, 4, strings.Count(out, `"candidate"`), "candidate is written for every node")
	assert.NotContains(t, out, `"x"`)
	assert.NotContains(t, out, `"probability"`)
	assert.Contains(t, out, `"name": "A"`)
	assert.Less(t, strings.Index(out, `"format"`), strings.Index(out, `"version"`))
	assert.Less(t, strings.Index(out, `"start"`), strings.Index(out, `"agents"`))
	assert.Less(t, strings.Index(out, `"nodes"`), strings.Index(out, `"corridors"`))
}

type failingWriter struct {
	w     interface{ Write([]byte) (int, error) }
	after int
}

func (f *failingWriter) Write(p []byte) (int, error) {
	if len(p) > f.after {
		n, _ := f.w.Write(p[:f.after])
		return n, errors.New("disk full (simulated)")
	}
	f.after -= len(p)
	return f.w.Write(p)
}

func TestSaveFileAtomic(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "site.sweep.json")
	require.NoError(t, SaveFile(path, Demo()))
	old, err := os.ReadFile(path)
	require.NoError(t, err)
	var want bytes.Buffer
	require.NoError(t, Save(&want, Demo())) // TestDemo compares it with DemoJSON
	assert.Equal(t, want.Bytes(), old)

	sc, err := LoadFile("testdata/tee-junction.sweep.json")
	require.NoError(t, err)
	writeHook = func(w io.Writer) io.Writer { return &failingWriter{w: w, after: 40} }
	err = SaveFile(path, sc)
	writeHook = nil
	require.Error(t, err)
	assert.Contains(t, err.Error(), "projects: "+path+": ")
	assert.Contains(t, err.Error(), "disk full")
	now, err := os.ReadFile(path)
	require.NoError(t, err)
	assert.Equal(t, old, now, "a failing write leaves the old file intact")
	entries, err := os.ReadDir(dir)
	require.NoError(t, err)
	assert.Len(t, entries, 1, "the temporary file is removed")

	// an invalid scenario is refused before anything is written
	sc.Corridors[0].Length = 0
	require.Error(t, SaveFile(path, sc))
	now, _ = os.ReadFile(path)
	assert.Equal(t, old, now)

	// and a good save replaces the file
	sc.Corridors[0].Length = 10
	require.NoError(t, SaveFile(path, sc))
	back, err := LoadFile(path)
	require.NoError(t, err)
	assert.Equal(t, sc, back)
	entries, _ = os.ReadDir(dir)
	assert.Len(t, entries, 1)

	err = SaveFile(filepath.Join(dir, "no-such-dir", "x.sweep.json"), sc)
	require.Error(t, err)
	assert.Contains(t, err.Error(), "no-such-dir")
}

func TestDemo(t *testing.T) {
	sc := Demo()
	s, err := engine.NewSite(sc)
	require.NoError(t, err)
	assert.GreaterOrEqual(t, s.N, 25)
	assert.LessOrEqual(t, s.N, 40)
	assert.Contains(t, sc.Name, "(invented)")
	assert.True(t, s.HasProb)
	sum := 0.0
	for _, p := range s.Prob {
		sum += p
	}
	assert.InDelta(t, 1, sum, 1e-9)
	assert.False(t, s.Candidate[s.Start])
	for i, a := range sc.Agents {
		assert.True(t, a.Speed >= 0.8 && a.Speed <= 1.2, "agent %d walks %g m/s", i, a.Speed)
	}
	for i, c := range sc.Corridors {
		assert.True(t, c.Length >= 5 && c.Length <= 120, "corridors[%d].length %g", i, c.Length)
		u, v := sc.Nodes[sc.NodeIndex(c.From)], sc.Nodes[sc.NodeIndex(c.To)]
		require.True(t, u.HasXY && v.HasXY)
		assert.GreaterOrEqual(t, c.Length, math.Hypot(u.X-v.X, u.Y-v.Y), "corridors[%d] is shorter than the straight line", i)
	}
	// the second-wave figures: two slow corridors, a covered main gallery and a finish at the portal
	slow := 0
	for _, c := range sc.Corridors {
		if c.Effort != nil {
			slow++
			assert.True(t, *c.Effort > 1, "%s-%s is a slow corridor", c.From, c.To)
		}
	}
	assert.Equal(t, 2, slow)
	require.NotNil(t, sc.Finish)
	assert.Equal(t, sc.Start, sc.Finish.Node)
	// the embedded file is what Save writes: byte for byte once this build
	// knows every field in it; the main gallery's "covered" marks (MODEL.md
	// §8) are written by the coverage work, and until a build has
	// engine.Corridor.Covered they are an unknown field that Load ignores
	var buf bytes.Buffer
	require.NoError(t, Save(&buf, sc))
	if _, known := reflect.TypeOf(engine.Corridor{}).FieldByName("Covered"); known {
		assert.Equal(t, string(DemoJSON()), buf.String())
	} else {
		var want, got any
		require.NoError(t, json.Unmarshal(DemoJSON(), &want))
		require.NoError(t, json.Unmarshal(buf.Bytes(), &got))
		covered := 0
		for _, c := range want.(map[string]any)["corridors"].([]any) {
			if _, ok := c.(map[string]any)["covered"]; ok {
				delete(c.(map[string]any), "covered")
				covered++
			}
		}
		assert.Equal(t, 7, covered, "the main gallery's seven corridors are covered")
		assert.Equal(t, want, got)
	}
}
