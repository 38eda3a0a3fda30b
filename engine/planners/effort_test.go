package planners_test

// Effort equivalence (MODEL.md §9): a site with effort factors and the same
// site with each length replaced by w·e give identical times for every
// registered planner under every model it supports, and the real lengths
// are only what a crew is told.

import (
	"context"
	"fmt"
	"math"
	"testing"
	"time"

	"duosweep/engine"
	"duosweep/engine/internal/testtrees"
	"duosweep/engine/planners"
)

// effortPair draws a random tree with random effort factors, and the same
// tree with every length multiplied out and no factors.
func effortPair(seed uint64, maxNodes int) (withEffort, multiplied engine.Scenario) {
	rng := testtrees.NewRand(seed)
	sc := testtrees.Random(rng, testtrees.Options{MaxNodes: maxNodes})
	if rng.IntN(2) == 0 {
		sc.Finish = &engine.Finish{Node: sc.Nodes[rng.IntN(len(sc.Nodes))].ID}
	}
	mult := sc.Clone()
	for i := range sc.Corridors {
		var e float64
		switch rng.IntN(4) {
		case 0:
			continue
		case 1:
			e = []float64{0.5, 1.8, 2.5, 3}[rng.IntN(4)]
		default:
			e = 0.2 + 5*rng.Float64()
		}
		sc.Corridors[i].Effort = engine.EffortValue(e)
		mult.Corridors[i].Length = sc.Corridors[i].Length * e
	}
	return sc, mult
}

func TestEffortEquivalence(t *testing.T) {
	trees := 60
	if testing.Short() {
		trees = 20
	}
	checks := 0
	for i := 0; i < trees; i++ {
		a, b := effortPair(uint64(40_000+i), 9)
		sa, err := engine.NewSite(a)
		if err != nil {
			t.Fatal(err)
		}
		sb, err := engine.NewSite(b)
		if err != nil {
			t.Fatal(err)
		}
		if ba, bb := engine.ComputeBounds(sa), engine.ComputeBounds(sb); ba != bb {
			t.Fatalf("tree %d: bounds differ: %+v vs %+v", i, ba, bb)
		}
		for _, info := range planners.Planners() {
			// a budget far above what 9-node trees need, so the search is
			// never cut by time (which would make the two runs differ)
			opt := planners.Options{Seed: int64(i), Budget: time.Minute, Iterations: 400}
			for _, m := range info.Models {
				pa, err := planners.MakePlan(context.Background(), sa, info.Name, m, opt)
				if err != nil {
					t.Fatalf("tree %d %s %s: %v", i, info.Name, m, err)
				}
				pb, err := planners.MakePlan(context.Background(), sb, info.Name, m, opt)
				if err != nil {
					t.Fatalf("tree %d %s %s: %v", i, info.Name, m, err)
				}
				for _, em := range engine.Models {
					ra, err := engine.Evaluate(sa, pa, em)
					if err != nil {
						t.Fatal(err)
					}
					rb, err := engine.Evaluate(sb, pb, em)
					if err != nil {
						t.Fatal(err)
					}
					label := fmt.Sprintf("tree %d, %s (for %s) under %s", i, info.Name, m, em)
					same(t, label, ra, rb)
					// the effort plan walked on the multiplied site too
					rc, err := engine.Evaluate(sb, pa, em)
					if err != nil {
						t.Fatal(err)
					}
					same(t, label+" (plan moved across)", ra, rc)
					checks++
				}
			}
		}
	}
	t.Logf("%d trees, %d report pairs identical", trees, checks)
}

func same(t *testing.T, label string, a, b *engine.Report) {
	t.Helper()
	eq := func(x, y float64) bool { return x == y || math.IsNaN(x) && math.IsNaN(y) }
	if !eq(a.Worst, b.Worst) || a.WorstExit != b.WorstExit || !eq(a.Expected, b.Expected) || a.RouteLengths != b.RouteLengths {
		t.Fatalf("%s: worst %v/%v at %d/%d, expected %v/%v, lengths %v/%v", label, a.Worst, b.Worst, a.WorstExit, b.WorstExit, a.Expected, b.Expected, a.RouteLengths, b.RouteLengths)
	}
	for k := range a.Exits {
		x, y := a.Exits[k], b.Exits[k]
		if !eq(x.FoundAt, y.FoundAt) || x.Finder != y.Finder || !eq(x.EvacAt, y.EvacAt) || !eq(x.DoneAt, y.DoneAt) {
			t.Fatalf("%s: exit %d: %+v vs %+v", label, x.Node, x, y)
		}
	}
}
