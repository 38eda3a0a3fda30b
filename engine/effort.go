package engine

// Effort (MODEL.md §9): a corridor of length w and effort factor e takes
// e·w/speed seconds to walk. NewSite weights every corridor once (Site.EW =
// w·e), so distances, bounds, planners, trajectories and evaluation all work
// in effort-weighted length, and a site with effort factors gives exactly the
// times of the same site with each length replaced by w·e. The real length
// stays in Site.RealLen for what a crew is told to walk.
//
// Points inside a corridor (Point.Offset) are effort-weighted too, like every
// engine length. Files keep real offsets (FORMATS.md): RealOffset and
// WeightedOffset convert at the boundary, and RealPointDist measures a walk
// in real length.

import (
	"fmt"
	"math"
)

// MaxEffort is the largest effort factor NewSite accepts: anything slower is
// taken for a typing error (FORMATS.md: "absurd values, say above 100").
const MaxEffort = 100

// EffortValue returns a pointer to e, for setting Corridor.Effort (or Finish.Speed).
func EffortValue(e float64) *float64 { return &e }

// EffortFactor returns the corridor's effort factor: 1 when none is given.
// It does not validate (NewSite does).
func (c Corridor) EffortFactor() float64 {
	if c.Effort == nil {
		return 1
	}
	return *c.Effort
}

// effortOf validates corridor i's effort and returns its factor.
func effortOf(i int, c Corridor) (float64, error) {
	e := c.EffortFactor()
	if !(e > 0) || e > MaxEffort {
		return 0, fieldErr(fmt.Sprintf("corridors[%d].effort", i), fmtNum(e),
			"effort must be a number > 0 and at most %d (1 is a normal corridor, 2 takes twice as long)", MaxEffort)
	}
	if math.IsInf(c.Length*e, 0) {
		return 0, fieldErr(fmt.Sprintf("corridors[%d].length", i), fmtNum(c.Length), "length times effort %g is not a finite number", e)
	}
	return e, nil
}

// cloneEffort gives out private copies of the effort factors and the finish
// (part of Clone's deep copy).
func cloneEffort(out *Scenario) {
	for i := range out.Corridors {
		if e := out.Corridors[i].Effort; e != nil {
			v := *e
			out.Corridors[i].Effort = &v
		}
	}
	if out.Finish != nil {
		f := *out.Finish
		if f.Speed != nil {
			v := *f.Speed
			f.Speed = &v
		}
		out.Finish = &f
	}
}

// HasEffort reports whether some open corridor has an effort factor other than 1.
func (s *Site) HasEffort() bool {
	for i, e := range s.Effort {
		if e != 1 && !s.Scenario.Corridors[i].Closed {
			return true
		}
	}
	return false
}

// corridorEffort returns the effort of the corridor joining adjacent u and v.
func (s *Site) corridorEffort(u, v int) float64 {
	if e := s.Edge(u, v); e >= 0 {
		return s.Effort[e]
	}
	return 1
}

// RealOffset returns p's offset from p.From in real length (the file's
// offset), for a point inside a corridor; 0 for a node. O(1).
func (s *Site) RealOffset(p Point) float64 {
	if p.To < 0 {
		return 0
	}
	return p.Offset / s.corridorEffort(p.From, p.To)
}

// WeightedOffset turns a real offset along the corridor from–to (as a file
// gives it) into the engine's effort-weighted offset. O(1).
func (s *Site) WeightedOffset(from, to int, real float64) float64 {
	return real * s.corridorEffort(from, to)
}

// RealDist returns the real (unweighted) length of the tree path between
// nodes u and v. O(log n).
func (s *Site) RealDist(u, v int) float64 {
	if u == v {
		return 0
	}
	return s.RealDepth[u] + s.RealDepth[v] - 2*s.RealDepth[s.LCA(u, v)]
}

// RealPointDist returns the real length of the shortest walk between two
// points (the walk PointDist measures in effort-weighted length). O(log n).
func (s *Site) RealPointDist(a, b Point) float64 {
	if a.To < 0 && b.To < 0 {
		return s.RealDist(a.From, b.From)
	}
	if a.To >= 0 && b.To >= 0 {
		if a.From == b.From && a.To == b.To {
			return math.Abs(s.RealOffset(a) - s.RealOffset(b))
		}
		if a.From == b.To && a.To == b.From {
			w := s.RealLen[s.Edge(a.From, a.To)]
			return math.Abs(s.RealOffset(a) - (w - s.RealOffset(b)))
		}
	}
	// the tree path is the same whatever the weights: leave each corridor by
	// the end PointDist's shortest walk uses, measured in real length
	type end struct {
		v     int
		w, rl float64
	}
	ends := func(p Point) []end {
		if p.To < 0 {
			return []end{{p.From, 0, 0}}
		}
		e := s.Edge(p.From, p.To)
		ro := s.RealOffset(p)
		return []end{{p.From, p.Offset, ro}, {p.To, s.EW[e] - p.Offset, s.RealLen[e] - ro}}
	}
	best, real := math.Inf(1), 0.0
	for _, x := range ends(a) {
		for _, y := range ends(b) {
			if d := x.w + y.w + s.Dist(x.v, y.v); d < best {
				best, real = d, x.rl+y.rl+s.RealDist(x.v, y.v)
			}
		}
	}
	return real
}
