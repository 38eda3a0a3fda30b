package search

import (
	"math"
	"math/rand/v2"

	"duosweep/engine"
)

// mutate returns a changed copy of st, or nil when the drawn move does not apply.
func (im *improver) mutate(st *imState, r *engine.Report) *imState {
	s := im.s
	rng := im.rng
	c := st.clone()
	a := rng.IntN(2)
	l := c.list[a]
	moves := imMovesRadio
	if im.m.Rendezvous() {
		moves = imMovesF2F
	}
	mu := &mutation{im: im, s: s, rng: rng, c: c, a: a, l: l, r: r}
	var res moveResult
	mu.mv = moves[rng.IntN(len(moves))]
	switch mu.mv {
	case 16:
		res = mu.handOverTail()
	case 17:
		res = mu.slideSplitPoint()
	case 18:
		res = mu.swapSiblingBlocks()
	case 0:
		res = mu.swapItems()
	case 1, 2:
		res = mu.moveBlock()
	case 3:
		res = mu.reverseStretch()
	case 4, 5:
		res = mu.moveWorstFinder()
	case 6:
		res = mu.insertDetour()
	case 7:
		res = mu.deleteItem()
	case 8:
		res = mu.snapSplitPoint()
	case 9:
		res = mu.replaceByNeighbour()
	case 10:
		res = mu.addRendezvous()
	case 11:
		res = mu.dropRendezvous()
	case 12:
		res = mu.moveRendezvous()
	case 13:
		res = mu.moveMeeting()
	case 14, 15:
		res = mu.rendezvousAfterItem()
	}
	switch res {
	case moveFails:
		return nil
	case moveDone:
		return c
	}
	if meetCount(c.list[0]) != len(c.meet) || meetCount(c.list[1]) != len(c.meet) {
		return nil
	}
	if len(c.list[0]) > im.maxItems || len(c.list[1]) > im.maxItems {
		return nil
	}
	return c
}

// mutation is one draw of mutate: the copy c being changed, the agent a
// whose list l the move works on, and the drawn move mv. Each move is a
// method that reports whether it applied.
type mutation struct {
	im  *improver
	s   *engine.Site
	rng *rand.Rand
	c   *imState
	a   int
	l   []imItem // c.list[a] as drawn
	r   *engine.Report
	mv  int
}

// moveResult is what a move reports.
type moveResult int

const (
	moveChecked moveResult = iota // applied: mutate checks the meeting counts and list lengths
	moveFails                     // does not apply: mutate returns nil
	moveDone                      // applied, c returned as it is (no checks)
)

// handOverTail: hand the last one to three items to the partner (the boundary of a split).
func (mu *mutation) handOverTail() moveResult {
	rng, c, a, l := mu.rng, mu.c, mu.a, mu.l
	b := 1 - a
	k := 1 + rng.IntN(3)
	end := len(l)
	for end > 0 && l[end-1].Meet {
		end--
	}
	if end-k < 0 || meetCount(l[end-k:end]) > 0 || end-k < meetCountBefore(l, end) {
		return moveFails
	}
	block := append([]imItem(nil), l[end-k:end]...)
	c.list[a] = append(l[:end-k:end-k], l[end:]...)
	lb := c.list[b]
	j := len(lb)
	for j > 0 && lb[j-1].Meet {
		j--
	}
	for x, y := 0, len(block)-1; x < y; x, y = x+1, y-1 {
		block[x], block[y] = block[y], block[x]
	}
	c.list[b] = append(lb[:j:j], append(block, lb[j:]...)...)
	return moveChecked
}

// slideSplitPoint: slide a corridor point (a split point) a little.
func (mu *mutation) slideSplitPoint() moveResult {
	s, rng, l := mu.s, mu.rng, mu.l
	var pts []int
	for k, it := range l {
		if !it.Meet && !it.P.IsNode() {
			pts = append(pts, k)
		}
	}
	if len(pts) == 0 {
		return moveFails
	}
	k := pts[rng.IntN(len(pts))]
	p := l[k].P
	w := s.EW[s.Edge(p.From, p.To)]
	p.Offset = math.Max(0, math.Min(w, p.Offset+(rng.Float64()-0.5)*w*0.06))
	l[k].P = s.Canon(p)
	return moveChecked
}

// swapSiblingBlocks: swap the blocks of two sibling subtrees (a child order in a tour).
func (mu *mutation) swapSiblingBlocks() moveResult {
	s, rng, l, im := mu.s, mu.rng, mu.l, mu.im
	if len(l) < 2 {
		return moveFails
	}
	i := rng.IntN(len(l))
	if l[i].Meet {
		return moveFails
	}
	v := l[i].P.From
	par := int(s.Parent[v])
	if par < 0 {
		return moveFails
	}
	in := func(k, root int) bool {
		return k >= 0 && k < len(l) && !l[k].Meet && im.under(l[k].P.From, root)
	}
	i0, i1 := i, i+1
	for in(i0-1, v) {
		i0--
	}
	for in(i1, v) {
		i1++
	}
	if i1 >= len(l) || l[i1].Meet || !im.under(l[i1].P.From, par) || l[i1].P.From == par {
		return moveFails
	}
	// the sibling whose subtree holds the next item
	w := l[i1].P.From
	for int(s.Parent[w]) != par {
		w = int(s.Parent[w])
	}
	j1 := i1 + 1
	for in(j1, w) {
		j1++
	}
	blk := append(append([]imItem(nil), l[i1:j1]...), l[i0:i1]...)
	copy(l[i0:j1], blk)
	return moveChecked
}

// swapItems: swap two items.
func (mu *mutation) swapItems() moveResult {
	rng, l := mu.rng, mu.l
	if len(l) < 2 {
		return moveFails
	}
	i, j := rng.IntN(len(l)), rng.IntN(len(l))
	if i == j {
		return moveFails
	}
	l[i], l[j] = l[j], l[i]
	return moveChecked
}

// moveBlock: move a block of 1..3 items, maybe to the partner.
func (mu *mutation) moveBlock() moveResult {
	rng, c, a, l, mv := mu.rng, mu.c, mu.a, mu.l, mu.mv
	if len(l) == 0 {
		return moveFails
	}
	n := 1 + rng.IntN(3)
	i := rng.IntN(len(l))
	if i+n > len(l) {
		n = len(l) - i
	}
	block := append([]imItem(nil), l[i:i+n]...)
	b := a
	if mv == 2 {
		b = 1 - a
		for _, it := range block {
			if it.Meet {
				return moveFails
			}
		}
	}
	c.list[a] = append(l[:i:i], l[i+n:]...)
	dst := c.list[b]
	j := rng.IntN(len(dst) + 1)
	c.list[b] = append(dst[:j:j], append(block, dst[j:]...)...)
	return moveChecked
}

// reverseStretch: reverse a stretch.
func (mu *mutation) reverseStretch() moveResult {
	rng, l := mu.rng, mu.l
	if len(l) < 2 {
		return moveFails
	}
	i, j := rng.IntN(len(l)), rng.IntN(len(l))
	if i > j {
		i, j = j, i
	}
	if i == j {
		return moveFails
	}
	for ; i < j; i, j = i+1, j-1 {
		l[i], l[j] = l[j], l[i]
	}
	return moveChecked
}

// moveWorstFinder: the item that first reaches the worst exit: earlier, or to the partner.
func (mu *mutation) moveWorstFinder() moveResult {
	s, rng, c, a, l, r, mv := mu.s, mu.rng, mu.c, mu.a, mu.l, mu.r, mu.mv
	if r == nil || r.WorstExit < 0 {
		return moveFails
	}
	x := r.WorstExit
	ex, _ := r.ExitFor(x)
	f := int(ex.Finder)
	if f != 0 && f != 1 {
		f = rng.IntN(2)
	}
	a = f
	l = c.list[a]
	// first item at or after which the agent has reached x: the first item whose point is x or beyond x
	i := -1
	for k, it := range l {
		if !it.Meet && it.P.IsNode() && (it.P.From == x || s.LCA(it.P.From, x) == x) {
			i = k
			break
		}
	}
	if i < 0 {
		return moveFails
	}
	it := l[i]
	c.list[a] = append(l[:i:i], l[i+1:]...)
	b := a
	if mv == 5 {
		b = 1 - a
	}
	dst := c.list[b]
	j := 0
	if len(dst) > 0 {
		hi := len(dst)
		if b == a {
			hi = i
		}
		j = rng.IntN(hi + 1)
	}
	c.list[b] = append(dst[:j:j], append([]imItem{{P: engine.At(x)}, it}, dst[j:]...)...)
	if it.P == engine.At(x) {
		c.list[b] = append(c.list[b][:j+1], c.list[b][j+2:]...)
	}
	return moveChecked
}

// insertDetour: insert a detour to an anchor (hedge / park).
func (mu *mutation) insertDetour() moveResult {
	rng, c, a, l, im := mu.rng, mu.c, mu.a, mu.l, mu.im
	v := im.anchors[rng.IntN(len(im.anchors))]
	j := rng.IntN(len(l) + 1)
	c.list[a] = append(l[:j:j], append([]imItem{{P: engine.At(v)}}, l[j:]...)...)
	return moveChecked
}

// deleteItem: delete an item.
func (mu *mutation) deleteItem() moveResult {
	rng, c, a, l := mu.rng, mu.c, mu.a, mu.l
	if len(l) == 0 {
		return moveFails
	}
	i := rng.IntN(len(l))
	if l[i].Meet {
		return moveFails
	}
	c.list[a] = append(l[:i:i], l[i+1:]...)
	return moveChecked
}

// snapSplitPoint: snap or slide a corridor point (a split point).
func (mu *mutation) snapSplitPoint() moveResult {
	s, rng, l := mu.s, mu.rng, mu.l
	var pts []int
	for k, it := range l {
		if !it.Meet && !it.P.IsNode() {
			pts = append(pts, k)
		}
	}
	if len(pts) == 0 {
		// drop a wait instead
		for k := range l {
			if l[k].Wait > 0 {
				l[k].Wait *= rng.Float64()
				return moveDone
			}
		}
		return moveFails
	}
	k := pts[rng.IntN(len(pts))]
	p := l[k].P
	w := s.EW[s.Edge(p.From, p.To)]
	switch rng.IntN(3) {
	case 0:
		l[k].P = engine.At(p.From)
	case 1:
		l[k].P = engine.At(p.To)
	default:
		p.Offset = math.Max(0, math.Min(w, p.Offset+(rng.Float64()-0.5)*w*0.5))
		l[k].P = s.Canon(p)
	}
	return moveChecked
}

// replaceByNeighbour: replace an item by a neighbouring anchor or candidate.
func (mu *mutation) replaceByNeighbour() moveResult {
	rng, l, im := mu.rng, mu.l, mu.im
	if len(l) == 0 {
		return moveFails
	}
	i := rng.IntN(len(l))
	if l[i].Meet {
		return moveFails
	}
	v := im.cand[rng.IntN(len(im.cand))]
	if rng.IntN(2) == 0 {
		v = im.anchors[rng.IntN(len(im.anchors))]
	}
	l[i] = imItem{P: engine.At(v)}
	return moveChecked
}

// addRendezvous: add a rendezvous.
func (mu *mutation) addRendezvous() moveResult {
	rng, c, im := mu.rng, mu.c, mu.im
	k := rng.IntN(len(c.meet) + 1)
	R := engine.At(im.anchors[rng.IntN(len(im.anchors))])
	for b := 0; b < 2; b++ {
		lo, hi := meetRange(c.list[b], k)
		j := lo + rng.IntN(hi-lo+1)
		lb := c.list[b]
		c.list[b] = append(lb[:j:j], append([]imItem{{Meet: true}}, lb[j:]...)...)
	}
	c.meet = append(c.meet[:k:k], append([]engine.Point{R}, c.meet[k:]...)...)
	return moveChecked
}

// dropRendezvous: drop a rendezvous.
func (mu *mutation) dropRendezvous() moveResult {
	rng, c := mu.rng, mu.c
	if len(c.meet) == 0 {
		return moveFails
	}
	k := rng.IntN(len(c.meet))
	for b := 0; b < 2; b++ {
		n := 0
		for i, it := range c.list[b] {
			if it.Meet {
				if n == k {
					c.list[b] = append(c.list[b][:i:i], c.list[b][i+1:]...)
					break
				}
				n++
			}
		}
	}
	c.meet = append(c.meet[:k:k], c.meet[k+1:]...)
	return moveChecked
}

// moveRendezvous: move a rendezvous to a neighbouring node or another anchor.
func (mu *mutation) moveRendezvous() moveResult {
	s, rng, c, im := mu.s, mu.rng, mu.c, mu.im
	if len(c.meet) == 0 {
		return moveFails
	}
	k := rng.IntN(len(c.meet))
	R := c.meet[k]
	if R.IsNode() && rng.IntN(2) == 0 {
		v := R.From
		var nb []int
		if p := s.Parent[v]; p >= 0 {
			nb = append(nb, int(p))
		}
		for _, ch := range s.Children(v) {
			if s.InSearch[ch] {
				nb = append(nb, int(ch))
			}
		}
		if len(nb) == 0 {
			return moveFails
		}
		c.meet[k] = engine.At(nb[rng.IntN(len(nb))])
	} else {
		c.meet[k] = engine.At(im.anchors[rng.IntN(len(im.anchors))])
	}
	return moveChecked
}

// moveMeeting: move a meeting item within its list.
func (mu *mutation) moveMeeting() moveResult {
	rng, c, a, l := mu.rng, mu.c, mu.a, mu.l
	n := meetCount(l)
	if n == 0 {
		return moveFails
	}
	k := rng.IntN(n)
	cnt := 0
	for i, it := range l {
		if it.Meet {
			if cnt == k {
				l = append(l[:i:i], l[i+1:]...)
				break
			}
			cnt++
		}
	}
	lo, hi := meetRange(l, k)
	j := lo + rng.IntN(hi-lo+1)
	c.list[a] = append(l[:j:j], append([]imItem{{Meet: true}}, l[j:]...)...)
	return moveChecked
}

// rendezvousAfterItem: a rendezvous right after one of a's items, where b is at about that time.
func (mu *mutation) rendezvousAfterItem() moveResult {
	rng, c, a, l, mv, im := mu.rng, mu.c, mu.a, mu.l, mu.mv, mu.im
	if len(l) == 0 {
		return moveFails
	}
	i := rng.IntN(len(l))
	if l[i].Meet {
		return moveFails
	}
	R := l[i].P
	if !R.IsNode() || mv == 15 {
		R = engine.At(im.anchors[rng.IntN(len(im.anchors))])
	}
	ta := im.itemTimes(c, a)
	tb := im.itemTimes(c, 1-a)
	lb := c.list[1-a]
	j := len(lb)
	for k := range lb {
		if tb[k] >= ta[i] {
			j = k
			if k > 0 && ta[i]-tb[k-1] < tb[k]-ta[i] {
				j = k - 1
			}
			j++ // after that item
			break
		}
	}
	if j > len(lb) {
		j = len(lb)
	}
	ka, kb := meetCount(l[:i+1]), meetCount(lb[:j])
	if ka != kb {
		return moveFails
	}
	c.list[a] = append(l[:i+1:i+1], append([]imItem{{Meet: true}}, l[i+1:]...)...)
	c.list[1-a] = append(lb[:j:j], append([]imItem{{Meet: true}}, lb[j:]...)...)
	c.meet = append(c.meet[:ka:ka], append([]engine.Point{R}, c.meet[ka:]...)...)
	return moveChecked
}
