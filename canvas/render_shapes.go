package canvas

import (
	"math"

	fc "fyne.io/fyne/v2/canvas"

	"duosweep/canvas/geom"
)

// shapeLayer draws the corridors that a single straight line does not: a
// closed corridor (FORMATS.md: on the drawing, never walked) as a dashed
// line, and a corridor with a drawn shape (its path, from an imported
// centreline) as a polyline; a closed corridor with a path is a dashed
// polyline. The corridor layer hides its straight line for these.
//
// The number of segments depends on the scenario only (one per path segment;
// dashesPer(length) per closed corridor), so the pool is sized in update and
// the dashes scale with the zoom.
type shapeLayer struct {
	segs []*fc.Line
}

// shaped reports whether corridor i is drawn by the shape layer.
func shaped(e *Editor, i int) bool {
	c := e.sc.Corridors[i]
	en := e.d.ends[i]
	return en[0] >= 0 && en[1] >= 0 && (c.Closed || (len(c.Path) > 0 && e.sc.Nodes[en[0]].HasXY && e.sc.Nodes[en[1]].HasXY))
}

// polyline returns corridor i's drawn shape in drawing coordinates.
func polyline(e *Editor, i int, buf []geom.Pt) []geom.Pt {
	c := e.sc.Corridors[i]
	en := e.d.ends[i]
	buf = append(buf[:0], e.d.world[en[0]])
	if e.sc.Nodes[en[0]].HasXY && e.sc.Nodes[en[1]].HasXY {
		for _, p := range c.Path {
			buf = append(buf, geom.Pt{X: p[0], Y: p[1]})
		}
	}
	return append(buf, e.d.world[en[1]])
}

// dashesPer is the number of dashes of a closed corridor of drawn length l:
// about six per median corridor length, between 3 and 60.
func dashesPer(l, unit float64) int {
	if !(unit > 0) {
		return 5
	}
	return int(math.Max(3, math.Min(60, math.Round(6*l/unit))))
}

func arcLength(pts []geom.Pt) float64 {
	s := 0.0
	for k := 1; k < len(pts); k++ {
		s += geom.Dist(pts[k-1], pts[k])
	}
	return s
}

// segments is how many lines corridor i takes.
func segments(e *Editor, i int, pts []geom.Pt) int {
	if e.sc.Corridors[i].Closed {
		return dashesPer(arcLength(pts), e.d.unit)
	}
	return len(pts) - 1
}

func (s *shapeLayer) update(e *Editor, f *frame, grown *bool) {
	var buf []geom.Pt
	need := 0
	for i := range e.sc.Corridors {
		if shaped(e, i) {
			buf = polyline(e, i, buf)
			need += segments(e, i, buf)
		}
	}
	s.segs = grow(s.segs, need, grown)
	for _, l := range s.segs {
		l.StrokeColor, l.StrokeWidth = f.muted, 2
	}
}

// layout places the segments of every shaped corridor on screen; closed
// corridors get dashes of 60% of their share of the arc, evenly spaced.
func (s *shapeLayer) layout(e *Editor, f *frame) {
	var buf []geom.Pt
	k := 0
	next := func() *fc.Line {
		if k >= len(s.segs) {
			return nil
		}
		l := s.segs[k]
		k++
		return l
	}
	for i := range e.sc.Corridors {
		if !shaped(e, i) {
			continue
		}
		buf = polyline(e, i, buf)
		n := segments(e, i, buf) // from drawing units, as update counted
		for j := range buf {
			buf[j] = e.view.ToScreen(buf[j])
		}
		if !e.sc.Corridors[i].Closed {
			for j := 1; j < len(buf); j++ {
				if l := next(); l != nil {
					l.Hidden = !f.vis.SegTouches(buf[j-1], buf[j])
					if !l.Hidden {
						placeLine(l, buf[j-1], buf[j])
					}
				}
			}
			continue
		}
		total := arcLength(buf)
		step := total / float64(n)
		for d := 0; d < n; d++ {
			l := next()
			if l == nil {
				break
			}
			a, b := pointAlong(buf, (float64(d)+0.2)*step), pointAlong(buf, (float64(d)+0.8)*step)
			l.Hidden = total == 0 || !f.vis.SegTouches(a, b)
			if !l.Hidden {
				placeLine(l, a, b)
			}
		}
	}
	for ; k < len(s.segs); k++ {
		s.segs[k].Hidden = true
	}
}

// pointAlong returns the point at arc length a along pts.
func pointAlong(pts []geom.Pt, a float64) geom.Pt {
	for k := 1; k < len(pts); k++ {
		l := geom.Dist(pts[k-1], pts[k])
		if a <= l || k == len(pts)-1 {
			if l == 0 {
				return pts[k]
			}
			return geom.Lerp(pts[k-1], pts[k], math.Min(1, math.Max(0, a/l)))
		}
		a -= l
	}
	return pts[0]
}
