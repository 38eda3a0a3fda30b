package projects

import (
	"fmt"
	"math"

	"duosweep/engine"
)

// The itinerary's effort and finish lines (MODEL.md §9, §10): real lengths
// beside effort-weighted ones, and the carry leg to the finish.

// walkLength is a walk's real length, with its effort when that is not 1:
// "120.0 m" or "120.0 m, effort ×2 (walks like 240.0 m)". d is the
// effort-weighted length.
func walkLength(s *engine.Site, from, to engine.Point, d float64) string {
	real := s.RealPointDist(from, to)
	if math.Abs(d-real) <= 1e-9*math.Max(1, d) || real <= 0 {
		return fmt.Sprintf("%.1f %s", d, s.Unit())
	}
	return fmt.Sprintf("%.1f %s, effort ×%.3g (walks like %.1f %s)", real, s.Unit(), d/real, d, s.Unit())
}

// realRouteLength is the real length an agent walks along its waypoints.
func realRouteLength(s *engine.Site, wps []engine.Waypoint) float64 {
	cur, total := engine.At(s.Start), 0.0
	for _, wp := range wps {
		p := s.Canon(wp.P)
		total += s.RealPointDist(cur, p)
		cur = p
	}
	return total
}

// writeCarryLegs lists, for each candidate, when it is reached, the carry leg
// to the finish and when the crew is out.
func writeCarryLegs(pf func(string, ...any), s *engine.Site, r *engine.Report) {
	pf("\nCarry out (both agents with the casualty, %g %s/s)\n", s.Carry, s.Unit())
	for _, ex := range r.Exits {
		if ex.Node == s.Finish {
			pf("  %s: reached %s; this is the finish, out at %s\n", s.IDs[ex.Node], FormatDuration(ex.EvacAt), FormatDuration(ex.DoneAt))
			continue
		}
		_, w, dur, _ := s.CarryLeg(ex.Node)
		pf("  %s: reached %s, carry the casualty to %s: %s, %s, out at %s\n", s.IDs[ex.Node], FormatDuration(ex.EvacAt),
			s.IDs[s.Finish], walkLength(s, engine.At(ex.Node), engine.At(s.Finish), w), FormatDuration(dur), FormatDuration(ex.DoneAt))
	}
}
