package engine

import (
	"fmt"
	"strings"
)

// Closed corridors (FORMATS.md, second wave) stay in the scenario and on the
// drawing but are never walked: NewSite keeps them in EU, EV, EW under their
// corridor index and leaves them out of the rooted tree, so Parent,
// ParentEdge, Children and Edge only ever name open corridors.

// OpenCorridors returns the number of open corridors (N − 1 on a valid site).
func (s *Site) OpenCorridors() int {
	n := 0
	for _, c := range s.Scenario.Corridors {
		if !c.Closed {
			n++
		}
	}
	return n
}

// loopErr explains why open corridor i closes a loop: the open corridors
// before it already join its ends, along the path it names. It runs only on
// the error path and is O(n + m).
func (s *Site) loopErr(i int) error {
	u, v := s.EU[i], s.EV[i]
	adj := make(map[int32][]int32)
	for j := 0; j < i; j++ {
		if s.Scenario.Corridors[j].Closed {
			continue
		}
		a, b := s.EU[j], s.EV[j]
		adj[a] = append(adj[a], b)
		adj[b] = append(adj[b], a)
	}
	// breadth-first from v back to u over the earlier open corridors
	prev := map[int32]int32{v: -1}
	queue := []int32{v}
	for len(queue) > 0 && queue[0] != u {
		x := queue[0]
		queue = queue[1:]
		for _, y := range adj[x] {
			if _, seen := prev[y]; !seen {
				prev[y] = x
				queue = append(queue, y)
			}
		}
	}
	ids := []string{s.IDs[u]}
	for x := prev[u]; x >= 0; x = prev[x] {
		ids = append(ids, s.IDs[x])
	}
	ids = append(ids, s.IDs[u])
	c := s.Scenario.Corridors[i]
	return fieldErr(fmt.Sprintf("corridors[%d]", i), c.From+"-"+c.To,
		"closes a cycle of open corridors %s: the open corridors must form a tree (mark one of them closed)",
		strings.Join(ids, " → "))
}

// disconnectedErr explains why node v is not reached from the start: through
// no corridor at all, or only through closed ones. O(n + m).
func (s *Site) disconnectedErr(v int) error {
	uf := newUnionFind(s.N)
	for i := range s.EU {
		uf.union(int(s.EU[i]), int(s.EV[i]))
	}
	why := "not connected to the start %q: the site must be one connected tree"
	if uf.find(v) == uf.find(s.Start) {
		why = "not connected to the start %q through open corridors (reached only through closed ones): disconnected; open one of them"
	}
	return fieldErr(fmt.Sprintf("nodes[%d]", v), s.IDs[v], why, s.IDs[s.Start])
}
