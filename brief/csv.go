package brief

import (
	"encoding/csv"
	"fmt"
	"io"
	"math"
	"strconv"

	"duosweep/engine"
	"duosweep/projects"
)

// CSVHeader is the timetable's header row. Waypoint rows fill record
// ("waypoint"), agent, step (1-based waypoint number), time_s and clock
// (when the agent leaves the waypoint), the place (node, or from, to and
// offset for a point inside a corridor), action and arrive_s; candidate rows
// fill record ("candidate"), node, found_s, found_clock, finder, reached_s
// and reached_clock.
var CSVHeader = []string{"record", "agent", "step", "time_s", "clock", "node", "from", "to", "offset",
	"action", "arrive_s", "found_s", "found_clock", "finder", "reached_s", "reached_clock"}

// WriteCSV writes the timetable of in (encoding/csv): one row per waypoint
// per agent, then one row per candidate. Times are seconds with one decimal
// and clock strings in the itinerary's format. O(waypoints · log n + candidates).
func WriteCSV(w io.Writer, in Input) error {
	if err := in.check(); err != nil {
		return err
	}
	s, p, r := in.Site, in.Plan, in.Report
	cw := csv.NewWriter(w)
	if err := cw.Write(CSVHeader); err != nil {
		return err
	}
	sec := func(t float64) string {
		if math.IsInf(t, 1) {
			return "never"
		}
		return strconv.FormatFloat(t, 'f', 1, 64)
	}
	row := func() []string { return make([]string, len(CSVHeader)) }
	for a := 0; a < 2; a++ {
		tr, err := s.Trajectory(p.Routes[a], a)
		if err != nil {
			return err
		}
		cur := engine.At(s.Start)
		t := 0.0
		for i, wp := range p.Routes[a].Waypoints {
			q := s.Canon(wp.P)
			d := s.PointDist(cur, q)
			arrive := t + d/s.Speed[a]
			leave := tr.WpTime[i]
			action := "walk"
			switch {
			case d == 0 && leave > arrive+1e-9*math.Max(1, leave):
				action = "wait"
			case d == 0:
				action = "stay"
			case leave > arrive+1e-9*math.Max(1, leave):
				action = fmt.Sprintf("walk %.1f %s, wait %.1f s", d, s.Unit(), leave-arrive)
			default:
				action = fmt.Sprintf("walk %.1f %s", d, s.Unit())
			}
			if wp.Rendezvous {
				action += "; rendezvous with " + s.Names[1-a]
			}
			rw := row()
			rw[0], rw[1], rw[2], rw[3], rw[4] = "waypoint", s.Names[a], strconv.Itoa(i+1), sec(leave), projects.FormatDuration(leave)
			if wp.P.To < 0 {
				rw[5] = s.IDs[wp.P.From]
			} else {
				rw[6], rw[7], rw[8] = s.IDs[wp.P.From], s.IDs[wp.P.To], strconv.FormatFloat(wp.P.Offset, 'f', -1, 64)
			}
			rw[9], rw[10] = action, sec(arrive)
			if err := cw.Write(rw); err != nil {
				return err
			}
			cur, t = q, leave
		}
	}
	for _, ex := range r.Exits {
		finder := "nobody"
		switch ex.Finder {
		case 0, 1:
			finder = s.Names[ex.Finder]
		case engine.Both:
			finder = "both"
		}
		rw := row()
		rw[0], rw[5] = "candidate", s.IDs[ex.Node]
		rw[11], rw[12], rw[13], rw[14], rw[15] = sec(ex.FoundAt), projects.FormatDuration(ex.FoundAt), finder, sec(ex.EvacAt), projects.FormatDuration(ex.EvacAt)
		if err := cw.Write(rw); err != nil {
			return err
		}
	}
	cw.Flush()
	return cw.Error()
}
