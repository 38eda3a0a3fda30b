package search

import (
	"context"
	"testing"
	"time"

	"github.com/stretchr/testify/require"

	"duosweep/engine"
	"duosweep/engine/internal/fixtures"
)

// LB3 never exceeds what exhaustive search achieves (120 small trees, both
// models; TestSearchPlannersOnSmallTrees checks exhaustive ≥ LB on 300
// more): the class optimum is a real plan, so it must be ≥ every valid lower
// bound. The share of proven-optimal runs (worst = LB) is logged.
func TestLB3BelowExhaustive(t *testing.T) {
	trees := 120
	if testing.Short() {
		trees = 40
	}
	tight, tightOld, total := 0, 0, 0
	for i := 0; i < trees; i++ {
		s := fixtures.MustSite(t, fixtures.SearchTree(uint64(9600+i), 3+i%8))
		b := engine.ComputeBounds(s)
		for _, m := range engine.Models {
			p, res, err := Exhaustive(context.Background(), s, m, Options{Budget: time.Minute, Seed: 1})
			require.NoError(t, err)
			require.True(t, res.Proven)
			w := fixtures.WorstOf(t, s, p, m)
			require.GreaterOrEqual(t, w, b.LB3*(1-1e-9), "tree %d %s", i, m)
			total++
			if w <= b.LB*(1+1e-9) {
				tight++
			}
			if w <= fixtures.LB12(s)*(1+1e-9) {
				tightOld++
			}
		}
	}
	t.Logf("exhaustive's class optimum equals the lower bound on %d of %d runs with LB3, %d with max(LB1, LB2) alone", tight, total, tightOld)
	require.Greater(t, tight, tightOld)
}
