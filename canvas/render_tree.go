package canvas

import (
	"math"
	"strconv"

	"fyne.io/fyne/v2"
	fc "fyne.io/fyne/v2/canvas"

	"duosweep/canvas/geom"
)

// junctionLayer draws the junctions (heat-coloured when they are candidates), the start square with
// its tag, and the junctions' labels.
type junctionLayer struct {
	nodes    []*fc.Circle
	labels   []*fc.Text
	startSq  *fc.Rectangle
	startTag *fc.Text
	dirs     []geom.Pt // scratch: corridor directions of one junction
	cands    []geom.Pt // scratch: label candidates of one junction
}

func (j *junctionLayer) init() {
	j.startSq = &fc.Rectangle{StrokeWidth: 2.5}
	j.startTag = &fc.Text{TextStyle: fyne.TextStyle{Bold: true}}
}

func (j *junctionLayer) update(e *Editor, f *frame, grown *bool) {
	ov := &e.overlay
	n := len(e.sc.Nodes)
	j.nodes = grow(j.nodes, n, grown)
	j.labels = grow(j.labels, n, grown)
	for i, nd := range e.sc.Nodes {
		c := j.nodes[i]
		c.StrokeColor, c.StrokeWidth = f.fg, 1.5
		switch h, ok := ov.evacFrac(i); {
		case nd.Candidate && ok:
			c.FillColor = heatPalette[int(math.Round(h*255))]
		case nd.Candidate:
			c.FillColor = f.primary
		default:
			c.FillColor, c.StrokeWidth = f.bg, 2
		}
		setText(j.labels[i], labelText(nd), f.fg, f.textSize)
	}
	for i := n; i < len(j.nodes); i++ {
		j.nodes[i].Hidden, j.labels[i].Hidden = true, true
	}
	j.startSq.StrokeColor = f.fg
	j.startSq.FillColor = f.bg
	if s := e.d.start; s >= 0 {
		j.startSq.FillColor = j.nodes[s].FillColor
	}
	setText(j.startTag, "start", f.fg, f.textSize)
}

// layoutMarks places the junctions on screen and the start square and tag, and reserves their boxes
// in the placer; it hides every label for layoutLabels.
func (j *junctionLayer) layoutMarks(e *Editor, f *frame) {
	start := e.d.start
	for i, p := range f.pts {
		c := j.nodes[i]
		on := f.vis.Contains(p)
		c.Hidden = !on || i == start
		if on {
			place(c, p, nodeR)
			f.placer.Add(geom.Rect{Min: p.Sub(geom.Pt{X: nodeR, Y: nodeR}), Max: p.Add(geom.Pt{X: nodeR, Y: nodeR})})
		}
		j.labels[i].Hidden = true
	}
	j.startSq.Hidden, j.startTag.Hidden = true, true
	if start < 0 || start >= len(f.pts) || !f.vis.Contains(f.pts[start]) {
		return
	}
	// the start's square and tag are drawn below its junction: keep labels off them
	p := f.pts[start]
	f.placer.Add(geom.Rect{Min: p.Sub(geom.Pt{X: startHalf, Y: startHalf}), Max: p.Add(geom.Pt{X: startHalf, Y: startHalf})})
	f.reserveBelow(j.startTag, p, startHalf+2)
	j.startSq.Hidden, j.startTag.Hidden = false, false
	j.startSq.Move(fyne.NewPos(float32(p.X-startHalf), float32(p.Y-startHalf)))
	j.startSq.Resize(fyne.NewSize(2*startHalf, 2*startHalf))
	moveText(j.startTag, p.X-float64(j.startTag.Size().Width)/2, p.Y+startHalf+2)
}

// layoutLabels places the labels of the selected, hovered, start, worst and replayed junctions
// first (even where they overlap), then, when the view is close enough, every other label that finds
// a free spot.
func (j *junctionLayer) layoutLabels(e *Editor, f *frame) {
	ov := &e.overlay
	n := len(f.pts)
	forced := [...]int{-1, -1, e.d.start, ov.Worst, ov.Focus}
	if e.sel.Kind == SelNode {
		forced[0] = e.sel.Index
	}
	if e.hover.Kind == SelNode {
		forced[1] = e.hover.Index
	}
	for _, i := range forced {
		if i >= 0 && i < n && j.labels[i].Hidden {
			j.placeLabel(e, f, i, true)
		}
	}
	if e.d.unit*e.view.Zoom >= labelMinZoom || n <= 12 {
		for i := range f.pts {
			if j.labels[i].Hidden {
				j.placeLabel(e, f, i, false)
			}
		}
	}
}

// placeLabel puts junction i's label in the best free spot beside it (a
// forced label takes the best spot even if it overlaps), or leaves it hidden.
func (j *junctionLayer) placeLabel(e *Editor, f *frame, i int, force bool) {
	ov := &e.overlay
	p := f.pts[i]
	if !f.vis.Contains(p) {
		return
	}
	t := j.labels[i]
	gap := float64(geom.LabelGap)
	dirs := j.dirs[:0]
	for _, w := range e.d.adj[e.d.adjAt[i]:e.d.adjAt[i+1]] {
		dirs = append(dirs, f.pts[w].Sub(p))
	}
	if i == e.d.start || i == ov.Worst || i == ov.Focus {
		gap = geom.LabelGapMarked                  // clear of the square, ring or target marker
		dirs = append(dirs, geom.Pt{X: 0.3, Y: 1}) // keep the tag below free
	}
	j.dirs = dirs
	sz := t.Size()
	w, h := float64(sz.Width), float64(sz.Height)
	j.cands = geom.LabelCandidates(dirs, w, h, gap, j.cands[:0])
	for k, o := range j.cands {
		box := geom.Rect{Min: p.Add(o), Max: p.Add(o).Add(geom.Pt{X: w, Y: h})}
		if (f.placer.Free(box) && f.inside(box)) || (force && k == len(j.cands)-1) {
			if !f.placer.Free(box) {
				o = j.cands[0]
				box = geom.Rect{Min: p.Add(o), Max: p.Add(o).Add(geom.Pt{X: w, Y: h})}
			}
			f.placer.Add(box)
			t.Hidden = false
			moveText(t, box.Min.X, box.Min.Y)
			return
		}
	}
}

// corridorLayer draws the corridors and their length labels.
type corridorLayer struct {
	lines   []*fc.Line
	labels  []*fc.Text
	lengths []float64 // length shown by each label
	unit    string    // unit shown by the labels
}

func (c *corridorLayer) update(e *Editor, f *frame, grown *bool) {
	m := len(e.sc.Corridors)
	c.lines = grow(c.lines, m, grown)
	c.labels = grow(c.labels, m, grown)
	unit := e.sc.Unit
	if unit == "" {
		unit = "m"
	}
	if len(c.lengths) < m {
		c.lengths = append(c.lengths, make([]float64, m-len(c.lengths))...)
	}
	for i, cor := range e.sc.Corridors {
		l := c.lines[i]
		l.StrokeColor, l.StrokeWidth = f.muted, 2
		txt := c.labels[i].Text
		if cor.Length != c.lengths[i] || unit != c.unit || txt == "" {
			txt = strconv.FormatFloat(cor.Length, 'f', -1, 64) + " " + unit
			c.lengths[i] = cor.Length
		}
		setText(c.labels[i], txt, f.muted, f.textSize*0.9)
	}
	c.unit = unit
	for i := m; i < len(c.lines); i++ {
		c.lines[i].Hidden, c.labels[i].Hidden = true, true
	}
}

// layout draws the visible corridors, and a length label beside each long enough one where it
// overlaps no label placed before.
func (c *corridorLayer) layout(e *Editor, f *frame) {
	for i, en := range e.d.ends {
		l, t := c.lines[i], c.labels[i]
		if en[0] < 0 || en[1] < 0 {
			l.Hidden, t.Hidden = true, true
			continue
		}
		a, b := f.pts[en[0]], f.pts[en[1]]
		l.Hidden = !f.vis.SegTouches(a, b)
		if !l.Hidden {
			placeLine(l, a, b)
		}
		if shaped(e, i) {
			l.Hidden = true // drawn dashed or along its path by the shape layer (render_shapes.go)
		}
		mid := geom.Lerp(a, b, 0.5)
		length := geom.Dist(a, b)
		t.Hidden = true
		if l.Hidden || length < lengthMinPx || !f.screen.Contains(mid) {
			continue
		}
		// beside the line, on the side of its normal that points up, else the other side
		nx, ny := -(b.Y-a.Y)/length, (b.X-a.X)/length
		if ny > 0 {
			nx, ny = -nx, -ny
		}
		sz := t.Size()
		w, h := float64(sz.Width), float64(sz.Height)
		for _, side := range [2]float64{1, -1} {
			// the box corner nearest the line sits 3 units from it
			cx := mid.X + side*nx*(3+w/2*math.Abs(nx)+h/2*math.Abs(ny))
			cy := mid.Y + side*ny*(3+w/2*math.Abs(nx)+h/2*math.Abs(ny))
			box := geom.Rect{Min: geom.Pt{X: cx - w/2, Y: cy - h/2}, Max: geom.Pt{X: cx + w/2, Y: cy + h/2}}
			if f.placer.Free(box) && f.inside(box) {
				f.placer.Add(box)
				t.Hidden = false
				moveText(t, box.Min.X, box.Min.Y)
				break
			}
		}
	}
}
