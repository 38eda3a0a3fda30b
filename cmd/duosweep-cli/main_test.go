package main

import (
	"bytes"
	"encoding/json"
	"flag"
	"fmt"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"duosweep/engine"
	"duosweep/engine/planners"
	"duosweep/projects"
)

var update = flag.Bool("update", false, "rewrite the golden files in testdata")

func runCLI(args ...string) (code int, stdout, stderr string) {
	var o, e bytes.Buffer
	code = run(args, &o, &e)
	return code, o.String(), e.String()
}

// demoFile writes the demo scenario to a temporary file.
func demoFile(t *testing.T) string {
	t.Helper()
	p := filepath.Join(t.TempDir(), "demo.sweep.json")
	code, _, stderr := runCLI("demo", p)
	require.Equal(t, 0, code, stderr)
	return p
}

func genFile(t *testing.T, family string, n int) string {
	t.Helper()
	p := filepath.Join(t.TempDir(), family+".sweep.json")
	code, _, stderr := runCLI("gen", "--family", family, "--nodes", strconv.Itoa(n), "--seed", "7", "--out", p)
	require.Equal(t, 0, code, stderr)
	return p
}

func needPlanners(t *testing.T, m engine.Model) {
	t.Helper()
	for _, p := range planners.PlannersFor(m) {
		if !p.Search {
			return
		}
	}
	t.Skipf("no non-search planner registered for the %s model yet (engine planners are written in parallel)", m)
}

func TestHelp(t *testing.T) {
	for _, args := range [][]string{{"help"}, {"--help"}, {"-h"}} {
		code, out, _ := runCLI(args...)
		assert.Equal(t, 0, code)
		for _, name := range []string{"plan", "eval", "compare", "bounds", "demo", "gen", "help"} {
			assert.Contains(t, out, "  "+name+" ")
		}
		assert.Contains(t, out, projects.Disclaimer)
	}
	code, out, _ := runCLI("help", "plan")
	assert.Equal(t, 0, code)
	assert.Contains(t, out, "-planner")
	code, out, _ = runCLI("plan", "--help")
	assert.Equal(t, 0, code)
	assert.Contains(t, out, "-seconds")
	code, _, errOut := runCLI()
	assert.Equal(t, 2, code)
	assert.Contains(t, errOut, "Usage:")
}

func TestDemoAndGen(t *testing.T) {
	code, out, _ := runCLI("demo")
	require.Equal(t, 0, code)
	assert.Equal(t, string(projects.DemoJSON()), out)
	p := demoFile(t)
	got, err := os.ReadFile(p)
	require.NoError(t, err)
	assert.Equal(t, projects.DemoJSON(), got)

	code, out, _ = runCLI("gen", "--family", "spider", "--nodes", "50", "--seed", "3")
	require.Equal(t, 0, code)
	sc, err := projects.Load(strings.NewReader(out))
	require.NoError(t, err)
	assert.Len(t, sc.Nodes, 50)
	assert.Equal(t, "spider, 50 nodes, seed 3", sc.Name)
	_, out2, _ := runCLI("gen", "--family", "spider", "--nodes", "50", "--seed", "3")
	assert.Equal(t, out, out2, "deterministic")
}

func TestBoundsGolden(t *testing.T) {
	code, out, stderr := runCLI("bounds", demoFile(t))
	require.Equal(t, 0, code, stderr)
	path := filepath.Join("testdata", "bounds-demo.golden")
	if *update {
		require.NoError(t, os.MkdirAll("testdata", 0o755))
		require.NoError(t, os.WriteFile(path, []byte(out), 0o644))
	}
	want, err := os.ReadFile(path)
	require.NoError(t, err, "run go test ./cmd/duosweep-cli -update")
	assert.Equal(t, string(want), out)
	// the figures agree with the engine
	s, err := engine.NewSite(projects.Demo())
	require.NoError(t, err)
	b := engine.ComputeBounds(s)
	assert.Contains(t, out, fmt.Sprintf("LB1 = W:             %.2f m", b.W))
}

func TestPlanDemo(t *testing.T) {
	demo := demoFile(t)
	for _, m := range engine.Models {
		t.Run(m.String(), func(t *testing.T) {
			needPlanners(t, m)
			code, out, stderr := runCLI("plan", demo, "--model", m.String())
			require.Equal(t, 0, code, stderr)
			assert.Contains(t, out, "Duosweep itinerary: Drill site: East service gallery (invented)")
			assert.Contains(t, out, projects.Disclaimer)

			code, out, stderr = runCLI("plan", demo, "--model", m.String(), "--json")
			require.Equal(t, 0, code, stderr)
			var rep map[string]any
			require.NoError(t, json.Unmarshal([]byte(out), &rep))
			assert.Equal(t, "duosweep-report", rep["format"])
			assert.Equal(t, m.String(), rep["model"])

			// the best plan is no worse than any single non-search planner
			worst := rep["worst"].(map[string]any)["evacuated_at"].(float64)
			for _, info := range planners.PlannersFor(m) {
				if info.Search {
					continue
				}
				code, out, stderr := runCLI("plan", demo, "--model", m.String(), "--planner", info.Name, "--json")
				require.Equal(t, 0, code, stderr)
				var r2 map[string]any
				require.NoError(t, json.Unmarshal([]byte(out), &r2))
				assert.Equal(t, info.Name, r2["planner"])
				w2 := r2["worst"].(map[string]any)["evacuated_at"].(float64)
				assert.LessOrEqual(t, worst, w2*(1+1e-9), info.Name)
			}

			// eval of the report reproduces it (model taken from the file)
			planPath := filepath.Join(t.TempDir(), "plan.json")
			require.NoError(t, os.WriteFile(planPath, []byte(out), 0o644))
			code, out2, stderr := runCLI("eval", demo, planPath, "--json")
			require.Equal(t, 0, code, stderr)
			var r3 map[string]any
			require.NoError(t, json.Unmarshal([]byte(out2), &r3))
			assert.Equal(t, rep["worst"], r3["worst"])
			assert.Equal(t, m.String(), r3["model"])
		})
	}
}

func TestPlanOnGenerated(t *testing.T) {
	needPlanners(t, engine.Radio)
	for _, fam := range []string{"random", "caterpillar", "star"} {
		p := genFile(t, fam, 200)
		code, out, stderr := runCLI("plan", p, "--json")
		require.Equal(t, 0, code, stderr)
		var rep map[string]any
		require.NoError(t, json.Unmarshal([]byte(out), &rep))
		assert.Equal(t, true, rep["complete"], fam)
		gap := rep["gap"].(float64)
		assert.GreaterOrEqual(t, gap, -1e-9, "no plan beats the lower bound (%s)", fam)
	}
}

func TestEvalModels(t *testing.T) {
	dir := t.TempDir()
	scen := filepath.Join("..", "..", "projects", "testdata", "tee-junction.sweep.json")
	plan := filepath.Join("..", "..", "projects", "testdata", "tee-junction.plan.json")
	// the plan file says face-to-face: hand-worked worst case 36 (see projects' worked example)
	code, out, stderr := runCLI("eval", scen, plan, "--json")
	require.Equal(t, 0, code, stderr)
	assert.Contains(t, out, `"model": "face-to-face"`)
	assert.Contains(t, out, `"evacuated_at": 36`)
	code, out, stderr = runCLI("eval", scen, plan, "--model", "radio")
	require.Equal(t, 0, code, stderr)
	assert.Contains(t, out, "Worst case:     00:26 (26.0 s), exit at c (Long end)")
	// no model in the file: radio
	noModel := filepath.Join(dir, "p.json")
	require.NoError(t, os.WriteFile(noModel, []byte(`{"routes": [{"agent": "Alpha", "waypoints": [{"t": 14, "node": "b"}]}, {"agent": "Bravo", "waypoints": [{"t": 16, "node": "c"}]}]}`), 0o644))
	code, out, _ = runCLI("eval", scen, noModel)
	require.Equal(t, 0, code)
	assert.Contains(t, out, "Model:          radio")
}

func TestCompare(t *testing.T) {
	if len(planners.Planners()) == 0 {
		t.Skip("no planner registered yet (engine planners are written in parallel)")
	}
	code, out, stderr := runCLI("compare", demoFile(t), "--seconds", "0.2")
	require.Equal(t, 0, code, stderr)
	for _, info := range planners.Planners() {
		for _, m := range engine.Models {
			line := findLine(out, info.Name, m.String())
			require.NotEmpty(t, line, "row for %s %s", info.Name, m)
			if !info.Supports(m) {
				assert.Contains(t, line, "n/a")
			}
		}
	}
	assert.Contains(t, out, "radio best under face-to-face")
	assert.Contains(t, out, "face-to-face best under radio")
}

// findLine returns the first table line whose first two columns are planner and model.
func findLine(out, planner, model string) string {
	for _, l := range strings.Split(out, "\n") {
		f := strings.Fields(l)
		if len(f) >= 2 && f[0] == planner && f[1] == model {
			return l
		}
	}
	return ""
}

func TestBadInput(t *testing.T) {
	dir := t.TempDir()
	demo := demoFile(t)
	bad := filepath.Join(dir, "bad.sweep.json")
	require.NoError(t, os.WriteFile(bad, []byte(`{"format": "duosweep-scenario", "version": 1, "start": "s", "nodes": [{"id": "s"}, {"id": "a"}], "corridors": [{"from": "s", "to": "a", "length": -3}]}`), 0o644))
	notJSON := filepath.Join(dir, "x.json")
	require.NoError(t, os.WriteFile(notJSON, []byte("hello"), 0o644))
	badPlan := filepath.Join(dir, "plan.json")
	require.NoError(t, os.WriteFile(badPlan, []byte(`{"routes": [{"waypoints": [{"t": 500, "node": "j9"}]}]}`), 0o644))
	cases := []struct {
		args []string
		want []string
	}{
		{[]string{"frobnicate"}, []string{`"frobnicate": unknown subcommand`}},
		{[]string{"help", "frobnicate"}, []string{`"frobnicate": unknown subcommand`}},
		{[]string{"plan"}, []string{"plan: missing argument: want SCENARIO"}},
		{[]string{"plan", demo, demo}, []string{"unexpected argument"}},
		{[]string{"plan", demo, "--colour", "red"}, []string{"flag provided but not defined: -colour"}},
		{[]string{"plan", filepath.Join(dir, "missing.sweep.json")}, []string{"missing.sweep.json: cannot open: no such file"}},
		{[]string{"plan", bad}, []string{bad, "corridors[0].length: -3"}},
		{[]string{"plan", notJSON}, []string{notJSON, "not a scenario file"}},
		{[]string{"plan", demo, "--model", "semaphore"}, []string{`--model: "semaphore"`}},
		{[]string{"plan", demo, "--planner", "teleport"}, []string{`--planner: "teleport": unknown planner`}},
		{[]string{"plan", demo, "--seconds", "-1"}, []string{"--seconds: -1"}},
		{[]string{"plan", demo, "--seconds", "abc"}, []string{`invalid value "abc" for flag -seconds`}},
		{[]string{"eval", demo}, []string{"missing argument: want SCENARIO PLAN"}},
		{[]string{"eval", demo, filepath.Join(dir, "nope.json")}, []string{"nope.json: cannot open"}},
		{[]string{"eval", demo, badPlan}, []string{badPlan, `routes[0].waypoints[0].node: "j9": no node has this id`}},
		{[]string{"eval", demo, demo}, []string{"routes: missing"}},
		{[]string{"eval", demo, badPlan, "--model", "x"}, []string{`--model: "x"`}},
		{[]string{"compare", bad}, []string{"corridors[0].length: -3"}},
		{[]string{"compare", demo, "--seconds", "NaN"}, []string{"--seconds: NaN"}},
		{[]string{"bounds"}, []string{"missing argument"}},
		{[]string{"bounds", bad}, []string{"corridors[0].length: -3"}},
		{[]string{"gen", "--family", "bush"}, []string{`--family: "bush"`}},
		{[]string{"gen", "--nodes", "0"}, []string{"--nodes: 0"}},
		{[]string{"gen", "--nodes", "ten"}, []string{`invalid value "ten" for flag -nodes`}},
		{[]string{"gen", "extra"}, []string{`"extra": unexpected argument`}},
		{[]string{"gen", "--out", filepath.Join(dir, "no", "such", "dir.json")}, []string{"no such file or directory"}},
		{[]string{"demo", filepath.Join(dir, "no", "x.json")}, []string{"no such file or directory"}},
		{[]string{"demo", "a", "b"}, []string{"unexpected argument"}},
	}
	for _, c := range cases {
		t.Run(strings.Join(c.args, " "), func(t *testing.T) {
			code, out, errOut := runCLI(c.args...)
			assert.Equal(t, 2, code, errOut)
			assert.Empty(t, out)
			assert.Equal(t, 1, strings.Count(errOut, "\n"), "one line: %q", errOut)
			assert.True(t, strings.HasPrefix(errOut, "duosweep-cli"), errOut)
			for _, w := range c.want {
				assert.Contains(t, errOut, w)
			}
		})
	}
}

func TestPanicBecomesExit3(t *testing.T) {
	register(command{name: "test-panic", summary: "test only", run: func(*env, []string) error { panic("boom") }})
	defer delete(commands, "test-panic")
	code, _, errOut := runCLI("test-panic")
	assert.Equal(t, 3, code)
	assert.Equal(t, "duosweep-cli: internal error (please report): boom\n", errOut)
}
