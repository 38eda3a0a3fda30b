package engine

import (
	"fmt"
	"math"
)

// hld is a heavy-light decomposition of the rooted tree: O(n) to build,
// O(log n) per lowest-common-ancestor query. Each node's record packs what a
// query step needs, so a step touches one cache line.
type hld struct {
	rec []hldRec
}

type hldRec struct {
	head      int32 // top node of the node's heavy chain
	headUp    int32 // parent of head, -1 at the root chain
	headLevel int32 // level of head
	level     int32
	depth     float64
}

func newHLD(s *Site) hld {
	n := s.N
	size := make([]int32, n)
	for i := n - 1; i >= 0; i-- {
		v := s.Order[i]
		size[v]++
		if p := s.Parent[v]; p >= 0 {
			size[p] += size[v]
		}
	}
	heavy := make([]int32, n)
	for v := 0; v < n; v++ {
		best := int32(-1)
		for _, c := range s.Children(v) {
			if best < 0 || size[c] > size[best] {
				best = c
			}
		}
		heavy[v] = best
	}
	rec := make([]hldRec, n)
	for _, v := range s.Order {
		p := s.Parent[v]
		r := &rec[v]
		r.level, r.depth = s.Level[v], s.Depth[v]
		if p >= 0 && heavy[p] == v {
			r.head, r.headUp, r.headLevel = rec[p].head, rec[p].headUp, rec[p].headLevel
		} else {
			r.head, r.headUp, r.headLevel = v, p, s.Level[v]
		}
	}
	return hld{rec: rec}
}

// LCA returns the lowest common ancestor of nodes u and v (rooted at the start). O(log n).
func (s *Site) LCA(u, v int) int {
	rec := s.hld.rec
	ru, rv := &rec[u], &rec[v]
	for ru.head != rv.head {
		if ru.headLevel < rv.headLevel {
			ru, rv = rv, ru
			u, v = v, u
		}
		u = int(ru.headUp)
		ru = &rec[u]
	}
	if ru.level < rv.level {
		return u
	}
	return v
}

// Dist returns the length of the tree path between nodes u and v. O(log n).
func (s *Site) Dist(u, v int) float64 {
	if u == v {
		return 0
	}
	if int(s.Parent[u]) == v {
		return s.EW[s.ParentEdge[u]]
	}
	if int(s.Parent[v]) == u {
		return s.EW[s.ParentEdge[v]]
	}
	rec := s.hld.rec
	du, dv := rec[u].depth, rec[v].depth
	return du + dv - 2*rec[s.LCA(u, v)].depth
}

// Point is a place on the site: node From when To < 0, else the point at
// distance Offset from From along the corridor From–To (0 ≤ Offset ≤ length).
type Point struct {
	From, To int
	Offset   float64
}

// At returns the point at node v.
func At(v int) Point { return Point{From: v, To: -1} }

// IsNode reports whether p is a node (also a corridor point at offset 0 or at full length).
func (p Point) IsNode() bool { return p.To < 0 }

// Canon returns p in canonical form: a node when it sits at a corridor end
// (within a relative 1e-9 of the corridor length),
// else oriented from the lower node index, so equal points compare equal.
func (s *Site) Canon(p Point) Point {
	if p.To < 0 {
		return Point{From: p.From, To: -1}
	}
	w := s.EW[s.Edge(p.From, p.To)]
	// a point within a relative 1e-9 of a corridor end is that end: rounding
	// must not make a walk stop a hair short of a node it means to visit
	snap := 1e-9 * math.Max(1, w)
	if p.Offset <= snap {
		return At(p.From)
	}
	if p.Offset >= w-snap {
		return At(p.To)
	}
	if p.From > p.To {
		return Point{From: p.To, To: p.From, Offset: w - p.Offset}
	}
	return p
}

// CheckPoint validates p against the site: nodes exist, a corridor joins
// From and To, and the offset lies on it.
func (s *Site) CheckPoint(p Point) error {
	if p.From < 0 || p.From >= s.N {
		return fmt.Errorf("engine: point: node index %d out of range", p.From)
	}
	if p.To < 0 {
		return nil
	}
	if p.To >= s.N {
		return fmt.Errorf("engine: point: node index %d out of range", p.To)
	}
	e := s.Edge(p.From, p.To)
	if e < 0 {
		return fmt.Errorf("engine: point: no corridor joins %q and %q", s.IDs[p.From], s.IDs[p.To])
	}
	if !(p.Offset >= 0) || p.Offset > s.EW[e]*(1+1e-12) || math.IsInf(p.Offset, 0) {
		return fmt.Errorf("engine: point: offset %g outside corridor %q-%q of length %g", p.Offset, s.IDs[p.From], s.IDs[p.To], s.EW[e])
	}
	return nil
}

// Ends returns the two corridor ends of p with their distances from p (for a
// node, the node twice at distance 0).
func (s *Site) Ends(p Point) (u int, du float64, v int, dv float64) {
	if p.To < 0 {
		return p.From, 0, p.From, 0
	}
	w := s.EW[s.Edge(p.From, p.To)]
	return p.From, p.Offset, p.To, w - p.Offset
}

// PointDist returns the length of the shortest path between two points. O(log n).
func (s *Site) PointDist(a, b Point) float64 {
	if a.To < 0 && b.To < 0 {
		return s.Dist(a.From, b.From)
	}
	if a.To >= 0 && b.To >= 0 {
		if a.From == b.From && a.To == b.To {
			return math.Abs(a.Offset - b.Offset)
		}
		if a.From == b.To && a.To == b.From {
			w := s.EW[s.Edge(a.From, a.To)]
			return math.Abs(a.Offset - (w - b.Offset))
		}
	}
	au, adu, av, adv := s.Ends(a)
	bu, bdu, bv, bdv := s.Ends(b)
	d := adu + bdu + s.Dist(au, bu)
	if av != au {
		d = math.Min(d, adv+bdu+s.Dist(av, bu))
	}
	if bv != bu {
		d = math.Min(d, adu+bdv+s.Dist(au, bv))
		if av != au {
			d = math.Min(d, adv+bdv+s.Dist(av, bv))
		}
	}
	return d
}

// NodeDist returns the distance from point a to node v. O(log n).
func (s *Site) NodeDist(a Point, v int) float64 {
	if a.To < 0 {
		return s.Dist(a.From, v)
	}
	au, adu, av, adv := s.Ends(a)
	d := adu + s.Dist(au, v)
	if av != au {
		d = math.Min(d, adv+s.Dist(av, v))
	}
	return d
}

// Path returns the nodes of the tree path from u to v, both included. O(path length).
func (s *Site) Path(u, v int) []int {
	a := s.LCA(u, v)
	var up, down []int
	for x := u; x != a; x = int(s.Parent[x]) {
		up = append(up, x)
	}
	for x := v; x != a; x = int(s.Parent[x]) {
		down = append(down, x)
	}
	up = append(up, a)
	for i := len(down) - 1; i >= 0; i-- {
		up = append(up, down[i])
	}
	return up
}
