package brief

import (
	"image"
	"image/color"
	"image/draw"
	"image/png"
	"io"
	"math"

	"github.com/srwiley/rasterx"
	"golang.org/x/image/font"
	"golang.org/x/image/math/fixed"
)

// Raster draws scenes into RGBA images with github.com/srwiley/rasterx (over
// golang.org/x/image/vector), anti-aliased, and text with the embedded Go
// font. Each shape is rasterised inside its own bounding box, so a scene of
// thousands of small discs costs their area, not thousands of full images.
// A Raster is not safe for concurrent use; the zero value is ready.
type Raster struct {
	faces map[faceKey]font.Face
}

type faceKey struct {
	bold bool
	size float64
}

// NewImage returns a w×h RGBA image (the scene's size, rounded) filled with
// the scene's background, with the scene drawn on it.
func (rz *Raster) NewImage(sc *Scene) *image.RGBA {
	img := image.NewRGBA(image.Rect(0, 0, int(math.Round(sc.W)), int(math.Round(sc.H))))
	draw.Draw(img, img.Bounds(), image.NewUniform(sc.Background), image.Point{}, draw.Src)
	rz.Draw(img, sc.Shapes, image.Point{})
	return img
}

// Draw draws shapes onto img, shifted by off pixels.
func (rz *Raster) Draw(img *image.RGBA, shapes []Shape, off image.Point) {
	o := Pt{X: float64(off.X), Y: float64(off.Y)}
	for _, s := range shapes {
		switch s := s.(type) {
		case *Path:
			if len(s.Pts) == 0 {
				continue
			}
			pts := make([]Pt, len(s.Pts))
			for i, p := range s.Pts {
				pts[i] = p.Add(o)
			}
			if s.Fill.A > 0 && len(pts) > 2 {
				rz.fill(img, pts, 0, s.Fill, func(a rasterx.Adder) { polyline(a, pts, true) })
			}
			if s.Stroke.A > 0 && s.Width > 0 {
				rz.stroke(img, pts, s.Width, s.Stroke, s.Dash, func(a rasterx.Adder) { polyline(a, pts, s.Closed) })
			}
		case *Disc:
			c := s.C.Add(o)
			ring := []Pt{{X: c.X - s.R, Y: c.Y - s.R}, {X: c.X + s.R, Y: c.Y + s.R}}
			if s.Fill.A > 0 {
				rz.fill(img, ring, 0, s.Fill, func(a rasterx.Adder) { rasterx.AddCircle(c.X, c.Y, s.R, a) })
			}
			if s.Stroke.A > 0 && s.Width > 0 {
				rz.stroke(img, ring, s.Width, s.Stroke, nil, func(a rasterx.Adder) { rasterx.AddCircle(c.X, c.Y, s.R, a) })
			}
		case *Label:
			rz.text(img, s, o)
		}
	}
}

func polyline(a rasterx.Adder, pts []Pt, closed bool) {
	a.Start(rasterx.ToFixedP(pts[0].X, pts[0].Y))
	for _, p := range pts[1:] {
		a.Line(rasterx.ToFixedP(p.X, p.Y))
	}
	a.Stop(closed)
}

// clipBox returns the pixel box of pts grown by pad, clipped to img.
func clipBox(img *image.RGBA, pts []Pt, pad float64) image.Rectangle {
	x0, y0, x1, y1 := math.Inf(1), math.Inf(1), math.Inf(-1), math.Inf(-1)
	for _, p := range pts {
		x0, y0, x1, y1 = math.Min(x0, p.X), math.Min(y0, p.Y), math.Max(x1, p.X), math.Max(y1, p.Y)
	}
	r := image.Rect(int(math.Floor(x0-pad))-1, int(math.Floor(y0-pad))-1, int(math.Ceil(x1+pad))+1, int(math.Ceil(y1+pad))+1)
	return r.Intersect(img.Bounds())
}

// region prepares a scanner for a sub-rectangle of img; add receives points
// in image coordinates and shifts them.
func region(img *image.RGBA, box image.Rectangle) (*image.RGBA, *rasterx.ScannerGV) {
	sub := img.SubImage(box).(*image.RGBA)
	sc := rasterx.NewScannerGV(box.Dx(), box.Dy(), sub, sub.Bounds())
	return sub, sc
}

// shifted wraps an Adder so that image coordinates become box coordinates.
type shifted struct {
	rasterx.Adder
	d fixed.Point26_6
}

func (s shifted) Start(a fixed.Point26_6)         { s.Adder.Start(a.Sub(s.d)) }
func (s shifted) Line(b fixed.Point26_6)          { s.Adder.Line(b.Sub(s.d)) }
func (s shifted) QuadBezier(b, c fixed.Point26_6) { s.Adder.QuadBezier(b.Sub(s.d), c.Sub(s.d)) }
func (s shifted) CubeBezier(b, c, d fixed.Point26_6) {
	s.Adder.CubeBezier(b.Sub(s.d), c.Sub(s.d), d.Sub(s.d))
}

func (rz *Raster) fill(img *image.RGBA, pts []Pt, pad float64, c color.NRGBA, add func(rasterx.Adder)) {
	box := clipBox(img, pts, pad)
	if box.Empty() {
		return
	}
	_, sc := region(img, box)
	f := rasterx.NewFiller(box.Dx(), box.Dy(), sc)
	f.SetColor(c)
	add(shifted{f, fixed.P(box.Min.X, box.Min.Y)})
	f.Draw()
}

func (rz *Raster) stroke(img *image.RGBA, pts []Pt, width float64, c color.NRGBA, dash []float64, add func(rasterx.Adder)) {
	box := clipBox(img, pts, width)
	if box.Empty() {
		return
	}
	_, sc := region(img, box)
	d := rasterx.NewDasher(box.Dx(), box.Dy(), sc)
	capF := rasterx.RoundCap
	if len(dash) > 0 {
		capF = rasterx.ButtCap
	}
	d.SetStroke(fixed.Int26_6(width*64), 4*64, capF, nil, rasterx.RoundGap, rasterx.Round, dash, 0)
	d.SetColor(c)
	add(shifted{d, fixed.P(box.Min.X, box.Min.Y)})
	d.Draw()
}

func (rz *Raster) face(bold bool, size float64) font.Face {
	k := faceKey{bold, math.Round(size*4) / 4}
	if rz.faces == nil {
		rz.faces = map[faceKey]font.Face{}
	}
	f, ok := rz.faces[k]
	if !ok {
		f = newFace(bold, k.size)
		rz.faces[k] = f
	}
	return f
}

func (rz *Raster) text(img *image.RGBA, l *Label, o Pt) {
	if l.Text == "" || l.Size <= 0 {
		return
	}
	f := rz.face(l.Bold, l.Size)
	x := l.Left() + o.X
	dr := font.Drawer{Dst: img, Src: image.NewUniform(l.Color), Face: f,
		Dot: fixed.Point26_6{X: fixed.Int26_6(math.Round(x * 64)), Y: fixed.Int26_6(math.Round((l.At.Y + o.Y) * 64))}}
	dr.DrawString(l.Text)
}

// WritePNG rasterises the scene and writes it as a PNG.
func WritePNG(w io.Writer, sc *Scene) error {
	var rz Raster
	img := rz.NewImage(sc)
	enc := png.Encoder{CompressionLevel: png.BestCompression}
	return enc.Encode(w, img)
}
