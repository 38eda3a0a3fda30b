package engine_test

import (
	"context"
	"math"
	"testing"

	"github.com/stretchr/testify/require"

	"duosweep/engine"
	"duosweep/engine/internal/fixtures"
	"duosweep/engine/internal/plantest"
	"duosweep/engine/published"
)

// TestReplayAgreesWithEvaluate checks, on random trees, every planner and
// both models, that a replay ends when the evaluator says, with both agents
// on the exit, that before the discovery both follow their uninformed
// routes, and that the informed trajectories never need more than full speed
// (Site.Trajectory refuses those).
func TestReplayAgreesWithEvaluate(t *testing.T) {
	plantest.ForEachPublishedPlan(t, 150, 21, func(seed uint64, s *engine.Site, info published.Planner, m engine.Model, p *engine.Plan, r *engine.Report) {
		trs, err := s.Trajectories(p)
		require.NoError(t, err)
		for _, ex := range r.Exits {
			rp, err := engine.NewReplay(s, p, m, ex.Node)
			require.NoError(t, err, "seed %d %s %s exit %d", seed, info.Name, m, ex.Node)
			require.InDelta(t, ex.EvacAt, rp.End, 1e-9*math.Max(1, ex.EvacAt))
			for a := 0; a < 2; a++ {
				require.InDelta(t, 0, s.NodeDist(rp.Position(a, rp.End+1e-9), ex.Node), 1e-6, "agent %d not at the exit", a)
				for _, f := range []float64{0, 0.3, 0.7, 1} {
					tt := f * ex.FoundAt
					require.InDelta(t, 0, s.PointDist(rp.Position(a, tt), trs[a].PositionAt(tt)), 1e-6)
				}
				require.Equal(t, rp.Informed(a, rp.End), true)
			}
			require.NotEmpty(t, rp.Events)
			require.Equal(t, engine.EventFound, rp.Events[0].Kind)
			require.InDelta(t, ex.EvacAt, rp.Events[len(rp.Events)-1].T, 1e-9*math.Max(1, ex.EvacAt))
		}
	})
}

func TestReplayRefusesNonCandidate(t *testing.T) {
	s, err := engine.NewSite(fixtures.Star(1, 2))
	require.NoError(t, err)
	p, err := published.MakePlan(context.Background(), s, "together", engine.Radio)
	require.NoError(t, err)
	_, err = engine.NewReplay(s, p, engine.Radio, s.Start)
	require.ErrorContains(t, err, "not a candidate")
	_, err = engine.NewReplay(s, p, engine.Radio, 99)
	require.Error(t, err)
}
