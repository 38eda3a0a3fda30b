package projects

import (
	"fmt"
	"io"
	"math"

	json "github.com/goccy/go-json"

	"duosweep/engine"
)

// ReportFormat is the "format" value of a plan report.
const ReportFormat = "duosweep-report"

// ReportVersion is the plan report format version.
const ReportVersion = 1

type outReport struct {
	Format       string           `json:"format"`
	Version      int              `json:"version"`
	Scenario     string           `json:"scenario"`
	Unit         string           `json:"unit"`
	Model        string           `json:"model"`
	Planner      string           `json:"planner"`
	Note         string           `json:"note,omitempty"`
	Routes       []outRoute       `json:"routes"`
	Exits        []outExit        `json:"exits"`
	Worst        outWorst         `json:"worst"`
	Expected     *float64         `json:"expected"`
	Bounds       outBounds        `json:"bounds"`
	LowerBounds  outLowerBounds   `json:"lower_bounds"`
	Gap          *float64         `json:"gap"`
	Complete     bool             `json:"complete"`
	Unvisited    []string         `json:"unvisited"`
	RouteLengths []outRouteLength `json:"route_lengths"`
}

type outRoute struct {
	Agent     string        `json:"agent"`
	Waypoints []outWaypoint `json:"waypoints"`
}

type outWaypoint struct {
	T          float64  `json:"t"`
	Node       string   `json:"node,omitempty"`
	From       string   `json:"from,omitempty"`
	To         string   `json:"to,omitempty"`
	Offset     *float64 `json:"offset,omitempty"`
	Rendezvous bool     `json:"rendezvous,omitempty"`
}

type outExit struct {
	Node        string   `json:"node"`
	FoundAt     *float64 `json:"found_at"`
	Finder      *string  `json:"finder"`
	EvacuatedAt *float64 `json:"evacuated_at"`
}

type outWorst struct {
	Node        *string  `json:"node"`
	EvacuatedAt *float64 `json:"evacuated_at"`
}

type outBounds struct {
	W          float64 `json:"W"`
	L          float64 `json:"L"`
	L2         float64 `json:"L2"`
	LowerBound float64 `json:"lower_bound"`
}

type outLowerBounds struct {
	LB1 float64 `json:"LB1"`
	LB2 float64 `json:"LB2"`
	LB3 float64 `json:"LB3"` // a time (s), 0 when not computed
}

type outRouteLength struct {
	Agent  string  `json:"agent"`
	Length float64 `json:"length"`
}

// finiteOrNil returns nil for an infinite or NaN value (written as JSON null).
func finiteOrNil(x float64) *float64 {
	if math.IsInf(x, 0) || math.IsNaN(x) {
		return nil
	}
	return &x
}

func strp(s string) *string { return &s }

// FinderName returns the name of the agent that finds an exit, "both" for a
// tie, "" when nobody visits it.
func FinderName(s *engine.Site, finder engine.Finder) string {
	if finder == engine.Nobody {
		return ""
	}
	return finder.Name(s.Names)
}

func waypointOut(s *engine.Site, wp engine.Waypoint) outWaypoint {
	o := outWaypoint{T: wp.T, Rendezvous: wp.Rendezvous}
	if wp.P.To < 0 {
		o.Node = s.IDs[wp.P.From]
	} else {
		off := wp.P.Offset
		o.From, o.To, o.Offset = s.IDs[wp.P.From], s.IDs[wp.P.To], &off
	}
	return o
}

func routesOut(s *engine.Site, p *engine.Plan) []outRoute {
	out := make([]outRoute, 2)
	for a := 0; a < 2; a++ {
		out[a] = outRoute{Agent: s.Names[a], Waypoints: []outWaypoint{}}
		for _, wp := range p.Routes[a].Waypoints {
			out[a].Waypoints = append(out[a].Waypoints, waypointOut(s, wp))
		}
	}
	return out
}

// WriteReport writes the plan report of FORMATS.md ("duosweep-report",
// version 1) for plan p evaluated as r on site s. Beyond the fixed fields it
// writes scenario, unit, note, lower_bounds {LB1, LB2 (lengths), LB3 (a time)}, unvisited and
// route_lengths. Infinite times (incomplete plans) are written as null.
func WriteReport(w io.Writer, s *engine.Site, p *engine.Plan, r *engine.Report) error {
	planner := r.Planner
	if planner == "" {
		planner = p.Planner
	}
	o := outReport{
		Format: ReportFormat, Version: ReportVersion,
		Scenario: s.Scenario.Name, Unit: s.Unit(),
		Model: r.Model.String(), Planner: planner, Note: p.Note,
		Routes:    routesOut(s, p),
		Exits:     []outExit{},
		Bounds:    outBounds{W: r.Bounds.W, L: r.Bounds.L, L2: r.Bounds.L2, LowerBound: r.Bounds.LB},
		Gap:       finiteOrNil(r.Gap),
		Complete:  r.Complete,
		Unvisited: []string{},
	}
	for _, ex := range r.Exits {
		e := outExit{Node: s.IDs[ex.Node], FoundAt: finiteOrNil(ex.FoundAt), EvacuatedAt: finiteOrNil(ex.EvacAt)}
		if name := FinderName(s, ex.Finder); name != "" {
			e.Finder = strp(name)
		}
		o.Exits = append(o.Exits, e)
	}
	if r.WorstExit >= 0 {
		o.Worst = outWorst{Node: strp(s.IDs[r.WorstExit]), EvacuatedAt: finiteOrNil(r.Worst)}
	}
	if r.HasExpected {
		o.Expected = finiteOrNil(r.Expected)
	}
	o.LowerBounds = outLowerBounds{LB1: r.Bounds.LB1, LB2: r.Bounds.LB2, LB3: r.Bounds.LB3}
	for _, v := range r.Unvisited {
		o.Unvisited = append(o.Unvisited, s.IDs[v])
	}
	for a := 0; a < 2; a++ {
		o.RouteLengths = append(o.RouteLengths, outRouteLength{Agent: s.Names[a], Length: r.RouteLengths[a]})
	}
	return writeJSON(w, "report", o)
}

// Plan files (the "routes" array of a report; other fields optional).

type wirePlan struct {
	Model   *string     `json:"model"`
	Planner *string     `json:"planner"`
	Routes  []wireRoute `json:"routes"`
}

type wireRoute struct {
	Agent     *string        `json:"agent"`
	Waypoints []wireWaypoint `json:"waypoints"`
}

type wireWaypoint struct {
	T          json.RawMessage `json:"t"`
	Node       *string         `json:"node"`
	From       *string         `json:"from"`
	To         *string         `json:"to"`
	Offset     json.RawMessage `json:"offset"`
	Rendezvous *bool           `json:"rendezvous"`
}

// PlanHeader holds what a plan file says about itself besides its routes.
type PlanHeader struct {
	Model    engine.Model
	HasModel bool   // the file has a "model" field
	Planner  string // the file's "planner" field, "" when absent
}

// ReadPlan reads the routes of a plan file (a report, or any JSON object with
// a "routes" array in the same shape) against site s. Routes are matched to
// agents by name, or by order where a route names no agent; node ids are
// resolved against the site, and the routes are checked to be walkable
// (times never go down nor ask for more than full speed).
func ReadPlan(r io.Reader, s *engine.Site) (*engine.Plan, error) {
	p, _, err := ReadPlanHeader(r, s)
	return p, err
}

// ReadPlanHeader is ReadPlan that also returns the file's model and planner fields.
func ReadPlanHeader(r io.Reader, s *engine.Site) (*engine.Plan, PlanHeader, error) {
	var h PlanHeader
	data, err := io.ReadAll(r)
	if err != nil {
		return nil, h, errf("read: %v", err)
	}
	var w wirePlan
	if err := json.Unmarshal(data, &w); err != nil {
		return nil, h, errf("not a plan file: %v", err)
	}
	if w.Model != nil {
		m, err := engine.ParseModel(*w.Model)
		if err != nil {
			return nil, h, errf("model: %q: want radio or face-to-face", *w.Model)
		}
		h.Model, h.HasModel = m, true
	}
	if w.Planner != nil {
		h.Planner = *w.Planner
	}
	if w.Routes == nil {
		return nil, h, errf("routes: missing")
	}
	if len(w.Routes) > 2 {
		return nil, h, errf("routes: %d routes: a crew has 2 agents", len(w.Routes))
	}
	// match agents: named routes first, then the rest by order
	agentOf := make([]int, len(w.Routes))
	used := [2]bool{}
	for i, rt := range w.Routes {
		agentOf[i] = -1
		if rt.Agent == nil || *rt.Agent == "" {
			continue
		}
		a := -1
		for k := 0; k < 2; k++ {
			if s.Names[k] == *rt.Agent {
				a = k
			}
		}
		if a < 0 {
			return nil, h, errf("routes[%d].agent: %q: no agent has this name (the agents are %q and %q)", i, *rt.Agent, s.Names[0], s.Names[1])
		}
		if used[a] {
			return nil, h, errf("routes[%d].agent: %q: this agent already has a route", i, *rt.Agent)
		}
		agentOf[i], used[a] = a, true
	}
	for i := range w.Routes {
		if agentOf[i] >= 0 {
			continue
		}
		for k := 0; k < 2; k++ {
			if !used[k] {
				agentOf[i], used[k] = k, true
				break
			}
		}
	}
	p := &engine.Plan{Planner: h.Planner, Model: h.Model}
	for i, rt := range w.Routes {
		route, err := routeIn(s, i, rt)
		if err != nil {
			return nil, h, err
		}
		p.Routes[agentOf[i]] = route
	}
	for i := range w.Routes {
		a := agentOf[i]
		if _, err := s.Trajectory(p.Routes[a], a); err != nil {
			return nil, h, &Error{Msg: fmt.Sprintf("projects: routes[%d]: %s", i, trimEngine(err.Error())), Err: err}
		}
	}
	return p, h, nil
}

func routeIn(s *engine.Site, i int, rt wireRoute) (engine.Route, error) {
	var route engine.Route
	if rt.Waypoints == nil {
		return route, errf("routes[%d].waypoints: missing", i)
	}
	nodeID := func(field string, id *string) (int, error) {
		if id == nil {
			return 0, errf("%s: missing", field)
		}
		v, ok := s.Index(*id)
		if !ok {
			return 0, errf("%s: %q: no node has this id", field, *id)
		}
		return v, nil
	}
	for j, wp := range rt.Waypoints {
		f := func(name string) string { return fmt.Sprintf("routes[%d].waypoints[%d].%s", i, j, name) }
		t, err := number(f("t"), wp.T)
		if err != nil {
			return route, err
		}
		var pt engine.Point
		if wp.Node != nil {
			v, err := nodeID(f("node"), wp.Node)
			if err != nil {
				return route, err
			}
			pt = engine.At(v)
		} else {
			if wp.From == nil && wp.To == nil {
				return route, errf("%s: missing (a waypoint needs node, or from, to and offset)", f("node"))
			}
			u, err := nodeID(f("from"), wp.From)
			if err != nil {
				return route, err
			}
			v, err := nodeID(f("to"), wp.To)
			if err != nil {
				return route, err
			}
			if s.Edge(u, v) < 0 {
				return route, errf("%s: %q-%q: no corridor joins these nodes", f("to"), *wp.From, *wp.To)
			}
			off, err := number(f("offset"), wp.Offset)
			if err != nil {
				return route, err
			}
			pt = engine.Point{From: u, To: v, Offset: off}
			if err := s.CheckPoint(pt); err != nil {
				return route, errf("%s: %s: %s", f("offset"), fmtG(off), trimEngine(err.Error()))
			}
		}
		route.Waypoints = append(route.Waypoints, engine.Waypoint{P: pt, T: t, Rendezvous: wp.Rendezvous != nil && *wp.Rendezvous})
	}
	return route, nil
}

func fmtG(x float64) string { return fmt.Sprintf("%g", x) }
