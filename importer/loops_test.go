package importer

import (
	"fmt"
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/graph/path"
	"gonum.org/v1/gonum/graph/simple"
	"gonum.org/v1/gonum/graph/topo"
)

// TestLoopsShortestPathTree: on 200 random graphs with loops, the imported
// open corridors form a shortest-path tree from the start (each node's
// distance along them equals gonum's Dijkstra on the whole graph, the
// reference), and every closed corridor closes exactly one loop: there are
// as many closed corridors as cycles in gonum's cycle basis (m − n + 1), and
// each closes one cycle with the open tree.
func TestLoopsShortestPathTree(t *testing.T) {
	rng := rand.New(rand.NewPCG(2026, 12))
	for trial := 0; trial < 200; trial++ {
		n := 4 + rng.IntN(40)
		pos := make([][2]float64, n)
		for i := range pos {
			pos[i] = [2]float64{rng.Float64() * 1000, rng.Float64() * 1000}
		}
		type edge struct {
			u, v int
			w    float64
		}
		var edges []edge
		has := map[[2]int]bool{}
		addEdge := func(u, v int) {
			if u == v || has[[2]int{min(u, v), max(u, v)}] {
				return
			}
			has[[2]int{min(u, v), max(u, v)}] = true
			edges = append(edges, edge{u, v, 0})
		}
		for v := 1; v < n; v++ {
			addEdge(rng.IntN(v), v)
		}
		for k := 0; k < 1+rng.IntN(2*n); k++ {
			addEdge(rng.IntN(n), rng.IntN(n))
		}
		given := trial%2 == 0 // half the graphs carry a "length" property, the others are measured
		var fc collection
		fc.Type = "FeatureCollection"
		for i := range edges {
			e := &edges[i]
			a, b := pos[e.u], pos[e.v]
			mid := [2]float64{(a[0]+b[0])/2 + rng.Float64()*3, (a[1]+b[1])/2 + rng.Float64()*3}
			props := map[string]any{}
			if given {
				e.w = 1 + rng.Float64()*99
				props["length"] = e.w
			} else {
				e.w = math.Hypot(mid[0]-a[0], mid[1]-a[1]) + math.Hypot(b[0]-mid[0], b[1]-mid[1])
			}
			fc.Features = append(fc.Features, lineFeature([][2]float64{a, mid, b}, props))
		}
		start := rng.IntN(n)
		for v := 0; v < n; v++ {
			props := map[string]any{"id": fmt.Sprintf("n%d", v)}
			if v == start {
				props["start"] = true
			}
			fc.Features = append(fc.Features, pointFeature(pos[v], props))
		}
		r, err := ReadGeoJSON(marshal(t, fc), Options{Planar: true})
		if err != nil {
			t.Fatalf("trial %d: %v", trial, err)
		}
		s := r.Site
		// the reference: gonum's Dijkstra on the whole graph
		g := simple.NewWeightedUndirectedGraph(0, math.Inf(1))
		for _, e := range edges {
			g.SetWeightedEdge(g.NewWeightedEdge(simple.Node(e.u), simple.Node(e.v), e.w))
		}
		sp := path.DijkstraFrom(simple.Node(start), g)
		for v := 0; v < n; v++ {
			i, ok := s.Index(fmt.Sprintf("n%d", v))
			if !ok {
				t.Fatalf("trial %d: node n%d lost", trial, v)
			}
			want := sp.WeightTo(int64(v))
			if got := s.Depth[i]; math.Abs(got-want) > 1e-9*math.Max(1, want) {
				t.Fatalf("trial %d: n%d is %.12g from the start along the open corridors, Dijkstra says %.12g", trial, v, got, want)
			}
		}
		basis := topo.UndirectedCyclesIn(g)
		closed := 0
		for i, c := range r.Scenario.Corridors {
			if !c.Closed {
				continue
			}
			closed++
			// the open tree plus this corridor: exactly one union fails
			u := newUF(s.N)
			fails := 0
			for j, d := range r.Scenario.Corridors {
				if d.Closed && j != i {
					continue
				}
				if !u.union(int(s.EU[j]), int(s.EV[j])) {
					fails++
				}
			}
			if fails != 1 {
				t.Fatalf("trial %d: closed corridor %d closes %d loops with the open tree", trial, i, fails)
			}
		}
		if closed != len(edges)-n+1 || closed != len(basis) || closed != len(r.Closed) {
			t.Fatalf("trial %d: %d closed (%d reported), m − n + 1 = %d, gonum's cycle basis has %d", trial, closed, len(r.Closed), len(edges)-n+1, len(basis))
		}
	}
}
