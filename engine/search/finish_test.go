package search

import (
	"context"
	"testing"
	"time"

	"github.com/stretchr/testify/require"

	"duosweep/engine"
	"duosweep/engine/internal/fixtures"
)

// Every finish-aware bound (LB1T, LB2T, LB3 and LB, docs/lower-bound.md)
// stays at or below exhaustive's class optimum of done(x) on 200 small trees
// with random finish nodes, carry speeds and effort factors, under both
// models: the class optimum is a real plan, so a bound above it would be a
// counterexample to the proofs. Improve never ends above its start.
func TestFinishBoundsBelowExhaustive(t *testing.T) {
	trees := 200
	if testing.Short() {
		trees = 50
	}
	tight, total := 0, 0
	for i := 0; i < trees; i++ {
		sc := fixtures.SearchTree(uint64(12_000+i), 3+i%7)
		rng := fixtures.NewRand(uint64(i))
		f := engine.Finish{Node: sc.Nodes[rng.IntN(len(sc.Nodes))].ID}
		if rng.IntN(2) == 0 {
			f.Speed = engine.EffortValue(0.25 + rng.Float64())
		}
		sc.Finish = &f
		if rng.IntN(3) == 0 {
			sc.Corridors[rng.IntN(len(sc.Corridors))].Effort = engine.EffortValue(2.5)
		}
		s := fixtures.MustSite(t, sc)
		b := engine.ComputeBounds(s)
		require.True(t, b.Finish)
		for _, m := range engine.Models {
			p, res, err := Exhaustive(context.Background(), s, m, Options{Budget: time.Minute, Seed: 1})
			require.NoError(t, err)
			require.True(t, res.Proven, "tree %d %s", i, m)
			r, err := engine.Evaluate(s, p, m)
			require.NoError(t, err)
			require.True(t, r.OverDone)
			w := r.Worst
			for name, lb := range map[string]float64{"LB1T": b.LB1T, "LB2T": b.LB2T, "LB3": b.LB3, "LB": b.LB} {
				require.GreaterOrEqual(t, w, lb*(1-1e-9), "tree %d %s: exhaustive worst done %v below %s = %v", i, m, w, name, lb)
			}
			total++
			if w <= b.LB*(1+1e-9) {
				tight++
			}
		}
	}
	t.Logf("%d exhaustive runs with a finish; the class optimum equals LB on %d", total, tight)
}

// Without its pruning bounds (noPrune) exhaustive finds the same class
// optimum of done(x): the pruning's carry terms cut no better plan.
func TestFinishPruningKeepsOptimum(t *testing.T) {
	for i := 0; i < 24; i++ {
		sc := fixtures.SearchTree(uint64(13_000+i), 3+i%3)
		rng := fixtures.NewRand(uint64(500 + i))
		sc.Finish = &engine.Finish{Node: sc.Nodes[rng.IntN(len(sc.Nodes))].ID, Speed: engine.EffortValue(0.3 + rng.Float64())}
		s := fixtures.MustSite(t, sc)
		for _, m := range engine.Models {
			p, res, err := exhaustive(context.Background(), s, m, Options{Budget: time.Minute, Seed: 1}, exConfig{})
			require.NoError(t, err)
			require.True(t, res.Proven)
			q, res2, err := exhaustive(context.Background(), s, m, Options{Budget: time.Minute, Seed: 1}, exConfig{noPrune: true, noSeed: true})
			require.NoError(t, err)
			require.True(t, res2.Proven)
			wp := fixtures.WorstOf(t, s, p, m)
			wq := fixtures.WorstOf(t, s, q, m)
			require.LessOrEqual(t, wp, wq*(1+1e-9), "tree %d %s: pruned %v, unpruned class optimum %v", i, m, wp, wq)
		}
	}
}
