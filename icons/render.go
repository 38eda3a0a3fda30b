//go:build ignore

// render.go draws the PNG app icon from duosweep.svg (run: go run ./icons/render.go from the repository
// root). ImageMagick on these machines has no SVG reader, so the PNG is rasterised with the same SVG
// renderer Fyne uses.
package main

import (
	"image"
	"image/png"
	"log"
	"os"

	"github.com/srwiley/oksvg"
	"github.com/srwiley/rasterx"
)

func main() {
	const size = 512
	icon, err := oksvg.ReadIcon("icons/duosweep.svg", oksvg.StrictErrorMode)
	if err != nil {
		log.Fatal(err)
	}
	icon.SetTarget(0, 0, size, size)
	img := image.NewRGBA(image.Rect(0, 0, size, size))
	scanner := rasterx.NewScannerGV(size, size, img, img.Bounds())
	icon.Draw(rasterx.NewDasher(size, size, scanner), 1)
	f, err := os.Create("icons/duosweep.png")
	if err != nil {
		log.Fatal(err)
	}
	if err := png.Encode(f, img); err != nil {
		log.Fatal(err)
	}
	if err := f.Close(); err != nil {
		log.Fatal(err)
	}
}
