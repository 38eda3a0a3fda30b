package brief

import (
	"image/color"
	"math"

	"duosweep/canvas/geom"
)

// Pt is a point in drawing units (pixels for SVG and PNG, points for PDF),
// y pointing down.
type Pt = geom.Pt

// Shape is one element of a Scene: a *Path, a *Disc or a *Label. Writers
// type-switch on it; the set is closed.
type Shape interface{ shape() }

// Path is a polyline or polygon. A zero Stroke alpha means no outline, a
// zero Fill alpha no fill. Dash lists dash and gap lengths (nil: solid).
type Path struct {
	Pts    []Pt
	Closed bool
	Stroke color.NRGBA
	Width  float64
	Dash   []float64
	Fill   color.NRGBA
	// Class is the role of the path ("corridor", "route", "scale",
	// "legend", "frame", "trail"); ID names one path ("route-0" for the
	// first agent's route), "" for most.
	Class, ID string
}

// Disc is a filled circle with an optional outline.
type Disc struct {
	C      Pt
	R      float64
	Fill   color.NRGBA
	Stroke color.NRGBA
	Width  float64
	Class  string // "node", "candidate", "start", "worst", "agent", "legend"
	ID     string // the node id for node discs
}

// Anchor is where a label's At lies on its baseline.
type Anchor int

const (
	// Start: At is the left end of the baseline.
	Start Anchor = iota
	// Middle: At is the middle of the baseline.
	Middle
	// End: At is the right end of the baseline.
	End
)

// Label is one line of text; At is on its baseline.
type Label struct {
	At     Pt
	Text   string
	Size   float64 // font size (the em height) in drawing units
	Color  color.NRGBA
	Anchor Anchor
	Bold   bool
	Class  string
}

func (*Path) shape()  {}
func (*Disc) shape()  {}
func (*Label) shape() {}

// Left returns the x of the label's left end (measured in the embedded font).
func (l *Label) Left() float64 {
	switch l.Anchor {
	case Middle:
		return l.At.X - TextWidth(l.Text, l.Size, l.Bold)/2
	case End:
		return l.At.X - TextWidth(l.Text, l.Size, l.Bold)
	}
	return l.At.X
}

// Scene is one drawing: a W×H area with a background and shapes drawn in
// order (later ones on top).
type Scene struct {
	W, H       float64
	Background color.NRGBA
	Shapes     []Shape
}

func (sc *Scene) add(s ...Shape) { sc.Shapes = append(sc.Shapes, s...) }

// Paths returns the scene's paths of the given class (all when class is "").
func (sc *Scene) Paths(class string) []*Path {
	var out []*Path
	for _, s := range sc.Shapes {
		if p, ok := s.(*Path); ok && (class == "" || p.Class == class) {
			out = append(out, p)
		}
	}
	return out
}

// Discs returns the scene's discs of the given class (all when class is "").
func (sc *Scene) Discs(class string) []*Disc {
	var out []*Disc
	for _, s := range sc.Shapes {
		if d, ok := s.(*Disc); ok && (class == "" || d.Class == class) {
			out = append(out, d)
		}
	}
	return out
}

// rectPath is a closed axis-aligned rectangle.
func rectPath(x0, y0, x1, y1 float64, fill, stroke color.NRGBA, w float64, class string) *Path {
	return &Path{Pts: []Pt{{X: x0, Y: y0}, {X: x1, Y: y0}, {X: x1, Y: y1}, {X: x0, Y: y1}}, Closed: true,
		Fill: fill, Stroke: stroke, Width: w, Class: class}
}

// squarePath is a closed square of half-side r centred on c.
func squarePath(c Pt, r float64, fill, stroke color.NRGBA, w float64, class string) *Path {
	return rectPath(c.X-r, c.Y-r, c.X+r, c.Y+r, fill, stroke, w, class)
}

// niceLength returns the largest 1, 2 or 5 × 10^k not above x (x > 0).
func niceLength(x float64) float64 {
	if !(x > 0) || math.IsInf(x, 0) {
		return 1
	}
	p := math.Pow(10, math.Floor(math.Log10(x)))
	for _, m := range []float64{5, 2, 1} {
		if m*p <= x {
			return m * p
		}
	}
	return p
}
