package engine_test

// Effort (MODEL.md §9) and finish (MODEL.md §10) in the model room:
// validation, real lengths beside effort-weighted ones, done(x) = evac(x) +
// d(x, F)/v_c with d from gonum's Dijkstra (an outside reference), the
// finish-aware bounds against an O(k²) pair scan, and a worked example derived
// by hand.

import (
	"context"
	"fmt"
	"math"
	"strings"
	"testing"

	"gonum.org/v1/gonum/graph/path"
	"gonum.org/v1/gonum/graph/simple"

	"duosweep/engine"
	"duosweep/engine/internal/testtrees"
	"duosweep/engine/planners"
)

func TestEffortValidation(t *testing.T) {
	base := testtrees.Star(3, 4)
	for _, tc := range []struct {
		e    float64
		want string
	}{
		{0, "corridors[1].effort: 0"},
		{-1, "corridors[1].effort: -1"},
		{math.NaN(), "corridors[1].effort: NaN"},
		{math.Inf(1), "corridors[1].effort: +Inf"},
		{100.5, "corridors[1].effort: 100.5"},
	} {
		sc := base.Clone()
		sc.Corridors[1].Effort = engine.EffortValue(tc.e)
		_, err := engine.NewSite(sc)
		if err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("effort %g: error %v, want one naming %q", tc.e, err, tc.want)
		}
	}
	for _, e := range []float64{0.01, 1, 2.5, 100} {
		sc := base.Clone()
		sc.Corridors[1].Effort = engine.EffortValue(e)
		s, err := engine.NewSite(sc)
		if err != nil {
			t.Fatalf("effort %g refused: %v", e, err)
		}
		if s.EW[1] != 4*e || s.RealLen[1] != 4 || s.Effort[1] != e {
			t.Errorf("effort %g: EW %g RealLen %g Effort %g", e, s.EW[1], s.RealLen[1], s.Effort[1])
		}
	}
	// Clone copies the factor, not the pointer
	sc := base.Clone()
	sc.Corridors[0].Effort = engine.EffortValue(2)
	cl := sc.Clone()
	*cl.Corridors[0].Effort = 3
	if *sc.Corridors[0].Effort != 2 {
		t.Error("Clone shares the effort pointer")
	}
	sc.Finish = &engine.Finish{Node: "s", Speed: engine.EffortValue(0.5)}
	cl = sc.Clone()
	cl.Finish.Node, *cl.Finish.Speed = "l0", 2
	if sc.Finish.Node != "s" || *sc.Finish.Speed != 0.5 {
		t.Error("Clone shares the finish")
	}
}

func TestFinishValidation(t *testing.T) {
	base := testtrees.Star(3, 4)
	bad := []struct {
		f    engine.Finish
		want string
	}{
		{engine.Finish{Node: "nowhere"}, "finish.node: nowhere"},
		{engine.Finish{Node: "s", Speed: engine.EffortValue(0)}, "finish.speed: 0"},
		{engine.Finish{Node: "s", Speed: engine.EffortValue(-0.5)}, "finish.speed: -0.5"},
		{engine.Finish{Node: "s", Speed: engine.EffortValue(math.NaN())}, "finish.speed: NaN"},
	}
	for _, tc := range bad {
		sc := base.Clone()
		f := tc.f
		sc.Finish = &f
		if _, err := engine.NewSite(sc); err == nil || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("finish %+v: error %v, want one naming %q", tc.f, err, tc.want)
		}
	}
	sc := base.Clone()
	sc.Agents = []engine.Agent{{Name: "A", Speed: 1.5}, {Name: "B", Speed: 0.75}}
	sc.Finish = &engine.Finish{Node: "l1"}
	s, err := engine.NewSite(sc)
	if err != nil {
		t.Fatal(err)
	}
	if s.Carry != 0.75 {
		t.Errorf("default carry speed %g, want the slower agent's 0.75", s.Carry)
	}
	l1, _ := s.Index("l0")
	if got := s.Out(l1); got != 7/0.75 {
		t.Errorf("o(l1) = %g, want 7/0.75", got)
	}
}

// TestRealLengths: with effort, distances are weighted and RealPointDist
// gives the real walk; offsets convert both ways. Worked by hand on the path
// a –(10 m, ×2)– b –(6 m, ×0.5)– c.
func TestRealLengths(t *testing.T) {
	sc := testtrees.Path(10, 6)
	sc.Corridors[0].Effort = engine.EffortValue(2)
	sc.Corridors[1].Effort = engine.EffortValue(0.5)
	s, err := engine.NewSite(sc)
	if err != nil {
		t.Fatal(err)
	}
	a, b, c := s.Start, int(s.Children(s.Start)[0]), -1
	c = int(s.Children(b)[0])
	if d := s.Dist(a, c); d != 23 {
		t.Errorf("weighted d(a, c) = %g, want 20 + 3", d)
	}
	if d := s.RealDist(a, c); d != 16 {
		t.Errorf("real d(a, c) = %g, want 16", d)
	}
	// 4 m into the first corridor from b's side is 8 weighted
	p := engine.Point{From: b, To: a, Offset: s.WeightedOffset(b, a, 4)}
	if p.Offset != 8 || s.RealOffset(p) != 4 {
		t.Errorf("offset %g (real %g), want 8 (4)", p.Offset, s.RealOffset(p))
	}
	q := engine.Point{From: b, To: c, Offset: s.WeightedOffset(b, c, 2)} // 1 weighted
	if d, r := s.PointDist(p, q), s.RealPointDist(p, q); d != 9 || r != 6 {
		t.Errorf("p–q: weighted %g real %g, want 9 and 6", d, r)
	}
	if r := s.RealPointDist(p, engine.At(a)); r != 6 {
		t.Errorf("p–a real %g, want 6", r)
	}
	if r := s.RealPointDist(p, engine.Point{From: a, To: b, Offset: 2}); r != 5 {
		t.Errorf("p–(1 m from a) real %g, want 5", r)
	}
}

// withFinish gives sc a random finish node and sometimes a carry speed, and
// sometimes random effort factors.
func withFinish(sc engine.Scenario, seed uint64) engine.Scenario {
	rng := testtrees.NewRand(seed)
	sc = sc.Clone()
	f := engine.Finish{Node: sc.Nodes[rng.IntN(len(sc.Nodes))].ID}
	if rng.IntN(2) == 0 {
		f.Speed = engine.EffortValue(0.3 + rng.Float64())
	}
	sc.Finish = &f
	if rng.IntN(2) == 0 {
		for i := range sc.Corridors {
			if rng.IntN(3) == 0 {
				sc.Corridors[i].Effort = engine.EffortValue([]float64{0.5, 1.8, 2.5, 4}[rng.IntN(4)])
			}
		}
	}
	return sc
}

// gonumDist returns all-pairs effort-weighted distances by gonum's Dijkstra.
func gonumDist(s *engine.Site) path.AllShortest {
	g := simple.NewWeightedUndirectedGraph(0, math.Inf(1))
	for v := 0; v < s.N; v++ {
		g.AddNode(simple.Node(v))
	}
	for i, c := range s.Scenario.Corridors {
		if c.Closed {
			continue
		}
		g.SetWeightedEdge(g.NewWeightedEdge(simple.Node(s.EU[i]), simple.Node(s.EV[i]), c.Length*c.EffortFactor()))
	}
	return path.DijkstraAllPaths(g)
}

// TestDoneIsEvacPlusCarry: done(x) = evac(x) + d(x, F)/v_c for every
// candidate of every published plan, with d from gonum; worst and expected
// are over done.
func TestDoneIsEvacPlusCarry(t *testing.T) {
	trees := 150
	if testing.Short() {
		trees = 40
	}
	for i := 0; i < trees; i++ {
		sc := withFinish(testtrees.Random(testtrees.NewRand(uint64(31_000+i)), testtrees.Options{MaxNodes: 30}), uint64(i))
		s, err := engine.NewSite(sc)
		if err != nil {
			t.Fatalf("tree %d: %v", i, err)
		}
		all := gonumDist(s)
		for _, m := range engine.Models {
			p, _, err := planners.BestPlan(context.Background(), s, m)
			if err != nil {
				t.Fatal(err)
			}
			r, err := engine.Evaluate(s, p, m)
			if err != nil {
				t.Fatal(err)
			}
			if !r.OverDone {
				t.Fatalf("tree %d: report not over done", i)
			}
			worst, exp, worstEvac := 0.0, 0.0, 0.0
			for _, ex := range r.Exits {
				want := ex.EvacAt + all.Weight(int64(ex.Node), int64(s.Finish))/s.Carry
				if !close9(ex.DoneAt, want) {
					t.Fatalf("tree %d %s exit %s: done %v, want evac %v + carry = %v", i, m, s.IDs[ex.Node], ex.DoneAt, ex.EvacAt, want)
				}
				worst = math.Max(worst, ex.DoneAt)
				worstEvac = math.Max(worstEvac, ex.EvacAt)
				exp += s.Prob[ex.Node] * ex.DoneAt
			}
			if r.Worst != worst || r.WorstEvac != worstEvac || (r.HasExpected && !close9(r.Expected, exp)) {
				t.Fatalf("tree %d %s: worst %v/%v evac %v/%v expected %v/%v", i, m, r.Worst, worst, r.WorstEvac, worstEvac, r.Expected, exp)
			}
			if r.Worst < r.Bounds.LB*(1-1e-9) {
				t.Fatalf("tree %d %s: worst %v below the finish-aware LB %v", i, m, r.Worst, r.Bounds.LB)
			}
		}
	}
}

// TestNoFinishNoChange: without a finish done = evac and the bounds are the
// old ones.
func TestNoFinishNoChange(t *testing.T) {
	for i := 0; i < 60; i++ {
		s, err := engine.NewSite(testtrees.Random(testtrees.NewRand(uint64(32_000+i)), testtrees.Options{MaxNodes: 25}))
		if err != nil {
			t.Fatal(err)
		}
		b := engine.ComputeBounds(s)
		v := math.Max(s.Speed[0], s.Speed[1])
		if b.Finish || b.MinOut != 0 || b.LB1T != b.LB1/v || b.LB2T != b.LB2/v || b.LB != math.Max(math.Max(b.LB1, b.LB2)/v, b.LB3) {
			t.Fatalf("tree %d: bounds changed without a finish: %+v", i, b)
		}
		p, r, err := planners.BestPlan(context.Background(), s, engine.Radio)
		if err != nil {
			t.Fatal(err)
		}
		_ = p
		if r.OverDone || r.Worst != r.WorstEvac {
			t.Fatalf("tree %d: worst %v, evac %v", i, r.Worst, r.WorstEvac)
		}
		for _, ex := range r.Exits {
			if ex.DoneAt != ex.EvacAt && !(math.IsInf(ex.DoneAt, 1) && math.IsInf(ex.EvacAt, 1)) {
				t.Fatalf("tree %d: done %v != evac %v", i, ex.DoneAt, ex.EvacAt)
			}
		}
	}
}

// TestLB2FinishPairScan checks LB2T against a plain scan of the definition
// with gonum's distances, and the fallback above the cap against the exact value.
func TestLB2FinishPairScan(t *testing.T) {
	for i := 0; i < 120; i++ {
		sc := withFinish(testtrees.Random(testtrees.NewRand(uint64(33_000+i)), testtrees.Options{MaxNodes: 40}), uint64(100+i))
		s, err := engine.NewSite(sc)
		if err != nil {
			t.Fatal(err)
		}
		all := gonumDist(s)
		v := math.Max(s.Speed[0], s.Speed[1])
		d := func(a, b int) float64 { return all.Weight(int64(a), int64(b)) }
		o := func(x int) float64 { return d(x, s.Finish) / s.Carry }
		want, minO := 0.0, math.Inf(1)
		cand := s.Candidates()
		for _, y := range cand {
			minO = math.Min(minO, o(y))
			for _, z := range cand {
				a := (d(s.Start, y)+d(y, z))/v + o(z)
				b := (d(s.Start, z)+d(z, y))/v + o(y)
				want = math.Max(want, math.Min(a, b))
			}
		}
		b := engine.ComputeBounds(s)
		if !b.LB2Pairs || !close9(b.LB2T, want) {
			t.Fatalf("tree %d: LB2T %v (exact %v), pair scan %v", i, b.LB2T, b.LB2Pairs, want)
		}
		if !close9(b.MinOut, minO) || !close9(b.LB1T, b.W/v+minO) {
			t.Fatalf("tree %d: MinOut %v want %v, LB1T %v", i, b.MinOut, minO, b.LB1T)
		}
		if fb := engine.LB2FinishFallback(s); fb > want*(1+1e-9) {
			t.Fatalf("tree %d: fallback %v above the exact pair bound %v", i, fb, want)
		}
	}
}

// TestFinishWorkedByHand: a worked example derived by hand. Star from the
// start c with legs l1 = 4 and l2 = 6 (both candidates), speeds 1, finish at
// the end of l2, carry speed 0.5: o(l1) = d(l1, l2)/0.5 = 20, o(l2) = 0.
//
//   - LB1T = W + min o = 10 + 0 = 10.
//   - LB2T: pair (l1, l2): min((4 + 10) + 0, (6 + 10) + 20) = 14; (l1, l1):
//     4 + 20 = 24; (l2, l2): 6 + 0 = 6. LB2T = 24.
//   - LB3: with l1 last, one cover set must also hold l2: 2·10 − 4 = 16, plus
//     o = 20: 36. With l2 last, one set holds l1: 2·10 − 6 = 14, plus 0: 14.
//     LB3 = 14. LB = max(10, 24, 14) = 24.
//
// Split plan (A to l1 at 4, B to l2 at 6), radio: exit l1 found at 4, B is 4
// along its leg, 8 from l1: evac 12, done 12 + 20 = 32; exit l2 found at 6,
// A walks 10: evac 16, done 16. Worst 32 (at l1), worst evac 16.
// Together, l1 first: both at l1 at 4 (done 24), both at l2 at 14 (done 14):
// worst 24 = LB, so it is optimal (exhaustive must find 24 under both models).
func TestFinishWorkedByHand(t *testing.T) {
	sc := testtrees.Star(4, 6)
	sc.Finish = &engine.Finish{Node: "l1", Speed: engine.EffortValue(0.5)}
	s, err := engine.NewSite(sc)
	if err != nil {
		t.Fatal(err)
	}
	b := engine.ComputeBounds(s)
	if b.LB1T != 10 || b.LB2T != 24 || b.LB3 != 14 || b.LB != 24 {
		t.Fatalf("bounds %+v, want LB1T 10, LB2T 24, LB3 14, LB 24", b)
	}
	a, bb := 1, 2
	split := &engine.Plan{Routes: [2]engine.Route{
		{Waypoints: []engine.Waypoint{{P: engine.At(a), T: 4}}},
		{Waypoints: []engine.Waypoint{{P: engine.At(bb), T: 6}}},
	}}
	r, err := engine.Evaluate(s, split, engine.Radio)
	if err != nil {
		t.Fatal(err)
	}
	ea, _ := r.ExitFor(a)
	eb, _ := r.ExitFor(bb)
	if ea.EvacAt != 12 || ea.DoneAt != 32 || eb.EvacAt != 16 || eb.DoneAt != 16 || r.Worst != 32 || r.WorstExit != a || r.WorstEvac != 16 {
		t.Fatalf("split plan: a %v/%v, b %v/%v, worst %v at %d (evac %v)", ea.EvacAt, ea.DoneAt, eb.EvacAt, eb.DoneAt, r.Worst, r.WorstExit, r.WorstEvac)
	}
	together := &engine.Plan{}
	for k := 0; k < 2; k++ {
		together.Routes[k] = engine.Route{Waypoints: []engine.Waypoint{{P: engine.At(a), T: 4}, {P: engine.At(bb), T: 14}}}
	}
	r, err = engine.Evaluate(s, together, engine.Radio)
	if err != nil {
		t.Fatal(err)
	}
	if r.Worst != 24 || r.WorstExit != a {
		t.Fatalf("together plan: worst %v at %d, want 24 at a", r.Worst, r.WorstExit)
	}
	for _, m := range engine.Models {
		p, err := planners.MakePlan(context.Background(), s, "exhaustive", m, planners.Options{})
		if err != nil {
			t.Fatal(err)
		}
		r, err := engine.Evaluate(s, p, m)
		if err != nil {
			t.Fatal(err)
		}
		if r.Worst != 24 {
			t.Errorf("%s: exhaustive worst %v, want the hand optimum 24 (%s)", m, r.Worst, p.Note)
		}
	}
}

var _ = fmt.Sprint

// TestReplayCarryLeg: with a finish, a replay ends at done(x) with both
// agents at the finish, having walked there from the exit at the carry speed.
func TestReplayCarryLeg(t *testing.T) {
	for i := 0; i < 40; i++ {
		sc := withFinish(testtrees.Random(testtrees.NewRand(uint64(34_000+i)), testtrees.Options{MaxNodes: 20}), uint64(200+i))
		s, err := engine.NewSite(sc)
		if err != nil {
			t.Fatal(err)
		}
		for _, m := range engine.Models {
			p, r, err := planners.BestPlan(context.Background(), s, m)
			if err != nil {
				t.Fatal(err)
			}
			for _, ex := range r.Exits {
				rp, err := engine.NewReplay(s, p, m, ex.Node)
				if err != nil {
					t.Fatalf("tree %d %s exit %d: %v", i, m, ex.Node, err)
				}
				if !close9(rp.End, ex.DoneAt) {
					t.Fatalf("tree %d %s exit %d: replay ends %v, done %v", i, m, ex.Node, rp.End, ex.DoneAt)
				}
				last := rp.Events[len(rp.Events)-1]
				if last.Kind != engine.EventOut || !close9(last.T, ex.DoneAt) {
					t.Fatalf("tree %d: last event %+v, want out at %v", i, last, ex.DoneAt)
				}
				walkable := s.Carry <= s.Speed[0] && s.Carry <= s.Speed[1]
				for a := 0; a < 2 && walkable; a++ {
					if d := s.NodeDist(rp.Position(a, ex.DoneAt), s.Finish); d > 1e-6 {
						t.Fatalf("tree %d %s exit %d: agent %d is %v from the finish at done", i, m, ex.Node, a, d)
					}
					if d := s.NodeDist(rp.Position(a, ex.EvacAt), ex.Node); d > 1e-6 {
						t.Fatalf("tree %d: agent %d not at the exit at evac", i, a)
					}
				}
			}
		}
	}
}

// BenchmarkBoundsFinishCap is ComputeBounds (with NewSite) on a 1,200-node
// random site with LB2PairCap candidates, with and without a finish:
// the difference is the exact pair scan of LB2 with carry.
func BenchmarkBoundsFinishCap(b *testing.B) {
	sc := testtrees.Random(testtrees.NewRand(7), testtrees.Options{MinNodes: 1200, MaxNodes: 1200, NoProbabilities: true})
	k := 0
	for i := range sc.Nodes {
		sc.Nodes[i].Candidate = sc.Nodes[i].ID != sc.Start && k < engine.LB2PairCap
		if sc.Nodes[i].Candidate {
			k++
		}
	}
	fin := sc.Clone()
	fin.Finish = &engine.Finish{Node: sc.Start}
	for _, c := range []struct {
		name string
		sc   engine.Scenario
	}{{"no-finish", sc}, {"finish", fin}} {
		b.Run(c.name, func(b *testing.B) {
			for i := 0; i < b.N; i++ {
				s, err := engine.NewSite(c.sc)
				if err != nil {
					b.Fatal(err)
				}
				engine.ComputeBounds(s)
			}
		})
	}
}
