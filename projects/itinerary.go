package projects

import (
	"bufio"
	"fmt"
	"io"
	"math"
	"sort"
	"strings"

	"duosweep/engine"
)

// Disclaimer is the last line of every itinerary.
const Disclaimer = "Duosweep is a planning and training aid, not a substitute for the site's emergency plan, local regulations or licensed practice."

// FormatDuration formats sec as "mm:ss", or "h:mm:ss" from one hour on.
//
// Deprecated: use engine.FormatClock, which it calls.
func FormatDuration(sec float64) string { return engine.FormatClock(sec) }

// formatSeconds is a time both as mm:ss and in seconds: "06:12 (372.4 s)".
func formatSeconds(sec float64) string { return engine.FormatClockSeconds(sec) }

// nodeName is "id (label)", or the id when the node has no label.
func nodeName(s *engine.Site, v int) string {
	if l := s.Scenario.Nodes[v].Label; l != "" && l != s.IDs[v] {
		return s.IDs[v] + " (" + l + ")"
	}
	return s.IDs[v]
}

func pointName(s *engine.Site, p engine.Point) string {
	if p.To < 0 {
		return nodeName(s, p.From)
	}
	return fmt.Sprintf("%.1f %s along %s–%s from %s", p.Offset, s.Unit(), s.IDs[p.From], s.IDs[p.To], s.IDs[p.From])
}

// WriteItinerary writes the printable, human-readable itinerary of plan p
// evaluated as r: a header with the figures of MODEL.md §7, one numbered step
// list per agent (times are when each step is done), and the disclaimer.
func WriteItinerary(w io.Writer, s *engine.Site, p *engine.Plan, r *engine.Report) error {
	bw := bufio.NewWriter(w)
	pf := func(format string, args ...any) { fmt.Fprintf(bw, format, args...) }
	name := s.Scenario.Name
	if name == "" {
		name = "(unnamed site)"
	}
	planner := r.Planner
	if planner == "" {
		planner = p.Planner
	}
	if planner == "" {
		planner = "hand-made plan"
	}
	pf("Duosweep itinerary: %s\n", name)
	pf("Model:          %s\n", modelLine(r.Model))
	pf("Planner:        %s\n", planner)
	if p.Note != "" {
		pf("                %s\n", p.Note)
	}
	if r.WorstExit >= 0 {
		pf("Worst case:     %s, exit at %s\n", formatSeconds(r.Worst), nodeName(s, r.WorstExit))
	} else {
		pf("Worst case:     no candidates\n")
	}
	pf("Lower bound:    %s (LB1 = W = %.1f %s, LB2 = L + 2·L2 = %.1f %s%s)\n", formatSeconds(r.Bounds.LB), r.Bounds.LB1, s.Unit(), r.Bounds.LB2, s.Unit(), lb3Text(r.Bounds.LB3))
	if math.IsInf(r.Gap, 0) || math.IsNaN(r.Gap) {
		pf("Certified gap:  none (the plan is incomplete)\n")
	} else {
		pf("Certified gap:  %.1f %% (the plan is at most this much slower than the best possible plan)\n", 100*r.Gap)
	}
	if r.HasExpected {
		pf("Expected time:  %s\n", formatSeconds(r.Expected))
	}
	pf("Route lengths:  %s %.1f %s, %s %.1f %s\n", s.Names[0], r.RouteLengths[0], s.Unit(), s.Names[1], r.RouteLengths[1], s.Unit())
	if !r.Complete {
		ids := make([]string, len(r.Unvisited))
		for i, v := range r.Unvisited {
			ids[i] = nodeName(s, v)
		}
		pf("INCOMPLETE:     no route visits %s\n", strings.Join(ids, ", "))
	}
	pf("When found:     %s\n", foundLine(r.Model))

	// candidates each agent checks first, by time
	type check struct {
		t float64
		v int
	}
	var first [2][]check
	for _, ex := range r.Exits {
		switch ex.Finder {
		case 0, 1:
			first[ex.Finder] = append(first[ex.Finder], check{ex.FoundAt, ex.Node})
		case engine.Both:
			first[0] = append(first[0], check{ex.FoundAt, ex.Node})
			first[1] = append(first[1], check{ex.FoundAt, ex.Node})
		}
	}
	for a := 0; a < 2; a++ {
		sort.SliceStable(first[a], func(i, j int) bool { return first[a][i].t < first[a][j].t })
		pf("\n%s (%g %s/s)\n", s.Names[a], s.Speed[a], s.Unit())
		steps := agentSteps(s, p.Routes[a].Waypoints, a)
		k := 0
		for i, st := range steps {
			pf("%3d. %s  %s", i+1, FormatDuration(st.t), st.text)
			var found []string
			for k < len(first[a]) && first[a][k].t <= st.t+engine.Tol(st.t) {
				if first[a][k].v != s.Start {
					found = append(found, s.IDs[first[a][k].v])
				}
				k++
			}
			if len(found) > 0 {
				pf("; first to check %s", strings.Join(found, ", "))
			}
			pf("\n")
		}
	}
	pf("\n%s\n", Disclaimer)
	return bw.Flush()
}

func modelLine(m engine.Model) string {
	if m == engine.Radio {
		return "radio (the agents tell each other at once)"
	}
	return "face-to-face (the agents share news only when they meet)"
}

func foundLine(m engine.Model) string {
	if m == engine.Radio {
		return "the finder calls the partner, who walks straight to the exit"
	}
	return "the finder goes to meet the partner on the partner's route below, then both walk to the exit; at a rendezvous an uninformed agent waits for the partner"
}

type step struct {
	t    float64
	text string
	walk bool
	// for ItinerarySteps
	action string       // "walk", "wait", "rendezvous" or "end"
	at     engine.Point // where the step ends
	dist   float64      // length walked (walk steps)
}

// ItineraryStep is one numbered step of an agent's itinerary as
// WriteItinerary prints it: Clock is the printed time (when the step is
// done), Text the printed sentence. Action is "walk", "wait", "rendezvous" or
// "end"; Place names the point the step ends at; Dist is the length walked
// (0 for the other actions).
type ItineraryStep struct {
	T      float64
	Clock  string
	Action string
	At     engine.Point
	Place  string
	Dist   float64
	Text   string
}

// ItinerarySteps returns agent a's itinerary steps of plan p, the same steps
// with the same wording and clock strings as WriteItinerary. O(waypoints · log n).
func ItinerarySteps(s *engine.Site, p *engine.Plan, a int) []ItineraryStep {
	steps := agentSteps(s, p.Routes[a].Waypoints, a)
	out := make([]ItineraryStep, len(steps))
	for i, st := range steps {
		out[i] = ItineraryStep{T: st.t, Clock: FormatDuration(st.t), Action: st.action, At: st.at,
			Place: pointName(s, st.at), Dist: st.dist, Text: st.text}
	}
	return out
}

// FormatSeconds formats a time as the itinerary prints figures: "06:12 (372.4 s)".
func FormatSeconds(sec float64) string { return formatSeconds(sec) }

// NodeName is the itinerary's name of node v: "id (label)", or the id.
func NodeName(s *engine.Site, v int) string { return nodeName(s, v) }

// PointName is the itinerary's name of a point: a node name, or "12.5 m along a–b from a".
func PointName(s *engine.Site, p engine.Point) string { return pointName(s, p) }

// ModelLine is the itinerary's one-line description of model m.
func ModelLine(m engine.Model) string { return modelLine(m) }

// FoundLine is the itinerary's rule for what happens when the exit is found under model m.
func FoundLine(m engine.Model) string { return foundLine(m) }

func agentSteps(s *engine.Site, wps []engine.Waypoint, a int) []step {
	var out []step
	partner := s.Names[1-a]
	cur := engine.At(s.Start)
	t := 0.0
	unit := s.Unit()
	for _, wp := range wps {
		p := s.Canon(wp.P)
		d := s.PointDist(cur, p)
		arrive := t + d/s.Speed[a]
		if d > 0 {
			text := fmt.Sprintf("walk to %s, %.1f %s", pointName(s, wp.P), d, unit)
			if cur.To < 0 && p.To < 0 {
				if path := s.Path(cur.From, p.From); len(path) > 2 {
					via := make([]string, 0, len(path)-2)
					for _, v := range path[1 : len(path)-1] {
						via = append(via, s.IDs[v])
					}
					if len(via) > 8 {
						via = append(via[:8], "…")
					}
					text += " via " + strings.Join(via, ", ")
				}
			}
			out = append(out, step{t: arrive, text: text, walk: true, action: "walk", at: wp.P, dist: d})
		}
		end := math.Max(wp.T, arrive)
		if end-arrive > engine.Tol(end) {
			out = append(out, step{t: end, text: fmt.Sprintf("wait at %s until %s (%.1f s)", pointName(s, wp.P), FormatDuration(end), end-arrive), action: "wait", at: wp.P})
		}
		if wp.Rendezvous {
			out = append(out, step{t: end, text: fmt.Sprintf("rendezvous with %s at %s: if you do not yet know where the exit is, wait here until %s arrives (face-to-face)", partner, pointName(s, wp.P), partner), action: "rendezvous", at: wp.P})
		}
		cur, t = p, end
	}
	out = append(out, step{t: t, text: fmt.Sprintf("end of route: stay at %s", pointName(s, cur)), action: "end", at: cur})
	return out
}

// lb3Text is the cover-split bound for the itinerary's lower-bound line.
func lb3Text(lb3 float64) string {
	if lb3 <= 0 {
		return ""
	}
	return ", cover split LB3 = " + formatSeconds(lb3)
}
