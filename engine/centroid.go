package engine

// Centroid returns the weighted centroid of the search tree: a point c,
// possibly inside a corridor, such that no component of the search tree
// minus c has more than W/2 corridor length (W = ComputeBounds(s).W).
// Consequently every point of the search tree is within W/2 of c: the path
// from c to a point lies inside one such component (plus c).
//
// It walks down from the start, always into the one child whose subtree
// (with its corridor) outweighs W/2, and stops at the first node where none
// does, or inside the corridor to that child at the offset where both sides
// weigh exactly W/2. O(n) (the subtree weights are cached on the site).
// Without candidates (W = 0) it returns the start.
func (s *Site) Centroid() Point {
	st := s.stats()
	W := ComputeBounds(s).W
	v := s.Start
	if !(W > 0) {
		return At(v)
	}
	half := W / 2
	for {
		next := -1
		for _, c := range s.Children(v) {
			if s.InSearch[c] && st.weight[c] > half {
				next = int(c) // at most one child can outweigh W/2
				break
			}
		}
		if next < 0 {
			return At(v)
		}
		e := s.EW[s.ParentEdge[next]]
		if st.weight[next]-e >= half {
			// below next's corridor there is still at least W/2: the part
			// above next weighs at most W/2, so keep descending
			v = next
			continue
		}
		// inside the corridor v–next: at offset x from v the lower side
		// weighs weight[next] − x, the upper side W − weight[next] + x
		return s.Canon(Point{From: v, To: next, Offset: st.weight[next] - half})
	}
}
