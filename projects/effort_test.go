package projects

import (
	"bytes"
	"math"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"duosweep/engine"
)

func TestLoadEffortFinishModel(t *testing.T) {
	sc, err := LoadFile("testdata/slow-drift.sweep.json")
	require.NoError(t, err)
	require.NotNil(t, sc.Corridors[0].Effort)
	assert.Equal(t, 0.5, *sc.Corridors[0].Effort)
	assert.Equal(t, 2.5, *sc.Corridors[1].Effort)
	assert.Nil(t, sc.Corridors[2].Effort, "absent effort stays absent (1)")
	require.NotNil(t, sc.Finish)
	assert.Equal(t, "base", sc.Finish.Node)
	assert.Equal(t, 0.6, *sc.Finish.Speed)
	assert.Equal(t, "face-to-face", sc.Model)
	s, err := engine.NewSite(sc)
	require.NoError(t, err)
	m, ok := s.PlannedModel()
	assert.True(t, ok)
	assert.Equal(t, engine.FaceToFace, m)

	// a finish without a speed: the slower agent's
	sc, err = load(t, strings.Replace(base, `"length": 4}]`, `"length": 4}], "finish": {"node": "a"}`, 1))
	require.NoError(t, err)
	assert.Nil(t, sc.Finish.Speed)

	// an old file has none of them and saves without them
	sc, err = load(t, base)
	require.NoError(t, err)
	assert.Nil(t, sc.Finish)
	assert.Empty(t, sc.Model)
	var buf bytes.Buffer
	require.NoError(t, Save(&buf, sc))
	for _, f := range []string{"effort", "finish", "model"} {
		assert.NotContains(t, buf.String(), `"`+f+`"`)
	}
}

// TestLoadEffortFinishInvalid: bad values are refused naming field and value.
func TestLoadEffortFinishInvalid(t *testing.T) {
	r := func(old, new string) string {
		require.Contains(t, base, old)
		return strings.Replace(base, old, new, 1)
	}
	c1 := func(extra string) string { return r(`"length": 4}`, `"length": 4, `+extra+`}`) }
	top := func(extra string) string { return r(`"length": 4}]`, `"length": 4}], `+extra) }
	cases := []struct {
		name, in string
		want     []string
	}{
		{"effort zero", c1(`"effort": 0`), []string{"corridors[1].effort: 0", "> 0"}},
		{"effort negative", c1(`"effort": -2`), []string{"corridors[1].effort: -2"}},
		{"effort text", c1(`"effort": "slow"`), []string{"corridors[1].effort", `"slow"`, "not a number"}},
		{"effort NaN", c1(`"effort": NaN`), []string{"not a scenario file"}},
		{"effort NaN text", c1(`"effort": "NaN"`), []string{"corridors[1].effort", `"NaN"`, "not a number"}},
		{"effort absurd", c1(`"effort": 250`), []string{"corridors[1].effort: 250", "at most 100"}},
		{"effort overflow", c1(`"effort": 1e999`), []string{"corridors[1].effort: 1e999", "not a finite number"}},
		{"finish unknown node", top(`"finish": {"node": "shaft"}`), []string{"finish.node: shaft", "no node has this id"}},
		{"finish without node", top(`"finish": {"speed": 1}`), []string{"finish.node: missing"}},
		{"finish not an object", top(`"finish": "s"`), []string{"finish", `"s"`}},
		{"carry speed zero", top(`"finish": {"node": "s", "speed": 0}`), []string{"finish.speed: 0", "> 0"}},
		{"carry speed negative", top(`"finish": {"node": "s", "speed": -1}`), []string{"finish.speed: -1"}},
		{"carry speed text", top(`"finish": {"node": "s", "speed": "slow"}`), []string{"finish.speed", `"slow"`}},
		{"model unknown", top(`"model": "semaphore"`), []string{"model: semaphore", "unknown communication model"}},
		{"model not text", top(`"model": 3`), []string{"model: 3", "not a string"}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			sc, err := load(t, c.in)
			require.Error(t, err)
			assert.Equal(t, engine.Scenario{}, sc, "nothing half-loaded")
			for _, w := range c.want {
				assert.Contains(t, err.Error(), w)
			}
		})
	}
}

// slowDrift plans the slow-drift test site with the best published planner.
func slowDrift(t *testing.T, m engine.Model) (*engine.Site, *engine.Plan, *engine.Report) {
	t.Helper()
	_, s, err := LoadSiteFile("testdata/slow-drift.sweep.json")
	require.NoError(t, err)
	// a hand-made plan with a corridor-interior waypoint on the slow corridor:
	// Lead goes to far, Second into the low corridor 12 m (real) and back to j1
	// and low. Worked by hand below.
	j1, _ := s.Index("j1")
	low, _ := s.Index("low")
	far, _ := s.Index("far")
	p := &engine.Plan{Routes: [2]engine.Route{
		{Waypoints: []engine.Waypoint{{P: engine.At(far), T: 80.0 / 1.2}}},
		{Waypoints: []engine.Waypoint{
			{P: engine.Point{From: j1, To: low, Offset: s.WeightedOffset(j1, low, 12)}, T: 20 + 30},
			{P: engine.At(low), T: 20 + 75},
		}},
	}}
	r, err := engine.Evaluate(s, p, m)
	require.NoError(t, err)
	return s, p, r
}

// TestSlowDriftByHand: figures derived by hand. Effort-weighted lengths:
// base–j1 40·0.5 = 20, j1–low 30·2.5 = 75, j1–far 60. Lead (1.2 m/s) passes
// j1 at 20/1.2 = 16.67 s and reaches far at 80/1.2 = 66.67 s. Second (1 m/s)
// is at j1 at 20, 12 m (real) = 30 weighted into j1–low at 50, at low at 95.
// Radio, carry speed 0.6:
//   - j1: found by Lead at 16.67; Second, on base–j1, gets there at 20:
//     evac 20; carry 20/0.6 = 33.33: done 53.33.
//   - far: found at 66.67; Second is 30 + 16.67 = 46.67 along j1–low, so
//     46.67 + 60 = 106.67 from far: evac 173.33; carry 80/0.6 = 133.33:
//     done 306.67.
//   - low: found by Second at 95; Lead at far walks 60 + 75 = 135 at 1.2:
//     112.5, evac 207.5; carry 95/0.6 = 158.33: done 365.83, the worst.
func TestSlowDriftByHand(t *testing.T) {
	s, p, r := slowDrift(t, engine.Radio)
	require.True(t, r.OverDone)
	near := func(a, b float64) bool { return math.Abs(a-b) < 1e-9 }
	for id, want := range map[string][2]float64{"j1": {20, 20 + 20/0.6}, "far": {66.0 + 2.0/3 + 106.0 + 2.0/3, 173.0 + 1.0/3 + 80/0.6}, "low": {207.5, 207.5 + 95/0.6}} {
		v, _ := s.Index(id)
		ex, _ := r.ExitFor(v)
		assert.True(t, near(ex.EvacAt, want[0]) && near(ex.DoneAt, want[1]), "%s: evac %v done %v, want %v", id, ex.EvacAt, ex.DoneAt, want)
	}
	low, _ := s.Index("low")
	assert.Equal(t, low, r.WorstExit)

	// the report: real offsets, done_at, worst over done_at
	var buf bytes.Buffer
	require.NoError(t, WriteReport(&buf, s, p, r))
	out := buf.String()
	assert.Contains(t, out, `"offset": 12`, "the waypoint's offset is the real 12 m, not the weighted 30")
	assert.Contains(t, out, `"worst_over": "done_at"`)
	assert.Contains(t, out, `"done_at"`)
	golden(t, "slow-drift.report-radio.json", buf.Bytes())

	// the plan reads back with the same (weighted) offsets and figures
	back, err := ReadPlan(bytes.NewReader(buf.Bytes()), s)
	require.NoError(t, err)
	r2, err := engine.Evaluate(s, back, engine.Radio)
	require.NoError(t, err)
	assert.True(t, near(r.Worst, r2.Worst))
	assert.True(t, near(back.Routes[1].Waypoints[0].P.Offset, 30))

	buf.Reset()
	require.NoError(t, WriteItinerary(&buf, s, p, r))
	out = buf.String()
	assert.Contains(t, out, "12.0 m along j1–low from j1")
	assert.Contains(t, out, "effort ×2.5")
	assert.Contains(t, out, "low: reached 03:27, carry the casualty to base: 70.0 m, effort ×1.36 (walks like 95.0 m), 02:38, out at 06:05")
	golden(t, "slow-drift.itinerary-radio.txt", buf.Bytes())
}

// TestReportWithoutFinishUnchanged: no done_at or worst_over without a finish.
func TestReportWithoutFinishUnchanged(t *testing.T) {
	s := teeSite(t)
	p, _ := teePlan(t, s)
	r, err := engine.Evaluate(s, p, engine.Radio)
	require.NoError(t, err)
	var buf bytes.Buffer
	require.NoError(t, WriteReport(&buf, s, p, r))
	for _, f := range []string{"done_at", "worst_over", "finish", "LB1_time"} {
		assert.NotContains(t, buf.String(), f)
	}
}

// TestEffortFinishRoundTripProperty: random effort factors, finishes and
// models on the testdata sites save and load back to an equal scenario with
// the same site figures; reports of random plans keep offsets within the
// corridor's real length and read back to the same evaluation.
func TestEffortFinishRoundTripProperty(t *testing.T) {
	sc0, err := LoadFile("testdata/tee-junction.sweep.json")
	require.NoError(t, err)
	for seed := 0; seed < 200; seed++ {
		sc := sc0.Clone()
		k := seed
		next := func(n int) int { k = (k*1103515245 + 12345) & 0x7fffffff; return k % n }
		for i := range sc.Corridors {
			if next(2) == 0 {
				e := []float64{0.25, 0.5, 1, 1.8, 2.5, 7.25, 100}[next(7)]
				sc.Corridors[i].Effort = &e
			}
		}
		if next(3) > 0 {
			sc.Finish = &engine.Finish{Node: sc.Nodes[next(len(sc.Nodes))].ID}
			if next(2) == 0 {
				v := 0.1 + float64(next(100))/50
				sc.Finish.Speed = &v
			}
		}
		sc.Model = []string{"", "radio", "face-to-face"}[next(3)]
		var buf bytes.Buffer
		require.NoError(t, Save(&buf, sc))
		back, err := Load(bytes.NewReader(buf.Bytes()))
		require.NoError(t, err, "seed %d:\n%s", seed, buf.String())
		require.Equal(t, sc, back, "seed %d", seed)

		s, err := engine.NewSite(back)
		require.NoError(t, err)
		for _, m := range engine.Models {
			p := &engine.Plan{}
			// every corridor's midpoint, then every node, by agent in turn
			for i := range s.EU {
				u, v := int(s.EU[i]), int(s.EV[i])
				p.Routes[i%2].Waypoints = append(p.Routes[i%2].Waypoints, engine.Waypoint{P: engine.Point{From: u, To: v, Offset: s.EW[i] / 2}})
			}
			for v := 0; v < s.N; v++ {
				p.Routes[v%2].Waypoints = append(p.Routes[v%2].Waypoints, engine.Waypoint{P: engine.At(v)})
			}
			for a := 0; a < 2; a++ {
				// times: as soon as the agent can be there
				tr := 0.0
				cur := engine.At(s.Start)
				for j := range p.Routes[a].Waypoints {
					wp := &p.Routes[a].Waypoints[j]
					tr += s.PointDist(cur, wp.P) / s.Speed[a]
					wp.T, cur = tr, wp.P
				}
			}
			r, err := engine.Evaluate(s, p, m)
			require.NoError(t, err)
			buf.Reset()
			require.NoError(t, WriteReport(&buf, s, p, r))
			q, err := ReadPlan(bytes.NewReader(buf.Bytes()), s)
			require.NoError(t, err, "seed %d", seed)
			r2, err := engine.Evaluate(s, q, m)
			require.NoError(t, err)
			require.InDelta(t, r.Worst, r2.Worst, 1e-6*math.Max(1, r.Worst), "seed %d", seed)
			require.Equal(t, r.OverDone, back.Finish != nil)
			for i, wp := range q.Routes[0].Waypoints {
				if wp.P.To >= 0 {
					assert.InDelta(t, p.Routes[0].Waypoints[i].P.Offset, wp.P.Offset, 1e-9*math.Max(1, wp.P.Offset))
				}
			}
		}
	}
}
