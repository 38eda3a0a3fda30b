package engine

import "math"

// Bounds are the lower bounds of MODEL.md §5 for a site.
type Bounds struct {
	W   float64 // total corridor length of the search tree
	L   float64 // largest distance from the start to a candidate
	L2  float64 // largest distance of a candidate from the path P to the farthest candidate
	LB1 float64 // = W (a length)
	LB2 float64 // = L + 2·L2 (a length)
	LB3 float64 // the last-discovery cover bound (lb3.go, docs/lower-bound.md): a time; 0 when not computed
	LB  float64 // max(LB1/v, LB2/v, LB3) with v the faster speed: a time
	Far int     // the farthest candidate (end of P); ties go to the lowest index; the start without candidates
}

// ComputeBounds returns the lower bounds of s. W, L, L2, LB1 and LB2 take
// O(n); LB3 takes O(n·K²) with K = 64 the cap on its frontiers, and is left
// out (0) above LargeSite search-tree nodes. The result is cached on the site.
func ComputeBounds(s *Site) Bounds {
	s.boundsOnce.Do(func() { s.bounds = computeBounds(s) })
	return s.bounds
}

func computeBounds(s *Site) Bounds {
	b := Bounds{Far: s.Start}
	for v := 0; v < s.N; v++ {
		if v != s.Start && s.InSearch[v] {
			b.W += s.EW[s.ParentEdge[v]]
		}
		if s.Candidate[v] && s.Depth[v] > b.L {
			b.L, b.Far = s.Depth[v], v
		}
	}
	onP := make([]bool, s.N)
	for v := b.Far; v >= 0; v = int(s.Parent[v]) {
		onP[v] = true
	}
	attach := make([]float64, s.N) // depth where v's branch leaves P
	for _, v := range s.Order {
		if onP[v] {
			attach[v] = s.Depth[v]
		} else {
			attach[v] = attach[s.Parent[v]]
		}
		if s.Candidate[v] {
			b.L2 = math.Max(b.L2, s.Depth[v]-attach[v])
		}
	}
	b.LB1 = b.W
	b.LB2 = b.L + 2*b.L2
	lb12 := math.Max(b.LB1, b.LB2) / math.Max(s.Speed[0], s.Speed[1])
	b.LB3 = lb3(s, lb12)
	b.LB = math.Max(lb12, b.LB3)
	return b
}

// PathToFar returns the nodes of P, from the start to the farthest candidate.
func (s *Site) PathToFar() []int {
	return s.Path(s.Start, ComputeBounds(s).Far)
}
