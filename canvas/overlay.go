package canvas

import (
	"image/color"
	"math"

	"duosweep/engine"
)

// Overlay is what the plan panel and playback draw on top of the site. All
// indices refer to the current scenario; the ui replaces the overlay after
// each replan (out-of-range indices are ignored).
type Overlay struct {
	Evac      []float64     // per node: evacuation time for candidates, NaN for others; nil = no heat colouring
	EvacMax   float64       // top of the colour scale
	Worst     int           // node index of the worst exit, -1 none: a thick ring and a "worst" tag
	Focus     int           // the exit being replayed, -1 none: a target marker
	Agents    []AgentMark   // agents at the current playback time
	Meeting   *engine.Point // where the finder meets the partner (face-to-face), nil none
	Unvisited []int         // candidates no route visits: a warning badge
}

// AgentMark is one agent on the drawing. Trail holds past positions (oldest
// first), drawn as a polyline ending at At.
type AgentMark struct {
	Name     string
	At       engine.Point
	Trail    []engine.Point
	Informed bool // knows where the exit is: drawn with a thick ring
}

// heatStops is Duosweep's own sequential ramp, dark blue through slate and
// olive to pale yellow. Lightness rises monotonically (checked by a test), so
// the order reads in grey and for the common colour-vision deficiencies; the
// hue path avoids a red–green contrast. (Design follows the common practice of
// blue–yellow ramps for colour-blind safety.)
var heatStops = [...]color.NRGBA{
	{0x0b, 0x1f, 0x4f, 0xff},
	{0x33, 0x47, 0x72, 0xff},
	{0x62, 0x6c, 0x7e, 0xff},
	{0x93, 0x92, 0x78, 0xff},
	{0xc6, 0xba, 0x63, 0xff},
	{0xf6, 0xe6, 0x5a, 0xff},
}

// HeatColor returns the colour for f in [0, 1] on the editor's heat scale
// (clamped; NaN gives the bottom). The ui legend uses the same function.
func HeatColor(f float64) color.Color { return heat(f) }

func heat(f float64) color.NRGBA {
	if !(f > 0) {
		return heatStops[0]
	}
	if f >= 1 {
		return heatStops[len(heatStops)-1]
	}
	x := f * float64(len(heatStops)-1)
	i := int(x)
	t := x - float64(i)
	a, b := heatStops[i], heatStops[i+1]
	mix := func(p, q uint8) uint8 { return uint8(math.Round(float64(p) + (float64(q)-float64(p))*t)) }
	return color.NRGBA{mix(a.R, b.R), mix(a.G, b.G), mix(a.B, b.B), 0xff}
}

// heatPalette holds HeatColor at 256 steps, boxed once, for drawing.
var heatPalette = func() (p [256]color.Color) {
	for i := range p {
		p[i] = heat(float64(i) / 255)
	}
	return p
}()

// agentColors: a dark and a light colour (they differ in lightness as well as
// hue), with the letter colour that reads on each.
var agentColors = [...]struct{ fill, letter color.NRGBA }{
	{color.NRGBA{0x5b, 0x1a, 0x8c, 0xff}, color.NRGBA{0xff, 0xff, 0xff, 0xff}}, // deep violet
	{color.NRGBA{0xf3, 0x9c, 0x1f, 0xff}, color.NRGBA{0x1a, 0x1a, 0x1a, 0xff}}, // amber
}

// AgentColor returns the fill colour used for the i-th agent (0 or 1, cycling).
func AgentColor(i int) color.Color { return agentColors[i%len(agentColors)].fill }

// evacFrac returns the heat fraction of node i, ok false when it has none.
func (o *Overlay) evacFrac(i int) (float64, bool) {
	if i < 0 || i >= len(o.Evac) {
		return 0, false
	}
	v := o.Evac[i]
	if math.IsNaN(v) {
		return 0, false
	}
	if math.IsInf(v, 1) {
		return 1, true
	}
	if !(o.EvacMax > 0) {
		return 0, true
	}
	return math.Max(0, math.Min(1, v/o.EvacMax)), true
}
