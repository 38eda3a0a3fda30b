package projects

import (
	"bytes"
	stdjson "encoding/json"
	"math"
	"os"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"duosweep/engine"
)

func teeSite(t *testing.T) *engine.Site {
	t.Helper()
	sc, err := LoadFile("testdata/tee-junction.sweep.json")
	require.NoError(t, err)
	s, err := engine.NewSite(sc)
	require.NoError(t, err)
	return s
}

func teePlan(t *testing.T, s *engine.Site) (*engine.Plan, PlanHeader) {
	t.Helper()
	f, err := os.Open("testdata/tee-junction.plan.json")
	require.NoError(t, err)
	defer f.Close()
	p, h, err := ReadPlanHeader(f, s)
	require.NoError(t, err)
	return p, h
}

// TestTeeJunctionWorkedExample checks the report figures of a hand-made plan
// on the tee junction (s–a 10 m, a–b 4 m, a–c 6 m, speeds 1) against values
// derived by hand from MODEL.md:
//
//	Alpha walks to b (t=14) and waits there (rendezvous at t=20); Bravo walks to c (t=16).
//	radio:  b found 14 by Alpha, Bravo then 4 m past a towards c: 14 + 8 = 22;
//	        c found 16 by Bravo, Alpha at b: 16 + 10 = 26. Worst 26 at c.
//	face-to-face: b: Bravo cannot be caught before c, so Alpha meets him at c
//	        at 14 + 10 = 24, both back to b: 34; c: Alpha waits at b (its
//	        rendezvous at 20 is after 16), Bravo fetches him: 26, back to c: 36.
//	bounds: W = 20, L = 16 (c), L2 = 4 (b leaves P at a), LB2 = 24, LB = 24.
//	expected (p(b) = 0.25, p(c) = 0.75): radio 25, face-to-face 35.5.
func TestTeeJunctionWorkedExample(t *testing.T) {
	s := teeSite(t)
	p, h := teePlan(t, s)
	assert.True(t, h.HasModel)
	assert.Equal(t, engine.FaceToFace, h.Model)
	// Bravo's route came first in the file but is matched by name
	assert.Len(t, p.Routes[0].Waypoints, 2)
	assert.True(t, p.Routes[0].Waypoints[1].Rendezvous)
	assert.Equal(t, engine.Point{From: 1, To: 3, Offset: 3}, p.Routes[1].Waypoints[0].P)

	radio, f2f, err := engine.EvaluateBoth(s, p)
	require.NoError(t, err)
	exit := func(r *engine.Report, id string) engine.ExitResult {
		v, _ := s.Index(id)
		ex, ok := r.ExitFor(v)
		require.True(t, ok)
		return ex
	}
	assert.InDelta(t, 22, exit(radio, "b").EvacAt, 1e-9)
	assert.InDelta(t, 26, exit(radio, "c").EvacAt, 1e-9)
	assert.InDelta(t, 34, exit(f2f, "b").EvacAt, 1e-9)
	assert.InDelta(t, 36, exit(f2f, "c").EvacAt, 1e-9)
	assert.InDelta(t, 25, radio.Expected, 1e-9)
	assert.InDelta(t, 35.5, f2f.Expected, 1e-9)
	assert.InDelta(t, 24, radio.Bounds.LB, 1e-9)

	var buf bytes.Buffer
	require.NoError(t, WriteReport(&buf, s, p, radio))
	golden(t, "tee-junction.report-radio.json", buf.Bytes())
	var got map[string]any
	require.NoError(t, stdjson.Unmarshal(buf.Bytes(), &got), "encoding/json reads the report")
	assert.Equal(t, "duosweep-report", got["format"])
	assert.Equal(t, 1.0, got["version"])
	assert.Equal(t, "radio", got["model"])
	assert.Equal(t, map[string]any{"node": "c", "evacuated_at": 26.0}, got["worst"])
	assert.Equal(t, map[string]any{"W": 20.0, "L": 16.0, "L2": 4.0, "lower_bound": 24.0}, got["bounds"])
	assert.InDelta(t, 26.0/24-1, got["gap"], 1e-12)
	assert.Equal(t, 25.0, got["expected"])
	assert.Equal(t, true, got["complete"])
	exits := got["exits"].([]any)
	require.Len(t, exits, 2)
	assert.Equal(t, map[string]any{"node": "b", "found_at": 14.0, "finder": "Alpha", "evacuated_at": 22.0}, exits[0])
	routes := got["routes"].([]any)
	alpha := routes[0].(map[string]any)
	assert.Equal(t, "Alpha", alpha["agent"])
	wps := alpha["waypoints"].([]any)
	assert.Equal(t, map[string]any{"t": 14.0, "node": "b"}, wps[0], "rendezvous only written when true")
	assert.Equal(t, map[string]any{"t": 20.0, "node": "b", "rendezvous": true}, wps[1])
	bravo := routes[1].(map[string]any)["waypoints"].([]any)
	assert.Equal(t, map[string]any{"t": 13.0, "from": "a", "to": "c", "offset": 3.0}, bravo[0])

	buf.Reset()
	require.NoError(t, WriteReport(&buf, s, p, f2f))
	golden(t, "tee-junction.report-face-to-face.json", buf.Bytes())

	// the report is itself a plan file: reading it back gives the same routes
	back, h2, err := ReadPlanHeader(bytes.NewReader(buf.Bytes()), s)
	require.NoError(t, err)
	assert.Equal(t, p.Routes, back.Routes)
	assert.Equal(t, engine.FaceToFace, h2.Model)

	for _, r := range []*engine.Report{radio, f2f} {
		buf.Reset()
		require.NoError(t, WriteItinerary(&buf, s, p, r))
		golden(t, "tee-junction.itinerary-"+r.Model.String()+".txt", buf.Bytes())
		out := buf.String()
		assert.True(t, strings.HasSuffix(out, Disclaimer+"\n"))
		assert.Contains(t, out, "00:14  walk to b (Short end), 14.0 m via a")
		assert.Contains(t, out, "00:20  wait at b (Short end) until 00:20 (6.0 s)")
		assert.Contains(t, out, "rendezvous with Bravo at b")
		assert.Contains(t, out, "00:13  walk to 3.0 m along a–c from a, 13.0 m")
	}
}

func TestReportIncomplete(t *testing.T) {
	s := teeSite(t)
	b, _ := s.Index("b")
	p := &engine.Plan{Planner: "hand"}
	p.Routes[0].Waypoints = []engine.Waypoint{{P: engine.At(b), T: 14}}
	r, err := engine.Evaluate(s, p, engine.Radio)
	require.NoError(t, err)
	require.False(t, r.Complete)
	var buf bytes.Buffer
	require.NoError(t, WriteReport(&buf, s, p, r))
	var got map[string]any
	require.NoError(t, stdjson.Unmarshal(buf.Bytes(), &got))
	assert.Equal(t, map[string]any{"node": "c", "evacuated_at": nil}, got["worst"])
	assert.Nil(t, got["gap"])
	assert.Nil(t, got["expected"])
	assert.Equal(t, []any{"c"}, got["unvisited"])
	exits := got["exits"].([]any)
	assert.Equal(t, map[string]any{"node": "c", "found_at": nil, "finder": nil, "evacuated_at": nil}, exits[1])
	buf.Reset()
	require.NoError(t, WriteItinerary(&buf, s, p, r))
	assert.Contains(t, buf.String(), "Worst case:     never, exit at c (Long end)")
	assert.Contains(t, buf.String(), "INCOMPLETE:     no route visits c (Long end)")
}

func TestReadPlanErrors(t *testing.T) {
	s := teeSite(t)
	cases := []struct{ in, want string }{
		{`{`, "projects: not a plan file"},
		{`{"model": "radio"}`, "projects: routes: missing"},
		{`{"model": "walkie", "routes": []}`, `projects: model: "walkie"`},
		{`{"routes": [{"waypoints": []}, {"waypoints": []}, {"waypoints": []}]}`, "projects: routes: 3 routes"},
		{`{"routes": [{"agent": "Zed", "waypoints": []}]}`, `projects: routes[0].agent: "Zed": no agent has this name`},
		{`{"routes": [{"agent": "Alpha", "waypoints": []}, {"agent": "Alpha", "waypoints": []}]}`, `projects: routes[1].agent: "Alpha": this agent already has a route`},
		{`{"routes": [{"waypoints": [{"t": 10, "node": "a"}]}, {"waypoints": [{"t": 1, "node": "a"}, {"t": 20, "node": "j9"}]}]}`, `projects: routes[1].waypoints[1].node: "j9": no node has this id`},
		{`{"routes": [{"waypoints": [{"node": "a"}]}]}`, "projects: routes[0].waypoints[0].t: missing"},
		{`{"routes": [{"waypoints": [{"t": 1e999, "node": "a"}]}]}`, "projects: routes[0].waypoints[0].t: 1e999: not a finite number"},
		{`{"routes": [{"waypoints": [{"t": 10}]}]}`, "projects: routes[0].waypoints[0].node: missing"},
		{`{"routes": [{"waypoints": [{"t": 10, "from": "s", "to": "b", "offset": 1}]}]}`, `projects: routes[0].waypoints[0].to: "s"-"b": no corridor joins these nodes`},
		{`{"routes": [{"waypoints": [{"t": 10, "from": "a", "to": "b", "offset": 9}]}]}`, "projects: routes[0].waypoints[0].offset: 9"},
		{`{"routes": [{"waypoints": [{"t": 10, "from": "a", "to": "b"}]}]}`, "projects: routes[0].waypoints[0].offset: missing"},
		{`{"routes": [{"waypoints": [{"t": 5, "node": "a"}]}]}`, "projects: routes[0]: route of Alpha, waypoint 0: t=5 but the earliest arrival at full speed is t=10"},
		{`{"routes": [{"waypoints": null}]}`, "projects: routes[0].waypoints: missing"},
	}
	for _, c := range cases {
		_, err := ReadPlan(strings.NewReader(c.in), s)
		if assert.Error(t, err, c.in) {
			assert.Contains(t, err.Error(), c.want, c.in)
		}
	}
	// by order when names are absent; a single route leaves the other agent at the start
	p, err := ReadPlan(strings.NewReader(`{"routes": [{"waypoints": [{"t": 10, "node": "a"}]}]}`), s)
	require.NoError(t, err)
	assert.Len(t, p.Routes[0].Waypoints, 1)
	assert.Empty(t, p.Routes[1].Waypoints)
	p, err = ReadPlan(strings.NewReader(`{"routes": [{"waypoints": []}, {"agent": "Alpha", "waypoints": [{"t": 10, "node": "a"}]}]}`), s)
	require.NoError(t, err)
	assert.Len(t, p.Routes[0].Waypoints, 1, "the named route goes to Alpha, the unnamed one to Bravo")
}

func TestFormatDuration(t *testing.T) {
	cases := []struct {
		in   float64
		want string
	}{
		{0, "00:00"}, {34.58, "00:34"}, {59.9999999999, "01:00"}, {61, "01:01"}, {599, "09:59"},
		{3599.9, "59:59"}, {3600, "1:00:00"}, {3725, "1:02:05"}, {36000 + 62, "10:01:02"},
		{math.Inf(1), "never"}, {math.NaN(), "n/a"}, {-5, "-00:05"},
	}
	for _, c := range cases {
		assert.Equal(t, c.want, engine.FormatClock(c.in), "%g", c.in)
	}
}
