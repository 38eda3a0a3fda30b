package published_test

import (
	"context"
	"testing"

	"github.com/stretchr/testify/require"

	"duosweep/engine"
	"duosweep/engine/internal/fixtures"
	"duosweep/engine/internal/plantest"
	"duosweep/engine/published"
)

func TestPublishedPlannersOnStar(t *testing.T) {
	// Derived by hand: star with leaves 1, 1, 3 (W = 5, L = 3, L2 = 1, LB = max(5, 3+2) = 5).
	s, err := engine.NewSite(fixtures.Star(1, 1, 3))
	require.NoError(t, err)
	b := engine.ComputeBounds(s)
	require.Equal(t, 5.0, b.W)
	require.Equal(t, 5.0, b.LB)
	for _, m := range engine.Models {
		for _, info := range published.Planners() {
			if !info.Supports(m) {
				continue
			}
			p, err := published.MakePlan(context.Background(), s, info.Name, m)
			require.NoError(t, err, info.Name)
			r, err := engine.Evaluate(s, p, m)
			require.NoError(t, err, info.Name)
			require.True(t, r.Complete, info.Name)
			require.GreaterOrEqual(t, r.Worst, b.LB-1e-9, info.Name)
			t.Logf("%s/%s: worst %g at %s", info.Name, m, r.Worst, s.IDs[r.WorstExit])
		}
	}
	// together with the farthest branch last: 2W - L = 7 (hand derivation: 1 out and back, 1 out and back, 3 out).
	p, err := published.MakePlan(context.Background(), s, "together", engine.Radio)
	require.NoError(t, err)
	r, err := engine.Evaluate(s, p, engine.Radio)
	require.NoError(t, err)
	require.InDelta(t, 7.0, r.Worst, 1e-9)
}

func TestPublishedGuaranteesSmoke(t *testing.T) {
	worstRatio := map[string]float64{}
	plantest.ForEachPublishedPlan(t, 400, 26, func(seed uint64, s *engine.Site, info published.Planner, m engine.Model, p *engine.Plan, r *engine.Report) {
		b := engine.ComputeBounds(s)
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
	plantest.ForEachPublishedPlan(t, 300, 26, func(seed uint64, s *engine.Site, info published.Planner, m engine.Model, p *engine.Plan, r *engine.Report) {
		if info.Name != "together" || len(s.Candidates()) == 0 {
			return
		}
		require.GreaterOrEqual(t, r.Worst, togetherFloor(s)*(1-1e-9), "seed %d %s", seed, m)
	})
	// unequal speeds
	for seed := uint64(1); seed <= 300; seed++ {
		sc := fixtures.RandomScenario(seed, 2+int(seed%25))
		sc.Agents = []engine.Agent{{Name: "A", Speed: 1}, {Name: "B", Speed: 1.7}}
		if seed%2 == 0 {
			sc.Agents[0].Speed, sc.Agents[1].Speed = 1.7, 1
		}
		s, err := engine.NewSite(sc)
		require.NoError(t, err)
		if len(s.Candidates()) == 0 {
			continue
		}
		for _, m := range engine.Models {
			p, err := published.MakePlan(context.Background(), s, "together", m)
			require.NoError(t, err)
			r, err := engine.Evaluate(s, p, m)
			require.NoError(t, err)
			require.GreaterOrEqual(t, r.Worst, togetherFloor(s)*(1-1e-9), "unequal speeds, seed %d %s", seed, m)
		}
	}
}

// togetherFloor is the together planner's published floor.
func togetherFloor(s *engine.Site) float64 {
	for _, p := range published.Planners() {
		if p.Name == "together" {
			return p.Floor(s)
		}
	}
	panic("no together planner")
}
