package importer

import (
	"fmt"
	"math"

	"github.com/paulmach/orb"
)

// Junction building: line ends within the snap tolerance are one junction
// (clustered transitively, so a chain of ends each within the snap of the
// next is one junction); an interior vertex within the snap of a line end,
// a vertex shared by two lines (or met twice by one), and a vertex a Point
// marks split their lines. Distances are in drawing coordinates (metres for
// longitude/latitude input, within the local scale's error of well under
// 0.1% across a site of 10 km).

type cell struct{ x, y int64 }

// grid buckets points by square cells for neighbour queries within a
// radius r: a map from cell to the last id added there, and a chain of
// earlier ids. Cells are 4r wide, so that a query looks at the one to four
// cells the disk of radius r overlaps (2.25 on average) rather than nine.
type grid struct {
	r, size float64
	head    map[cell]int32
	next    []int32 // next[id] is the previous id in the same cell, or -1
}

func newGrid(r float64, hint int) *grid {
	return &grid{r: r, size: 4 * r, head: make(map[cell]int32, hint), next: make([]int32, 0, hint)}
}

func (g *grid) cellOf(x, y float64) cell {
	if g.size == 0 {
		return cell{int64(math.Float64bits(x)), int64(math.Float64bits(y))}
	}
	return cell{int64(math.Floor(x / g.size)), int64(math.Floor(y / g.size))}
}

// add adds p under id; ids must be added in order 0, 1, 2, ...
func (g *grid) add(p [2]float64, id int32) {
	k := g.cellOf(p[0], p[1])
	prev, ok := g.head[k]
	if !ok {
		prev = -1
	}
	g.next = append(g.next, prev)
	g.head[k] = id
}

func (g *grid) empty() bool { return len(g.head) == 0 }

// near calls f for every id in the cells that the disk of radius r around p
// overlaps (the caller checks the distance).
func (g *grid) near(p [2]float64, f func(id int32)) {
	walk := func(c cell) {
		id, ok := g.head[c]
		for ok && id >= 0 {
			f(id)
			id = g.next[id]
		}
	}
	if g.size == 0 {
		walk(g.cellOf(p[0], p[1]))
		return
	}
	lo, hi := g.cellOf(p[0]-g.r, p[1]-g.r), g.cellOf(p[0]+g.r, p[1]+g.r)
	for x := lo.x; x <= hi.x; x++ {
		for y := lo.y; y <= hi.y; y++ {
			walk(cell{x, y})
		}
	}
}

func dist(a, b [2]float64) float64 { return math.Hypot(a[0]-b[0], a[1]-b[1]) }

// vref names vertex k of line l.
type vref struct{ l, k int32 }

func buildJunctions(net *network, lines []gline, points []gpoint, snap float64) error {
	// 1. cluster the line ends
	nEnds := 2 * len(lines)
	endXY := func(e int) [2]float64 {
		l := &lines[e/2]
		if e%2 == 0 {
			return l.xy[0]
		}
		return l.xy[len(l.xy)-1]
	}
	ends := newGrid(snap, nEnds)
	clusters := newUF(nEnds)
	for e := 0; e < nEnds; e++ {
		p := endXY(e)
		ends.near(p, func(o int32) {
			if dist(p, endXY(int(o))) <= snap {
				clusters.union(e, int(o))
			}
		})
		ends.add(p, int32(e))
	}
	nearestEnd := func(p [2]float64) int {
		best, bd := -1, math.Inf(1)
		ends.near(p, func(o int32) {
			if d := dist(p, endXY(int(o))); d <= snap && d < bd {
				best, bd = int(o), d
			}
		})
		return best
	}
	// 2. interior vertices: snapped to an end, or shared exactly
	// key[l][k] is the junction key of vertex k of line l, or -1; keys below
	// nEnds are end clusters, the others shared vertices.
	key := make([][]int32, len(lines))
	// interior position -> its junction key, or -2 with the first place seen
	type seenAt struct {
		key   int32
		first vref
	}
	shared := make(map[orb.Point]seenAt, len(lines))
	nextKey := int32(nEnds)
	for li := range lines {
		l := &lines[li]
		ks := make([]int32, len(l.src))
		last := len(l.src) - 1
		ks[0] = int32(clusters.find(2 * li))
		ks[last] = int32(clusters.find(2*li + 1))
		for k := 1; k < last; k++ {
			ks[k] = -1
			if !ends.empty() {
				if e := nearestEnd(l.xy[k]); e >= 0 {
					ks[k] = int32(clusters.find(e))
					continue
				}
			}
			p := l.src[k]
			if sa, seen := shared[p]; seen {
				if sa.key == -2 {
					sa.key = nextKey
					nextKey++
					shared[p] = sa
					f := sa.first
					if f.l == int32(li) {
						ks[f.k] = sa.key
					} else {
						key[f.l][f.k] = sa.key
					}
				}
				ks[k] = sa.key
			} else {
				shared[p] = seenAt{-2, vref{int32(li), int32(k)}}
			}
		}
		key[li] = ks
	}
	// 3. Points mark junctions: the nearest end within the snap, else the
	// nearest vertex within the snap (which then splits its line)
	marks := map[int32]*gpoint{}
	if len(points) > 0 {
		verts := newGrid(snap, 0)
		var refs []vref
		for li := range lines {
			for k := 1; k < len(lines[li].xy)-1; k++ {
				verts.add(lines[li].xy[k], int32(len(refs)))
				refs = append(refs, vref{int32(li), int32(k)})
			}
		}
		for i := range points {
			pt := &points[i]
			x, y := net.geo.ToDrawing(pt.src[0], pt.src[1])
			p := [2]float64{x, y}
			var kk int32 = -1
			if e := nearestEnd(p); e >= 0 {
				kk = int32(clusters.find(e))
			} else {
				best, bd := -1, math.Inf(1)
				verts.near(p, func(o int32) {
					r := refs[o]
					if d := dist(p, lines[r.l].xy[r.k]); d <= snap && d < bd {
						best, bd = int(o), d
					}
				})
				if best < 0 {
					return errAt(pt.where, "Point %q at %g,%g is not within the snap (%g) of a line end or vertex", pt.id, pt.src[0], pt.src[1], snap)
				}
				r := refs[best]
				kk = key[r.l][r.k]
				if kk < 0 {
					kk = nextKey
					nextKey++
					key[r.l][r.k] = kk
				}
			}
			if other, dup := marks[kk]; dup {
				return errAt(pt.where, "Point %q marks the same junction as %s (%q)", pt.id, other.where, other.id)
			}
			marks[kk] = pt
		}
	}
	// 4. walk the lines, numbering junctions as they are met, and cut pieces
	nodeOf := make(map[int32]int, len(lines))
	node := func(kk int32, l *gline, k int) int {
		if v, ok := nodeOf[kk]; ok {
			return v
		}
		v := len(net.nodes)
		nodeOf[kk] = v
		n := jnode{src: [2]float64(l.src[k]), xy: l.xy[k], hasXY: true, where: l.where}
		if pt := marks[kk]; pt != nil {
			n.id, n.named, n.label = pt.id, pt.hasID, pt.label
			n.candidate, n.prob, n.start = pt.candidate, pt.prob, pt.start
			n.where = pt.where
		}
		net.nodes = append(net.nodes, n)
		return v
	}
	net.firstWhere = lines[0].where
	dropped := 0
	for li := range lines {
		l := &lines[li]
		ks := key[li]
		first := len(net.edges)
		from, fromK := node(ks[0], l, 0), 0
		run := 0.0 // length since the piece's start
		for k := 1; k < len(l.src); k++ {
			run += net.segLength(l.src[k-1], l.src[k])
			if ks[k] < 0 {
				continue
			}
			to := node(ks[k], l, k)
			if to == from {
				if run <= 2*snap && k < len(l.src)-1 {
					continue // a vertex snapped back to the piece's own start: part of the piece
				}
				if k-fromK >= 2 {
					// a loop back to the same junction: split it at its middle vertex
					mid := (fromK + k) / 2
					kk := nextKey
					nextKey++
					m := node(kk, l, mid)
					a := 0.0
					for j := fromK + 1; j <= mid; j++ {
						a += net.segLength(l.src[j-1], l.src[j])
					}
					net.edges = append(net.edges, l.piece(from, m, fromK, mid, a), l.piece(m, to, mid, k, run-a))
				} else {
					dropped++
				}
			} else {
				net.edges = append(net.edges, l.piece(from, to, fromK, k, run))
			}
			from, fromK, run = to, k, 0
		}
		if !math.IsNaN(l.length) {
			// share the given length out in proportion to the computed ones
			sum := 0.0
			for _, e := range net.edges[first:] {
				sum += e.length
			}
			for j := first; j < len(net.edges); j++ {
				if len(net.edges)-first == 1 {
					net.edges[j].length = l.length
				} else {
					net.edges[j].length = l.length * net.edges[j].length / sum
				}
			}
		}
	}
	if dropped > 0 {
		net.msgs = append(net.msgs, fmt.Sprintf("%d piece%s shorter than twice the snap that started and ended at one junction dropped", dropped, plural(dropped)))
	}
	if len(net.edges) == 0 {
		return errAt("", "empty result: every line collapsed into one junction (is --snap %g too large for this network?)", snap)
	}
	return nil
}

// piece is the corridor of l from vertex a to vertex b.
func (l *gline) piece(from, to, a, b int, length float64) jedge {
	e := jedge{from: from, to: to, length: length, closed: l.closed, where: l.where}
	if b-a > 1 {
		e.path = append([][2]float64(nil), l.xy[a+1:b]...)
	}
	return e
}
