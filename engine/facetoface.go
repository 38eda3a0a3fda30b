package engine

import (
	"math"
	"sort"
)

// faceToFace is local communication (MODEL.md §4): agents share what they
// know only when they stand at the same point at the same time. The finder
// goes to meet its partner wherever that is fastest; the partner keeps to
// its route and waits at its first rendezvous at or after t(x).
type faceToFace struct{}

func (faceToFace) rendezvous() bool { return true }

func (faceToFace) instant() bool { return false }

func (faceToFace) tell(s *Site, partner *Trajectory, x int, t, sf, sp float64, hint *int) telling {
	if hint == nil {
		h := 0
		hint = &h
	}
	tau, p, e := intercept(s, partner, x, t, sf, sp, hint)
	return telling{at: tau, where: p, evac: e, met: true}
}

// intercept solves MODEL.md §4 for a finder at node x at time t with speed sf
// and an uninformed partner on trajectory tr with speed sp: the meeting time
// τ, the meeting point and the evacuation time min τ + d(π(τ),x)/min(sf,sp)
// over τ ≥ t with d(x, π(τ)) ≤ sf·(τ − t).
//
// hint is the segment index where the previous search ended; it only steers
// the search (an exponential search around it), never the result.
func intercept(s *Site, tr *Trajectory, x int, t, sf, sp float64, hint *int) (float64, Point, float64) {
	slow := math.Min(sf, sp)
	// the partner's trajectory for this exit: segments up to the first
	// rendezvous at or after t, then stationary there.
	nseg := len(tr.Segs)
	final := tr.FinalPoint()
	tailFrom := tr.End
	if k := sort.SearchFloat64s(tr.RVTime, t-Tol(t)); k < len(tr.RVTime) {
		nseg = tr.RVSegs[k]
		final = tr.RVAt[k]
		tailFrom = tr.RVTime[k]
	}
	segs := tr.Segs[:nseg]
	// first segment that ends at or after t
	i0 := sort.Search(len(segs), func(i int) bool { return segs[i].T1 >= t })

	bestT, bestP, bestE := math.Inf(1), Point{}, math.Inf(1)
	consider := func(tau float64, p Point, d float64) {
		e := tau + d/slow
		if e < bestE-1e-12 {
			bestT, bestP, bestE = tau, p, e
		}
	}
	// the stationary tail
	{
		dEnd := s.NodeDist(final, x)
		tau := math.Max(math.Max(tailFrom, t), t+dEnd/sf)
		consider(tau, final, dEnd)
	}
	// segment g restricted to [max(t,T0), T1]: D linear in τ.
	trySeg := func(g *Seg) {
		a := math.Max(t, g.T0)
		b := g.T1
		if b < a {
			return
		}
		pa, pb := s.segPoint(g, a), s.segPoint(g, b)
		da, db := s.NodeDist(pa, x), s.NodeDist(pb, x)
		// feasibility h(τ) = sf(τ−t) − D(τ), linear between a and b
		ha, hb := sf*(a-t)-da, sf*(b-t)-db
		ok := func(h, tau float64) bool { return h >= -1e-9*math.Max(1, tau) }
		if ok(ha, a) {
			consider(a, pa, da)
		}
		if ok(hb, b) {
			consider(b, pb, db)
		}
		if (ha < 0) != (hb < 0) && b > a {
			// the boundary crossing
			z := a + (b-a)*(-ha)/(hb-ha)
			pz := s.segPoint(g, z)
			consider(z, pz, s.NodeDist(pz, x))
		}
	}
	if sp <= sf {
		// feasibility never decreases and the objective never decreases on
		// the feasible part: the earliest feasible τ is optimal. Binary search
		// the first segment whose end is feasible.
		feasible := func(i int) bool {
			g := &segs[i]
			var d float64
			if g.N1 >= 0 {
				d = s.Dist(int(g.N1), x)
			} else {
				d = s.NodeDist(s.segPoint(g, g.T1), x)
			}
			return sf*(g.T1-t)-d >= -1e-9*math.Max(1, g.T1)
		}
		j := firstTrue(i0, len(segs), *hint, feasible)
		if j < len(segs) {
			trySeg(&segs[j])
			*hint = j
		}
	} else {
		for i := i0; i < len(segs); i++ {
			if math.Max(t, segs[i].T0) >= bestE {
				break // τ ≥ evac already reached: no later meeting helps
			}
			trySeg(&segs[i])
		}
	}
	return bestT, bestP, bestE
}
