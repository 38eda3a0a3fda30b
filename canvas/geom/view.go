package geom

import "math"

// Zoom limits of a View (widget pixels per drawing unit).
const (
	MinZoom = 1e-4
	MaxZoom = 1e4
)

// View maps drawing coordinates to widget coordinates:
// screen = world·Zoom + Off. The zero value is not usable; use NewView.
type View struct {
	Zoom float64
	Off  Pt
}

// NewView returns the identity view.
func NewView() View { return View{Zoom: 1} }

// ToScreen maps a drawing point to widget coordinates.
func (v View) ToScreen(w Pt) Pt { return Pt{w.X*v.Zoom + v.Off.X, w.Y*v.Zoom + v.Off.Y} }

// ToWorld maps a widget point to drawing coordinates.
func (v View) ToWorld(s Pt) Pt { return Pt{(s.X - v.Off.X) / v.Zoom, (s.Y - v.Off.Y) / v.Zoom} }

// ZoomAround multiplies the zoom by f (clamped to [MinZoom, MaxZoom]) keeping
// the drawing point under the widget point s fixed.
func (v View) ZoomAround(f float64, s Pt) View {
	if !(f > 0) || math.IsInf(f, 0) {
		return v
	}
	w := v.ToWorld(s)
	z := math.Max(MinZoom, math.Min(MaxZoom, v.Zoom*f))
	return View{Zoom: z, Off: Pt{s.X - w.X*z, s.Y - w.Y*z}}
}

// Pan moves the view by d widget units.
func (v View) Pan(d Pt) View { return View{Zoom: v.Zoom, Off: v.Off.Add(d)} }

// Fit returns the view that shows box b centred in a w×h widget with a margin
// of m on every side. A box of zero extent keeps the zoom given by keep
// (clamped) and is centred; an empty box yields keep's zoom centred on the origin.
func Fit(b Rect, w, h, m float64, keep float64) View {
	z := keep
	if !(z > 0) {
		z = 1
	}
	if b.Empty() {
		return View{Zoom: z, Off: Pt{w / 2, h / 2}}
	}
	aw, ah := math.Max(w-2*m, 1), math.Max(h-2*m, 1)
	bw, bh := b.Max.X-b.Min.X, b.Max.Y-b.Min.Y
	switch {
	case bw > 0 && bh > 0:
		z = math.Min(aw/bw, ah/bh)
	case bw > 0:
		z = aw / bw
	case bh > 0:
		z = ah / bh
	}
	z = math.Max(MinZoom, math.Min(MaxZoom, z))
	c := Pt{(b.Min.X + b.Max.X) / 2, (b.Min.Y + b.Max.Y) / 2}
	return View{Zoom: z, Off: Pt{w/2 - c.X*z, h/2 - c.Y*z}}
}

// Extent is the room a drawn point needs around it on screen, in widget units
// (for a node: its marker and its label), left, right, above and below.
type Extent struct{ L, R, T, B float64 }

// FitExtents returns the largest-zoom view (at most MaxZoom, keep's zoom when
// every point coincides) that shows every point pts[i] with ext[i] of room
// around it inside a w×h widget, centred in the room left over. Extents are
// in widget units, so they do not shrink with the zoom: a long label at the
// right edge pulls the drawing left and in. When the widget cannot hold the
// extents at any zoom (it is narrower than two labels), or only at less than
// half the zoom of the plain fit, the result is Fit(Bounds(pts), w, h,
// fallback, keep). O(n·60).
func FitExtents(pts []Pt, ext []Extent, w, h, fallback, keep float64) View {
	if len(pts) == 0 || len(ext) != len(pts) {
		return Fit(Bounds(pts), w, h, fallback, keep)
	}
	xs := func(i int) (p, lo, hi float64) { return pts[i].X, ext[i].L, ext[i].R }
	ys := func(i int) (p, lo, hi float64) { return pts[i].Y, ext[i].T, ext[i].B }
	zx, okx := fitAxis(len(pts), xs, w)
	zy, oky := fitAxis(len(pts), ys, h)
	if !okx || !oky {
		return Fit(Bounds(pts), w, h, fallback, keep)
	}
	z := math.Min(zx, zy)
	if math.IsInf(z, 1) {
		z = keep
		if !(z > 0) {
			z = 1
		}
	}
	z = math.Max(MinZoom, math.Min(MaxZoom, z))
	if plain := Fit(Bounds(pts), w, h, fallback, keep); z < plain.Zoom/2 {
		// the labels would squeeze the drawing: draw it at the plain fit
		// (labels that do not fit then go elsewhere or hide)
		return plain
	}
	ox, okx := axisOffset(len(pts), xs, w, z)
	oy, oky := axisOffset(len(pts), ys, h, z)
	if !okx || !oky {
		return Fit(Bounds(pts), w, h, fallback, keep)
	}
	return View{Zoom: z, Off: Pt{ox, oy}}
}

// axisOffset returns the middle of the offsets o that keep every point's
// room inside [0, size] at zoom z: lo_i ≤ z·p_i + o ≤ size − hi_i.
func axisOffset(n int, at func(int) (p, lo, hi float64), size, z float64) (float64, bool) {
	a, b := math.Inf(-1), math.Inf(1)
	for i := 0; i < n; i++ {
		p, lo, hi := at(i)
		a = math.Max(a, lo-z*p)
		b = math.Min(b, size-hi-z*p)
	}
	return (a + b) / 2, a <= b+1e-9
}

// fitAxis returns the largest zoom at which one axis fits (+Inf when every
// point has the same coordinate) and whether it fits at all. The feasible
// zooms form an interval (the slack is a minimum of linear functions of the
// zoom, so concave); it holds 0 when the widget has room for the largest
// extents on both sides, and the largest feasible zoom is found by bisection.
func fitAxis(n int, at func(int) (p, lo, hi float64), size float64) (float64, bool) {
	pmin, pmax := math.Inf(1), math.Inf(-1)
	for i := 0; i < n; i++ {
		p, _, _ := at(i)
		pmin, pmax = math.Min(pmin, p), math.Max(pmax, p)
	}
	if _, ok := axisOffset(n, at, size, 0); !ok {
		return 0, false
	}
	if pmax-pmin <= 0 {
		return math.Inf(1), true
	}
	lo, hi := 0.0, size/(pmax-pmin) // at hi the points alone span the widget
	if _, ok := axisOffset(n, at, size, hi); ok {
		return hi, true
	}
	for k := 0; k < 60; k++ {
		mid := (lo + hi) / 2
		if _, ok := axisOffset(n, at, size, mid); ok {
			lo = mid
		} else {
			hi = mid
		}
	}
	return lo, true
}
