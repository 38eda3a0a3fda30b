package brief

import (
	"bufio"
	"context"
	"fmt"
	"image"
	"image/color"
	"image/draw"
	"image/gif"
	"io"
	"math"
	"sync"

	"duosweep/engine"
)

// GIFOptions configure WriteGIF. The zero value gives a 640×400 animation of
// the worst exit, 10 frames per second for 20 seconds, one panel.
type GIFOptions struct {
	W, H    int     // size of the whole animation in pixels (default 640×400)
	FPS     int     // frames per second, 1 to 50 (default 10)
	Seconds float64 // length, 0.1 to 600 (default 20)
	// Exit is the id of the candidate whose replay is shown; "" means the
	// report's worst exit.
	Exit string
	// Compare, when set, adds a second panel on the right: the same plan and
	// exit under this model (radio against face to face, or the current model
	// against another), with the same clock.
	Compare *engine.Model
	// Progress, when set, is called after each frame with the fraction done.
	Progress func(done float64)
}

func (o GIFOptions) withDefaults() (GIFOptions, error) {
	if o.W == 0 && o.H == 0 {
		o.W, o.H = 640, 400
	}
	if o.FPS == 0 {
		o.FPS = 10
	}
	if o.Seconds == 0 {
		o.Seconds = 20
	}
	switch {
	case o.W < 64 || o.H < 64 || o.W > 4000 || o.H > 4000:
		return o, fmt.Errorf("brief: animation size %d×%d: want 64 to 4000 pixels in each direction", o.W, o.H)
	case o.FPS < 1 || o.FPS > 50:
		return o, fmt.Errorf("brief: fps %d: want 1 to 50", o.FPS)
	case !(o.Seconds >= 0.1 && o.Seconds <= 600):
		return o, fmt.Errorf("brief: length %g s: want 0.1 to 600 seconds", o.Seconds)
	}
	return o, nil
}

// Frames returns the number of frames: length × fps, rounded, at least 1.
func (o GIFOptions) Frames() int {
	return max(1, int(math.Round(o.Seconds*float64(o.FPS))))
}

// holdFraction is the share of the animation that holds the final state.
const holdFraction = 0.1

// FrameTime returns the replay time shown in frame k of n when the replay
// ends at end: the clock runs evenly from 0 and reaches end after 90 % of
// the frames; the rest hold the end.
func FrameTime(k, n int, end float64) float64 {
	if n <= 1 || !(end > 0) {
		return math.Max(0, end)
	}
	f := float64(k) / (float64(n-1) * (1 - holdFraction))
	return math.Min(end, end*f)
}

// Animation is a prepared GIF: its panels' maps and replays. Build it with
// NewAnimation; Frame draws one frame.
type Animation struct {
	Opt    GIFOptions
	Panels []*Panel
	End    float64 // the replay time of the last frames: the latest end of the panels
	bg     *image.RGBA
	rz     Raster
}

// Panel is one side of an animation.
type Panel struct {
	Map    *Map
	Replay *engine.Replay
	X      int // left edge in the animation
}

// NewAnimation prepares the animation of in (see WriteGIF).
func NewAnimation(in Input, opt GIFOptions) (*Animation, error) {
	if err := in.check(); err != nil {
		return nil, err
	}
	opt, err := opt.withDefaults()
	if err != nil {
		return nil, err
	}
	s := in.Site
	exit := in.Report.WorstExit
	if opt.Exit != "" {
		v, ok := s.Index(opt.Exit)
		if !ok {
			return nil, fmt.Errorf("brief: exit %q: no node has this id", opt.Exit)
		}
		if !s.Candidate[v] {
			return nil, fmt.Errorf("brief: exit %q: not a candidate", opt.Exit)
		}
		exit = v
	}
	if exit < 0 {
		return nil, fmt.Errorf("brief: the site has no candidates to replay")
	}
	inputs := []Input{in}
	if opt.Compare != nil {
		r2, err := engine.Evaluate(s, in.Plan, *opt.Compare)
		if err != nil {
			return nil, err
		}
		in2 := in
		in2.Report = r2
		inputs = append(inputs, in2)
	}
	a := &Animation{Opt: opt}
	noticeH := 14
	pw := opt.W / len(inputs)
	a.bg = image.NewRGBA(image.Rect(0, 0, opt.W, opt.H))
	draw.Draw(a.bg, a.bg.Bounds(), image.NewUniform(White), image.Point{}, draw.Src)
	for i, pin := range inputs {
		rp, err := engine.NewReplay(s, pin.Plan, pin.Report.Model, exit)
		if err != nil {
			return nil, err
		}
		if math.IsInf(rp.End, 0) {
			return nil, fmt.Errorf("brief: exit %q is never reached (no route visits it)", s.IDs[exit])
		}
		title := fmt.Sprintf("%s · exit %s · both there at %s", pin.Report.Model, s.IDs[exit], engine.FormatClock(rp.End))
		m, err := BuildMap(pin, float64(pw), float64(opt.H-noticeH), MapOptions{NoRoutes: true, Title: title, Caption: true})
		if err != nil {
			return nil, err
		}
		if exit != pin.Report.WorstExit {
			c := m.NodePos(exit)
			m.add(&Disc{C: c, R: m.R + 2.5, Stroke: Ink, Width: 1.5, Class: "exit"})
		}
		p := &Panel{Map: m, Replay: rp, X: i * pw}
		a.Panels = append(a.Panels, p)
		a.End = math.Max(a.End, rp.End)
		a.rz.Draw(a.bg, m.Shapes, image.Point{X: p.X})
		if i > 0 {
			a.rz.Draw(a.bg, []Shape{&Path{Pts: []Pt{{X: float64(p.X), Y: 0}, {X: float64(p.X), Y: float64(opt.H - noticeH)}}, Stroke: Faint, Width: 1}}, image.Point{})
		}
	}
	fs := 9.0
	a.rz.Draw(a.bg, []Shape{&Label{At: Pt{X: float64(opt.W) / 2, Y: float64(opt.H) - 3.5}, Text: Notice, Size: noticeSize(float64(opt.W), fs/0.8), Color: Ink, Anchor: Middle, Class: "notice"}}, image.Point{})
	return a, nil
}

// Overlay returns the moving shapes of panel p at replay time t, in the
// panel's coordinates: both agents' trails and markers, the clock and the
// latest event as a caption.
func (p *Panel) Overlay(t float64) []Shape {
	m, rp := p.Map, p.Replay
	s := m.in.Site
	var out []Shape
	for a := 0; a < 2; a++ {
		pts := m.proj.trajectoryPolyline(rp.Trajectory(a), t)
		pts = append(pts, m.PointPos(rp.Position(a, t)))
		w := m.routeWidth(a)
		out = append(out, &Path{Pts: pts, Stroke: AgentColor(a), Width: w, Dash: AgentDash(a, w), Class: "trail"})
	}
	mr := MarkerRadius(m)
	for a := 0; a < 2; a++ {
		c := m.PointPos(rp.Position(a, t))
		ow := 1.0
		if rp.Informed(a, t) {
			ow = 2.2
		}
		if a == 0 {
			out = append(out, &Disc{C: c, R: mr, Fill: AgentColor(a), Stroke: Ink, Width: ow, Class: "agent"})
		} else {
			out = append(out, squarePath(c, 0.9*mr, AgentColor(a), Ink, ow, "agent"))
		}
	}
	fs := m.FontSize
	out = append(out, &Label{At: Pt{X: m.W - 0.5*fs, Y: 1.4 * fs}, Text: engine.FormatClock(t), Size: 1.15 * fs, Color: Ink, Anchor: End, Bold: true, Class: "clock"})
	caption := "Searching: neither agent knows where the exit is"
	for _, ev := range rp.Events {
		if ev.T <= t {
			caption = engine.FormatClock(ev.T) + "  " + ev.Text
		}
	}
	_ = s
	size := 0.9 * fs
	if tw := TextWidth(caption, size, false); tw > m.W-fs {
		size *= (m.W - fs) / tw
	}
	out = append(out, &Label{At: Pt{X: 0.5 * fs, Y: 2.9 * fs}, Text: caption, Size: size, Color: Ink, Class: "caption"})
	return out
}

// MarkerRadius is the radius of the agent markers on map m.
func MarkerRadius(m *Map) float64 { return math.Max(4, 1.5*m.R) }

// Frame draws frame k of n (replay time FrameTime(k, n, End)) into dst, a
// copy of the background.
func (a *Animation) Frame(dst *image.RGBA, k, n int) {
	copy(dst.Pix, a.bg.Pix)
	t := FrameTime(k, n, a.End)
	for _, p := range a.Panels {
		a.rz.Draw(dst, p.Overlay(t), image.Point{X: p.X})
	}
}

// WriteGIF writes the replay of one exit as an animated GIF (image/gif):
// the site with its heat colours, both agents with their trails, the clock
// and the events as captions; with opt.Compare, two panels side by side.
// All frames share one palette that holds every heat colour exactly; after
// the first, a frame stores only the rectangle that changed, with unchanged
// pixels transparent. ctx cancels it between frames. O(frames × pixels).
func WriteGIF(ctx context.Context, w io.Writer, in Input, opt GIFOptions) error {
	a, err := NewAnimation(in, opt)
	if err != nil {
		return err
	}
	opt = a.Opt
	n := opt.Frames()
	pal, lut := gifPalette()
	bounds := image.Rect(0, 0, opt.W, opt.H)
	frame := image.NewRGBA(bounds)
	prev := make([]uint8, opt.W*opt.H)
	cur := make([]uint8, opt.W*opt.H)
	delay := max(2, int(math.Round(100/float64(opt.FPS))))
	// the frames after the first are mostly small changed rectangles, so
	// holding them for gif.EncodeAll costs little memory
	out := &gif.GIF{Config: image.Config{ColorModel: pal, Width: opt.W, Height: opt.H}}
	for k := 0; k < n; k++ {
		if err := ctx.Err(); err != nil {
			return err
		}
		a.Frame(frame, k, n)
		quantize(frame, cur, lut)
		var img *image.Paletted
		if k == 0 {
			img = &image.Paletted{Pix: append([]uint8(nil), cur...), Stride: opt.W, Rect: bounds, Palette: pal}
		} else {
			img = diffFrame(prev, cur, opt.W, opt.H, pal)
		}
		out.Image = append(out.Image, img)
		out.Delay = append(out.Delay, delay)
		out.Disposal = append(out.Disposal, gif.DisposalNone)
		prev, cur = cur, prev
		if opt.Progress != nil {
			opt.Progress(float64(k+1) / float64(n))
		}
	}
	bw := bufio.NewWriter(w)
	if err := gif.EncodeAll(bw, out); err != nil {
		return fmt.Errorf("brief: gif: %w", err)
	}
	return bw.Flush()
}

// transparentIndex is the palette index that leaves the previous frame's pixel.
const transparentIndex = 0

// diffFrame returns the smallest rectangle where cur differs from prev,
// unchanged pixels set to the transparent index (a 1×1 transparent frame
// when nothing changed).
func diffFrame(prev, cur []uint8, w, h int, pal color.Palette) *image.Paletted {
	x0, y0, x1, y1 := w, h, -1, -1
	for y := 0; y < h; y++ {
		row := y * w
		for x := 0; x < w; x++ {
			if prev[row+x] != cur[row+x] {
				x0, x1 = min(x0, x), max(x1, x)
				y0, y1 = min(y0, y), max(y1, y)
			}
		}
	}
	if x1 < 0 {
		img := image.NewPaletted(image.Rect(0, 0, 1, 1), pal)
		img.Pix[0] = transparentIndex
		return img
	}
	r := image.Rect(x0, y0, x1+1, y1+1)
	img := image.NewPaletted(r, pal)
	for y := y0; y <= y1; y++ {
		for x := x0; x <= x1; x++ {
			i := y*w + x
			if prev[i] != cur[i] {
				img.Pix[(y-y0)*img.Stride+(x-x0)] = cur[i]
			} else {
				img.Pix[(y-y0)*img.Stride+(x-x0)] = transparentIndex
			}
		}
	}
	return img
}

// The animation palette: the transparent entry, every key colour of the
// drawing (white, ink, greys, both agent colours, the worst-exit red and all
// HeatSteps heat colours) exactly, then blends of them for anti-aliased
// edges. A 6-bit-per-channel lookup table maps any colour to its nearest
// entry, with every key colour mapped to itself.
var (
	palOnce sync.Once
	pal     color.Palette
	palLUT  []uint8
)

func gifPalette() (color.Palette, []uint8) {
	palOnce.Do(buildPalette)
	return pal, palLUT
}

// PaletteKeyColors returns the colours the animation palette holds exactly.
func PaletteKeyColors() []color.NRGBA {
	keys := []color.NRGBA{White, Ink, Muted, Faint, WorstInk, AgentColor(0), AgentColor(1)}
	for k := 0; k < HeatSteps; k++ {
		keys = append(keys, HeatColor(float64(k)/(HeatSteps-1)))
	}
	return keys
}

func buildPalette() {
	keys := PaletteKeyColors()
	p := color.Palette{color.NRGBA{}}
	seen := map[color.NRGBA]bool{}
	addc := func(c color.NRGBA) {
		c.A = 0xff
		if !seen[c] && len(p) < 256 {
			seen[c] = true
			p = append(p, c)
		}
	}
	for _, c := range keys {
		addc(c)
	}
	mix := func(a, b color.NRGBA, f float64) color.NRGBA {
		l := func(x, y uint8) uint8 { return uint8(math.Round(float64(x) + (float64(y)-float64(x))*f)) }
		return color.NRGBA{l(a.R, b.R), l(a.G, b.G), l(a.B, b.B), 0xff}
	}
	for g := 0; g < 16; g++ { // greys for text edges
		v := uint8(g * 17)
		addc(color.NRGBA{v, v, v, 0xff})
	}
	strong := []color.NRGBA{AgentColor(0), AgentColor(1), WorstInk, Ink}
	for _, c := range strong {
		for _, f := range []float64{0.15, 0.3, 0.45, 0.6, 0.75, 0.88} {
			addc(mix(c, White, f))
		}
		for _, f := range []float64{0.3, 0.6} {
			addc(mix(c, Faint, f))
		}
	}
	addc(mix(AgentColor(0), AgentColor(1), 0.5))
	for k := 0; k < HeatSteps; k += 2 {
		h := HeatColor(float64(k) / (HeatSteps - 1))
		addc(mix(h, White, 0.5))
		addc(mix(h, Ink, 0.5))
	}
	pal = p
	palLUT = make([]uint8, 1<<18)
	for i := range palLUT {
		r, g, b := uint8(i>>12)<<2|2, uint8(i>>6&63)<<2|2, uint8(i&63)<<2|2
		best, bd := 1, math.MaxInt
		for j := 1; j < len(p); j++ {
			c := p[j].(color.NRGBA)
			dr, dg, db := int(c.R)-int(r), int(c.G)-int(g), int(c.B)-int(b)
			if d := 3*dr*dr + 4*dg*dg + 2*db*db; d < bd {
				best, bd = j, d
			}
		}
		palLUT[i] = uint8(best)
	}
	for j := len(p) - 1; j >= 1; j-- { // key colours (listed first) win their own cell
		c := p[j].(color.NRGBA)
		palLUT[lutIndex(c.R, c.G, c.B)] = uint8(j)
	}
}

func lutIndex(r, g, b uint8) int { return int(r>>2)<<12 | int(g>>2)<<6 | int(b>>2) }

// quantize maps an opaque RGBA image to palette indexes through the lookup table.
func quantize(img *image.RGBA, out []uint8, lut []uint8) {
	w, h := img.Rect.Dx(), img.Rect.Dy()
	for y := 0; y < h; y++ {
		row := img.Pix[y*img.Stride:]
		o := out[y*w:]
		for x := 0; x < w; x++ {
			o[x] = lut[lutIndex(row[4*x], row[4*x+1], row[4*x+2])]
		}
	}
}
