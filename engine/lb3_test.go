package engine_test

import (
	"fmt"
	"math"
	"testing"

	"github.com/stretchr/testify/require"

	"duosweep/engine"
	"duosweep/engine/internal/fixtures"
)

// bruteLB3 computes LB3 from its definition (docs/lower-bound.md) by plain
// enumeration: for every candidate x and every split of the other
// candidates between the agents, each agent's set is the union of the root
// paths to its candidates and to x, and the bound is
// max((2|S_0| − D_x)/v_0, (2|S_1| − D_x)/v_1); LB3 is the least of these.
// Independent of lb3.go's frontier programme (it shares only the site's
// parent links and depths).
func bruteLB3(s *engine.Site) float64 {
	cand := s.Candidates()
	in := make([][2]bool, s.N)
	mark := func(a, v int) {
		for v >= 0 && !in[v][a] {
			in[v][a] = true
			v = int(s.Parent[v])
		}
	}
	best := math.Inf(1)
	for xi, x := range cand {
		var others []int
		for i, c := range cand {
			if i != xi {
				others = append(others, c)
			}
		}
		for mask := 0; mask < 1<<len(others); mask++ {
			clear(in)
			mark(0, x)
			mark(1, x)
			for i, c := range others {
				mark(mask>>i&1, c)
			}
			var size [2]float64
			for v := 0; v < s.N; v++ {
				for a := 0; a < 2; a++ {
					if in[v][a] && s.Parent[v] >= 0 {
						size[a] += s.Depth[v] - s.Depth[s.Parent[v]]
					}
				}
			}
			d := s.Depth[x]
			best = math.Min(best, math.Max((2*size[0]-d)/s.Speed[0], (2*size[1]-d)/s.Speed[1]))
		}
	}
	return best
}

// The frontier programme equals plain enumeration of the definition on 400
// random trees with up to 11 candidates (integer and real lengths, random
// starts, some with unequal speeds), up to its cap of 1.25·max(LB1, LB2).
func TestLB3MatchesEnumeration(t *testing.T) {
	above := 0
	for i := 0; i < 400; i++ {
		s := fixtures.MustSite(t, fixtures.SearchTree(uint64(9100+i), 2+i%12))
		b := engine.ComputeBounds(s)
		want := math.Min(bruteLB3(s), engine.LB3Above*fixtures.LB12(s)*math.Max(s.Speed[0], s.Speed[1])/math.Min(s.Speed[0], s.Speed[1]))
		require.InDelta(t, want, b.LB3, 1e-9*math.Max(1, want), "tree %d", i)
		require.GreaterOrEqual(t, b.LB3, b.W/math.Max(s.Speed[0], s.Speed[1])*(1-1e-12), "tree %d: LB3 below W/v", i)
		require.Equal(t, math.Max(fixtures.LB12(s), b.LB3), b.LB)
		if b.LB3 > fixtures.LB12(s)*(1+1e-9) {
			above++
		}
	}
	t.Logf("LB3 exceeded max(LB1, LB2)/v on %d of 400 trees", above)
	require.Greater(t, above, 40, "LB3 should be stronger than max(LB1, LB2) on a good share of small trees")
}

// Derived by hand: on the PARTITION stars of MODEL.md §6 (short leaves a_i
// and one long leaf M > Σa_i) LB3 is exactly W when the a_i split into two
// equal halves (x = the long leaf, each agent takes one half) and more than
// W when they do not (every split leaves one agent |Σ_F − Σ_G| ≥ 1 more).
func TestLB3PartitionStars(t *testing.T) {
	r := fixtures.NewRand(78)
	yes, no := 0, 0
	for yes < 20 || no < 20 {
		n := 3 + r.IntN(5)
		a := make([]int, n)
		legs := make([]float64, 0, n+1)
		sum := 0
		for i := range a {
			a[i] = 1 + r.IntN(9)
			sum += a[i]
			legs = append(legs, float64(a[i]))
		}
		part := fixtures.SubsetHalf(a)
		if part && yes >= 20 || !part && no >= 20 {
			continue
		}
		M := float64(sum + 1 + r.IntN(5))
		s := fixtures.MustSite(t, fixtures.Star(append(legs, M)...))
		b := engine.ComputeBounds(s)
		if part {
			yes++
			require.InDelta(t, b.W, b.LB, 1e-9, "%v M=%g: a partition exists", a, M)
		} else {
			no++
			// the best split is off by the smallest odd-sum imbalance, ≥ 1, and
			// the agent with more walks it twice: LB3 ≥ W + 1
			require.GreaterOrEqual(t, b.LB, b.W+1-1e-9, "%v M=%g: no partition", a, M)
		}
	}
}

// Past its caps LB3 is left out (0) and LB is max(LB1, LB2)/v: a star with
// more leaves than engine.LB3MaxNodes, and a random tree that needs more work than
// lb3Work.
func TestLB3Caps(t *testing.T) {
	legs := make([]float64, engine.LB3MaxNodes+1)
	for i := range legs {
		legs[i] = float64(1 + i%7)
	}
	s := fixtures.MustSite(t, fixtures.Star(legs...))
	b := engine.ComputeBounds(s)
	require.Zero(t, b.LB3)
	require.Equal(t, fixtures.LB12(s), b.LB)
	over := 0
	for i := 0; i < 20; i++ {
		sc := fixtures.SearchTree(uint64(9900+i), 150)
		for k := range sc.Nodes {
			sc.Nodes[k].Candidate = sc.Nodes[k].ID != sc.Start
		}
		s := fixtures.MustSite(t, sc)
		if engine.ComputeBounds(s).LB3 == 0 {
			over++
			require.Equal(t, fixtures.LB12(s), engine.ComputeBounds(s).LB)
		}
	}
	require.Positive(t, over, "no 150-node tree reached the work cap")
}

// BenchmarkLB3 measures LB3 on fresh random sites (every node but the start
// a candidate) of 20 to 300 nodes; at 100 and more it usually reaches the
// work cap and gives up, which is the slowest case.
func BenchmarkLB3(b *testing.B) {
	for _, n := range []int{20, 60, 100, 300} {
		b.Run(fmt.Sprintf("n%d", n), func(b *testing.B) {
			sc := fixtures.SearchTree(1, n)
			for k := range sc.Nodes {
				sc.Nodes[k].Candidate = sc.Nodes[k].ID != sc.Start
			}
			computed := 0
			for b.Loop() {
				b.StopTimer()
				s := fixtures.MustSite(b, sc)
				u := fixtures.LB12(s) // (this computes LB3 once too, untimed)
				b.StartTimer()
				if engine.LB3(s, u) > 0 {
					computed++
				}
			}
			b.ReportMetric(float64(computed)/float64(b.N), "computed")
		})
	}
}
