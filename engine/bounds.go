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
	LB  float64 // max(LB1T, LB2T, LB3): a time (max(LB1/v, LB2/v, LB3) without a finish)
	Far int     // the farthest candidate (end of P); ties go to the lowest index; the start without candidates

	// With a finish (MODEL.md §10) every bound is of done(x) = evac(x) + o(x),
	// o(x) = d(x, F)/v_c (finish.go, docs/lower-bound.md). Without one,
	// MinOut is 0, LB1T = LB1/v, LB2T = LB2/v and LB3 is as before.
	Finish bool    // the site has a finish: the time bounds include the carry
	MinOut float64 // min o(x) over the candidates (a time)
	LB1T   float64 // LB1/v + MinOut (a time)
	// LB2T is max over candidate pairs y, z of min((d(s,y) + d(y,z))/v + o(z),
	// (d(s,z) + d(z,y))/v + o(y)) (pairs y = z included), a time: exact up to
	// LB2PairCap candidates, above that the smaller valid
	// max(LB2/v + MinOut, max over x of d(s,x)/v + o(x)); LB2Pairs says which.
	LB2T     float64
	LB2Pairs bool
}

// LB2PairCap is the largest number of candidates on which the finish-aware
// pairwise bound LB2T is computed exactly by scanning every pair (O(k² log n));
// above it LB2T is a fallback that is still a valid bound (bounds.go).
const LB2PairCap = 300

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
	v := math.Max(s.Speed[0], s.Speed[1])
	lb12 := math.Max(b.LB1, b.LB2) / v
	b.LB3 = lb3(s, lb12)
	b.Finish = s.HasFinish()
	b.MinOut = s.minOut()
	b.LB1T = b.LB1/v + b.MinOut
	b.LB2T, b.LB2Pairs = b.LB2/v, true
	if b.Finish {
		b.LB2T, b.LB2Pairs = lb2Finish(s, b, v)
	}
	b.LB = math.Max(math.Max(b.LB1T, b.LB2T), b.LB3)
	return b
}

// lb2Finish is the finish-aware pairwise bound (docs/lower-bound.md, "LB2
// with a finish"): for candidates y, z, whichever is first reached, the
// agent that reached it still has to walk to the other, so the plan needs
// min((D_y + d(y,z))/v + o(z), (D_z + d(z,y))/v + o(y)). With up to
// LB2PairCap candidates every pair is scanned (O(k² log n)); above it the
// fallback max(LB2/v + min o, max over x of D_x/v + o(x)) is returned: each
// term is at most the pair maximum (the first is the no-finish pair value plus
// the smallest carry, the second the pair y = z), so it is still a valid bound.
func lb2Finish(s *Site, b Bounds, v float64) (float64, bool) {
	cand := s.Candidates()
	if len(cand) > LB2PairCap {
		return lb2FinishFallback(s, b, v), false
	}
	best := 0.0
	for _, x := range cand {
		best = math.Max(best, s.Depth[x]/v+s.Out(x))
	}
	for i, y := range cand {
		for _, z := range cand[i+1:] {
			d := s.Dist(y, z)
			best = math.Max(best, math.Min((s.Depth[y]+d)/v+s.Out(z), (s.Depth[z]+d)/v+s.Out(y)))
		}
	}
	return best, true
}

// PathToFar returns the nodes of P, from the start to the farthest candidate.
func (s *Site) PathToFar() []int {
	return s.Path(s.Start, ComputeBounds(s).Far)
}

// lb2FinishFallback is the O(n) bound used above LB2PairCap candidates:
// max(LB2/v + min o, max over x of D_x/v + o(x)).
func lb2FinishFallback(s *Site, b Bounds, v float64) float64 {
	single := 0.0
	for x, c := range s.Candidate {
		if c {
			single = math.Max(single, s.Depth[x]/v+s.Out(x))
		}
	}
	return math.Max(single, b.LB2/v+b.MinOut)
}
