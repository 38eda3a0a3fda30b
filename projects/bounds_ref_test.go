package projects

import (
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"gonum.org/v1/gonum/graph/path"
	"gonum.org/v1/gonum/graph/simple"

	"duosweep/engine"
)

// TestDemoBoundsReference recomputes the lower bounds of the demo site and of
// the testdata sites with gonum's all-pairs shortest paths (a general-purpose
// graph library outside the project) and the O(n²) pairwise form of LB2 from
// MODEL.md §5: max over candidate pairs y, z of min(d(s,y), d(s,z)) + d(y,z).
func TestDemoBoundsReference(t *testing.T) {
	scs := []engine.Scenario{Demo()}
	for _, f := range []string{"testdata/tee-junction.sweep.json", "testdata/gallery-wing.sweep.json", "testdata/minimal.sweep.json"} {
		sc, err := LoadFile(f)
		require.NoError(t, err)
		scs = append(scs, sc)
	}
	for _, sc := range scs {
		s, err := engine.NewSite(sc)
		require.NoError(t, err)
		g := simple.NewWeightedUndirectedGraph(0, math.Inf(1))
		for i := range sc.Nodes {
			g.AddNode(simple.Node(i))
		}
		for _, c := range sc.Corridors {
			// effort-weighted lengths (MODEL.md §9)
			g.SetWeightedEdge(g.NewWeightedEdge(simple.Node(sc.NodeIndex(c.From)), simple.Node(sc.NodeIndex(c.To)), c.Length*c.EffortFactor()))
		}
		all := path.DijkstraAllPaths(g)
		d := func(u, v int) float64 { return all.Weight(int64(u), int64(v)) }
		st := s.Start
		// W: corridors on some start-to-candidate path
		used := map[[2]int64]float64{}
		L := 0.0
		for _, x := range s.Candidates() {
			nodes, _, _ := all.Between(int64(st), int64(x))
			for i := 1; i < len(nodes); i++ {
				a, b := nodes[i-1].ID(), nodes[i].ID()
				if a > b {
					a, b = b, a
				}
				used[[2]int64{a, b}] = g.WeightedEdge(a, b).Weight()
			}
			L = math.Max(L, d(st, x))
		}
		W := 0.0
		for _, w := range used {
			W += w
		}
		lb2 := 0.0
		cands := s.Candidates()
		for _, y := range cands {
			for _, z := range cands {
				lb2 = math.Max(lb2, math.Min(d(st, y), d(st, z))+d(y, z))
			}
		}
		b := engine.ComputeBounds(s)
		assert.InDelta(t, W, b.W, 1e-9, sc.Name)
		assert.InDelta(t, L, b.L, 1e-9, sc.Name)
		assert.InDelta(t, lb2, b.LB2, 1e-9, sc.Name)
		// LB3 has its own enumeration reference (engine/lb3_test.go)
		fast := math.Max(s.Speed[0], s.Speed[1])
		// with a finish (the demo's portal), o(x) = d(x, F)/v_c and the
		// finish-aware forms of docs/lower-bound.md
		o := func(x int) float64 { return 0 }
		if sc.Finish != nil {
			f := sc.NodeIndex(sc.Finish.Node)
			o = func(x int) float64 { return d(x, f) / s.Carry }
		}
		minO, lb2t := math.Inf(1), 0.0
		for _, y := range cands {
			minO = math.Min(minO, o(y))
			for _, z := range cands {
				lb2t = math.Max(lb2t, math.Min((d(st, y)+d(y, z))/fast+o(z), (d(st, z)+d(z, y))/fast+o(y)))
			}
		}
		assert.InDelta(t, lb2t, b.LB2T, 1e-9, sc.Name)
		assert.InDelta(t, W/fast+minO, b.LB1T, 1e-9, sc.Name)
		assert.GreaterOrEqual(t, b.LB3, W/fast*(1-1e-12)+minO, sc.Name)
		assert.InDelta(t, math.Max(math.Max(W/fast+minO, lb2t), b.LB3), b.LB, 1e-9, sc.Name)
	}
}
