package engine_test

// Distances checked against an outside reference: gonum's graph packages
// (gonum.org/v1/gonum/graph/simple and graph/path, all-pairs Dijkstra), a
// general-purpose shortest-path library that knows nothing about trees.
// Corridor-interior points become extra gonum nodes that split their
// corridors, so PointDist is checked by plain graph distances too.

import (
	"fmt"
	"math"
	"sort"
	"testing"

	"gonum.org/v1/gonum/graph/path"
	"gonum.org/v1/gonum/graph/simple"

	"duosweep/engine"
	"duosweep/engine/internal/testtrees"
)

func TestDistancesAgainstGonum(t *testing.T) {
	trees := 40
	if testing.Short() {
		trees = 15
	}
	rng := testtrees.NewRand(2024)
	for ti := 0; ti < trees; ti++ {
		sc := testtrees.Random(testtrees.NewRand(uint64(77_000+ti)), testtrees.Options{MinNodes: 2, MaxNodes: 200})
		s, err := engine.NewSite(sc)
		if err != nil {
			t.Fatal(err)
		}
		// random corridor-interior points, grouped by corridor
		type pt struct {
			p   engine.Point
			e   int
			off float64 // from the corridor's From end (scenario orientation)
			id  int64
		}
		var pts []pt
		byEdge := map[int][]int{}
		for k := 0; k < 40; k++ {
			e := rng.IntN(len(sc.Corridors))
			c := sc.Corridors[e]
			u, _ := s.Index(c.From)
			v, _ := s.Index(c.To)
			off := c.Length * (0.01 + 0.98*rng.Float64())
			p := engine.Point{From: u, To: v, Offset: off}
			if rng.IntN(2) == 0 {
				p = engine.Point{From: v, To: u, Offset: c.Length - off}
			}
			byEdge[e] = append(byEdge[e], len(pts))
			pts = append(pts, pt{p: p, e: e, off: off, id: int64(s.N + len(pts))})
		}
		g := simple.NewWeightedUndirectedGraph(0, math.Inf(1))
		for v := 0; v < s.N+len(pts); v++ {
			g.AddNode(simple.Node(v))
		}
		for e, c := range sc.Corridors {
			u, _ := s.Index(c.From)
			v, _ := s.Index(c.To)
			chain := append([]int(nil), byEdge[e]...)
			sort.Slice(chain, func(i, j int) bool { return pts[chain[i]].off < pts[chain[j]].off })
			prevID, prevOff := int64(u), 0.0
			for _, k := range chain {
				g.SetWeightedEdge(g.NewWeightedEdge(simple.Node(prevID), simple.Node(pts[k].id), pts[k].off-prevOff))
				prevID, prevOff = pts[k].id, pts[k].off
			}
			g.SetWeightedEdge(g.NewWeightedEdge(simple.Node(prevID), simple.Node(int64(v)), c.Length-prevOff))
		}
		all := path.DijkstraAllPaths(g)
		label := fmt.Sprintf("tree %d (%d nodes)", ti, s.N)
		for u := 0; u < s.N; u++ {
			for v := 0; v < s.N; v++ {
				want := all.Weight(int64(u), int64(v))
				if got := s.Dist(u, v); !close9(got, want) {
					t.Fatalf("%s: Dist(%d,%d) = %v, gonum %v", label, u, v, got, want)
				}
				if got := s.PointDist(engine.At(u), engine.At(v)); !close9(got, want) {
					t.Fatalf("%s: PointDist(node %d, node %d) = %v, gonum %v", label, u, v, got, want)
				}
			}
		}
		for i, a := range pts {
			for v := 0; v < s.N; v++ {
				want := all.Weight(a.id, int64(v))
				if got := s.NodeDist(a.p, v); !close9(got, want) {
					t.Fatalf("%s: NodeDist(%+v, %d) = %v, gonum %v", label, a.p, v, got, want)
				}
				if got := s.PointDist(a.p, engine.At(v)); !close9(got, want) {
					t.Fatalf("%s: PointDist(%+v, node %d) = %v, gonum %v", label, a.p, v, got, want)
				}
				if got := s.PointDist(engine.At(v), a.p); !close9(got, want) {
					t.Fatalf("%s: PointDist(node %d, %+v) = %v, gonum %v", label, v, a.p, got, want)
				}
			}
			for j, b := range pts {
				want := all.Weight(a.id, b.id)
				if i == j {
					want = 0
				}
				if got := s.PointDist(a.p, b.p); !close9(got, want) {
					t.Fatalf("%s: PointDist(%+v, %+v) = %v, gonum %v", label, a.p, b.p, got, want)
				}
			}
		}
	}
}

// TestCanonAndLCA: Canon maps corridor ends to nodes and orients interior
// points from the lower index; LCA on a hand tree (derived by hand).
func TestCanonAndLCA(t *testing.T) {
	s := mustSite(t, testtrees.Caterpillar([]float64{2, 2, 2}, []float64{1, 0, 1}))
	S, c1, c2, c3, h1, h3 := idx(t, s, "s"), idx(t, s, "c1"), idx(t, s, "c2"), idx(t, s, "c3"), idx(t, s, "h1"), idx(t, s, "h3")
	if got := s.Canon(engine.Point{From: c1, To: c2, Offset: 0}); got != engine.At(c1) {
		t.Errorf("offset 0: %+v", got)
	}
	if got := s.Canon(engine.Point{From: c1, To: c2, Offset: 2}); got != engine.At(c2) {
		t.Errorf("offset = length: %+v", got)
	}
	a, b := s.Canon(engine.Point{From: c2, To: c1, Offset: 0.5}), s.Canon(engine.Point{From: c1, To: c2, Offset: 1.5})
	if a != b {
		t.Errorf("same point, two forms: %+v vs %+v", a, b)
	}
	// h1 hangs off c1, h3 off c3: LCA c1; d(h1,h3) = 1 + 4 + 1 = 6
	if l := s.LCA(h1, h3); l != c1 {
		t.Errorf("LCA(h1,h3) = %d, want c1 = %d", l, c1)
	}
	if d := s.Dist(h1, h3); d != 6 {
		t.Errorf("Dist(h1,h3) = %v, want 6", d)
	}
	if l := s.LCA(S, c3); l != S {
		t.Errorf("LCA(s,c3) = %d", l)
	}
	if p := s.Path(h1, h3); fmt.Sprint(p) != fmt.Sprint([]int{h1, c1, c2, c3, h3}) {
		t.Errorf("Path(h1,h3) = %v", p)
	}
}
