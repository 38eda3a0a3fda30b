package published

import (
	"context"
	"fmt"
	"math"
	"math/rand/v2"
	"sort"
	"strings"
	"testing"

	"github.com/stretchr/testify/require"

	"duosweep/engine"
	"duosweep/engine/internal/fixtures"
)

// hubFamilies are the tree shapes of the hub-rendezvous tests.
var hubFamilies = []string{"random", "star", "spider", "caterpillar", "binary", "path"}

// hubTree draws a seeded test tree of the given family: 2..60 nodes, the
// start at a random node, a random non-empty candidate subset, integer or
// real lengths, and (when unequal) speeds 1 and a random other speed.
// Invented test data.
func hubTree(r *rand.Rand, family string, unequal bool) engine.Scenario {
	n := 2 + r.IntN(59)
	parent := make([]int, n)
	parent[0] = -1
	switch family {
	case "random":
		bushy := r.IntN(3)
		for i := 1; i < n; i++ {
			switch bushy {
			case 0:
				parent[i] = r.IntN(i)
			case 1:
				parent[i] = i - 1
				if r.IntN(4) == 0 {
					parent[i] = r.IntN(i)
				}
			default:
				parent[i] = r.IntN(min(i, 3))
			}
		}
	case "star":
		for i := 1; i < n; i++ {
			parent[i] = 0
		}
	case "spider":
		legs := 2 + r.IntN(6)
		for i := 1; i < n; i++ {
			if i <= legs {
				parent[i] = 0
			} else {
				parent[i] = i - legs
			}
		}
	case "caterpillar":
		spine := 1 + r.IntN(n)
		for i := 1; i < n; i++ {
			if i < spine {
				parent[i] = i - 1
			} else {
				parent[i] = r.IntN(spine)
			}
		}
	case "binary":
		for i := 1; i < n; i++ {
			parent[i] = (i - 1) / 2
		}
	case "path":
		for i := 1; i < n; i++ {
			parent[i] = i - 1
		}
	}
	integer := r.IntN(2) == 0
	length := func() float64 {
		if integer {
			return float64(1 + r.IntN(9))
		}
		return 0.1 + 9.9*r.Float64()
	}
	sc := engine.Scenario{Name: family}
	start := r.IntN(n)
	sc.Start = fmt.Sprintf("n%d", start)
	density := 0.2 + 0.8*r.Float64()
	some := false
	for i := 0; i < n; i++ {
		cand := i != start && r.Float64() < density
		some = some || cand
		sc.Nodes = append(sc.Nodes, engine.Node{ID: fmt.Sprintf("n%d", i), Candidate: cand})
		if i > 0 {
			sc.Corridors = append(sc.Corridors, engine.Corridor{From: fmt.Sprintf("n%d", parent[i]), To: fmt.Sprintf("n%d", i), Length: length()})
		}
	}
	if !some {
		k := (start + 1 + r.IntN(n-1)) % n
		sc.Nodes[k].Candidate = true
	}
	sc.Agents = engine.DefaultAgents()
	if unequal {
		sc.Agents[r.IntN(2)].Speed = 0.25 + 1.75*r.Float64()
	}
	return sc
}

// bruteTree is an independent adjacency view of a scenario for the tests.
type bruteTree struct {
	adj    [][]int // neighbour node indices
	adjLen [][]float64
	search []bool // the smallest subtree holding the start and every candidate
}

func newBruteTree(t *testing.T, sc engine.Scenario) *bruteTree {
	n := len(sc.Nodes)
	idx := map[string]int{}
	for i, nd := range sc.Nodes {
		idx[nd.ID] = i
	}
	bt := &bruteTree{adj: make([][]int, n), adjLen: make([][]float64, n), search: make([]bool, n)}
	for _, c := range sc.Corridors {
		u, v := idx[c.From], idx[c.To]
		bt.adj[u] = append(bt.adj[u], v)
		bt.adj[v] = append(bt.adj[v], u)
		bt.adjLen[u] = append(bt.adjLen[u], c.Length)
		bt.adjLen[v] = append(bt.adjLen[v], c.Length)
	}
	// search tree: nodes on a start–candidate path
	st := idx[sc.Start]
	par := make([]int, n)
	for i := range par {
		par[i] = -2
	}
	par[st] = -1
	queue := []int{st}
	for len(queue) > 0 {
		v := queue[0]
		queue = queue[1:]
		for _, w := range bt.adj[v] {
			if par[w] == -2 {
				par[w] = v
				queue = append(queue, w)
			}
		}
	}
	bt.search[st] = true
	for i, nd := range sc.Nodes {
		if nd.Candidate {
			for v := i; v >= 0 && !bt.search[v]; v = par[v] {
				bt.search[v] = true
			}
		}
	}
	require.Equal(t, n, len(bt.adj))
	return bt
}

// componentWeight sums the corridor lengths of the search tree reachable from
// node from without crossing node block or the corridor from–block.
func (bt *bruteTree) componentWeight(from, block int) float64 {
	seen := map[int]bool{from: true, block: true}
	stack := []int{from}
	sum := 0.0
	for len(stack) > 0 {
		v := stack[len(stack)-1]
		stack = stack[:len(stack)-1]
		for k, w := range bt.adj[v] {
			if !bt.search[w] || seen[w] {
				continue
			}
			seen[w] = true
			sum += bt.adjLen[v][k]
			stack = append(stack, w)
		}
	}
	return sum
}

func (bt *bruteTree) edgeLen(u, v int) float64 {
	for k, w := range bt.adj[u] {
		if w == v {
			return bt.adjLen[u][k]
		}
	}
	return math.NaN()
}

// distFrom returns the distances from point c to every node, by a plain graph search.
func (bt *bruteTree) distFrom(s *engine.Site, c engine.Point) []float64 {
	n := len(bt.adj)
	d := make([]float64, n)
	for i := range d {
		d[i] = math.Inf(1)
	}
	var stack []int
	if c.IsNode() {
		d[c.From] = 0
		stack = append(stack, c.From)
	} else {
		d[c.From] = c.Offset
		d[c.To] = bt.edgeLen(c.From, c.To) - c.Offset
		stack = append(stack, c.From, c.To)
	}
	for len(stack) > 0 {
		v := stack[len(stack)-1]
		stack = stack[:len(stack)-1]
		for k, w := range bt.adj[v] {
			if nd := d[v] + bt.adjLen[v][k]; nd < d[w] {
				d[w] = nd
				stack = append(stack, w)
			}
		}
	}
	return d
}

func TestCentroidHandExamples(t *testing.T) {
	// Derived by hand: star with leaves 1, 1, 3 from the centre (W = 5). The
	// 3-leaf side weighs 3 − x at offset x from the centre, the rest 2 + x:
	// balanced at x = 0.5.
	s, err := engine.NewSite(fixtures.Star(1, 1, 3))
	require.NoError(t, err)
	c := s.Centroid()
	l3, _ := s.Index("l3")
	require.False(t, c.IsNode())
	require.InDelta(t, 0.5, s.PointDist(engine.At(s.Start), c), 1e-12)
	require.InDelta(t, 2.5, s.NodeDist(c, l3), 1e-12)
	// star with four unit leaves: the centre itself (each component weighs 1 ≤ 2).
	s, err = engine.NewSite(fixtures.Star(1, 1, 1, 1))
	require.NoError(t, err)
	require.Equal(t, engine.At(s.Start), s.Centroid())
}

func TestHubHandExamples(t *testing.T) {
	ctx := context.Background()
	// Derived by hand: star with four unit leaves, start at the centre. The
	// parts split evenly (two leaves each): both are back at the centre at
	// t = 4 = W, and an exit found earlier is reached by t = 4 + 1 = 5.
	// MODEL.md §5: no plan does better than 5 here (LB3 = 5), so the plan is optimal.
	s, err := engine.NewSite(fixtures.Star(1, 1, 1, 1))
	require.NoError(t, err)
	p, err := MakePlan(ctx, s, "hub-rendezvous", engine.FaceToFace)
	require.NoError(t, err)
	r, err := engine.Evaluate(s, p, engine.FaceToFace)
	require.NoError(t, err)
	require.True(t, r.Complete)
	require.InDelta(t, 5.0, r.Worst, 1e-9)
	require.InDelta(t, 5.0, r.Bounds.LB, 1e-12) // LB3 proves 5 optimal (docs/lower-bound.md)
	// Derived by hand: star 1, 1, 3 (W = LB = 5). Whatever the plan, the
	// face-to-face worst is at most 1.5·W = 7.5 here (the assertion of MODEL.md §6).
	s, err = engine.NewSite(fixtures.Star(1, 1, 3))
	require.NoError(t, err)
	p, err = MakePlan(ctx, s, "hub-rendezvous", engine.FaceToFace)
	require.NoError(t, err)
	r, err = engine.Evaluate(s, p, engine.FaceToFace)
	require.NoError(t, err)
	require.LessOrEqual(t, r.Worst, 7.5+1e-9)
	require.GreaterOrEqual(t, r.Worst, 5.0-1e-9)
	t.Logf("star 1,1,3: worst %g (%s)", r.Worst, p.Note)
	// radio is refused: the planner is face to face only
	_, err = MakePlan(ctx, s, "hub-rendezvous", engine.Radio)
	require.ErrorIs(t, err, ErrModelNotSupported)
}

func TestCentroidBruteForce(t *testing.T) {
	r := fixtures.NewRand(424242)
	for i := 0; i < 2000; i++ {
		fam := hubFamilies[i%len(hubFamilies)]
		sc := hubTree(r, fam, false)
		s, err := engine.NewSite(sc)
		require.NoError(t, err)
		bt := newBruteTree(t, sc)
		W := engine.ComputeBounds(s).W
		c := s.Centroid()
		require.NoError(t, s.CheckPoint(c))
		tol := 1e-9 * math.Max(1, W)
		var comps []float64
		if c.IsNode() {
			require.True(t, bt.search[c.From], "tree %d: centroid off the search tree", i)
			for k, y := range bt.adj[c.From] {
				if bt.search[y] {
					comps = append(comps, bt.adjLen[c.From][k]+bt.componentWeight(y, c.From))
				}
			}
		} else {
			require.True(t, bt.search[c.From] && bt.search[c.To], "tree %d: centroid corridor off the search tree", i)
			e := bt.edgeLen(c.From, c.To)
			comps = append(comps, c.Offset+bt.componentWeight(c.From, c.To), e-c.Offset+bt.componentWeight(c.To, c.From))
		}
		total := 0.0
		for _, w := range comps {
			require.LessOrEqual(t, w, W/2+tol, "tree %d (%s): a component of the search tree minus the centroid weighs %g > W/2 = %g", i, fam, w, W/2)
			total += w
		}
		require.InDelta(t, W, total, tol, "tree %d: components must add up to W", i)
		d := bt.distFrom(s, c)
		for v := range d {
			if bt.search[v] {
				require.LessOrEqual(t, d[v], W/2+tol, "tree %d: node %s at %g from the centroid, W/2 = %g", i, s.IDs[v], d[v], W/2)
			}
		}
	}
}

// hubExactSplitExists reports whether the parts hanging off the start–centroid
// path (the components of the search tree minus that path) can be split
// exactly into the forward agent's share, for some choice of forward agent:
// the configuration docs/hub-rendezvous.md proves worst ≤ T1 + W/(2·slower speed).
// Computed here independently of the planner (at most hubExactItems parts).
func hubExactSplitExists(t *testing.T, s *engine.Site, sc engine.Scenario) bool {
	bt := newBruteTree(t, sc)
	c := s.Centroid()
	b := engine.ComputeBounds(s)
	d := bt.distFrom(s, engine.At(s.Start))
	// path nodes: search nodes x with d(s,x) + d(x,c) = d(s,c)
	dc := bt.distFrom(s, c)
	dsc := s.PointDist(engine.At(s.Start), c)
	n := s.N
	onPath := make([]bool, n)
	for v := 0; v < n; v++ {
		if bt.search[v] && math.Abs(d[v]+dc[v]-dsc) <= 1e-9*math.Max(1, b.W) {
			onPath[v] = true
		}
	}
	var parts []float64
	for v := 0; v < n; v++ {
		if !onPath[v] {
			continue
		}
		for k, y := range bt.adj[v] {
			if !bt.search[y] || onPath[y] {
				continue
			}
			w := bt.adjLen[v][k] + bt.componentWeight(y, v)
			if !c.IsNode() && (y == c.From || y == c.To) && (v == c.From || v == c.To) {
				w -= dsc - d[v] // the path covers c's corridor up to c
			}
			parts = append(parts, w)
		}
	}
	if len(parts) > hubExactItems {
		return false
	}
	T1 := 2 * b.W / (s.Speed[0] + s.Speed[1])
	for fa := 0; fa < 2; fa++ {
		target := (s.Speed[fa]*T1 - dsc) / 2
		if target < 0 {
			continue
		}
		for mask := 0; mask < 1<<len(parts); mask++ {
			sum := 0.0
			for j, w := range parts {
				if mask&(1<<j) != 0 {
					sum += w
				}
			}
			if math.Abs(sum-target) <= 1e-9*math.Max(1, b.W) {
				return true
			}
		}
	}
	return false
}

func hubWinner(t *testing.T, s *engine.Site) string {
	var bestR *engine.Report
	tag := ""
	for _, v := range hubVariants(s) {
		r, err := engine.Evaluate(s, v.plan, engine.FaceToFace)
		require.NoError(t, err)
		if bestR == nil || engine.Better(r, bestR) {
			bestR, tag = r, v.tag
		}
	}
	return tag
}

type hubStat struct {
	n             int
	maxLB, maxW   float64
	argLB         string
	proved, maxPW float64
	maxRef        float64 // worst / (T1 + W/(2·slower speed)), = worst/(1.5·W) at equal speeds
}

func TestHubRendezvousRandomTrees(t *testing.T) {
	ctx := context.Background()
	stats := map[string]*hubStat{}
	wins := map[string]int{}
	var failures []string
	for i := 0; i < 2000; i++ {
		fam := hubFamilies[i%len(hubFamilies)]
		seed := uint64(9000 + i)
		r := fixtures.NewRand(seed)
		unequal := i%5 == 4
		sc := hubTree(r, fam, unequal)
		s, err := engine.NewSite(sc)
		require.NoError(t, err)
		b := engine.ComputeBounds(s)
		p, err := MakePlan(ctx, s, "hub-rendezvous", engine.FaceToFace)
		require.NoError(t, err)
		rep, err := engine.Evaluate(s, p, engine.FaceToFace)
		require.NoError(t, err, "tree %d (%s, seed %d): invalid plan", i, fam, seed)
		require.True(t, rep.Complete, "tree %d (%s, seed %d): unvisited %v", i, fam, seed, rep.Unvisited)
		require.GreaterOrEqual(t, rep.Worst, b.LB*(1-1e-9), "tree %d (%s, seed %d)", i, fam, seed)
		// never worse than the plain face-to-face opposite tours it always includes
		fb, err := engine.Evaluate(s, hubOpposite(s).plan, engine.FaceToFace)
		require.NoError(t, err)
		require.LessOrEqual(t, rep.Worst, fb.Worst*(1+1e-9), "tree %d (%s, seed %d)", i, fam, seed)
		wins[hubWinner(t, s)]++

		key := fam
		if unequal {
			key += "/unequal"
		}
		st := stats[key]
		if st == nil {
			st = &hubStat{}
			stats[key] = st
		}
		st.n++
		wr := rep.Worst * math.Max(s.Speed[0], s.Speed[1]) / b.W // worst in units of W (as a time at the faster speed, like LB)
		if q := rep.Worst / b.LB; q > st.maxLB {
			st.maxLB, st.argLB = q, fmt.Sprintf("tree %d seed %d", i, seed)
		}
		st.maxW = math.Max(st.maxW, wr)
		T1 := 2 * b.W / (s.Speed[0] + s.Speed[1])
		ref := T1 + b.W/(2*math.Min(s.Speed[0], s.Speed[1]))
		st.maxRef = math.Max(st.maxRef, rep.Worst/ref)
		if !unequal && rep.Worst > 1.5*b.LB*(1+1e-9) {
			// the published 1.5-approximation for two agents face to face
			// (MODEL.md §6, hub rendezvous) is asserted against LB
			failures = append(failures, fmt.Sprintf("tree %d (%s, seed %d): worst %g > 1.5·LB = %g (W %g, note %q)", i, fam, seed, rep.Worst, 1.5*b.LB, b.W, p.Note))
		}
		if hubExactSplitExists(t, s, sc) {
			// proven in docs/hub-rendezvous.md (Theorem 1)
			bound := ref
			require.LessOrEqual(t, rep.Worst, bound*(1+1e-9)+1e-9, "tree %d (%s, seed %d): exact split, worst %g > %g", i, fam, seed, rep.Worst, bound)
			st.proved++
			st.maxPW = math.Max(st.maxPW, rep.Worst/bound)
		}
	}
	keys := make([]string, 0, len(stats))
	for k := range stats {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	for _, k := range keys {
		st := stats[k]
		t.Logf("%-20s trees %4d  max worst/LB %.4f (%s)  max worst/W %.4f  max worst/(T1+W/(2v_min)) %.4f  exact splits %3.0f (max worst/bound %.4f)", k, st.n, st.maxLB, st.argLB, st.maxW, st.maxRef, st.proved, st.maxPW)
	}
	var tags []string
	for k, v := range wins {
		tags = append(tags, fmt.Sprintf("%s %d", k, v))
	}
	sort.Strings(tags)
	t.Logf("winning variant: %s", strings.Join(tags, ", "))
	require.Empty(t, failures, "%d trees above 1.5·LB:\n%s", len(failures), strings.Join(failures, "\n"))
}

// hubBigTree is a seeded random recursive tree of n nodes (half of them
// candidates, real lengths, equal speeds) for benchmarks. Invented data.
func hubBigTree(n int, seed uint64) engine.Scenario {
	r := fixtures.NewRand(seed)
	sc := engine.Scenario{Name: "bench", Start: "n0", Agents: engine.DefaultAgents()}
	sc.Nodes = make([]engine.Node, n)
	sc.Corridors = make([]engine.Corridor, 0, n-1)
	for i := 0; i < n; i++ {
		sc.Nodes[i] = engine.Node{ID: fmt.Sprintf("n%d", i), Candidate: i > 0 && r.IntN(2) == 0}
		if i > 0 {
			sc.Corridors = append(sc.Corridors, engine.Corridor{From: fmt.Sprintf("n%d", r.IntN(i)), To: sc.Nodes[i].ID, Length: 0.5 + 20*r.Float64()})
		}
	}
	return sc
}

// BenchmarkHub plans hub-rendezvous (every variant built and evaluated
// exactly) on a 10^5-node random tree.
func BenchmarkHub(b *testing.B) {
	const n = 100_000
	s, err := engine.NewSite(hubBigTree(n, 77))
	require.NoError(b, err)
	ctx := context.Background()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if _, err := MakePlan(ctx, s, "hub-rendezvous", engine.FaceToFace); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/n, "ns/node")
}
