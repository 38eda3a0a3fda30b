package brief

import (
	"image/color"
	"math"
	"strings"
	"testing"

	"duosweep/engine"
)

// lightness is CIE L* of an sRGB colour (the standard sRGB transfer curve
// and the CIE 1976 L* formula).
func lightness(c color.NRGBA) float64 {
	lin := func(v uint8) float64 {
		x := float64(v) / 255
		if x <= 0.04045 {
			return x / 12.92
		}
		return math.Pow((x+0.055)/1.055, 2.4)
	}
	y := 0.2126*lin(c.R) + 0.7152*lin(c.G) + 0.0722*lin(c.B)
	if y > 216.0/24389 {
		return 116*math.Cbrt(y) - 16
	}
	return y * 24389 / 27
}

func TestHeatRampRisesInLightness(t *testing.T) {
	prev := -1.0
	for k := 0; k < HeatSteps; k++ {
		l := lightness(HeatColor(float64(k) / (HeatSteps - 1)))
		if l <= prev {
			t.Fatalf("heat step %d: L* %.1f not above %.1f", k, l, prev)
		}
		prev = l
	}
	// the editor's ramp ends (canvas/overlay.go)
	if HeatColor(0) != (color.NRGBA{0x0b, 0x1f, 0x4f, 0xff}) || HeatColor(1) != (color.NRGBA{0xf6, 0xe6, 0x5a, 0xff}) {
		t.Fatalf("ramp ends %v %v", HeatColor(0), HeatColor(1))
	}
}

// TestAgentsApartInGrey: the two agent colours differ by more than 20 L*
// units, so they stay apart on a greyscale printout (besides their dash
// patterns).
func TestAgentsApartInGrey(t *testing.T) {
	l0, l1 := lightness(AgentColor(0)), lightness(AgentColor(1))
	if math.Abs(l0-l1) < 20 {
		t.Fatalf("agent lightness %.1f and %.1f too close", l0, l1)
	}
	if AgentDash(0, 2) != nil || len(AgentDash(1, 2)) == 0 {
		t.Fatal("the agents need different line patterns")
	}
}

// TestFontHasEveryGlyph: the embedded Go font covers the special characters
// and every text of the demo briefing.
func TestFontHasEveryGlyph(t *testing.T) {
	if miss := MissingGlyphs("·–×≤…—"); len(miss) > 0 {
		t.Fatalf("missing glyphs %q", string(miss))
	}
	for _, m := range engine.Models {
		in := demoInput(t, m)
		var all []string
		for _, f := range Figures(in) {
			all = append(all, f[0], f[1])
		}
		rule, err := Rule(in)
		if err != nil {
			t.Fatal(err)
		}
		all = append(all, rule...)
		for a := 0; a < 2; a++ {
			for _, r := range ItineraryRows(in, a) {
				all = append(all, r...)
			}
		}
		for _, r := range CandidateRows(in) {
			all = append(all, r...)
		}
		all = append(all, Notice)
		if miss := MissingGlyphs(strings.Join(all, " ")); len(miss) > 0 {
			t.Fatalf("%s: missing glyphs %q", m, string(miss))
		}
	}
	if miss := MissingGlyphs("☃"); len(miss) != 1 {
		t.Fatalf("a snowman should be missing from the Go font, got %q", string(miss))
	}
}

func TestPaletteKeepsKeyColours(t *testing.T) {
	pal, lut := gifPalette()
	if len(pal) > 256 {
		t.Fatalf("palette has %d colours", len(pal))
	}
	for _, c := range PaletteKeyColors() {
		i := lut[lutIndex(c.R, c.G, c.B)]
		if got := pal[i].(color.NRGBA); got != c {
			t.Errorf("key colour %v maps to %v", c, got)
		}
	}
}
