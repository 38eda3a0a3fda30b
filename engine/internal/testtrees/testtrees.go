package testtrees

import (
	"fmt"
	"math"
	"math/rand/v2"

	"duosweep/engine"
)

// Options shape the scenarios drawn by Random. The zero value gives trees of
// 2..60 nodes with every kind of variation switched on.
type Options struct {
	MinNodes, MaxNodes int  // node count range (defaults 2 and 60)
	EqualSpeeds        bool // never draw unequal speeds
	NoProbabilities    bool // never attach probabilities
}

// NewRand returns a PCG random source with the given seed (the fixtures'
// only source of randomness).
func NewRand(seed uint64) *rand.Rand { return rand.New(rand.NewPCG(seed, 0x5eed_d005_11ee)) }

// Random returns a random valid scenario: a random tree of MinNodes..MaxNodes
// nodes (random attachment, sometimes path-like, sometimes bushy), integer
// or real corridor lengths, the start at a random node, a random non-empty
// candidate subset, sometimes probabilities, and sometimes unequal speeds.
// Node order and corridor orientation are shuffled so that no test relies
// on the start being node 0 or on parents coming first. O(n).
func Random(rng *rand.Rand, opt Options) engine.Scenario {
	lo, hi := opt.MinNodes, opt.MaxNodes
	if lo < 2 {
		lo = 2
	}
	if hi < lo {
		hi = 60
		if hi < lo {
			hi = lo
		}
	}
	n := lo + rng.IntN(hi-lo+1)

	// tree shape: parent of the i-th created node among the earlier ones
	shape := rng.IntN(3)
	parent := make([]int, n)
	parent[0] = -1
	for i := 1; i < n; i++ {
		switch shape {
		case 0: // uniform random recursive tree
			parent[i] = rng.IntN(i)
		case 1: // long branches: mostly extend the latest node
			if rng.IntN(4) > 0 {
				parent[i] = i - 1
			} else {
				parent[i] = rng.IntN(i)
			}
		default: // bushy: attach to one of the first few nodes
			parent[i] = rng.IntN(min(i, 1+rng.IntN(4)))
		}
	}
	lengthKind := rng.IntN(3)
	length := func() float64 {
		switch lengthKind {
		case 0:
			return float64(1 + rng.IntN(9)) // integers 1..9
		case 1:
			return 0.1 + 9.9*rng.Float64() // reals
		default: // mixed, with some very short and long corridors
			if rng.IntN(2) == 0 {
				return float64(1 + rng.IntN(20))
			}
			return math.Round((0.05+3*rng.Float64())*1000) / 1000
		}
	}

	perm := rng.Perm(n) // created node i gets index perm[i]
	sc := engine.Scenario{Name: "random", Nodes: make([]engine.Node, n)}
	for i := 0; i < n; i++ {
		sc.Nodes[perm[i]] = engine.Node{ID: fmt.Sprintf("n%d", perm[i])}
	}
	edges := make([]engine.Corridor, 0, n-1)
	for i := 1; i < n; i++ {
		a, b := sc.Nodes[perm[i]].ID, sc.Nodes[perm[parent[i]]].ID
		if rng.IntN(2) == 0 {
			a, b = b, a
		}
		edges = append(edges, engine.Corridor{From: a, To: b, Length: length()})
	}
	rng.Shuffle(len(edges), func(i, j int) { edges[i], edges[j] = edges[j], edges[i] })
	sc.Corridors = edges

	start := rng.IntN(n)
	sc.Start = sc.Nodes[start].ID

	// candidates
	q := []float64{1, 1, 0.6, 0.3, 0.1}[rng.IntN(5)]
	count := 0
	for v := range sc.Nodes {
		if v != start && rng.Float64() < q {
			sc.Nodes[v].Candidate = true
			count++
		}
	}
	if count == 0 {
		v := rng.IntN(n - 1)
		if v >= start {
			v++
		}
		sc.Nodes[v].Candidate = true
	}
	if rng.IntN(20) == 0 {
		sc.Nodes[start].Candidate = true // the start itself may hold the exit
	}
	// probabilities
	if !opt.NoProbabilities && rng.IntN(4) == 0 {
		sum := 0.0
		w := make([]float64, n)
		for v := range sc.Nodes {
			if sc.Nodes[v].Candidate {
				w[v] = rng.Float64()
				if rng.IntN(5) == 0 {
					w[v] = 0
				}
				sum += w[v]
			}
		}
		if sum == 0 {
			for v := range sc.Nodes {
				if sc.Nodes[v].Candidate {
					w[v], sum = 1, 1
					break
				}
			}
		}
		for v := range sc.Nodes {
			if sc.Nodes[v].Candidate {
				sc.Nodes[v].Probability = w[v] / sum
				sc.Nodes[v].HasProbability = true
			}
		}
	}
	// speeds
	sc.Agents = []engine.Agent{{Name: "A", Speed: 1}, {Name: "B", Speed: 1}}
	if !opt.EqualSpeeds {
		switch rng.IntN(6) {
		case 0:
			sc.Agents[1].Speed = 1.7
		case 1:
			sc.Agents[0].Speed = 1.7
		case 2:
			sc.Agents[0].Speed, sc.Agents[1].Speed = 0.5+rng.Float64(), 0.5+rng.Float64()
		case 3:
			sc.Agents[0].Speed, sc.Agents[1].Speed = 1.3, 1.3
		}
	}
	return sc
}

// Named is a scenario with a name, for table tests.
type Named struct {
	Name     string
	Scenario engine.Scenario
}

func base(name string) engine.Scenario {
	return engine.Scenario{Name: name, Start: "s", Nodes: []engine.Node{{ID: "s"}},
		Agents: []engine.Agent{{Name: "A", Speed: 1}, {Name: "B", Speed: 1}}}
}

func addNode(sc *engine.Scenario, id, parent string, w float64) {
	sc.Nodes = append(sc.Nodes, engine.Node{ID: id, Candidate: true})
	sc.Corridors = append(sc.Corridors, engine.Corridor{From: parent, To: id, Length: w})
}

// Star returns a star: start "s" with leaves "l0", "l1", ... at the given
// lengths; every leaf is a candidate.
func Star(legs ...float64) engine.Scenario {
	sc := base("star")
	for i, w := range legs {
		addNode(&sc, fmt.Sprintf("l%d", i), "s", w)
	}
	return sc
}

// Path returns a path "s", "p1", "p2", ... with the given corridor lengths;
// every node but the start is a candidate.
func Path(lengths ...float64) engine.Scenario {
	sc := base("path")
	prev := "s"
	for i, w := range lengths {
		id := fmt.Sprintf("p%d", i+1)
		addNode(&sc, id, prev, w)
		prev = id
	}
	return sc
}

// Spider returns a spider: legs leave the start, leg i is a path with the
// corridor lengths legs[i]; nodes are "g<i>_<j>"; all non-start nodes are candidates.
func Spider(legs ...[]float64) engine.Scenario {
	sc := base("spider")
	for i, leg := range legs {
		prev := "s"
		for j, w := range leg {
			id := fmt.Sprintf("g%d_%d", i, j+1)
			addNode(&sc, id, prev, w)
			prev = id
		}
	}
	return sc
}

// Caterpillar returns a spine from the start with corridor lengths spine;
// hairs[i] > 0 hangs a leaf of that length off the i-th spine node after the
// start ("c<i>" spine, "h<i>" hair). All non-start nodes are candidates.
func Caterpillar(spine, hairs []float64) engine.Scenario {
	sc := base("caterpillar")
	prev := "s"
	for i, w := range spine {
		id := fmt.Sprintf("c%d", i+1)
		addNode(&sc, id, prev, w)
		prev = id
		if i < len(hairs) && hairs[i] > 0 {
			addNode(&sc, fmt.Sprintf("h%d", i+1), id, hairs[i])
		}
	}
	return sc
}

// Binary returns a complete binary tree of the given depth rooted at the
// start, with corridors of length w; all non-start nodes are candidates.
func Binary(depth int, w float64) engine.Scenario {
	sc := base("binary")
	var grow func(id string, d int)
	grow = func(id string, d int) {
		if d == depth {
			return
		}
		for _, c := range []string{"0", "1"} {
			child := id + c
			if id == "s" {
				child = "b" + c
			}
			addNode(&sc, child, id, w)
			grow(child, d+1)
		}
	}
	grow("s", 0)
	return sc
}

// Star113 is the star with leaves of length 1, 1 and 3 ("a", "b", "c"):
// W = 5, L = 3, L2 = 1, so LB = 5 (MODEL.md §6 opposite tours example).
func Star113() engine.Scenario {
	sc := base("star-1-1-3")
	addNode(&sc, "a", "s", 1)
	addNode(&sc, "b", "s", 1)
	addNode(&sc, "c", "s", 3)
	return sc
}

// Star1111 is the star with four unit leaves "a".."d": LB 4, best worst case 5 (MODEL.md §5).
func Star1111() engine.Scenario {
	sc := base("star-4x1")
	for _, id := range []string{"a", "b", "c", "d"} {
		addNode(&sc, id, "s", 1)
	}
	return sc
}

// Partition is the PARTITION star of MODEL.md §6: short leaves "a1".."an"
// of lengths a and one long leaf "m" of length M (callers choose M > Σa).
func Partition(a []float64, M float64) engine.Scenario {
	sc := base("partition")
	for i, w := range a {
		addNode(&sc, fmt.Sprintf("a%d", i+1), "s", w)
	}
	addNode(&sc, "m", "s", M)
	return sc
}

// Shapes returns the named shapes used by table tests, in a fixed order.
func Shapes() []Named {
	return []Named{
		{"star-1-1-3", Star113()},
		{"star-4x1", Star1111()},
		{"star-mixed", Star(2, 0.5, 7, 3.25, 1)},
		{"path-5", Path(1, 2, 3, 4, 5)},
		{"path-1", Path(2.5)},
		{"spider", Spider([]float64{1, 2}, []float64{3}, []float64{0.5, 0.5, 0.5}, []float64{4, 1})},
		{"caterpillar", Caterpillar([]float64{2, 2, 2, 2}, []float64{1, 0, 3, 0.5})},
		{"binary-3", Binary(3, 1)},
		{"partition", Partition([]float64{3, 1, 1, 2, 1}, 10)},
	}
}
