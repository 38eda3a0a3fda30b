package geom

import "math"

// labelDirs are the candidate label directions (widget coordinates, y down),
// in order of preference: right-above first, as text is read from the left.
var labelDirs = func() [8]Pt {
	var d [8]Pt
	for k, deg := range [8]float64{-45, 0, -90, 45, -135, 180, 90, 135} {
		a := deg * math.Pi / 180
		d[k] = Pt{math.Cos(a), math.Sin(a)}
	}
	return d
}()

// LabelOffset places a w×h label beside a node whose corridors leave in the
// directions dirs (any length; zero vectors are ignored): of eight compass
// directions it takes the one farthest in angle from every corridor (ties by
// preference: right-above, right, above, right-below, left-above, left, below,
// left-below) and returns the label's top-left corner relative to the node
// centre, gap away from it. O(8·len(dirs)).
func LabelOffset(dirs []Pt, w, h, gap float64) Pt {
	best, bestScore := 0, math.Inf(1)
	for k, c := range labelDirs {
		score := crowding(c, dirs)
		if score < bestScore-1e-9 {
			best, bestScore = k, score
		}
	}
	return boxAt(labelDirs[best], w, h, gap)
}

// LabelCandidates appends to out the top-left offsets of a w×h label for all
// eight directions, best first (the first is LabelOffset's choice).
// O(8·len(dirs)).
func LabelCandidates(dirs []Pt, w, h, gap float64, out []Pt) []Pt {
	var score [8]float64
	var idx [8]int
	for k, c := range labelDirs {
		score[k], idx[k] = crowding(c, dirs), k
	}
	// insertion sort, stable: ties keep the preference order
	for i := 1; i < 8; i++ {
		for j := i; j > 0 && score[idx[j]] < score[idx[j-1]]-1e-9; j-- {
			idx[j], idx[j-1] = idx[j-1], idx[j]
		}
	}
	for _, k := range idx {
		out = append(out, boxAt(labelDirs[k], w, h, gap))
	}
	return out
}

// crowding is how close direction c comes to the nearest of the corridor
// directions dirs: the largest cosine, −1 when there are none.
func crowding(c Pt, dirs []Pt) float64 {
	score := -1.0
	for _, u := range dirs {
		l := math.Hypot(u.X, u.Y)
		if l == 0 {
			continue
		}
		score = math.Max(score, (c.X*u.X+c.Y*u.Y)/l)
	}
	return score
}

func boxAt(c Pt, w, h, gap float64) Pt {
	a := c.Mul(gap)
	var o Pt
	switch {
	case c.X > 0.3:
		o.X = a.X
	case c.X < -0.3:
		o.X = a.X - w
	default:
		o.X = -w / 2
	}
	switch {
	case c.Y > 0.3:
		o.Y = a.Y
	case c.Y < -0.3:
		o.Y = a.Y - h
	default:
		o.Y = -h / 2
	}
	return o
}

// Overlaps reports whether r and q share interior points.
func (r Rect) Overlaps(q Rect) bool {
	return r.Min.X < q.Max.X && q.Min.X < r.Max.X && r.Min.Y < q.Max.Y && q.Min.Y < r.Max.Y
}

// Placer remembers occupied boxes in a uniform grid so that labels can be
// placed without overlapping: Free and Add are O(boxes in the touched cells).
// Reset reuses its memory, so a steady frame allocates nothing.
type Placer struct {
	cell  float64
	head  map[[2]int32]int32
	next  []int32
	boxes []Rect
}

// Reset empties the placer and sets the grid cell size (> 0).
func (p *Placer) Reset(cell float64) {
	p.cell = cell
	if p.head == nil {
		p.head = make(map[[2]int32]int32)
	} else {
		clear(p.head)
	}
	p.next, p.boxes = p.next[:0], p.boxes[:0]
}

func (p *Placer) cells(r Rect) (x0, y0, x1, y1 int32) {
	return int32(math.Floor(r.Min.X / p.cell)), int32(math.Floor(r.Min.Y / p.cell)),
		int32(math.Floor(r.Max.X / p.cell)), int32(math.Floor(r.Max.Y / p.cell))
}

// Free reports whether r overlaps no box added so far.
func (p *Placer) Free(r Rect) bool {
	x0, y0, x1, y1 := p.cells(r)
	for x := x0; x <= x1; x++ {
		for y := y0; y <= y1; y++ {
			for i, ok := p.head[[2]int32{x, y}]; ok && i >= 0; i = p.next[i] {
				if p.boxes[i].Overlaps(r) {
					return false
				}
			}
		}
	}
	return true
}

// Add marks r as occupied.
func (p *Placer) Add(r Rect) {
	x0, y0, x1, y1 := p.cells(r)
	for x := x0; x <= x1; x++ {
		for y := y0; y <= y1; y++ {
			k := [2]int32{x, y}
			h, ok := p.head[k]
			if !ok {
				h = -1
			}
			p.boxes = append(p.boxes, r)
			p.next = append(p.next, h)
			p.head[k] = int32(len(p.boxes) - 1)
		}
	}
}

// Spacing of junction labels, in widget units. The editor places labels with these and its FitView
// leaves room for them, so both read them from here.
const (
	// NodeRadius is the radius of a junction's marker.
	NodeRadius = 7
	// LabelGap is the distance from a junction's centre to its label: clear of the marker.
	LabelGap = NodeRadius + 4
	// LabelGapMarked is the same beside the start square, the worst-exit ring or the target marker,
	// and the distance below a marked junction kept free for its tag.
	LabelGapMarked = 21
	// labelPadX and labelPadY are the room LabelRoom keeps beyond a label's far side, across and
	// along.
	labelPadX = 8
	labelPadY = 4
)

// LabelRoom is the room a junction with a w×h label needs on screen, at least margin on every side:
// the label to the right and above (where LabelCandidates tries it first on an unconnected side), and
// for the start, whose square and tag sit below, room under it and a label kept clear of them.
func LabelRoom(w, h, margin float64, start bool) Extent {
	ext := Extent{L: margin, R: math.Max(margin, LabelGap+w+labelPadX), T: math.Max(margin, LabelGap+h+labelPadY), B: margin}
	if start {
		ext.B = math.Max(margin, LabelGapMarked+h+labelPadY)
		ext.R = math.Max(ext.R, LabelGapMarked+w+labelPadX)
	}
	return ext
}
