// Package plantest holds test helpers that need the published planners:
// shared by the tests of engine (replay) and engine/published.
package plantest

import (
	"context"
	"testing"

	"github.com/stretchr/testify/require"

	"duosweep/engine"
	"duosweep/engine/internal/fixtures"
	"duosweep/engine/published"
)

// ForEachPublishedPlan calls fn with the plan and report of every published
// planner under every model it supports, on seeded random trees of up to
// maxN nodes (fixtures.RandomScenario).
func ForEachPublishedPlan(t *testing.T, seeds uint64, maxN int, fn func(seed uint64, s *engine.Site, info published.Planner, m engine.Model, p *engine.Plan, r *engine.Report)) {
	t.Helper()
	for seed := uint64(1); seed <= seeds; seed++ {
		s, err := engine.NewSite(fixtures.RandomScenario(seed, 2+int(seed%uint64(maxN-1))))
		require.NoError(t, err)
		for _, m := range engine.Models {
			for _, info := range published.Planners() {
				if !info.Supports(m) {
					continue
				}
				p, err := published.MakePlan(context.Background(), s, info.Name, m)
				require.NoError(t, err)
				r, err := engine.Evaluate(s, p, m)
				require.NoError(t, err, "%s %s seed %d", info.Name, m, seed)
				fn(seed, s, info, m, p, r)
			}
		}
	}
}
