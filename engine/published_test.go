package engine

import (
	"context"
	"fmt"
	"testing"

	"github.com/stretchr/testify/require"
)

// star builds a star with the start at the centre and the given leaf lengths.
func star(leaves ...float64) Scenario {
	sc := Scenario{Name: "star", Start: "c", Nodes: []Node{{ID: "c"}}}
	for i, w := range leaves {
		id := fmt.Sprintf("l%d", i+1)
		sc.Nodes = append(sc.Nodes, Node{ID: id, Candidate: true})
		sc.Corridors = append(sc.Corridors, Corridor{From: "c", To: id, Length: w})
	}
	return sc
}

func TestPublishedPlannersOnStar(t *testing.T) {
	// Derived by hand: star with leaves 1, 1, 3 (W = 5, L = 3, L2 = 1, LB = max(5, 3+2) = 5).
	s, err := NewSite(star(1, 1, 3))
	require.NoError(t, err)
	b := ComputeBounds(s)
	require.Equal(t, 5.0, b.W)
	require.Equal(t, 5.0, b.LB)
	for _, m := range Models {
		for _, info := range PlannersFor(m) {
			if info.Search {
				continue
			}
			p, err := MakePlan(context.Background(), s, info.Name, m, Options{})
			require.NoError(t, err, info.Name)
			r, err := Evaluate(s, p, m)
			require.NoError(t, err, info.Name)
			require.True(t, r.Complete, info.Name)
			require.GreaterOrEqual(t, r.Worst, b.LB-1e-9, info.Name)
			t.Logf("%s/%s: worst %g at %s", info.Name, m, r.Worst, s.IDs[r.WorstExit])
		}
	}
	// together with the farthest branch last: 2W - L = 7 (hand derivation: 1 out and back, 1 out and back, 3 out).
	p, err := MakePlan(context.Background(), s, "together", Radio, Options{})
	require.NoError(t, err)
	r, err := Evaluate(s, p, Radio)
	require.NoError(t, err)
	require.InDelta(t, 7.0, r.Worst, 1e-9)
}

// randomScenario builds a small random tree for the planners' smoke test
// (the thorough property suite lives in property_test.go).
func randomScenario(seed uint64, n int) Scenario {
	r := newTestRand(seed)
	sc := Scenario{Name: "random", Start: fmt.Sprintf("n%d", r.IntN(n))}
	for i := 0; i < n; i++ {
		sc.Nodes = append(sc.Nodes, Node{ID: fmt.Sprintf("n%d", i), Candidate: r.IntN(3) > 0})
		if i > 0 {
			sc.Corridors = append(sc.Corridors, Corridor{From: fmt.Sprintf("n%d", r.IntN(i)), To: fmt.Sprintf("n%d", i), Length: float64(1 + r.IntN(9))})
		}
	}
	for i := range sc.Nodes {
		if sc.Nodes[i].ID == sc.Start {
			sc.Nodes[i].Candidate = false
		}
	}
	return sc
}

// forEachPublishedPlan calls fn with the plan and report of every non-search
// planner under every model it supports, on seeded random trees of up to
// maxN nodes.
func forEachPublishedPlan(t *testing.T, seeds uint64, maxN int, fn func(seed uint64, s *Site, info PlannerInfo, m Model, p *Plan, r *Report)) {
	t.Helper()
	for seed := uint64(1); seed <= seeds; seed++ {
		s, err := NewSite(randomScenario(seed, 2+int(seed%uint64(maxN-1))))
		require.NoError(t, err)
		for _, m := range Models {
			for _, info := range PlannersFor(m) {
				if info.Search {
					continue
				}
				p, err := MakePlan(context.Background(), s, info.Name, m, Options{})
				require.NoError(t, err)
				r, err := Evaluate(s, p, m)
				require.NoError(t, err, "%s %s seed %d", info.Name, m, seed)
				fn(seed, s, info, m, p, r)
			}
		}
	}
}

func TestPublishedGuaranteesSmoke(t *testing.T) {
	worstRatio := map[string]float64{}
	forEachPublishedPlan(t, 400, 26, func(seed uint64, s *Site, info PlannerInfo, m Model, p *Plan, r *Report) {
		b := ComputeBounds(s)
		if len(s.Candidates()) == 0 {
			return
		}
		require.True(t, r.Complete, "%s %s seed %d", info.Name, m, seed)
		require.GreaterOrEqual(t, r.Worst, b.LB*(1-1e-9), "%s %s seed %d", info.Name, m, seed)
		k := info.Name + "/" + m.String()
		if q := r.Worst / b.LB; q > worstRatio[k] {
			worstRatio[k] = q
		}
		switch k {
		case "together/radio", "together/face-to-face":
			require.LessOrEqual(t, r.Worst, 2*b.W-b.L+1e-9, "%s seed %d", k, seed)
		case "opposite-tours/radio":
			require.LessOrEqual(t, r.Worst, 1.5*b.W+1e-9, "%s seed %d", k, seed)
			require.LessOrEqual(t, r.Worst, 1.4*b.LB+1e-9, "%s seed %d", k, seed)
		case "spine-split/radio":
			require.LessOrEqual(t, r.Worst, b.W+b.L2+1e-9, "%s seed %d", k, seed)
		case "opposite-tours/face-to-face":
			require.LessOrEqual(t, r.Worst, 2*b.W+1e-9, "%s seed %d", k, seed)
		}
	})
	t.Logf("max worst/LB: %v", worstRatio)
}

// TestTogetherFloor checks the bound BestPlan uses to skip the together
// planner: no together plan is faster than (2W − L) / faster speed.
func TestTogetherFloor(t *testing.T) {
	forEachPublishedPlan(t, 300, 26, func(seed uint64, s *Site, info PlannerInfo, m Model, p *Plan, r *Report) {
		if info.Name != "together" || len(s.Candidates()) == 0 {
			return
		}
		require.GreaterOrEqual(t, r.Worst, floors["together"](s)*(1-1e-9), "seed %d %s", seed, m)
	})
	// unequal speeds
	for seed := uint64(1); seed <= 300; seed++ {
		sc := randomScenario(seed, 2+int(seed%25))
		sc.Agents = []Agent{{Name: "A", Speed: 1}, {Name: "B", Speed: 1.7}}
		if seed%2 == 0 {
			sc.Agents[0].Speed, sc.Agents[1].Speed = 1.7, 1
		}
		s, err := NewSite(sc)
		require.NoError(t, err)
		if len(s.Candidates()) == 0 {
			continue
		}
		for _, m := range Models {
			p, err := MakePlan(context.Background(), s, "together", m, Options{})
			require.NoError(t, err)
			r, err := Evaluate(s, p, m)
			require.NoError(t, err)
			require.GreaterOrEqual(t, r.Worst, floors["together"](s)*(1-1e-9), "unequal speeds, seed %d %s", seed, m)
		}
	}
}
