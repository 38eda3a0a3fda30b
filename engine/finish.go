package engine

// Finish (MODEL.md §10): once both agents have reached the exit x they take
// the casualty together from x to the finish node F at the carry speed v_c,
//
//	done(x) = evac(x) + o(x),   o(x) = d(x, F)/v_c   (effort-weighted d),
//
// and a plan's worst case and expected time are taken over done(x). Without
// a finish o = 0 and done(x) = evac(x): nothing changes. Since o(x) depends
// only on x, every argument that bounds evac(x) for a chosen candidate x
// bounds done(x) by adding o(x) (bounds.go, lb3.go, docs/lower-bound.md).

import "math"

// Finish names where the crew takes the casualty: Node is a node id, Speed
// the carry speed in unit per second (nil: the slower agent's speed; a value
// given must be a finite number > 0).
type Finish struct {
	Node  string
	Speed *float64
}

// buildFinish validates the scenario's finish and sets Site.Finish and Site.Carry.
func (s *Site) buildFinish() error {
	s.Finish, s.Carry = -1, 0
	if name := s.Scenario.Model; name != "" {
		if _, err := ParseModel(name); err != nil {
			return fieldErr("model", name, "unknown communication model (%s)", trimPrefix(err.Error()))
		}
	}
	f := s.Scenario.Finish
	if f == nil {
		return nil
	}
	v, ok := s.index[f.Node]
	if !ok {
		return fieldErr("finish.node", f.Node, "no node has this id")
	}
	c := math.Min(s.Speed[0], s.Speed[1])
	if f.Speed != nil {
		c = *f.Speed
		if !(c > 0) || math.IsInf(c, 0) {
			return fieldErr("finish.speed", fmtNum(c), "carry speed must be a finite number > 0")
		}
	}
	s.Finish, s.Carry = v, c
	return nil
}

// buildOut fills o(v) for every node (after the distance index is built). O(n log n).
func (s *Site) buildOut() {
	if s.Finish < 0 {
		return
	}
	s.out = make([]float64, s.N)
	for v := range s.out {
		s.out[v] = s.Dist(v, s.Finish) / s.Carry
	}
}

// HasFinish reports whether the scenario names a finish.
func (s *Site) HasFinish() bool { return s.Finish >= 0 }

// Out returns o(v) = d(v, F)/v_c, the carry time from node v to the finish
// (0 without a finish). O(1).
func (s *Site) Out(v int) float64 {
	if s.out == nil {
		return 0
	}
	return s.out[v]
}

// minOut returns the smallest o(x) over the candidates (0 without a finish
// or without candidates).
func (s *Site) minOut() float64 {
	if s.out == nil {
		return 0
	}
	m := math.Inf(1)
	for v, c := range s.Candidate {
		if c {
			m = math.Min(m, s.out[v])
		}
	}
	if math.IsInf(m, 1) {
		return 0
	}
	return m
}

// FinishName is "id" of the finish node, "" without a finish.
func (s *Site) FinishName() string {
	if s.Finish < 0 {
		return ""
	}
	return s.IDs[s.Finish]
}

// CarryLeg describes the carry from candidate x to the finish: its real
// length, its effort-weighted length and its duration o(x). ok is false
// without a finish.
func (s *Site) CarryLeg(x int) (real, weighted, dur float64, ok bool) {
	if s.Finish < 0 {
		return 0, 0, 0, false
	}
	return s.RealDist(x, s.Finish), s.Dist(x, s.Finish), s.Out(x), true
}

// PlannedModel returns the model the scenario says it is planned for, and
// whether it names one (Scenario.Model; NewSite has checked the name).
func (s *Site) PlannedModel() (Model, bool) {
	if s.Scenario.Model == "" {
		return 0, false
	}
	m, err := ParseModel(s.Scenario.Model)
	return m, err == nil
}

func trimPrefix(msg string) string {
	const p = "engine: model: "
	if len(msg) > len(p) && msg[:len(p)] == p {
		return msg[len(p):]
	}
	return msg
}
