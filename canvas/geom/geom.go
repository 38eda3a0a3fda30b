package geom

import "math"

// Pt is a point in the plane (drawing or widget coordinates).
type Pt struct{ X, Y float64 }

// Add returns p+q.
func (p Pt) Add(q Pt) Pt { return Pt{p.X + q.X, p.Y + q.Y} }

// Sub returns p−q.
func (p Pt) Sub(q Pt) Pt { return Pt{p.X - q.X, p.Y - q.Y} }

// Mul returns p scaled by f.
func (p Pt) Mul(f float64) Pt { return Pt{p.X * f, p.Y * f} }

// Dist returns the Euclidean distance between p and q.
func Dist(p, q Pt) float64 { return math.Hypot(p.X-q.X, p.Y-q.Y) }

// Lerp returns the point a fraction f of the way from a to b; f is clamped to [0, 1].
func Lerp(a, b Pt, f float64) Pt {
	if !(f > 0) { // also NaN
		return a
	}
	if f >= 1 {
		return b
	}
	return Pt{a.X + (b.X-a.X)*f, a.Y + (b.Y-a.Y)*f}
}

// SegDist returns the distance from p to the segment a–b and the fraction t
// in [0, 1] of the closest point along it.
func SegDist(p, a, b Pt) (d, t float64) {
	dx, dy := b.X-a.X, b.Y-a.Y
	l2 := dx*dx + dy*dy
	if l2 > 0 {
		t = ((p.X-a.X)*dx + (p.Y-a.Y)*dy) / l2
		t = math.Max(0, math.Min(1, t))
	}
	c := Pt{a.X + dx*t, a.Y + dy*t}
	return Dist(p, c), t
}

// NearestPoint returns the index of the point of pts closest to p within
// radius r, or -1. Ties go to the lower index; skip (if ≥ 0) is ignored. O(n).
func NearestPoint(pts []Pt, p Pt, r float64, skip int) int {
	best, bd := -1, r
	for i, q := range pts {
		if i == skip {
			continue
		}
		if d := Dist(p, q); d < bd || (d == bd && best < 0) {
			best, bd = i, d
		}
	}
	return best
}

// Seg is a segment between two points.
type Seg struct{ A, B Pt }

// NearestSeg returns the index of the segment closest to p within distance r,
// or -1. Ties go to the lower index. O(n).
func NearestSeg(segs []Seg, p Pt, r float64) int {
	best, bd := -1, r
	for i, s := range segs {
		if d, _ := SegDist(p, s.A, s.B); d < bd || (d == bd && best < 0) {
			best, bd = i, d
		}
	}
	return best
}

// Rect is an axis-aligned box; Empty reports a box that holds no point.
type Rect struct{ Min, Max Pt }

// EmptyRect returns the box holding no point, the identity of Extend.
func EmptyRect() Rect {
	inf := math.Inf(1)
	return Rect{Pt{inf, inf}, Pt{-inf, -inf}}
}

// Empty reports whether r holds no point.
func (r Rect) Empty() bool { return r.Min.X > r.Max.X || r.Min.Y > r.Max.Y }

// Extend returns the smallest box holding r and p.
func (r Rect) Extend(p Pt) Rect {
	return Rect{Pt{math.Min(r.Min.X, p.X), math.Min(r.Min.Y, p.Y)}, Pt{math.Max(r.Max.X, p.X), math.Max(r.Max.Y, p.Y)}}
}

// Contains reports whether p lies in r, borders included.
func (r Rect) Contains(p Pt) bool {
	return p.X >= r.Min.X && p.X <= r.Max.X && p.Y >= r.Min.Y && p.Y <= r.Max.Y
}

// Grow returns r with every side moved outwards by m.
func (r Rect) Grow(m float64) Rect {
	return Rect{Pt{r.Min.X - m, r.Min.Y - m}, Pt{r.Max.X + m, r.Max.Y + m}}
}

// SegTouches reports whether the bounding box of segment a–b meets r (a cheap,
// conservative culling test).
func (r Rect) SegTouches(a, b Pt) bool {
	return math.Max(a.X, b.X) >= r.Min.X && math.Min(a.X, b.X) <= r.Max.X &&
		math.Max(a.Y, b.Y) >= r.Min.Y && math.Min(a.Y, b.Y) <= r.Max.Y
}

// Bounds returns the bounding box of pts (empty for none).
func Bounds(pts []Pt) Rect {
	r := EmptyRect()
	for _, p := range pts {
		r = r.Extend(p)
	}
	return r
}
