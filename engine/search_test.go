package engine

import (
	"context"
	"fmt"
	"math"
	"testing"
	"time"

	"github.com/stretchr/testify/require"
)

// searchTree draws a random tree of n nodes for the search tests: random
// attachment, integer or real corridor lengths, a random start, random
// candidates (at least one), sometimes unequal speeds.
func searchTree(seed uint64, n int) Scenario {
	r := newTestRand(seed)
	sc := Scenario{Name: fmt.Sprintf("search-%d", seed), Agents: []Agent{{Name: "A", Speed: 1}, {Name: "B", Speed: 1}}}
	ints := r.IntN(2) == 0
	for i := 0; i < n; i++ {
		sc.Nodes = append(sc.Nodes, Node{ID: fmt.Sprintf("n%d", i)})
		if i > 0 {
			w := float64(1 + r.IntN(9))
			if !ints {
				w = math.Round((0.2+9.8*r.Float64())*100) / 100
			}
			sc.Corridors = append(sc.Corridors, Corridor{From: fmt.Sprintf("n%d", r.IntN(i)), To: fmt.Sprintf("n%d", i), Length: w})
		}
	}
	start := r.IntN(n)
	sc.Start = sc.Nodes[start].ID
	q := []float64{1, 1, 0.7, 0.4}[r.IntN(4)]
	k := 0
	for i := range sc.Nodes {
		if i != start && r.Float64() < q {
			sc.Nodes[i].Candidate = true
			k++
		}
	}
	if k == 0 {
		sc.Nodes[(start+1)%n].Candidate = true
	}
	if r.IntN(6) == 0 {
		sc.Agents[1].Speed = 1.5
	}
	return sc
}

func TestExhaustiveMatchesEnumeration(t *testing.T) {
	for seed := uint64(1); seed <= 40; seed++ {
		s, err := NewSite(searchTree(seed, 2+int(seed%5)))
		require.NoError(t, err)
		for _, m := range Models {
			p1, r1, err := exhaustive(context.Background(), s, m, Options{Budget: time.Minute}, exConfig{noSeed: true})
			require.NoError(t, err)
			p2, r2, err := exhaustive(context.Background(), s, m, Options{Budget: time.Minute}, exConfig{noSeed: true, noPrune: true})
			require.NoError(t, err)
			require.True(t, r1.Proven && r2.Proven)
			e1, err := Evaluate(s, p1, m)
			require.NoError(t, err)
			e2, err := Evaluate(s, p2, m)
			require.NoError(t, err)
			require.InDelta(t, e2.Worst, e1.Worst, 1e-9*e2.Worst, "seed %d %s: pruned %g, enumeration %g (states %d vs %d)", seed, m, e1.Worst, e2.Worst, r1.States, r2.States)
			if seed%10 == 0 {
				t.Logf("seed %d %s: class optimum %g, states %d pruned vs %d enumerated", seed, m, e1.Worst, r1.States, r2.States)
			}
		}
	}
}
