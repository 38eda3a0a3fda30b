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
