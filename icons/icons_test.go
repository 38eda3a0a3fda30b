package icons

import (
	"bytes"
	"image/png"
	"testing"

	"github.com/srwiley/oksvg"
)

// TestIconsDecode checks that both bundled icons are real images: the SVG parses with the renderer
// Fyne uses and the PNG decodes at 512×512.
func TestIconsDecode(t *testing.T) {
	if _, err := oksvg.ReadIconStream(bytes.NewReader(App.Content()), oksvg.StrictErrorMode); err != nil {
		t.Fatalf("app SVG: %v", err)
	}
	img, err := png.Decode(bytes.NewReader(AppPNG.Content()))
	if err != nil {
		t.Fatalf("app PNG: %v", err)
	}
	if b := img.Bounds(); b.Dx() != 512 || b.Dy() != 512 {
		t.Fatalf("app PNG is %v, want 512×512", b)
	}
}
