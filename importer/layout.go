package importer

import (
	"fmt"

	"duosweep/canvas/geom"
)

// layoutMissing places the nodes without coordinates along the open tree:
// canvas/geom's Tidy lays the whole open tree out (corridor lengths as row
// gaps), and a node without coordinates sits where Tidy puts it relative to
// its parent in the tree from the start (the start itself, when it has none,
// at Tidy's root position). Nodes with coordinates keep them. O(n + m log m).
func layoutMissing(net *network, start int) {
	missing := false
	for _, n := range net.nodes {
		if !n.hasXY {
			missing = true
			break
		}
	}
	if !missing {
		return
	}
	n := len(net.nodes)
	var edges []geom.Edge
	adj := make([][]int, n)
	for _, e := range net.edges {
		if e.closed {
			continue
		}
		edges = append(edges, geom.Edge{A: e.from, B: e.to, Len: e.length})
		adj[e.from] = append(adj[e.from], e.to)
		adj[e.to] = append(adj[e.to], e.from)
	}
	pos := geom.Tidy(n, edges, start)
	placed := 0
	seen := make([]bool, n)
	seen[start] = true
	if !net.nodes[start].hasXY {
		net.nodes[start].xy, net.nodes[start].hasXY = [2]float64{pos[start].X, pos[start].Y}, true
		placed++
	}
	queue := []int{start}
	for len(queue) > 0 {
		v := queue[0]
		queue = queue[1:]
		for _, w := range adj[v] {
			if seen[w] {
				continue
			}
			seen[w] = true
			if !net.nodes[w].hasXY {
				p := net.nodes[v].xy
				net.nodes[w].xy = [2]float64{p[0] + pos[w].X - pos[v].X, p[1] + pos[w].Y - pos[v].Y}
				net.nodes[w].hasXY = true
				placed++
			}
			queue = append(queue, w)
		}
	}
	if placed > 0 {
		net.msgs = append(net.msgs, fmt.Sprintf("layout: %d", placed)+" node"+plural(placed)+" without coordinates laid out along the tree")
	}
}
