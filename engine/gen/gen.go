package gen

import (
	"fmt"
	"math"
	"math/rand/v2"
	"strconv"

	"duosweep/engine"
)

// Families lists the tree families Generate knows, in display order.
var Families = []string{"random", "star", "spider", "caterpillar", "binary", "path"}

var familyNames = map[string]string{
	"random":      "random tree",
	"star":        "star",
	"spider":      "spider",
	"caterpillar": "caterpillar",
	"binary":      "binary tree",
	"path":        "path",
}

// MaxNodes is the largest size Generate accepts.
const MaxNodes = 1 << 26

// Generate returns a tree site of family with n ≥ 1 nodes, deterministic in
// seed (a PCG source). Node ids are "n0".."n{n-1}", the start is n0, every
// other node is a candidate, corridor lengths are whole numbers 1..100 and
// there are no coordinates. O(n) time and memory.
//
// Families: random (random recursive tree: node i hangs from a uniform
// earlier node), star (every node hangs from n0), spider (about √(n−1) legs
// whose node counts differ by at most one), caterpillar (a spine of ⌈n/2⌉
// nodes with the rest as leaves on uniform spine nodes), binary (node i hangs
// from (i−1)/2), path.
func Generate(family string, n int, seed int64) (engine.Scenario, error) {
	title, ok := familyNames[family]
	if !ok {
		return engine.Scenario{}, fmt.Errorf("gen: family: %q: want one of %v", family, Families)
	}
	if n < 1 || n > MaxNodes {
		return engine.Scenario{}, fmt.Errorf("gen: nodes: %d: want 1..%d", n, MaxNodes)
	}
	rng := rand.New(rand.NewPCG(uint64(seed), uint64(seed)^0x9e3779b97f4a7c15))
	parent := parents(family, n, rng)

	ids := make([]string, n)
	buf := make([]byte, 0, 16)
	for i := range ids {
		buf = strconv.AppendInt(append(buf[:0], 'n'), int64(i), 10)
		ids[i] = string(buf)
	}
	sc := engine.Scenario{
		Name:      title + ", " + strconv.Itoa(n) + " nodes, seed " + strconv.FormatInt(seed, 10),
		Unit:      "m",
		Start:     ids[0],
		Agents:    engine.DefaultAgents(),
		Nodes:     make([]engine.Node, n),
		Corridors: make([]engine.Corridor, n-1),
	}
	for i := range sc.Nodes {
		sc.Nodes[i] = engine.Node{ID: ids[i], Candidate: i != 0}
	}
	for i := 1; i < n; i++ {
		sc.Corridors[i-1] = engine.Corridor{From: ids[parent[i]], To: ids[i], Length: float64(1 + rng.IntN(100))}
	}
	return sc, nil
}

// parents returns the parent of every node (parent[0] is unused); parents
// always have smaller indices.
func parents(family string, n int, rng *rand.Rand) []int32 {
	p := make([]int32, n)
	switch family {
	case "random":
		for i := 1; i < n; i++ {
			p[i] = int32(rng.IntN(i))
		}
	case "star":
		// all zero
	case "spider":
		legs := int(math.Round(math.Sqrt(float64(n - 1))))
		if legs < 1 {
			legs = 1
		}
		for i := 1; i < n; i++ {
			if i <= legs {
				p[i] = 0
			} else {
				p[i] = int32(i - legs) // the previous node on the same leg
			}
		}
	case "caterpillar":
		spine := (n + 1) / 2
		for i := 1; i < n; i++ {
			if i < spine {
				p[i] = int32(i - 1)
			} else {
				p[i] = int32(rng.IntN(spine))
			}
		}
	case "binary":
		for i := 1; i < n; i++ {
			p[i] = int32((i - 1) / 2)
		}
	case "path":
		for i := 1; i < n; i++ {
			p[i] = int32(i - 1)
		}
	}
	return p
}
