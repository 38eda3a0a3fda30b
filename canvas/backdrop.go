package canvas

import (
	"errors"
	"image"
	"math"

	"fyne.io/fyne/v2"
	fc "fyne.io/fyne/v2/canvas"

	"duosweep/canvas/geom"
)

// The backdrop (FORMATS.md `backdrop`): an image drawn under the site, its
// top-left corner at (X, Y) in drawing coordinates, Scale drawing units per
// image pixel, Opacity in [0, 1]. The app decodes the file and hands the
// image to SetBackdropImage; the scenario's Backdrop says where it goes. It is
// never dragged (locked): its place changes only through scenario edits.

// backdropMaxPx is the long side of the downscaled copy drawn while the image
// is shown at most that large on screen, so that a large scan (say
// 8000 × 8000) stays responsive at low zoom.
const backdropMaxPx = 1600

type backdropState struct {
	full, small image.Image // the decoded image and a copy of at most backdropMaxPx
	w, h        int         // the full image's size in pixels
	capture     []geom.Pt   // calibration points tapped so far
	onCaptured  func(a, b geom.Pt)
}

// SetBackdropImage sets the decoded backdrop image (nil removes it). It keeps
// a downscaled copy for low zoom. O(image pixels) for a large image.
func (e *Editor) SetBackdropImage(img image.Image) {
	e.bd.full, e.bd.small = img, nil
	e.bd.w, e.bd.h = 0, 0
	if img != nil {
		b := img.Bounds()
		e.bd.w, e.bd.h = b.Dx(), b.Dy()
		e.bd.small = downscale(img, backdropMaxPx)
	}
	e.Refresh()
}

// BackdropImageSize returns the backdrop image's size in pixels (0, 0 without one).
func (e *Editor) BackdropImageSize() (w, h int) { return e.bd.w, e.bd.h }

// CalibrationPoints starts a calibration: the next two taps on the canvas
// mark two points (in drawing coordinates) instead of acting, and done is
// called with them. A hint asks for each point.
func (e *Editor) CalibrationPoints(done func(a, b geom.Pt)) {
	e.bd.capture = e.bd.capture[:0]
	e.bd.onCaptured = done
	e.message("Click the first of two points whose distance you know", e.centre())
}

// captureTap records a calibration tap; it reports whether the tap was one.
func (e *Editor) captureTap(pos fyne.Position) bool {
	if e.bd.onCaptured == nil {
		return false
	}
	e.bd.capture = append(e.bd.capture, e.view.ToWorld(toPt(pos)))
	if len(e.bd.capture) < 2 {
		e.message("Now click the second point", pos)
		return true
	}
	done, a, b := e.bd.onCaptured, e.bd.capture[0], e.bd.capture[1]
	e.bd.onCaptured, e.bd.capture = nil, e.bd.capture[:0]
	done(a, b)
	return true
}

// CalibratedScale returns the backdrop scale (drawing units per image pixel)
// that puts points a and b (drawing coordinates, tapped on the backdrop drawn
// at scale old) distance scenario units apart, for an editor whose Scale is
// unitsPerDrawing (0 means 1). The image keeps its top-left corner. O(1).
func CalibratedScale(old float64, a, b geom.Pt, distance, unitsPerDrawing float64) (float64, error) {
	if unitsPerDrawing == 0 {
		unitsPerDrawing = 1
	}
	px := geom.Dist(a, b) / old // the two points' distance in image pixels
	switch {
	case !(old > 0):
		return 0, errors.New("the backdrop has no scale yet")
	case !(distance > 0) || math.IsInf(distance, 0):
		return 0, errors.New("the distance must be a number > 0")
	case !(px >= 1):
		return 0, errors.New("the two points are less than a pixel apart: click two points farther apart")
	}
	return distance / unitsPerDrawing / px, nil
}

// backdropLayer draws the backdrop image.
type backdropLayer struct {
	img   *fc.Image
	shown image.Image
}

func (l *backdropLayer) init() {
	l.img = &fc.Image{FillMode: fc.ImageFillStretch, ScaleMode: fc.ImageScaleFastest}
	l.img.Hidden = true
}

func (l *backdropLayer) update(e *Editor) {
	b := e.sc.Backdrop
	if b == nil || e.bd.full == nil {
		l.img.Hidden = true
		return
	}
	l.img.Translucency = 1 - math.Max(0, math.Min(1, b.Opacity))
}

// layout places the image and picks the copy to draw: the small one while
// the image is no larger on screen than that copy.
func (l *backdropLayer) layout(e *Editor, f *frame) {
	b := e.sc.Backdrop
	if b == nil || e.bd.full == nil || !(b.Scale > 0) {
		l.img.Hidden = true
		return
	}
	tl := e.view.ToScreen(geom.Pt{X: b.X, Y: b.Y})
	w := float64(e.bd.w) * b.Scale * e.view.Zoom
	h := float64(e.bd.h) * b.Scale * e.view.Zoom
	box := geom.Rect{Min: tl, Max: tl.Add(geom.Pt{X: w, Y: h})}
	l.img.Hidden = box.Max.X < f.vis.Min.X || box.Min.X > f.vis.Max.X || box.Max.Y < f.vis.Min.Y || box.Min.Y > f.vis.Max.Y
	if l.img.Hidden {
		return
	}
	want := e.bd.full
	if sb := e.bd.small.Bounds(); math.Max(w, h) <= float64(max(sb.Dx(), sb.Dy())) {
		want = e.bd.small
	}
	if want != l.shown {
		l.img.Image, l.shown = want, want
		l.img.Refresh()
	}
	l.img.Move(fyne.NewPos(float32(tl.X), float32(tl.Y)))
	l.img.Resize(fyne.NewSize(float32(w), float32(h)))
}

// downscale returns img when its long side is at most maxPx, else a copy
// whose long side is maxPx (nearest-neighbour sampling). O(output pixels).
func downscale(img image.Image, maxPx int) image.Image {
	b := img.Bounds()
	long := max(b.Dx(), b.Dy())
	if long <= maxPx {
		return img
	}
	f := float64(long) / float64(maxPx)
	w, h := max(1, int(float64(b.Dx())/f)), max(1, int(float64(b.Dy())/f))
	out := image.NewNRGBA(image.Rect(0, 0, w, h))
	for y := 0; y < h; y++ {
		sy := b.Min.Y + min(b.Dy()-1, int((float64(y)+0.5)*f))
		for x := 0; x < w; x++ {
			sx := b.Min.X + min(b.Dx()-1, int((float64(x)+0.5)*f))
			out.Set(x, y, img.At(sx, sy))
		}
	}
	return out
}
