package geom

import (
	"math"
	"sort"
)

// Edge joins nodes A and B; Len is its length in drawing units (≤ 0 counts as
// the typical length).
type Edge struct {
	A, B int
	Len  float64
}

// MedianLen returns the median of the positive edge lengths, or 1 when there
// are none. O(m log m).
func MedianLen(edges []Edge) float64 {
	ls := make([]float64, 0, len(edges))
	for _, e := range edges {
		if e.Len > 0 {
			ls = append(ls, e.Len)
		}
	}
	if len(ls) == 0 {
		return 1
	}
	sort.Float64s(ls)
	return ls[len(ls)/2]
}

// TidyAspect is the largest width:height ratio of a Tidy layout (about a
// desktop canvas's shape); narrower trees keep their natural row gaps.
const TidyAspect = 1.5

// Tidy returns a layered layout of the graph with n nodes, drawn downwards
// from root (root at the origin). All nodes with the same number of corridors
// from the root share a row; the gap above a row is the median length of the
// corridors entering it, clamped to [½, 3] × the median corridor length, so
// lengths are roughly reflected while rows stay readable. Leaves take
// consecutive columns one median length apart in depth-first order, and every
// inner node is centred over its first and last child.
//
// A tree much wider than deep (a 2,000-junction generated site has about
// 1,000 leaves over a dozen rows) is stretched vertically, every row gap by
// the same factor, until its width is at most TidyAspect × its height, so
// that a fitted view uses the canvas instead of drawing a flat strip.
// Stretching one axis keeps every property below (it maps segments to
// segments and never brings two points closer).
//
// The subtrees of two siblings occupy disjoint column ranges and rows keep
// their order, so no two nodes are closer than half the median length and no
// two corridors cross (tests check both). The graph need not be a tree: a
// depth-first spanning forest is laid out (root's component first, then the
// others in index order, side by side), so the function also copes with a
// scenario that is still being edited. Edges with an end out of range are
// ignored. O(n + m log m).
func Tidy(n int, edges []Edge, root int) []Pt {
	pos := make([]Pt, n)
	if n == 0 {
		return pos
	}
	unit := MedianLen(edges)
	level := make([]int, n)
	var rowLens [][]float64 // lengths of the corridors entering each row
	// adjacency (CSR, edge order)
	deg := make([]int, n+1)
	for _, e := range edges {
		if e.A < 0 || e.B < 0 || e.A >= n || e.B >= n || e.A == e.B {
			continue
		}
		deg[e.A+1]++
		deg[e.B+1]++
	}
	for i := 1; i <= n; i++ {
		deg[i] += deg[i-1]
	}
	adj := make([]int, deg[n])
	adjL := make([]float64, deg[n])
	fill := append([]int(nil), deg[:n]...)
	for _, e := range edges {
		if e.A < 0 || e.B < 0 || e.A >= n || e.B >= n || e.A == e.B {
			continue
		}
		adj[fill[e.A]], adjL[fill[e.A]] = e.B, e.Len
		fill[e.A]++
		adj[fill[e.B]], adjL[fill[e.B]] = e.A, e.Len
		fill[e.B]++
	}
	parent := make([]int, n)
	seen := make([]bool, n)
	order := make([]int, 0, n)   // preorder of the spanning forest
	children := make([][]int, n) // in adjacency order
	col := 0.0
	if root < 0 || root >= n {
		root = 0
	}
	layoutFrom := func(r int) {
		// DFS preorder with an explicit stack; children in adjacency order.
		first := len(order)
		parent[r] = -1
		seen[r] = true
		level[r] = 0
		stack := []int{r}
		for len(stack) > 0 {
			v := stack[len(stack)-1]
			stack = stack[:len(stack)-1]
			order = append(order, v)
			var kids []int
			for k := deg[v]; k < deg[v+1]; k++ {
				w := adj[k]
				if seen[w] {
					continue
				}
				seen[w] = true
				parent[w] = v
				l := adjL[k]
				if !(l > 0) {
					l = unit
				}
				level[w] = level[v] + 1
				for len(rowLens) <= level[w] {
					rowLens = append(rowLens, nil)
				}
				rowLens[level[w]] = append(rowLens[level[w]], l)
				kids = append(kids, w)
			}
			children[v] = kids
			for i := len(kids) - 1; i >= 0; i-- {
				stack = append(stack, kids[i])
			}
		}
		// postorder (reverse preorder gives children before parents): columns
		// must be handed to leaves in preorder, so do that first.
		for _, v := range order[first:] {
			if len(children[v]) == 0 {
				pos[v].X = col * unit
				col++
			}
		}
		for i := len(order) - 1; i >= first; i-- {
			v := order[i]
			if k := children[v]; len(k) > 0 {
				pos[v].X = (pos[k[0]].X + pos[k[len(k)-1]].X) / 2
			}
		}
		col++ // a blank column between components
	}
	layoutFrom(root)
	for v := 0; v < n; v++ {
		if !seen[v] {
			layoutFrom(v)
		}
	}
	rowY := make([]float64, len(rowLens)+1)
	for k := 1; k < len(rowLens); k++ {
		ls := rowLens[k]
		sort.Float64s(ls)
		gap := math.Max(unit/2, math.Min(3*unit, ls[len(ls)/2]))
		rowY[k] = rowY[k-1] + gap
	}
	// a wide tree (many leaves, few rows) would be one flat strip: stretch the
	// rows until the drawing is no wider than TidyAspect × its height
	xmin, xmax := math.Inf(1), math.Inf(-1)
	for v := range pos {
		xmin, xmax = math.Min(xmin, pos[v].X), math.Max(xmax, pos[v].X)
	}
	if len(rowLens) > 1 && rowY[len(rowLens)-1] > 0 && xmax-xmin > TidyAspect*rowY[len(rowLens)-1] {
		h := rowY[len(rowLens)-1]
		f := (xmax - xmin) / (TidyAspect * h)
		for k := range rowY {
			rowY[k] *= f
		}
	}
	for v := range pos {
		pos[v].Y = rowY[level[v]]
	}
	// shift so that root is at the origin
	r0 := pos[root]
	for i := range pos {
		pos[i] = pos[i].Sub(r0)
	}
	return pos
}
