package brief

import (
	"fmt"
	"sync"

	"golang.org/x/image/font"
	"golang.org/x/image/font/gofont/gobold"
	"golang.org/x/image/font/gofont/goregular"
	"golang.org/x/image/font/opentype"
	"golang.org/x/image/font/sfnt"
	"golang.org/x/image/math/fixed"
)

// The Go font (a pure-Go embedded TrueType font, WGL4 coverage) is the one
// font of every briefing: the PDF embeds it, the rasteriser draws with it,
// and label widths are measured with it, so every backend agrees on where
// text ends.
var (
	fontOnce              sync.Once
	fontRegular, fontBold *opentype.Font
	fontErr               error
)

func loadFonts() {
	fontRegular, fontErr = opentype.Parse(goregular.TTF)
	if fontErr == nil {
		fontBold, fontErr = opentype.Parse(gobold.TTF)
	}
	if fontErr != nil {
		fontErr = fmt.Errorf("brief: the embedded Go font does not parse: %w", fontErr)
	}
}

func fonts() (regular, bold *opentype.Font) {
	fontOnce.Do(loadFonts)
	if fontErr != nil {
		panic(fontErr) // the embedded font is part of the binary; a test covers it
	}
	return fontRegular, fontBold
}

// RegularTTF and BoldTTF are the embedded font files (for the PDF writer).
func RegularTTF() []byte { return goregular.TTF }

// BoldTTF is the bold embedded font file.
func BoldTTF() []byte { return gobold.TTF }

// MissingGlyphs returns the runes of s that the embedded regular or bold
// font has no glyph for.
func MissingGlyphs(s string) []rune {
	reg, bold := fonts()
	var buf sfnt.Buffer
	var out []rune
	for _, r := range s {
		if r == ' ' || r == '\n' {
			continue
		}
		for _, f := range []*opentype.Font{reg, bold} {
			if i, err := f.GlyphIndex(&buf, r); err != nil || i == 0 {
				out = append(out, r)
				break
			}
		}
	}
	return out
}

// newFace returns a face of the embedded font at size (drawing units at 72
// dpi, so one unit is one pixel or one point). Faces are not safe for
// concurrent use, so each drawing holds its own; TextWidth uses a locked one.
func newFace(bold bool, size float64) font.Face {
	reg, b := fonts()
	f := reg
	if bold {
		f = b
	}
	fc, err := opentype.NewFace(f, &opentype.FaceOptions{Size: size, DPI: 72, Hinting: font.HintingNone})
	if err != nil {
		panic(fmt.Errorf("brief: font face at size %g: %w", size, err))
	}
	return fc
}

var (
	measureMu   sync.Mutex
	measureFace [2]font.Face // at size 100
)

// TextWidth returns the advance width of s in the embedded font at size.
func TextWidth(s string, size float64, bold bool) float64 {
	measureMu.Lock()
	defer measureMu.Unlock()
	k := 0
	if bold {
		k = 1
	}
	if measureFace[k] == nil {
		measureFace[k] = newFace(bold, 100)
	}
	w := font.MeasureString(measureFace[k], s)
	return fixedToF(w) * size / 100
}

func fixedToF(x fixed.Int26_6) float64 { return float64(x) / 64 }
