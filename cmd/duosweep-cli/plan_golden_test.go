package main

import (
	"bytes"
	"context"
	"crypto/sha256"
	"encoding/hex"
	"encoding/json"
	"fmt"
	"os"
	"path/filepath"
	"testing"

	"github.com/stretchr/testify/require"

	"duosweep/engine"
	"duosweep/engine/gen"
	"duosweep/engine/planners"
	"duosweep/projects"
)

// The plan golden test pins the behaviour of every deterministic planner:
// for each generated site below and each model it records the worst case,
// worst exit and expected time of `duosweep-cli plan --json` (and a SHA-256
// of the whole JSON report, so that every per-exit time, route and bound is
// pinned too). It was recorded before the engine was split into packages
// and must pass unchanged after any refactor. Regenerate with
//
//	go test ./cmd/duosweep-cli -run TestPlanGolden -update
//
// The improve rows call the CLI's own makePlan with an iteration cap (the
// CLI has no flag for one; with only --seconds it would not be
// deterministic).

type goldenSite struct {
	family string
	n      int
	seed   int64
	// variant: "" (as generated), "speeds" (B walks at 1.5), "probs"
	// (probabilities 1..k on the candidates, normalised).
	variant string
}

func (g goldenSite) name() string {
	s := fmt.Sprintf("%s-%d-s%d", g.family, g.n, g.seed)
	if g.variant != "" {
		s += "-" + g.variant
	}
	return s
}

var goldenSites = func() []goldenSite {
	var out []goldenSite
	for _, f := range gen.Families {
		for _, n := range []int{8, 12, 60, 300} {
			out = append(out, goldenSite{family: f, n: n, seed: 3})
		}
	}
	out = append(out,
		goldenSite{"random", 9, 11, "speeds"},
		goldenSite{"random", 80, 11, "speeds"},
		goldenSite{"spider", 10, 5, "probs"},
		goldenSite{"caterpillar", 90, 5, "probs"},
		goldenSite{"binary", 10, 2, "speeds"},
		goldenSite{"star", 40, 2, "probs"},
	)
	return out
}()

// goldenPlanners lists the rows per site: "" is the default (best available).
var goldenPlanners = []string{"", "together", "opposite-tours", "spine-split", "hub-rendezvous", "exhaustive", "improve"}

const goldenImproveIterations = 400

type goldenRow struct {
	Site      string   `json:"site"`
	Planner   string   `json:"planner"`
	Model     string   `json:"model"`
	Error     string   `json:"error,omitempty"`
	Made      string   `json:"made_by,omitempty"` // the planner named in the report
	Worst     *float64 `json:"worst"`
	WorstExit *string  `json:"worst_exit"`
	Expected  *float64 `json:"expected,omitempty"`
	SHA256    string   `json:"report_sha256,omitempty"`
}

func goldenScenario(t *testing.T, g goldenSite) engine.Scenario {
	sc, err := gen.Generate(g.family, g.n, g.seed)
	require.NoError(t, err)
	switch g.variant {
	case "speeds":
		sc.Agents[1].Speed = 1.5
	case "probs":
		tot := 0.0
		for i := range sc.Nodes {
			if sc.Nodes[i].Candidate {
				tot += float64(1 + i%5)
			}
		}
		for i := range sc.Nodes {
			if sc.Nodes[i].Candidate {
				sc.Nodes[i].Probability = float64(1+i%5) / tot
				sc.Nodes[i].HasProbability = true
			}
		}
	}
	return sc
}

// goldenExhaustive says whether exhaustive is run on a site: only small
// ones, where the search finishes well inside its time limit.
func goldenExhaustive(g goldenSite) bool { return g.n <= 12 }

func TestPlanGolden(t *testing.T) {
	dir := t.TempDir()
	var rows []goldenRow
	for _, g := range goldenSites {
		sc := goldenScenario(t, g)
		path := filepath.Join(dir, g.name()+".sweep.json")
		require.NoError(t, projects.SaveFile(path, sc))
		for _, m := range []engine.Model{engine.Radio, engine.FaceToFace} {
			for _, pl := range goldenPlanners {
				if pl == "exhaustive" && !goldenExhaustive(g) {
					continue
				}
				if testing.Short() && (pl == "exhaustive" || pl == "improve") && g.n > 10 {
					continue
				}
				row := goldenRow{Site: g.name(), Planner: pl, Model: m.String()}
				var out string
				if pl == "improve" {
					var buf, errBuf bytes.Buffer
					e := &env{ctx: context.Background(), stdout: &buf, stderr: &errBuf, name: "plan"}
					_, s, err := projects.LoadSiteFile(path)
					require.NoError(t, err)
					p, r, err := makePlan(e, s, pl, m, planners.Options{Seed: 1, Iterations: goldenImproveIterations, Progress: func(planners.Progress) {}})
					if err != nil {
						row.Error = err.Error()
					} else {
						require.NoError(t, projects.WriteReport(&buf, s, p, r))
						out = buf.String()
					}
				} else {
					args := []string{"plan", path, "--model", m.String(), "--json"}
					if pl != "" {
						args = append(args, "--planner", pl)
					}
					code, stdout, stderr := runCLI(args...)
					if code != 0 {
						row.Error = stderr
					}
					out = stdout
				}
				if out != "" {
					var rep struct {
						Worst struct {
							Node        *string  `json:"node"`
							EvacuatedAt *float64 `json:"evacuated_at"`
						} `json:"worst"`
						Expected *float64 `json:"expected"`
						Planner  string   `json:"planner"`
					}
					require.NoError(t, json.Unmarshal([]byte(out), &rep), "%s %s %s", g.name(), pl, m)
					row.Worst, row.WorstExit, row.Expected, row.Made = rep.Worst.EvacuatedAt, rep.Worst.Node, rep.Expected, rep.Planner
					h := sha256.Sum256([]byte(out))
					row.SHA256 = hex.EncodeToString(h[:])
				}
				rows = append(rows, row)
			}
		}
	}
	golden := filepath.Join("testdata", "plan_golden.json")
	if *update && !testing.Short() {
		got, err := json.MarshalIndent(rows, "", " ")
		require.NoError(t, err)
		require.NoError(t, os.WriteFile(golden, append(got, '\n'), 0o644))
		return
	}
	data, err := os.ReadFile(golden)
	require.NoError(t, err)
	var want []goldenRow
	require.NoError(t, json.Unmarshal(data, &want))
	if !testing.Short() {
		require.Equal(t, want, rows)
		return
	}
	// -short runs a subset of the rows: each must match its golden row
	byKey := map[string]goldenRow{}
	for _, w := range want {
		byKey[w.Site+"/"+w.Planner+"/"+w.Model] = w
	}
	for _, r := range rows {
		w, ok := byKey[r.Site+"/"+r.Planner+"/"+r.Model]
		require.True(t, ok, "no golden row for %s/%s/%s", r.Site, r.Planner, r.Model)
		require.Equal(t, w, r)
	}
}
