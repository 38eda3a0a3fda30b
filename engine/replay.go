package engine

import (
	"fmt"
	"math"
	"sort"
)

// EventKind is the kind of a replay event.
type EventKind int

const (
	// EventFound: an agent stands on the exit for the first time.
	EventFound EventKind = iota
	// EventInformed: the partner learns of the exit by radio.
	EventInformed
	// EventMet: the finder meets its partner face to face and tells it.
	EventMet
	// EventArrived: an agent reaches the exit knowing it is there.
	EventArrived
)

func (k EventKind) String() string {
	switch k {
	case EventFound:
		return "found"
	case EventInformed:
		return "informed"
	case EventMet:
		return "met"
	case EventArrived:
		return "arrived"
	}
	return fmt.Sprintf("EventKind(%d)", int(k))
}

// Event is one moment of a replay.
type Event struct {
	T     float64
	Kind  EventKind
	Agent Finder // Agent0, Agent1 or Both
	At    Point
	Text  string
}

// Replay is what both agents do when the exit is at one candidate: their
// uninformed routes until they learn where it is, then the way to it (the
// radio call, or the finder's intercept walk and the meeting face to face).
type Replay struct {
	Exit   int
	Model  Model
	Result ExitResult
	End    float64 // the evacuation time
	Events []Event // in time order
	full   [2]*Trajectory
	learn  [2]float64 // when each agent knows the exit
}

// NewReplay builds the replay of plan p under model m for the exit at
// candidate node exit. O(route length + log n).
func NewReplay(s *Site, p *Plan, m Model, exit int) (*Replay, error) {
	if exit < 0 || exit >= s.N {
		return nil, fmt.Errorf("engine: replay: node index %d out of range", exit)
	}
	if !s.Candidate[exit] {
		return nil, fmt.Errorf("engine: replay: %q is not a candidate", s.IDs[exit])
	}
	trs, err := s.Trajectories(p)
	if err != nil {
		return nil, err
	}
	fv := [2][]float64{trs[0].FirstVisits(), trs[1].FirstVisits()}
	ex, tl := exitTelling(s, trs, fv, exit, m)
	rp := &Replay{Exit: exit, Model: m, Result: ex, End: ex.EvacAt}
	if ex.Finder == Nobody {
		rp.full = trs
		rp.learn = [2]float64{math.Inf(1), math.Inf(1)}
		return rp, nil
	}
	x := At(exit)
	var mkErr error
	mk := func(r Route, a int) *Trajectory {
		tr, err := s.Trajectory(r, a)
		if err != nil && mkErr == nil {
			mkErr = fmt.Errorf("engine: replay of %q built an invalid route (an engine bug): %w", s.IDs[exit], err)
		}
		return tr
	}
	name := func(a int) string { return s.Names[a] }
	if ex.Finder == Both {
		for a := 0; a < 2; a++ {
			rp.full[a] = mk(prefixRoute(trs[a], p.Routes[a], ex.FoundAt, -1, x, ex.FoundAt), a)
			rp.learn[a] = ex.FoundAt
		}
		rp.Events = []Event{
			{T: ex.FoundAt, Kind: EventFound, Agent: Both, At: x, Text: fmt.Sprintf("%s and %s reach %s together: the exit is here", name(0), name(1), s.Label(exit))},
			{T: ex.FoundAt, Kind: EventArrived, Agent: Both, At: x, Text: "both at the exit"},
		}
		if mkErr != nil {
			return nil, mkErr
		}
		return rp, nil
	}
	f, q := int(ex.Finder), 1-int(ex.Finder)
	t := ex.FoundAt
	rp.learn[f] = t
	rp.Events = append(rp.Events, Event{T: t, Kind: EventFound, Agent: Finder(f), At: x,
		Text: fmt.Sprintf("%s finds the exit at %s", name(f), s.Label(exit))})
	if !tl.met {
		// told at a distance, the moment the exit is found
		rp.full[f] = mk(prefixRoute(trs[f], p.Routes[f], t, -1, x, t), f)
		pos := trs[q].PositionAt(t)
		d := s.NodeDist(pos, exit)
		r := prefixRoute(trs[q], p.Routes[q], t, -1, pos, t)
		r.Waypoints = append(r.Waypoints, Waypoint{P: x, T: t + d/s.Speed[q]})
		rp.full[q] = mk(r, q)
		rp.learn[q] = t
		rp.Events = append(rp.Events,
			Event{T: t, Kind: EventInformed, Agent: Finder(q), At: pos, Text: fmt.Sprintf("%s radios %s, who heads for the exit (%.1f %s away)", name(f), name(q), d, s.Unit())},
			Event{T: t, Kind: EventArrived, Agent: Finder(f), At: x, Text: name(f) + " waits at the exit"},
			Event{T: t + d/s.Speed[q], Kind: EventArrived, Agent: Finder(q), At: x, Text: name(q) + " reaches the exit"})
	} else {
		tau, meet := ex.MeetAt, ex.MeetPoint
		dm := s.NodeDist(meet, exit)
		rf := prefixRoute(trs[f], p.Routes[f], t, -1, x, t)
		rf.Waypoints = append(rf.Waypoints, Waypoint{P: meet, T: t + dm/s.Speed[f]}, Waypoint{P: meet, T: tau}, Waypoint{P: x, T: tau + dm/s.Speed[f]})
		rp.full[f] = mk(rf, f)
		// the partner's uninformed route up to τ, cut at the first rendezvous at or after t
		rvLimit := -1
		if k := sort.SearchFloat64s(trs[q].RVTime, t-Tol(t)); k < len(trs[q].RVTime) {
			rvLimit = trs[q].RVWp[k]
		}
		rq := prefixRoute(trs[q], p.Routes[q], tau, rvLimit, meet, tau)
		rq.Waypoints = append(rq.Waypoints, Waypoint{P: x, T: tau + dm/s.Speed[q]})
		rp.full[q] = mk(rq, q)
		rp.learn[q] = tau
		how := "walks to meet"
		if dm == 0 {
			how = "waits at the exit for"
		}
		rp.Events = append(rp.Events,
			Event{T: tau, Kind: EventMet, Agent: Both, At: meet, Text: fmt.Sprintf("%s %s %s and tells them (%.1f %s from the exit)", name(f), how, name(q), dm, s.Unit())},
			Event{T: tau + dm/s.Speed[f], Kind: EventArrived, Agent: Finder(f), At: x, Text: name(f) + " reaches the exit"},
			Event{T: tau + dm/s.Speed[q], Kind: EventArrived, Agent: Finder(q), At: x, Text: name(q) + " reaches the exit"})
	}
	if mkErr != nil {
		return nil, mkErr
	}
	sort.SliceStable(rp.Events, func(i, j int) bool { return rp.Events[i].T < rp.Events[j].T })
	return rp, nil
}

// prefixRoute returns the waypoints of r that the agent has left by time ta
// (and none past waypoint index limit when limit ≥ 0), followed by a
// waypoint at pos at time at.
func prefixRoute(tr *Trajectory, r Route, ta float64, limit int, pos Point, at float64) Route {
	var out Route
	for i, wp := range r.Waypoints {
		if tr.WpTime[i] > ta || (limit >= 0 && i > limit) {
			break
		}
		wp.T = tr.WpTime[i]
		wp.Rendezvous = false
		out.Waypoints = append(out.Waypoints, wp)
	}
	out.Waypoints = append(out.Waypoints, Waypoint{P: pos, T: at})
	return out
}

// Position returns where the agent is at time t in the replay. O(log route length).
func (r *Replay) Position(agent int, t float64) Point { return r.full[agent].PositionAt(t) }

// Informed reports whether the agent knows where the exit is at time t.
func (r *Replay) Informed(agent int, t float64) bool { return t >= r.learn[agent] }

// Trajectory returns the agent's full replay trajectory.
func (r *Replay) Trajectory(agent int) *Trajectory { return r.full[agent] }
