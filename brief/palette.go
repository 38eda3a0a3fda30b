package brief

import (
	"image/color"
	"math"
)

// Notice is printed on every page and every picture of a briefing.
const Notice = "Planning and training aid — not a substitute for the site's emergency plan, local regulations or licensed practice."

// Agent styles. The two colours are the blue (#0072B2) and the orange
// (#E69F00) of the Okabe–Ito palette (Okabe and Ito, "Color Universal Design",
// 2008), chosen for readers with the common colour-vision deficiencies:
// the pair stays apart under protanopia, deuteranopia and tritanopia
// simulations, and it differs in lightness too (CIE L* about 46 against 72),
// so it stays apart in greyscale. Each agent also has its own line pattern
// (solid against dashed) and its own marker shape (disc against square), so
// the routes read on a black-and-white printout with no colour at all.
var agentColor = [2]color.NRGBA{
	{0x00, 0x72, 0xb2, 0xff}, // Okabe–Ito blue
	{0xe6, 0x9f, 0x00, 0xff}, // Okabe–Ito orange
}

// AgentColor returns the colour of agent a (0 or 1).
func AgentColor(a int) color.NRGBA { return agentColor[a&1] }

// AgentDash returns the dash pattern of agent a's route for a line of width
// w: nil (solid) for the first agent, dashes three widths long with gaps of
// two widths for the second.
func AgentDash(a int, w float64) []float64 {
	if a&1 == 0 {
		return nil
	}
	return []float64{3 * w, 2 * w}
}

// Plain colours of the drawing.
var (
	White    = color.NRGBA{0xff, 0xff, 0xff, 0xff}
	Ink      = color.NRGBA{0x1a, 0x1a, 0x1a, 0xff} // text and outlines
	Muted    = color.NRGBA{0x8c, 0x8c, 0x8c, 0xff} // corridors
	Faint    = color.NRGBA{0xd0, 0xd0, 0xd0, 0xff} // frames
	WorstInk = color.NRGBA{0xc0, 0x00, 0x3c, 0xff} // the worst-exit ring and tag
)

// heatStops is the heat ramp of the site editor (canvas/overlay.go), kept
// here in a pure package so that the canvas can switch to it: dark blue
// through slate and olive to pale yellow. Lightness rises monotonically (a
// test checks), so the order reads in grey and for the common colour-vision
// deficiencies, and the hue path avoids a red–green contrast (common
// practice for colour-blind-safe sequential ramps).
var heatStops = [...]color.NRGBA{
	{0x0b, 0x1f, 0x4f, 0xff},
	{0x33, 0x47, 0x72, 0xff},
	{0x62, 0x6c, 0x7e, 0xff},
	{0x93, 0x92, 0x78, 0xff},
	{0xc6, 0xba, 0x63, 0xff},
	{0xf6, 0xe6, 0x5a, 0xff},
}

// HeatSteps is the number of distinct heat colours a drawing uses: heat
// fractions are rounded to this many steps, so that a GIF palette can hold
// every one of them exactly.
const HeatSteps = 32

// HeatColor returns the heat colour for f in [0, 1] (clamped; NaN gives the
// bottom), rounded to one of HeatSteps steps. It matches the editor's ramp.
func HeatColor(f float64) color.NRGBA {
	if !(f > 0) {
		f = 0
	}
	if f > 1 {
		f = 1
	}
	k := math.Round(f * (HeatSteps - 1))
	return heatRamp(k / (HeatSteps - 1))
}

func heatRamp(f float64) color.NRGBA {
	if f <= 0 {
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

// heatFrac is the heat fraction of an evacuation time: evac over the largest
// finite one; never visited (+Inf) is the top.
func heatFrac(evac, max float64) float64 {
	switch {
	case math.IsInf(evac, 1):
		return 1
	case !(max > 0):
		return 0
	}
	return math.Max(0, math.Min(1, evac/max))
}
