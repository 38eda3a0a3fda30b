package brief

import (
	"image"
	"image/png"
	"os"
	"testing"

	"duosweep/engine"
)

func TestScratchPictures(t *testing.T) {
	in := demoInput(t, engine.Radio)
	m, err := BuildMap(in, 1200, 800, MapOptions{Title: in.Site.Scenario.Name, Notice: true})
	if err != nil {
		t.Fatal(err)
	}
	f, _ := os.Create("/tmp/brief/demo.png")
	if err := WritePNG(f, &m.Scene); err != nil {
		t.Fatal(err)
	}
	f.Close()
	f, _ = os.Create("/tmp/brief/demo.svg")
	WriteSVG(f, &m.Scene)
	f.Close()
}

func TestScratchPDF(t *testing.T) {
	in := demoInput(t, engine.Radio)
	f, _ := os.Create("/tmp/brief/demo.pdf")
	n, err := WritePDF(f, in, PDFOptions{})
	if err != nil {
		t.Fatal(err)
	}
	f.Close()
	t.Log("pages", n)
}

func TestScratchGIF(t *testing.T) {
	in := demoInput(t, engine.Radio)
	f, _ := os.Create("/tmp/brief/demo.gif")
	ff := engine.FaceToFace
	err := WriteGIF(t.Context(), f, in, GIFOptions{Compare: &ff})
	if err != nil {
		t.Fatal(err)
	}
	f.Close()
	a, _ := NewAnimation(in, GIFOptions{Compare: &ff})
	img := image.NewRGBA(image.Rect(0, 0, 640, 400))
	a.Frame(img, 120, 200)
	g, _ := os.Create("/tmp/brief/frame120.png")
	png.Encode(g, img)
	g.Close()
}
